import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { WASP_AREA_STATUSES, type WaspAreaStatus } from '@shared/domain/codes';
import type { WaspAreaRecord } from '@shared/schemas/wasp-areas';
import { DataTable, filterClass, type PageState } from '../../editors/components/data-table';
import { useRetireWaspArea, waspAreaQueries } from '../api';
import { DateText } from '../../units/components/date-text';

const column = createColumnHelper<WaspAreaRecord>();

/** Every recorded wasp area, retired ones included (history), paginated on the server. */
export function WaspAreaTable({ selectedId, onSelect, onEdit }: { selectedId: number | null; onSelect: (a: WaspAreaRecord) => void; onEdit: (a: WaspAreaRecord) => void }) {
  const [status, setStatus] = useState<WaspAreaStatus | ''>('');
  const [q, setQ] = useState('');
  const [page, setPage] = useState<PageState>({ limit: 10, offset: 0 });
  const { data, isLoading } = useQuery(waspAreaQueries.records({ status: status || undefined, q: q || undefined, ...page }));
  const retire = useRetireWaspArea();

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Area',
        cell: (c) => (
          <button type="button" className={`text-left font-medium hover:underline ${c.row.original.id === selectedId ? 'text-fig-600' : 'text-fig-900'}`} onClick={() => onSelect(c.row.original)}>
            {c.getValue()}
          </button>
        ),
      }),
      column.accessor('status', {
        header: 'Status',
        cell: (c) =>
          c.getValue() === 'active' ? (
            <span className="rounded-full bg-leaf-100 px-2 py-0.5 text-xs font-medium text-leaf-700">Active</span>
          ) : (
            <span className="text-xs text-ink/70">Retired {c.row.original.retiredAt?.slice(0, 10)}</span>
          ),
      }),
      column.accessor('observedOn', { header: 'Observed', cell: (c) => <DateText iso={c.getValue()} className="whitespace-nowrap" /> }),
      column.accessor('source', { header: 'Source', enableSorting: false, cell: (c) => <span className="line-clamp-2 max-w-xs text-ink/80">{c.getValue()}</span> }),
      column.accessor('areaKm2', { header: 'Size', cell: (c) => <span className="whitespace-nowrap tabular-nums">{Math.round(c.getValue()).toLocaleString()} km²</span> }),
      column.accessor('vertexCount', { header: 'Corners', cell: (c) => <span className="tabular-nums">{c.getValue()}</span> }),
      column.accessor('createdBy', { header: 'Recorded by', cell: (c) => c.getValue() ?? '—' }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => (
          <div className="flex gap-1 whitespace-nowrap">
            <button type="button" className="rounded px-2 py-1 text-fig-700 hover:bg-fig-50" onClick={() => onEdit(c.row.original)} aria-label={`Edit ${c.row.original.name}`}>
              Edit
            </button>
            {c.row.original.status === 'active' && (
              <button
                type="button"
                className="rounded px-2 py-1 text-red-800 hover:bg-red-50"
                aria-label={`Retire ${c.row.original.name}`}
                onClick={() => {
                  if (window.confirm(`Retire “${c.row.original.name}”? It leaves the map and the pollination check but stays in this list.`)) retire.mutate(c.row.original.id);
                }}
              >
                Retire
              </button>
            )}
          </div>
        ),
      }),
    ],
    [selectedId, onSelect, onEdit, retire],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm">
          <span className="font-medium">Search</span>
          <input className={filterClass} type="search" placeholder="Area name" value={q} onChange={(e) => { setQ(e.target.value); setPage((p) => ({ ...p, offset: 0 })); }} />
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Status</span>
          <select className={filterClass} value={status} onChange={(e) => { setStatus(e.target.value as WaspAreaStatus | ''); setPage((p) => ({ ...p, offset: 0 })); }}>
            <option value="">Active and retired</option>
            {WASP_AREA_STATUSES.map((s) => (
              <option key={s} value={s}>
                {s === 'active' ? 'Active' : 'Retired'}
              </option>
            ))}
          </select>
        </label>
      </div>
      {retire.error && <p role="alert" className="text-sm text-red-700">{retire.error.message}</p>}
      <DataTable caption="Wasp areas" columns={columns} rows={data?.items ?? []} total={data?.total ?? 0} page={page} onPageChange={setPage} isLoading={isLoading} empty="No wasp area recorded yet." rowId={(a) => String(a.id)} />
    </div>
  );
}
