import type { Column } from '@tanstack/react-table';

/**
 * The label a cell shows beside its value when its table is drawn as cards on a phone (the
 * `table-cards` class in index.css): the column's header text, or none for a header that is not
 * plain text (a photo, the row's buttons).
 */
export function cardLabel<T>(column: Column<T, unknown>): string | undefined {
  const header = column.columnDef.header;
  return typeof header === 'string' ? header : undefined;
}
