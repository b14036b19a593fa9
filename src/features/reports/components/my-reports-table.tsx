import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { CROPS, GROWING_FORMS, LABELS, OUTCOMES, REPORT_STATUSES, type Crop, type GrowingForm, type Outcome, type ReportStatus } from '@shared/domain/codes';
import type { ReportListItem, ReportListQuery, ReportSort } from '@shared/schemas/reports';
import { Button } from '../../../components/button';
import { SortableTableHead } from '../../../components/sortable-table-head';
import { cardLabel } from '../../../components/table-cards';
import { reportQueries, useDeleteReport, usePublishReport } from '../api';
import { inputClass } from '../../../components/form-field';
import { DateText } from '../../units/components/date-text';
import { VarietyLink } from '../../varieties/components/variety-link';
import { countOf } from '@shared/domain/plural';

const column = createColumnHelper<ReportListItem>();
const STATUS_LABEL = { published: 'Published', draft: 'Draft', hidden: 'Hidden by an editor' } as const;
const PAGE_SIZE = 25;

interface Filters {
  q?: string;
  crop?: Crop;
  outcome?: Outcome;
  form?: GrowingForm;
  status?: ReportStatus;
  seasonFrom?: number;
  seasonTo?: number;
}

/** The grower's own reports: sorted and filtered on the server, with edit and delete. */
export function MyReportsTable() {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'season', desc: true }]);
  const [filters, setFilters] = useState<Filters>({});
  const [page, setPage] = useState(1);
  const query: ReportListQuery = {
    mine: 'true',
    ...filters,
    sort: (sorting[0]?.id as ReportSort | undefined) ?? 'createdAt',
    dir: sorting[0]?.desc === false ? 'asc' : 'desc',
    page,
    pageSize: PAGE_SIZE,
  };
  const list = useQuery(reportQueries.list(query));
  const remove = useDeleteReport();
  const publish = usePublishReport();

  const columns = useMemo(
    () => [
      column.display({
        id: 'photo',
        header: () => <span className="sr-only">Photo</span>,
        cell: ({ row }) =>
          row.original.thumbUrl ? <img src={row.original.thumbUrl} alt="" className="h-10 w-10 rounded object-cover" /> : <span className="block h-10 w-10 rounded bg-fig-50" aria-hidden="true" />,
      }),
      column.accessor('varietyName', {
        id: 'variety',
        header: 'Variety',
        cell: ({ row, getValue }) => (
          <span>
            {row.original.varietyStatus === 'accepted' ? <VarietyLink id={row.original.varietyId} name={getValue()} /> : <span className="font-medium text-fig-700">{getValue()}</span>}
            {row.original.varietyStatus === 'proposed' && <span className="ml-1 text-xs font-normal text-ink/70">(proposed)</span>}
          </span>
        ),
      }),
      column.accessor('treeLabel', { header: 'Tree', enableSorting: false, cell: ({ getValue }) => getValue() ?? '' }),
      column.accessor('season', { header: 'Season' }),
      column.accessor('crop', { header: 'Crop', cell: ({ getValue }) => (getValue() === 'breba' ? 'Breba' : 'Main') }),
      column.accessor('outcome', { header: 'Outcome', cell: ({ getValue }) => LABELS.outcome[getValue()] }),
      column.accessor('form', { header: 'Form', cell: ({ getValue }) => LABELS.growingForm[getValue()] }),
      column.accessor('status', { header: 'Status', cell: ({ getValue }) => <span className={getValue() === 'published' ? 'text-leaf-700' : 'text-fig-700'}>{STATUS_LABEL[getValue()]}</span> }),
      column.accessor('updatedAt', { header: 'Changed', cell: ({ getValue }) => <DateText iso={getValue()} className="whitespace-nowrap" /> }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => (
          <div className="flex gap-2 whitespace-nowrap">
            {row.original.status === 'draft' && (
              <button type="button" className="text-sm text-leaf-700 underline" onClick={() => publish.mutate(row.original.id)}>
                Publish
              </button>
            )}
            <Link to={`/reports/${row.original.id}`} className="text-sm text-fig-700 underline" aria-label={`Open the report of ${row.original.varietyName}, ${row.original.season}`}>
              Open
            </Link>
            <Link to={`/reports/${row.original.id}/edit`} className="text-sm text-fig-700 underline">
              Edit
            </Link>
            <button
              type="button"
              className="text-sm text-red-800 underline"
              aria-label={`Delete the ${row.original.season} report of ${row.original.varietyName}`}
              onClick={() => window.confirm(`Delete your ${row.original.season} report of ${row.original.varietyName}?`) && remove.mutate(row.original.id)}
            >
              Delete
            </button>
          </div>
        ),
      }),
    ],
    [remove, publish],
  );

  const table = useReactTable({
    data: list.data?.reports ?? [],
    columns,
    state: { sorting },
    onSortingChange: (updater) => {
      setSorting(updater);
      setPage(1);
    },
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
  });

  const setFilter = <K extends keyof typeof filters>(key: K, value: (typeof filters)[K] | '') => {
    setFilters((f) => ({ ...f, [key]: value === '' ? undefined : value }));
    setPage(1);
  };
  const total = list.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  return (
    <div className="flex flex-col gap-4">
      <div className="grid grid-cols-2 gap-3 rounded-lg border border-fig-100 bg-white p-4 sm:grid-cols-4 lg:grid-cols-7" role="search" aria-label="Filter my reports">
        <label className="col-span-2 flex flex-col gap-1 text-xs font-medium text-ink/80">
          Variety or tree
          <input className={inputClass} type="search" value={filters.q ?? ''} onChange={(e) => setFilter('q', e.target.value)} placeholder="Search" />
        </label>
        <FilterSelect label="Crop" value={filters.crop} options={CROPS.map((c) => [c, c === 'breba' ? 'Breba' : 'Main'])} onChange={(v) => setFilter('crop', v as typeof filters.crop)} />
        <FilterSelect label="Outcome" value={filters.outcome} options={OUTCOMES.map((c) => [c, LABELS.outcome[c]])} onChange={(v) => setFilter('outcome', v as typeof filters.outcome)} />
        <FilterSelect label="Form" value={filters.form} options={GROWING_FORMS.map((c) => [c, LABELS.growingForm[c]])} onChange={(v) => setFilter('form', v as typeof filters.form)} />
        <FilterSelect label="Status" value={filters.status} options={REPORT_STATUSES.map((c) => [c, STATUS_LABEL[c]])} onChange={(v) => setFilter('status', v as typeof filters.status)} />
        <label className="flex flex-col gap-1 text-xs font-medium text-ink/80">
          Season
          <input className={inputClass} type="number" inputMode="numeric" value={filters.seasonFrom ?? ''} onChange={(e) => { const v = e.target.value ? Number(e.target.value) : ''; setFilters((f) => ({ ...f, seasonFrom: v === '' ? undefined : v, seasonTo: v === '' ? undefined : v })); setPage(1); }} placeholder="Any" />
        </label>
      </div>

      <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white">
        <table className="table-cards w-full text-left text-sm">
          <caption className="sr-only">My reports, {total} in all</caption>
          <SortableTableHead table={table} className="bg-fig-50 text-ink/80" />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-fig-50 hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="whitespace-nowrap px-3 py-2 align-middle" data-label={cardLabel(cell.column)}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {list.isLoading && <p className="p-4 text-sm text-ink/70">Loading your reports…</p>}
        {list.isSuccess && total === 0 && (
          <p className="p-4 text-sm text-ink/70">
            No reports {Object.values(filters).some((v) => v !== undefined) ? 'match these filters' : 'yet'}. <Link to="/reports/new" className="text-fig-700 underline">Post your first report</Link>.
          </p>
        )}
        {list.isError && <p role="alert" className="p-4 text-sm text-red-800">{list.error.message}</p>}
      </div>
      {(remove.error ?? publish.error) && <p role="alert" className="text-sm text-red-800">{(remove.error ?? publish.error)!.message}</p>}
      {total > 0 && (
        <div className="flex items-center gap-3 text-sm">
          {pages > 1 && (
            <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
              Previous
            </Button>
          )}
          <span>
            {pages > 1 && `Page ${page} of ${pages} · `}
            {countOf(total, 'report')}
          </span>
          {pages > 1 && (
            <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
              Next
            </Button>
          )}
        </div>
      )}
    </div>
  );
}

function FilterSelect({ label, value, options, onChange }: { label: string; value: string | undefined; options: [string, string][]; onChange: (value: string) => void }) {
  return (
    <label className="flex flex-col gap-1 text-xs font-medium text-ink/80">
      {label}
      <select className={inputClass} value={value ?? ''} onChange={(e) => onChange(e.target.value)}>
        <option value="">All</option>
        {options.map(([code, text]) => (
          <option key={code} value={code}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}
