import { flexRender, type Table } from '@tanstack/react-table';

const SORT_MARK = { asc: '▲', desc: '▼' } as const;

/**
 * A table's header rows from TanStack Table: a sortable column's title is a button that toggles
 * its order, with the order shown as a mark and told to screen readers (aria-sort).
 */
export function SortableTableHead<T>({ table, className, columnClassName }: { table: Table<T>; className: string; columnClassName?: (columnId: string) => string }) {
  return (
    <thead className={className}>
      {table.getHeaderGroups().map((group) => (
        <tr key={group.id}>
          {group.headers.map((header) => {
            const sorted = header.column.getIsSorted();
            const title = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
            return (
              <th key={header.id} scope="col" className={`whitespace-nowrap px-3 py-2 font-medium ${columnClassName?.(header.column.id) ?? ''}`} aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                {header.column.getCanSort() && !header.isPlaceholder ? (
                  <button type="button" className="inline-flex items-center gap-1 hover:text-fig-700" onClick={header.column.getToggleSortingHandler()}>
                    {title}
                    <span aria-hidden="true" className="text-xs">
                      {sorted ? SORT_MARK[sorted] : '↕'}
                    </span>
                  </button>
                ) : (
                  title
                )}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
