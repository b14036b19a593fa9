/** Keys inside an audit entry's before/after that hold a variety's or a person's id: the log shows their names. */
export const AUDIT_VARIETY_ID_KEYS: ReadonlySet<string> = new Set(['varietyId', 'mergedIntoId', 'targetId', 'intoId']);
export const AUDIT_USER_ID_KEYS: ReadonlySet<string> = new Set(['userId', 'reviewedBy', 'reviewedById', 'proposedById', 'createdBy', 'flaggedBy', 'actorId']);

/** One changed key between an audit entry's before and after. */
export interface AuditChange {
  key: string;
  before: string;
  after: string;
}

function show(value: unknown): string {
  if (value === undefined) return '—';
  if (value === null) return 'empty';
  if (typeof value === 'string') return value === '' ? 'empty' : value;
  return JSON.stringify(value);
}

/**
 * The keys whose values differ between before and after, each shown as readable text. Nested
 * values (geometry, lists) compare by their JSON; a whole-value change (no objects) is one row.
 */
export function auditChanges(before: unknown, after: unknown): AuditChange[] {
  const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
  if (!isRecord(before) && !isRecord(after)) {
    return JSON.stringify(before) === JSON.stringify(after) ? [] : [{ key: '(value)', before: show(before ?? undefined), after: show(after ?? undefined) }];
  }
  const b = isRecord(before) ? before : {};
  const a = isRecord(after) ? after : {};
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])];
  return keys
    .filter((key) => JSON.stringify(b[key]) !== JSON.stringify(a[key]))
    .map((key) => ({ key, before: show(b[key]), after: show(a[key]) }));
}
