import { and, asc, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
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
  return { items: rows.map(({ entry, actor }) => ({ ...entry, actor })), total, facets };
}

function nextDay(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}
