import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { auditChanges } from '@shared/domain/audit-diff';
import type { AuditEntryView } from '@shared/schemas/audit';
import { DataTable, filterClass, type PageState } from '../../editors/components/data-table';
import { auditQueries } from '../api';

const column = createColumnHelper<AuditEntryView>();

/** Before → after for the keys that changed, one line each. */
export function ChangeList({ before, after }: { before: unknown; after: unknown }) {
  const changes = auditChanges(before, after);
  if (changes.length === 0) return <span className="text-ink/60">no field changed</span>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
      {changes.slice(0, 12).map((c) => (
        <div key={c.key} className="contents">
          <dt className="font-medium text-ink/80">{c.key}</dt>
          <dd className="break-words">
            <del className="text-red-800 decoration-red-800/50">{truncate(c.before)}</del> <span aria-hidden="true">→</span> <ins className="text-leaf-700 no-underline">{truncate(c.after)}</ins>
          </dd>
        </div>
      ))}
      {changes.length > 12 && <dd className="col-span-2 text-ink/60">…{changes.length - 12} more</dd>}
    </dl>
  );
}

const truncate = (s: string) => (s.length > 140 ? `${s.slice(0, 140)}…` : s);

/** Who did what, when, with before and after; filtered and paginated on the server. */
export function AuditTable() {
  const [filters, setFilters] = useState({ actorId: '', action: '', entityType: '', from: '', to: '' });
  const [page, setPage] = useState<PageState>({ limit: 25, offset: 0 });
  const { data, isLoading, error } = useQuery(
    auditQueries.page({ ...page, actorId: filters.actorId ? Number(filters.actorId) : undefined, action: filters.action || undefined, entityType: filters.entityType || undefined, from: filters.from || undefined, to: filters.to || undefined }),
  );
  const set = (key: keyof typeof filters) => (e: { target: { value: string } }) => {
    setFilters((f) => ({ ...f, [key]: e.target.value }));
    setPage((p) => ({ ...p, offset: 0 }));
  };

  const columns = useMemo(
    () => [
      column.accessor('createdAt', { header: 'When', cell: (c) => <time dateTime={c.getValue()} className="whitespace-nowrap tabular-nums">{new Date(c.getValue()).toLocaleString()}</time> }),
      column.accessor('actor', { header: 'Who', cell: (c) => c.getValue() ?? <span className="text-ink/60">system</span> }),
      column.accessor('action', { header: 'What', cell: (c) => <code className="rounded bg-fig-50 px-1 text-xs">{c.getValue()}</code> }),
      column.accessor((e) => `${e.entityType}${e.entityId ? ` #${e.entityId}` : ''}`, { id: 'entity', header: 'On' }),
      column.display({ id: 'changes', header: 'Before → after', cell: (c) => <ChangeList before={c.row.original.before} after={c.row.original.after} /> }),
    ],
    [],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm">
          <span className="font-medium">Who</span>
          <select className={filterClass} value={filters.actorId} onChange={set('actorId')}>
            <option value="">Anyone</option>
            {data?.facets.actors.map((a) => (
              <option key={a.id} value={a.id}>
                {a.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Action</span>
          <select className={filterClass} value={filters.action} onChange={set('action')}>
            <option value="">Any action</option>
            {data?.facets.actions.map((a) => (
              <option key={a}>{a}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Record type</span>
          <select className={filterClass} value={filters.entityType} onChange={set('entityType')}>
            <option value="">Any</option>
            {data?.facets.entityTypes.map((a) => (
              <option key={a}>{a}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">From</span>
          <input type="date" className={filterClass} value={filters.from} onChange={set('from')} />
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">To</span>
          <input type="date" className={filterClass} value={filters.to} onChange={set('to')} />
        </label>
      </div>
      {error && <p role="alert" className="text-sm text-red-700">{error.message}</p>}
      <DataTable caption="Audit log" columns={columns} rows={data?.items ?? []} total={data?.total ?? 0} page={page} onPageChange={setPage} isLoading={isLoading} empty="No entries match these filters." rowId={(e) => String(e.id)} />
    </div>
  );
}
