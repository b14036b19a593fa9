import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, type SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { FIG_TYPES, LABELS, VARIETY_STATUSES, type FigType, type VarietyStatus } from '@shared/domain/codes';
import { CATALOGUE_SORTS, type CatalogueEntry } from '@shared/schemas/varieties';
import { DataTable, filterClass, type PageState } from '../../editors/components/data-table';
import { varietyQueries } from '../api';
import { VarietyLink } from './variety-link';

const STATUS_STYLE: Record<VarietyStatus, string> = {
  accepted: 'bg-leaf-100 text-leaf-700',
  proposed: 'bg-amber-soft text-ink',
  rejected: 'bg-red-50 text-red-800',
  merged: 'bg-fig-50 text-fig-700',
};
const STATUS_LABEL: Record<VarietyStatus, string> = { accepted: 'Accepted', proposed: 'Proposed by a grower', rejected: 'Rejected', merged: 'Merged' };

export function StatusBadge({ status }: { status: VarietyStatus }) {
  return <span className={`rounded-full px-2 py-0.5 text-xs font-medium whitespace-nowrap ${STATUS_STYLE[status]}`}>{STATUS_LABEL[status]}</span>;
}

const column = createColumnHelper<CatalogueEntry>();

export interface CatalogueActions {
  onEdit: (v: CatalogueEntry) => void;
  onMerge: (v: CatalogueEntry) => void;
  onReview: (v: CatalogueEntry) => void;
}

/** Every variety of any status, searched, filtered and sorted on the server. */
export function CatalogueTable({ status, onStatusChange, actions }: { status: VarietyStatus | ''; onStatusChange: (s: VarietyStatus | '') => void; actions: CatalogueActions }) {
  const [q, setQ] = useState('');
  const [figType, setFigType] = useState<FigType | ''>('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [page, setPage] = useState<PageState>({ limit: 25, offset: 0 });
  const sort = sorting[0] && (CATALOGUE_SORTS as readonly string[]).includes(sorting[0].id) ? (sorting[0].id as (typeof CATALOGUE_SORTS)[number]) : 'name';
  const filters = { q: q || undefined, status: status || undefined, figType: figType || undefined, sort, dir: sorting[0]?.desc ? ('desc' as const) : ('asc' as const), ...page };
  const { data, isLoading, error } = useQuery(varietyQueries.catalogue(filters));

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <div>
            <div className="font-medium text-fig-900">
              {c.row.original.status === 'accepted' ? <VarietyLink id={c.row.original.id} name={c.getValue()} /> : c.getValue()}{' '}
              {c.row.original.isFictional && <span className="text-xs font-normal text-ink/70">(fictional)</span>}
            </div>
            {c.row.original.synonyms.length > 0 && <div className="text-xs text-ink/70">also {c.row.original.synonyms.join(', ')}</div>}
          </div>
        ),
      }),
      column.accessor('status', {
        header: 'Status',
        cell: (c) => (
          <div className="flex flex-col items-start gap-1">
            <StatusBadge status={c.getValue()} />
            {c.row.original.mergedIntoName && <span className="text-xs text-ink/70">into {c.row.original.mergedIntoName}</span>}
            {c.row.original.proposedBy && c.getValue() !== 'accepted' && <span className="text-xs text-ink/70">by {c.row.original.proposedBy}</span>}
            {c.row.original.reviewNote && <span className="text-xs text-ink/70">“{c.row.original.reviewNote}”</span>}
          </div>
        ),
      }),
      column.accessor('figType', { header: 'Fig type', cell: (c) => LABELS.figType[c.getValue()].split(' (')[0] }),
      column.display({
        id: 'crops',
        header: 'Crops',
        cell: (c) => [c.row.original.bearsBreba && 'breba', c.row.original.bearsMain && 'main'].filter(Boolean).join(' + '),
      }),
      column.display({
        id: 'ripening',
        header: 'Ripening',
        cell: (c) =>
          [c.row.original.ripeningClass && LABELS.ripeningClass[c.row.original.ripeningClass], c.row.original.typicalDaysToRipen && `${c.row.original.typicalDaysToRipen} d`].filter(Boolean).join(' · ') || '—',
      }),
      column.accessor('reportCount', { header: 'Reports', cell: (c) => <span className="tabular-nums">{c.getValue()}</span> }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const v = c.row.original;
          if (v.status === 'merged') return null;
          return (
            <div className="flex gap-1 whitespace-nowrap">
              {v.status === 'proposed' || v.status === 'rejected' ? (
                <button type="button" className="rounded px-2 py-1 font-medium text-fig-700 hover:bg-fig-50" onClick={() => actions.onReview(v)} aria-label={`Review ${v.name}`}>
                  Review
                </button>
              ) : (
                <button type="button" className="rounded px-2 py-1 text-fig-700 hover:bg-fig-50" onClick={() => actions.onEdit(v)} aria-label={`Edit ${v.name}`}>
                  Edit
                </button>
              )}
              <button type="button" className="rounded px-2 py-1 text-fig-700 hover:bg-fig-50" onClick={() => actions.onMerge(v)} aria-label={`Merge ${v.name} into another variety`}>
                Merge…
              </button>
            </div>
          );
        },
      }),
    ],
    [actions],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm">
          <span className="font-medium">Search</span>
          <input className={filterClass} type="search" placeholder="Name or synonym" value={q} onChange={(e) => { setQ(e.target.value); setPage((p) => ({ ...p, offset: 0 })); }} />
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Status</span>
          <select className={filterClass} value={status} onChange={(e) => { onStatusChange(e.target.value as VarietyStatus | ''); setPage((p) => ({ ...p, offset: 0 })); }}>
            <option value="">Any</option>
            {VARIETY_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABEL[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Fig type</span>
          <select className={filterClass} value={figType} onChange={(e) => { setFigType(e.target.value as FigType | ''); setPage((p) => ({ ...p, offset: 0 })); }}>
            <option value="">Any</option>
            {FIG_TYPES.map((t) => (
              <option key={t} value={t}>
                {LABELS.figType[t].split(' (')[0]}
              </option>
            ))}
          </select>
        </label>
      </div>
      {error && <p role="alert" className="text-sm text-red-700">{error.message}</p>}
      <DataTable
        caption="Variety catalogue"
        columns={columns}
        rows={data?.items ?? []}
        total={data?.total ?? 0}
        page={page}
        onPageChange={setPage}
        sorting={sorting}
        onSortingChange={(updater) => {
          setSorting(updater);
          setPage((p) => ({ ...p, offset: 0 }));
        }}
        isLoading={isLoading}
        empty="No variety matches these filters."
        rowId={(v) => String(v.id)}
      />
    </div>
  );
}
