import { and, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { findSuspiciousReports, type ReportForRules, type Suspicion } from '../../shared/domain/moderation-rules';
import type { ModerationItem, ModerationQueueQuery, ModerationSummary } from '../../shared/schemas/moderation';
import type { Db } from '../db/client';
import { auditLog, reportFlags, reports, users, varieties, waspAreas } from '../db/schema';
import { recordAudit } from '../audit/audit.repo';
import { HttpError, notFound } from '../lib/http-error';

/** The action an editor records when a report the rules picked out is fine after all. */
export const REVIEWED_ACTION = 'report.reviewed';

/**
 * Published reports the rules pick out, minus those an editor already looked at since their last
 * change (a 'report.reviewed' audit entry newer than the report's updatedAt).
 */
export function suspiciousReports(db: Db): Map<number, Suspicion[]> {
  // The rules read every published report; reuse the last answer until reports, varieties or the
  // audit log (reviews) change. The fingerprint is three aggregate reads.
  const fingerprint = String(
    db.sqlite
      .prepare(
        "SELECT (SELECT count(*) || '/' || ifnull(max(updated_at), '') FROM reports) || '|' || (SELECT ifnull(max(updated_at), '') FROM varieties) || '|' || (SELECT ifnull(max(id), 0) FROM audit_log)",
      )
      .pluck()
      .get(),
  );
  const cached = cache.get(db);
  if (cached?.fingerprint === fingerprint) return new Map(cached.result);
  const result = computeSuspicious(db);
  cache.set(db, { fingerprint, result });
  return new Map(result);
}

const cache = new WeakMap<Db, { fingerprint: string; result: Map<number, Suspicion[]> }>();

function computeSuspicious(db: Db): Map<number, Suspicion[]> {
  const rows: ReportForRules[] = db
    .select({
      id: reports.id,
      treeId: reports.treeId,
      varietyId: reports.varietyId,
      lat: reports.lat,
      lon: reports.lon,
      season: reports.season,
      crop: reports.crop,
      outcome: reports.outcome,
      form: reports.form,
      firstRipeDate: reports.firstRipeDate,
      lastHarvestDate: reports.lastHarvestDate,
      springFrostDate: reports.springFrostDate,
      fallFrostDate: reports.fallFrostDate,
      pinchedDate: reports.pinchedDate,
    })
    .from(reports)
    .where(eq(reports.status, 'published'))
    .all();
  const varietyRows = db.select({ id: varieties.id, name: varieties.name, typicalDaysToRipen: varieties.typicalDaysToRipen }).from(varieties).all();
  const found = findSuspiciousReports(rows, varietyRows);
  if (found.size === 0) return found;
  const reviewed = db
    .select({ id: reports.id })
    .from(reports)
    .innerJoin(auditLog, and(eq(auditLog.entityType, 'report'), eq(auditLog.entityId, reports.id), eq(auditLog.action, REVIEWED_ACTION), sql`${auditLog.createdAt} >= ${reports.updatedAt}`))
    .all();
  for (const { id } of reviewed) found.delete(id);
  return found;
}

function openFlagReportIds(db: Db): number[] {
  return db
    .selectDistinct({ id: reportFlags.reportId })
    .from(reportFlags)
    .innerJoin(reports, eq(reports.id, reportFlags.reportId))
    .where(and(eq(reportFlags.status, 'open'), sql`${reports.status} <> 'draft'`))
    .orderBy(desc(reportFlags.reportId))
    .all()
    .map((r) => r.id);
}

/** The queue: report ids in order for the chosen kind, one page of them with details, and the total. */
export function moderationQueue(db: Db, query: ModerationQueueQuery): { items: ModerationItem[]; total: number } {
  let ids: number[];
  let suspicions = new Map<number, Suspicion[]>();
  if (query.kind === 'hidden') {
    ids = db.select({ id: reports.id }).from(reports).where(eq(reports.status, 'hidden')).orderBy(desc(reports.hiddenAt), desc(reports.id)).all().map((r) => r.id);
  } else {
    suspicions = suspiciousReports(db);
    if (query.rule) {
      for (const [id, list] of suspicions) {
        const kept = list.filter((s) => s.rule === query.rule);
        if (kept.length) suspicions.set(id, kept);
        else suspicions.delete(id);
      }
    }
    const suspicious = [...suspicions.keys()].sort((a, b) => b - a);
    const flagged = query.rule ? [] : openFlagReportIds(db);
    ids = query.kind === 'flagged' ? flagged : query.kind === 'suspicious' ? suspicious : [...new Set([...flagged, ...suspicious])];
  }
  const page = ids.slice(query.offset, query.offset + query.limit);
  return { items: loadItems(db, page, suspicions), total: ids.length };
}

function loadItems(db: Db, ids: number[], suspicions: Map<number, Suspicion[]>): ModerationItem[] {
  if (ids.length === 0) return [];
  const rows = db
    .select({ report: reports, grower: users.displayName, varietyName: varieties.name })
    .from(reports)
    .innerJoin(users, eq(users.id, reports.userId))
    .leftJoin(varieties, eq(varieties.id, reports.varietyId))
    .where(inArray(reports.id, ids))
    .all();
  const flags = db
    .select({ flag: reportFlags, flaggedBy: users.displayName })
    .from(reportFlags)
    .leftJoin(users, eq(users.id, reportFlags.userId))
    .where(and(inArray(reportFlags.reportId, ids), eq(reportFlags.status, 'open')))
    .orderBy(reportFlags.createdAt)
    .all();
  const byId = new Map(rows.map((r) => [r.report.id, r]));
  return ids.map((id) => {
    const { report: r, grower, varietyName } = byId.get(id)!;
    return {
      report: {
        id: r.id,
        grower,
        varietyId: r.varietyId,
        varietyName: varietyName ?? r.proposedVarietyName,
        season: r.season,
        crop: r.crop,
        outcome: r.outcome,
        form: r.form,
        lat: r.lat,
        lon: r.lon,
        springFrostDate: r.springFrostDate,
        firstRipeDate: r.firstRipeDate,
        lastHarvestDate: r.lastHarvestDate,
        fallFrostDate: r.fallFrostDate,
        notes: r.notes,
        status: r.status,
        hiddenReason: r.hiddenReason,
        hiddenAt: r.hiddenAt,
        createdAt: r.createdAt,
      },
      flags: flags.filter((f) => f.flag.reportId === id).map((f) => ({ id: f.flag.id, reason: f.flag.reason, status: f.flag.status, flaggedBy: f.flaggedBy, createdAt: f.flag.createdAt })),
      suspicions: suspicions.get(id) ?? [],
    };
  });
}

function reportState(db: Db, id: number) {
  const row = db
    .select({ status: reports.status, hiddenReason: reports.hiddenReason, hiddenAt: reports.hiddenAt, hiddenById: reports.hiddenById })
    .from(reports)
    .where(eq(reports.id, id))
    .get();
  if (!row) throw notFound('Report');
  return row;
}

/** Clear a flag that needs no action (the report stays as it is). */
export function clearFlag(db: Db, flagId: number, actorId: number) {
  return db.transaction(() => {
    const before = db.select().from(reportFlags).where(eq(reportFlags.id, flagId)).get();
    if (!before) throw notFound('Flag');
    if (before.status !== 'open') throw new HttpError(409, 'not_open', `This flag is already ${before.status}`);
    const at = new Date().toISOString();
    db.update(reportFlags).set({ status: 'cleared', resolvedById: actorId, resolvedAt: at }).where(eq(reportFlags.id, flagId)).run();
    const after = db.select().from(reportFlags).where(eq(reportFlags.id, flagId)).get()!;
    recordAudit(db, { actorId, action: 'flag.clear', entityType: 'report-flag', entityId: flagId, before, after });
    return after;
  });
}

/** An editor looked at a report the rules picked out and found it fine: it leaves the queue until it changes. */
export function markReviewed(db: Db, id: number, actorId: number, suspicions: Suspicion[]): void {
  db.transaction(() => {
    reportState(db, id);
    recordAudit(db, { actorId, action: REVIEWED_ACTION, entityType: 'report', entityId: id, before: { suspicions: suspicions.map((s) => s.message) }, after: { reviewed: true } });
  });
}

export function moderationSummary(db: Db): ModerationSummary {
  const n = (q: { n: number } | undefined) => q?.n ?? 0;
  return {
    openFlags: n(db.select({ n: count() }).from(reportFlags).where(eq(reportFlags.status, 'open')).get()),
    proposedVarieties: n(db.select({ n: count() }).from(varieties).where(eq(varieties.status, 'proposed')).get()),
    suspiciousReports: suspiciousReports(db).size,
    hiddenReports: n(db.select({ n: count() }).from(reports).where(eq(reports.status, 'hidden')).get()),
    activeWaspAreas: n(db.select({ n: count() }).from(waspAreas).where(eq(waspAreas.status, 'active')).get()),
  };
}
