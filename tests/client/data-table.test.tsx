import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ColumnDef } from '@tanstack/react-table';
import { describe, expect, it } from 'vitest';
import { DataTable } from '../../src/features/editors/components/data-table';

type Row = { name: string; trees: number };
const columns: ColumnDef<Row, any>[] = [
  { accessorKey: 'name', header: 'Name' },
  { accessorKey: 'trees', header: 'Trees', enableSorting: false },
];
const rows: Row[] = [
  { name: 'Fictional Brass', trees: 2 },
  { name: 'Fictional Amber', trees: 5 },
];

describe('DataTable headers', () => {
  it('sort by a column on click and say the order to screen readers; a column that does not sort is plain text', async () => {
    render(<DataTable caption="Varieties" columns={columns} rows={rows} total={2} page={{ limit: 10, offset: 0 }} onPageChange={() => {}} />);
    const nameHeader = screen.getByRole('columnheader', { name: /Name/ });
    expect(nameHeader).not.toHaveAttribute('aria-sort');
    expect(within(screen.getByRole('columnheader', { name: 'Trees' })).queryByRole('button')).toBeNull();

    await userEvent.click(within(nameHeader).getByRole('button'));
    expect(nameHeader).toHaveAttribute('aria-sort', 'ascending');
    const names = () => screen.getAllByRole('row').slice(1).map((row) => within(row).getAllByRole('cell')[0]!.textContent);
    expect(names()).toEqual(['Fictional Amber', 'Fictional Brass']);

    await userEvent.click(within(nameHeader).getByRole('button'));
    expect(nameHeader).toHaveAttribute('aria-sort', 'descending');
    expect(names()).toEqual(['Fictional Brass', 'Fictional Amber']);
  });
});
