import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type OnChangeFn, type SortingState } from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';
import { SortableTableHead } from '../../../components/sortable-table-head';
import { cardLabel } from '../../../components/table-cards';

export interface PageState {
  limit: number;
  offset: number;
}

interface DataTableProps<T> {
  caption: string;
  columns: ColumnDef<T, any>[];
  rows: T[];
  total: number;
  page: PageState;
  onPageChange: (page: PageState) => void;
  /** Sorting done by the server (catalogue); without it, headers sort the rows of this page. */
  sorting?: SortingState;
  onSortingChange?: OnChangeFn<SortingState>;
  isLoading?: boolean;
  empty?: ReactNode;
  rowId?: (row: T) => string;
}

/**
 * A readable table over one page of server results (TanStack Table v8): clickable headers sort,
 * the pager below moves through the server's pages and says where you are.
 */
export function DataTable<T>({ caption, columns, rows, total, page, onPageChange, sorting, onSortingChange, isLoading, empty, rowId }: DataTableProps<T>) {
  const [localSorting, setLocalSorting] = useState<SortingState>([]);
  const manual = sorting !== undefined;
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting: manual ? sorting : localSorting },
    onSortingChange: manual ? onSortingChange : setLocalSorting,
    manualSorting: manual,
    manualPagination: true,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: manual ? undefined : getSortedRowModel(),
    getRowId: rowId,
  });
  const first = total === 0 ? 0 : page.offset + 1;
  const last = Math.min(total, page.offset + rows.length);

  return (
    <div className="rounded-lg border border-fig-100 bg-white">
      <div className="overflow-x-auto">
        <table className="table-cards w-full text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <SortableTableHead table={table} className="bg-fig-50 text-ink/70" />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-fig-100 align-top hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2" data-label={cardLabel(cell.column)}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink/70">
                  {isLoading ? 'Loading…' : (empty ?? 'Nothing here.')}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pager page={page} total={total} first={first} last={last} onPageChange={onPageChange} />
    </div>
  );
}

export function Pager({ page, total, first, last, onPageChange }: { page: PageState; total: number; first: number; last: number; onPageChange: (page: PageState) => void }) {
  return (
    <div className="flex flex-wrap items-center justify-between gap-2 border-t border-fig-100 px-3 py-2 text-sm text-ink/75">
      <span aria-live="polite">
        {first}–{last} of {total}
      </span>
      <div className="flex items-center gap-2">
        <label className="flex items-center gap-1">
          Rows
          <select className="rounded border border-fig-200 bg-white px-1 py-0.5" value={page.limit} onChange={(e) => onPageChange({ limit: Number(e.target.value), offset: 0 })}>
            {[10, 25, 50, 100].map((n) => (
              <option key={n}>{n}</option>
            ))}
          </select>
        </label>
        <button type="button" className="rounded px-2 py-1 hover:bg-fig-50 disabled:opacity-40" disabled={page.offset === 0} onClick={() => onPageChange({ ...page, offset: Math.max(0, page.offset - page.limit) })}>
          ← Previous
        </button>
        <button type="button" className="rounded px-2 py-1 hover:bg-fig-50 disabled:opacity-40" disabled={page.offset + page.limit >= total} onClick={() => onPageChange({ ...page, offset: page.offset + page.limit })}>
          Next →
        </button>
      </div>
    </div>
  );
}

/** Small shared classes for the editors' filters. */
export const filterClass = 'rounded-md border border-fig-200 bg-white px-2 py-1.5 text-sm';
