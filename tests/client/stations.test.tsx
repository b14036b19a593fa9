import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { formatDoy, thresholdLabel } from '../../src/features/stations/components/doy';
import { StationUploadForm } from '../../src/features/stations/components/station-upload-form';

function renderForm() {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onUploaded = vi.fn();
  render(
    <QueryClientProvider client={queryClient}>
      <StationUploadForm onUploaded={onUploaded} />
    </QueryClientProvider>,
  );
  return { onUploaded };
}

describe('station upload form', () => {
  it('names each missing or wrong field before sending anything', async () => {
    const send = vi.spyOn(XMLHttpRequest.prototype, 'send');
    renderForm();
    await userEvent.type(screen.getByLabelText('Latitude'), '123');
    await userEvent.click(screen.getByRole('button', { name: 'Upload and compute' }));
    expect(await screen.findByText('Give the station a name')).toBeVisible();
    expect(screen.getByText('Latitude must be between -90 and 90')).toBeVisible();
    expect(screen.getByText('Please choose a CSV file')).toBeVisible();
    expect(screen.getByLabelText('Latitude')).toHaveAttribute('aria-invalid', 'true');
    // The first problem on the form takes the focus, so the editor starts there.
    expect(screen.getByLabelText('Station name')).toHaveFocus();
    expect(send).not.toHaveBeenCalled();
    send.mockRestore();
  });
});

describe('date labels', () => {
  it('reads days of year on a common year and names thresholds in both units', () => {
    // 27 April is day 117 of a common year (common practice, no source: calendar arithmetic).
    expect(formatDoy(117)).toBe('Apr 27');
    expect(formatDoy(null)).toBe('—');
    expect(thresholdLabel(32)).toBe('32 °F (0 °C)');
    expect(thresholdLabel(28)).toBe('28 °F (-2.2 °C)');
  });
});
