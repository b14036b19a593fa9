import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import { authQueries } from '../../src/features/auth/api';
import { guidanceQueries } from '../../src/features/guidance/api';
import { DiagnosisStepper } from '../../src/features/guidance/components/diagnosis-stepper';

function setup() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(authQueries.me().queryKey, { user: null });
  client.setQueryData(guidanceQueries.varieties().queryKey, { varieties: [] });
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <DiagnosisStepper />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('Why no figs? with the keyboard', () => {
  it('moves focus to each new question (the pressed button is gone) and names its choices by the question', async () => {
    const user = userEvent.setup();
    setup();
    await user.click(screen.getByRole('button', { name: /No fruit formed/ }));
    expect(screen.getByRole('heading', { name: 'Which variety is it?' })).toHaveFocus();
    expect(screen.getByRole('group', { name: 'Its type' })).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Next' }));
    const heading = screen.getByRole('heading', { level: 2 });
    expect(heading).toHaveFocus();
    expect(heading.textContent).not.toBe('Which variety is it?');

    await user.click(screen.getByRole('button', { name: 'Back' }));
    expect(screen.getByRole('heading', { name: 'Which variety is it?' })).toHaveFocus();
  });
});
