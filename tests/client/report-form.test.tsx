import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router';
import { describe, expect, it, vi } from 'vitest';
import { reportQueries } from '../../src/features/reports/api';
import { ReportForm } from '../../src/features/reports/components/report-form';

function setup() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(reportQueries.trees().queryKey, { trees: [] });
  const onSaved = vi.fn();
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <ReportForm onSaved={onSaved} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { onSaved };
}

describe('ReportForm submitted empty', () => {
  it('lands on the first problem on the page (the variety), says how many fields need a look, and saves nothing', async () => {
    const user = userEvent.setup();
    const { onSaved } = setup();
    await user.click(screen.getByRole('button', { name: 'Post report' }));

    const variety = screen.getByRole('combobox', { name: 'Variety' });
    // Focus moves once the form has rendered its errors (after the submit's validation settles).
    await waitFor(() => expect(variety).toHaveFocus());
    expect(variety).toHaveAttribute('aria-invalid', 'true');
    expect(variety).toHaveAccessibleDescription(/Pick the name on the label.*Choose a variety/);
    // Fields further down are marked too, and the radio group's error is tied to it.
    expect(screen.getByRole('spinbutton', { name: 'Latitude' })).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByRole('group', { name: 'Outcome' })).toHaveAccessibleDescription(/What the best of this crop did/);
    expect(screen.getByText(/fields need a look/)).toBeInTheDocument();
    expect(onSaved).not.toHaveBeenCalled();
  });
});
