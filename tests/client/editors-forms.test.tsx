import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../src/lib/api-client';
import { VarietyForm } from '../../src/features/varieties/components/variety-form';
import { WaspAreaForm } from '../../src/features/wasp-areas/components/wasp-area-form';
import { ChangeList } from '../../src/features/audit/components/audit-table';

describe('VarietyForm', () => {
  it('asks for a source before a fig type claim is saved, then sends the parsed variety', async () => {
    const user = userEvent.setup();
    const onSubmit = vi.fn().mockResolvedValue(undefined);
    render(<VarietyForm mode="create" onSubmit={onSubmit} onCancel={() => {}} isPending={false} />);
    await user.type(screen.getByLabelText('Name'), 'Testfield Brown');
    await user.type(screen.getByLabelText('Synonyms'), 'TF Brown; Brownie');
    await user.selectOptions(screen.getByLabelText('Fig type'), 'common');
    await user.click(screen.getByRole('button', { name: 'Add variety' }));
    expect(await screen.findByText(/Name a source for the fig type and ripening claims/)).toBeVisible();
    expect(onSubmit).not.toHaveBeenCalled();

    await user.type(screen.getByLabelText('Sources'), 'Test handbook, p. 1');
    await user.type(screen.getByLabelText('Typical days to ripen'), '150');
    await user.click(screen.getByRole('button', { name: 'Add variety' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledOnce());
    expect(onSubmit.mock.calls[0]![0]).toMatchObject({ name: 'Testfield Brown', synonyms: ['TF Brown', 'Brownie'], figType: 'common', typicalDaysToRipen: 150, ripeningClass: null, bearsMain: true });
  });

  it('shows the server’s field error beside the field', async () => {
    const user = userEvent.setup();
    const onSubmit = vi.fn().mockRejectedValue(new ApiError(409, 'name_taken', 'taken', { name: ['“Lantern Amber” is already used by variety #1; merge the two instead'] }));
    render(<VarietyForm mode="create" onSubmit={onSubmit} onCancel={() => {}} isPending={false} />);
    await user.type(screen.getByLabelText('Name'), 'Lantern Amber');
    await user.click(screen.getByRole('button', { name: 'Add variety' }));
    expect(await screen.findByText(/already used by variety #1/)).toBeVisible();
    expect(screen.getByLabelText('Name')).toHaveAttribute('aria-invalid', 'true');
  });
});

describe('WaspAreaForm', () => {
  it('names the problem in an uploaded file with an open ring, and keeps it off the map', async () => {
    const user = userEvent.setup();
    const onUploaded = vi.fn();
    render(
      <WaspAreaForm area={null} mode="upload" onModeChange={() => {}} vertices={[]} onUndo={() => {}} onClearDrawing={() => {}} uploaded={null} onUploaded={onUploaded} onSubmit={vi.fn()} onCancel={() => {}} isPending={false} />,
    );
    const open = { type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1]]] };
    await user.upload(screen.getByLabelText(/^GeoJSON file/), new File([JSON.stringify(open)], 'open.geojson', { type: 'application/geo+json' }));
    expect(await screen.findByText('The outer ring of the polygon is not closed: its last position must repeat its first')).toBeVisible();
    expect(onUploaded).toHaveBeenLastCalledWith(null);
  });

  it('asks for the source and date, and an outline, before saving', async () => {
    const user = userEvent.setup();
    const onSubmit = vi.fn();
    render(<WaspAreaForm area={null} mode="draw" onModeChange={() => {}} vertices={[]} onUndo={() => {}} onClearDrawing={() => {}} uploaded={null} onUploaded={() => {}} onSubmit={onSubmit} onCancel={() => {}} isPending={false} />);
    await user.type(screen.getByLabelText('Area name'), 'Somewhere');
    await user.click(screen.getByRole('button', { name: 'Record area' }));
    expect(await screen.findByText(/Say where the record comes from/)).toBeVisible();
    expect(screen.getByText('Use a date like 2025-07-15')).toBeVisible();
    expect(screen.getByText('Draw the area on the map or upload a GeoJSON file')).toBeVisible();
    expect(onSubmit).not.toHaveBeenCalled();
  });
});

describe('ChangeList', () => {
  it('shows only the changed keys, before and after', () => {
    render(<ChangeList before={{ name: 'Old', status: 'active' }} after={{ name: 'New', status: 'active' }} />);
    expect(screen.getByText('Name')).toBeVisible();
    expect(screen.getByText('Old')).toBeVisible();
    expect(screen.getByText('New')).toBeVisible();
    expect(screen.queryByText('Status')).toBeNull();
  });

  it('speaks in words: field labels, names for ids, labels for codes', () => {
    render(<ChangeList before={{ varietyId: 3, outcome: 'unripe', hiddenReason: null }} after={{ varietyId: 4, outcome: 'ripened', hiddenReason: 'spam' }} names={{ varieties: { '3': 'Amber Dome', '4': 'Violet Keel' }, users: {} }} />);
    expect(screen.getByText('Variety')).toBeVisible();
    expect(screen.getByText('Amber Dome')).toBeVisible();
    expect(screen.getByText('Violet Keel')).toBeVisible();
    expect(screen.getByText('Outcome')).toBeVisible();
    expect(screen.getByText('Reason for hiding')).toBeVisible();
    expect(screen.queryByText('varietyId')).toBeNull();
  });
});
