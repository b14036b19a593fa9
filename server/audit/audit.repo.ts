import { and, asc, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import { AUDIT_USER_ID_KEYS, AUDIT_VARIETY_ID_KEYS } from '../../shared/domain/audit-diff';
import type { AuditPage, AuditQuery } from '../../shared/schemas/audit';
import type { Db } from '../db/client';
import { statement } from '../db/prepared';
import { auditLog, users } from '../db/schema';

export interface AuditEntry {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId?: number | null;
  before?: unknown;
  after?: unknown;
}

// Every report post writes one entry: plain SQL prepared once (created_at takes the column's default).
const INSERT_SQL = 'INSERT INTO audit_log (actor_id, action, entity_type, entity_id, before, after) VALUES (?, ?, ?, ?, ?, ?)';
const json = (value: unknown) => (value === undefined || value === null ? null : JSON.stringify(value));

/** Write one audit entry; call it inside the same transaction as the change it records. */
export function recordAudit(db: Db, entry: AuditEntry): void {
  statement(db, INSERT_SQL).run(entry.actorId ?? null, entry.action, entry.entityType, entry.entityId ?? null, json(entry.before), json(entry.after));
}

/** Read the log, newest first, with filters and server-side pagination. */
export function listAudit(db: Db, query: AuditQuery): AuditPage {
  const conditions: SQL[] = [];
  if (query.actorId) conditions.push(eq(auditLog.actorId, query.actorId));
  if (query.action) conditions.push(eq(auditLog.action, query.action));
  if (query.entityType) conditions.push(eq(auditLog.entityType, query.entityType));
  if (query.entityId) conditions.push(eq(auditLog.entityId, query.entityId));
  if (query.from) conditions.push(gte(auditLog.createdAt, query.from));
  // the whole "to" day counts: timestamps are ISO text, so compare with the next day's start
  if (query.to) conditions.push(lt(auditLog.createdAt, nextDay(query.to)));
  const where = conditions.length ? and(...conditions) : undefined;
  const total = db.select({ n: count() }).from(auditLog).where(where).get()!.n;
  const rows = db
    .select({ entry: auditLog, actor: users.displayName })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(where)
    .orderBy(desc(auditLog.createdAt), desc(auditLog.id))
    .limit(query.limit)
    .offset(query.offset)
    .all();
  const facets = {
    actions: db.selectDistinct({ v: auditLog.action }).from(auditLog).orderBy(asc(auditLog.action)).all().map((r) => r.v),
    entityTypes: db.selectDistinct({ v: auditLog.entityType }).from(auditLog).orderBy(asc(auditLog.entityType)).all().map((r) => r.v),
    actors: db
      .selectDistinct({ id: users.id, name: users.displayName })
      .from(auditLog)
      .innerJoin(users, eq(users.id, auditLog.actorId))
      .orderBy(asc(users.displayName))
      .all(),
  };
  const items = rows.map(({ entry, actor }) => ({ ...entry, actor }));
  const { entityNames, names } = namesFor(db, items);
  return { items: items.map((item) => ({ ...item, entityName: entityNames.get(`${item.entityType}:${item.entityId}`) ?? null })), total, facets, names };
}


/** The page's records and referenced ids in words, a few batched look-ups per page. */
function namesFor(db: Db, items: { entityType: string; entityId: number | null; before: unknown; after: unknown }[]) {
  const varietyIds = new Set<number>();
  const userIds = new Set<number>();
  const byType = new Map<string, Set<number>>();
  for (const item of items) {
    if (item.entityId !== null) {
      if (!byType.has(item.entityType)) byType.set(item.entityType, new Set());
      byType.get(item.entityType)!.add(item.entityId);
    }
    for (const side of [item.before, item.after]) {
      if (typeof side !== 'object' || side === null || Array.isArray(side)) continue;
      for (const [key, value] of Object.entries(side)) {
        if (typeof value !== 'number' || !Number.isInteger(value)) continue;
        if (AUDIT_VARIETY_ID_KEYS.has(key)) varietyIds.add(value);
        if (AUDIT_USER_ID_KEYS.has(key)) userIds.add(value);
      }
    }
  }
  const ids = (type: string) => [...(byType.get(type) ?? [])];
  const lookup = (table: string, nameSql: string, wanted: number[]) =>
    wanted.length === 0 ? [] : (db.$client.prepare(`SELECT id, ${nameSql} AS name FROM ${table} WHERE id IN (${wanted.map(() => '?').join(',')})`).all(...wanted) as { id: number; name: string }[]);
  const entityNames = new Map<string, string>();
  const put = (type: string, rows: { id: number; name: string }[]) => rows.forEach((r) => entityNames.set(`${type}:${r.id}`, r.name));
  put('variety', lookup('varieties', 'name', ids('variety')));
  put('user', lookup('users', 'display_name', ids('user')));
  put('station', lookup('stations', 'name', ids('station')));
  put('wasp-area', lookup('wasp_areas', 'name', ids('wasp-area')));
  put(
    'report',
    lookup(
      'reports',
      "coalesce((SELECT name FROM varieties v WHERE v.id = reports.variety_id), reports.proposed_variety_name, 'Unnamed variety') || ', ' || reports.season || ' ' || CASE reports.crop WHEN 'breba' THEN 'breba' ELSE 'main crop' END",
      ids('report'),
    ),
  );
  put(
    'report-flag',
    lookup('report_flags', "'flag on ' || coalesce((SELECT coalesce((SELECT name FROM varieties v WHERE v.id = r.variety_id), r.proposed_variety_name) || ', ' || r.season FROM reports r WHERE r.id = report_flags.report_id), 'a deleted report')", ids('report-flag')),
  );
  const toRecord = (rows: { id: number; name: string }[]) => Object.fromEntries(rows.map((r) => [String(r.id), r.name]));
  return { entityNames, names: { varieties: toRecord(lookup('varieties', 'name', [...varietyIds])), users: toRecord(lookup('users', 'display_name', [...userIds])) } };
}

function nextDay(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}
