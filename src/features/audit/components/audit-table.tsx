import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { AUDIT_USER_ID_KEYS, AUDIT_VARIETY_ID_KEYS, auditChanges } from '@shared/domain/audit-diff';
import type { AuditEntryView, AuditPage } from '@shared/schemas/audit';
import { fieldLabel, valueLabel } from '../field-labels';
import { DataTable, filterClass, type PageState } from '../../editors/components/data-table';
import { auditQueries } from '../api';
import { DateText } from '../../units/components/date-text';
import { browserLocale, useUnits } from '../../units/use-units';
import { formatDateTime } from '@shared/domain/units';

const column = createColumnHelper<AuditEntryView>();

/** Plain words for the server's action codes; an unknown code is shown as it is. */
const ACTION_LABELS: Record<string, string> = {
  'report.create': 'Report posted',
  'report.update': 'Report edited',
  'report.delete': 'Report deleted',
  'report.publish': 'Report published',
  'report.import': 'Reports imported',
  'report.flag': 'Report flagged',
  'report.hide': 'Report hidden',
  'report.restore': 'Report restored',
  'report.reviewed': 'Report marked as fine',
  'report.photo.add': 'Photo added',
  'report.photo.delete': 'Photo removed',
  'flag.clear': 'Flag cleared',
  'variety.create': 'Variety added',
  'variety.update': 'Variety edited',
  'variety.accept': 'Proposed name accepted',
  'variety.reject': 'Proposed name rejected',
  'variety.merge': 'Varieties merged',
  'variety.import': 'Catalogue imported',
  'wasp-area.create': 'Wasp area recorded',
  'wasp-area.update': 'Wasp area edited',
  'wasp-area.retire': 'Wasp area retired',
  'station.create': 'Station uploaded',
  'station.replace': 'Station data replaced',
  'station.delete': 'Station deleted',
  'user.role': 'Role changed',
};
const actionLabel = (code: string) => ACTION_LABELS[code] ?? code;

const ENTITY_LABELS: Record<string, string> = {
  report: 'Report',
  'report-flag': 'Flag',
  variety: 'Variety',
  catalogue: 'Catalogue',
  'wasp-area': 'Wasp area',
  station: 'Station',
  user: 'Person',
};
const entityLabel = (type: string) => ENTITY_LABELS[type] ?? type;

/** Where an entry's record can be opened, if anywhere. */
function entityHref(type: string, id: number | null): string | null {
  if (id === null) return null;
  if (type === 'report') return `/reports/${id}`;
  if (type === 'station') return `/editors/stations/${id}`;
  if (type === 'variety') return `/editors/varieties`;
  return null;
}

const ISO_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;
/** Timestamps in before/after read as local dates and times, not raw ISO strings. */
const readable = (s: string, dateTime: (iso: string) => string) => (ISO_TIME.test(s) && !Number.isNaN(Date.parse(s)) ? dateTime(s) : s);

type Names = AuditPage['names'];
const NO_NAMES: Names = { varieties: {}, users: {} };

/** A changed value in words: ids become the variety's or person's name, codes their labels. */
function valueInWords(key: string, value: string, names: Names, dateTime: (iso: string) => string): string {
  if (AUDIT_VARIETY_ID_KEYS.has(key) && names.varieties[value]) return names.varieties[value];
  if (AUDIT_USER_ID_KEYS.has(key) && names.users[value]) return names.users[value];
  return valueLabel(key, readable(value, dateTime));
}

/** Before → after for the fields that changed, one line each, in words. */
export function ChangeList({ before, after, names = NO_NAMES, dateTime = (iso) => formatDateTime(iso, browserLocale()) }: { before: unknown; after: unknown; names?: Names; dateTime?: (iso: string) => string }) {
  const changes = auditChanges(before, after);
  if (changes.length === 0) return <span className="text-ink/70">no field changed</span>;
  return (
    <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5 text-xs">
      {changes.slice(0, 12).map((c) => (
        <div key={c.key} className="contents">
          <dt className="font-medium text-ink/80" title={c.key}>
            {fieldLabel(c.key)}
          </dt>
          <dd className="[overflow-wrap:anywhere]">
            <del className="text-red-800 decoration-red-800/50">{truncate(valueInWords(c.key, c.before, names, dateTime))}</del> <span aria-hidden="true">→</span> <ins className="text-leaf-700 no-underline">{truncate(valueInWords(c.key, c.after, names, dateTime))}</ins>
          </dd>
        </div>
      ))}
      {changes.length > 12 && <dd className="col-span-2 text-ink/70">…{changes.length - 12} more</dd>}
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
  const names = data?.names ?? NO_NAMES;
  const set = (key: keyof typeof filters) => (e: { target: { value: string } }) => {
    setFilters((f) => ({ ...f, [key]: e.target.value }));
    setPage((p) => ({ ...p, offset: 0 }));
  };

  const units = useUnits();
  const columns = useMemo(
    () => [
      column.accessor('createdAt', { header: 'When', cell: (c) => <DateText iso={c.getValue()} withTime className="whitespace-nowrap tabular-nums" /> }),
      column.accessor('actor', { header: 'Who', cell: (c) => c.getValue() ?? <span className="text-ink/70">system</span> }),
      column.accessor('action', { header: 'What', cell: (c) => <span title={c.getValue()}>{actionLabel(c.getValue())}</span> }),
      column.accessor((e) => `${e.entityType}${e.entityId ? ` #${e.entityId}` : ''}`, {
        id: 'entity',
        header: 'On',
        cell: (c) => {
          const { entityType, entityId, entityName } = c.row.original;
          const text = `${entityLabel(entityType)}${entityName ? `: ${entityName}` : entityId ? ` #${entityId}` : ''}`;
          const href = entityHref(entityType, entityId);
          return href ? (
            <Link to={href} className="text-fig-700 underline">
              {text}
            </Link>
          ) : (
            <span>{text}</span>
          );
        },
      }),
      column.display({ id: 'changes', header: 'Before → after', cell: (c) => <ChangeList before={c.row.original.before} after={c.row.original.after} names={names} dateTime={units.dateTime} /> }),
    ],
    [names, units.dateTime],
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
              <option key={a} value={a}>
                {actionLabel(a)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          <span className="font-medium">Record type</span>
          <select className={filterClass} value={filters.entityType} onChange={set('entityType')}>
            <option value="">Any</option>
            {data?.facets.entityTypes.map((a) => (
              <option key={a} value={a}>
                {entityLabel(a)}
              </option>
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
