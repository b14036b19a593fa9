import { and, asc, eq } from 'drizzle-orm';
import { recordAudit } from '../audit/audit.repo';
import type { Db } from '../db/client';
import { reports } from '../db/schema';
import { updateReportRow, type ReportRow } from './reports.repo';

/**
 * Make one draft public: status 'published', published_at now (kept if it was ever set, so a
 * report is announced by the nearby digest once), and an audit entry. The one publish path, used
 * by POST /api/reports/:id/publish and by e-mail verification; call it inside the caller's transaction.
 */
export function publishDraft(db: Db, before: ReportRow, actorId: number, now: string, via: 'publish' | 'email-verified' = 'publish'): ReportRow {
  const updated = updateReportRow(db, before.id, { status: 'published', publishedAt: before.publishedAt ?? now, updatedAt: now, updatedById: actorId });
  recordAudit(db, {
    actorId,
    action: 'report.publish',
    entityType: 'report',
    entityId: before.id,
    before: { status: before.status },
    after: via === 'publish' ? { status: updated.status } : { status: updated.status, via },
  });
  return updated;
}

/**
 * Publish every draft of a grower who has just confirmed the address (the draft notice promises
 * it). Returns the ids published, oldest first; call it inside the transaction that marks the
 * address confirmed, so both happen or neither.
 */
export function publishDraftsOf(db: Db, userId: number, now: string): number[] {
  const drafts = db.select().from(reports).where(and(eq(reports.userId, userId), eq(reports.status, 'draft'))).orderBy(asc(reports.id)).all();
  return drafts.map((draft) => publishDraft(db, draft, userId, now, 'email-verified').id);
}
