import { and, asc, eq, gt, inArray, max } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { MailDeps } from './mailer';
import { reportFlags, reports, users, varieties } from '../db/schema';
import { editorAlertMessage, type AlertFlag, type AlertProposal } from './templates';

/** How far the last alert run got: the highest flag and variety ids it has looked at. */
export interface AlertWatermark {
  flagId: number;
  varietyId: number;
}

export const EDITOR_ALERT_EVERY_MS = 5 * 60_000;

/**
 * One summary per editor (and admin) of everything new since the last run: report flags and
 * variety names proposed by growers. A burst of flags therefore makes one message. Returns the new
 * watermark, which the scheduler stores in the jobs table.
 */
export async function runEditorAlerts(deps: MailDeps, watermark: AlertWatermark | null): Promise<AlertWatermark> {
  const { db } = deps;
  const from = watermark ?? { flagId: 0, varietyId: 0 };
  const flagger = alias(users, 'flagger');
  const proposer = alias(users, 'proposer');
  // One read transaction: the rows and the new watermark come from the same snapshot.
  const { flagRows, proposalRows, lastVarietyId } = db.transaction(() => ({
    flagRows: db
      .select({ id: reportFlags.id, reportId: reportFlags.reportId, reason: reportFlags.reason, flaggedBy: flagger.displayName, variety: varieties.name, proposed: reports.proposedVarietyName, status: reportFlags.status })
      .from(reportFlags)
      .innerJoin(reports, eq(reports.id, reportFlags.reportId))
      .innerJoin(flagger, eq(flagger.id, reportFlags.userId))
      .leftJoin(varieties, eq(varieties.id, reports.varietyId))
      .where(gt(reportFlags.id, from.flagId))
      .orderBy(asc(reportFlags.id))
      .all(),
    lastVarietyId: db.select({ id: max(varieties.id) }).from(varieties).get()?.id ?? 0,
    proposalRows: db
      .select({ name: varieties.name, proposedBy: proposer.displayName })
      .from(varieties)
      .leftJoin(proposer, eq(proposer.id, varieties.proposedByUserId))
      .where(and(gt(varieties.id, from.varietyId), eq(varieties.status, 'proposed')))
      .orderBy(asc(varieties.id))
      .all(),
  }), { behavior: 'deferred' }); // read only: one snapshot, no write lock
  const next: AlertWatermark = { flagId: flagRows.at(-1)?.id ?? from.flagId, varietyId: Math.max(from.varietyId, lastVarietyId) };

  const flags: AlertFlag[] = flagRows
    .filter((f) => f.status === 'open')
    .map((f) => ({ reportId: f.reportId, variety: f.variety ?? f.proposed ?? 'unnamed', reason: f.reason.length > 140 ? `${f.reason.slice(0, 139)}…` : f.reason, flaggedBy: f.flaggedBy }));
  const proposals: AlertProposal[] = proposalRows.map((p) => ({ name: p.name, proposedBy: p.proposedBy ?? 'a grower' }));
  if (!flags.length && !proposals.length) return next;

  const editors = db.select({ email: users.email, displayName: users.displayName }).from(users).where(inArray(users.role, ['editor', 'admin'])).orderBy(asc(users.id)).all();
  for (const editor of editors) {
    const message = editorAlertMessage({ displayName: editor.displayName, flags, proposals, editorsUrl: `${deps.appUrl}/editors` });
    await deps.mailer.send({ to: editor.email, ...message });
  }
  return next;
}
