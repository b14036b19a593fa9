import type { Db } from '../db/client';
import { auditLog } from '../db/schema';

export interface AuditEntry {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId?: number | null;
  before?: unknown;
  after?: unknown;
}

/** Write one audit entry; call it inside the same transaction as the change it records. */
export function recordAudit(db: Db, entry: AuditEntry): void {
  db.insert(auditLog)
    .values({ ...entry, entityId: entry.entityId ?? null, before: entry.before ?? null, after: entry.after ?? null })
    .run();
}
