import { and, asc, count, desc, eq, gte, lte, sql, type SQL } from 'drizzle-orm';
import type { PublicReportRow } from '../../shared/domain/report-csv';
import { toPublicPoint } from '../../shared/domain/public-grid';
import type { CreateReportValues, Report, ReportFilter, ReportListItem, ReportPhoto, ReportSort, Tree } from '../../shared/schemas/reports';
import type { Db } from '../db/client';
import { perDb } from '../db/prepared';
import { reportFlags, reportPhotos, reports, trees, users, varieties, varietySynonyms } from '../db/schema';
import { HttpError } from '../lib/http-error';
import { isEditor } from '../middleware/require-role';
import { photoUrl } from '../photos/photos';

export type ReportRow = typeof reports.$inferSelect;
type Viewer = Express.User | undefined;

/** Who may see a report at all: drafts only their owner, hidden ones the owner and editors. */
export function canView(row: Pick<ReportRow, 'status' | 'userId'>, viewer: Viewer): boolean {
  if (row.status === 'published') return true;
  if (viewer?.id === row.userId) return true;
  return row.status === 'hidden' && isEditor(viewer);
}

/** Exact place and tree label: the owner's and editors' only. */
const seesExact = (row: Pick<ReportRow, 'userId'>, viewer: Viewer) => viewer?.id === row.userId || isEditor(viewer);

// Reading one report (GET /api/reports/:id, and the answer to every write) and posting one run
// these on every request: Drizzle queries prepared once per database (server/db/prepared.ts).
const ph = sql.placeholder;
const q = {
  reportById: perDb((db) => db.select().from(reports).where(eq(reports.id, ph('id'))).prepare()),
  photos: perDb((db) => db.select().from(reportPhotos).where(eq(reportPhotos.reportId, ph('reportId'))).orderBy(asc(reportPhotos.position), asc(reportPhotos.id)).prepare()),
  varietyRef: perDb((db) => db.select({ id: varieties.id, name: varieties.name, figType: varieties.figType, status: varieties.status }).from(varieties).where(eq(varieties.id, ph('id'))).prepare()),
  treeLabel: perDb((db) => db.select({ label: trees.label }).from(trees).where(eq(trees.id, ph('id'))).prepare()),
  grower: perDb((db) =>
    db
      .select({
        displayName: users.displayName,
        // The opt-in supporter mark shows only while a membership is paid up (drizzle/0020_supporters.sql).
        supporter: sql<number>`${users.supporterMark} = 1 AND EXISTS (SELECT 1 FROM memberships m WHERE m.user_id = ${users.id} AND m.status IN ('active', 'past_due'))`,
      })
      .from(users)
      .where(eq(users.id, ph('id')))
      .prepare(),
  ),
  openFlagOf: perDb((db) =>
    db.select({ id: reportFlags.id }).from(reportFlags).where(and(eq(reportFlags.reportId, ph('reportId')), eq(reportFlags.userId, ph('userId')), eq(reportFlags.status, 'open'))).prepare(),
  ),
  openFlagCount: perDb((db) => db.select({ n: count() }).from(reportFlags).where(and(eq(reportFlags.reportId, ph('reportId')), eq(reportFlags.status, 'open'))).prepare()),
  varietyById: perDb((db) => db.select().from(varieties).where(eq(varieties.id, ph('id'))).prepare()),
  varietyByName: perDb((db) =>
    db.select({ id: varieties.id, status: varieties.status, mergedIntoId: varieties.mergedIntoId }).from(varieties).where(sql`lower(${varieties.name}) = lower(${ph('name')})`).prepare(),
  ),
  varietyBySynonym: perDb((db) =>
    db
      .select({ id: varieties.id, status: varieties.status })
      .from(varietySynonyms)
      .innerJoin(varieties, eq(varieties.id, varietySynonyms.varietyId))
      .where(sql`lower(${varietySynonyms.name}) = lower(${ph('name')})`)
      .prepare(),
  ),
  treeById: perDb((db) => db.select().from(trees).where(eq(trees.id, ph('id'))).prepare()),
  insertTree: perDb((db) => db.insert(trees).values({ userId: ph('userId'), label: ph('label') }).returning({ id: trees.id }).prepare()),
  insertReport: perDb((db) =>
    db
      .insert(reports)
      .values(Object.fromEntries(NEW_REPORT_KEYS.map((key) => [key, ph(key)])) as unknown as typeof reports.$inferInsert)
      .returning()
      .prepare(),
  ),
};

export function findReportRow(db: Db, id: number): ReportRow | undefined {
  return q.reportById(db).get({ id });
}

function photosOf(db: Db, reportId: number): (ReportPhoto & { fileName: string; thumbName: string })[] {
  return q
    .photos(db)
    .all({ reportId })
    .map((p) => ({ id: p.id, url: photoUrl(p.fileName), thumbUrl: photoUrl(p.thumbName), width: p.width, height: p.height, fileName: p.fileName, thumbName: p.thumbName }));
}

export function photoCount(db: Db, reportId: number): number {
  return db.select({ n: count() }).from(reportPhotos).where(eq(reportPhotos.reportId, reportId)).get()!.n;
}

type VarietyRef = NonNullable<Report['variety']>;

/** What a report's answer shows besides its own row. */
interface ReportRefs {
  variety: VarietyRef | undefined;
  treeLabel: string | undefined;
  grower: { displayName: string; supporter: number | boolean } | undefined;
  photos: ReportPhoto[];
  hasOpenFlag: boolean;
  openFlags: number;
}

/** The report as this viewer may see it (call canView first). */
export function toReport(db: Db, row: ReportRow, viewer: Viewer): Report {
  return shapeReport(row, viewer, {
    variety: row.varietyId ? q.varietyRef(db).get({ id: row.varietyId }) : undefined,
    treeLabel: q.treeLabel(db).get({ id: row.treeId })?.label,
    grower: q.grower(db).get({ id: row.userId }),
    photos: photosOf(db, row.id).map(({ fileName: _f, thumbName: _t, ...photo }) => photo),
    hasOpenFlag: viewer ? !!q.openFlagOf(db).get({ reportId: row.id, userId: viewer.id }) : false,
    openFlags: isEditor(viewer) ? q.openFlagCount(db).get({ reportId: row.id })!.n : 0,
  });
}

/**
 * A report its author has just written, as toReport would answer it, without reading back what
 * the write already knows: its variety and tree as resolved, no photos or flags yet (the author's
 * name and supporter mark are one primary-key read).
 */
export function toNewReport(db: Db, row: ReportRow, author: Express.User, refs: { variety: VarietyRef; treeLabel: string }): Report {
  return shapeReport(row, author, { ...refs, grower: q.grower(db).get({ id: author.id }), photos: [], hasOpenFlag: false, openFlags: 0 });
}

function shapeReport(row: ReportRow, viewer: Viewer, refs: ReportRefs): Report {
  const exact = seesExact(row, viewer);
  const isOwner = viewer?.id === row.userId;
  const moderator = isEditor(viewer);
  const { variety, hasOpenFlag, openFlags } = refs;
  return {
    id: row.id,
    treeId: row.treeId,
    treeLabel: exact ? (refs.treeLabel ?? null) : null,
    variety: variety ?? null,
    proposedVarietyName: row.proposedVarietyName,
    lat: exact ? row.lat : null,
    lon: exact ? row.lon : null,
    gridLat: row.gridLat,
    gridLon: row.gridLon,
    ...seasonDetails(row),
    status: row.status,
    hiddenReason: isOwner || moderator ? row.hiddenReason : null,
    hiddenAt: isOwner || moderator ? row.hiddenAt : null,
    grower: { displayName: refs.grower?.displayName ?? 'A grower', supporter: !!refs.grower?.supporter },
    photos: refs.photos,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    viewer: { isOwner, canModerate: moderator, hasOpenFlag, openFlags },
  };
}

export { photosOf };

// ---------------------------------------------------------------- lists and exports

function filterConditions(filter: ReportFilter): SQL[] {
  const conditions: SQL[] = [];
  if (filter.varietyId !== undefined) conditions.push(eq(reports.varietyId, filter.varietyId));
  if (filter.figType) conditions.push(eq(varieties.figType, filter.figType));
  if (filter.crop) conditions.push(eq(reports.crop, filter.crop));
  if (filter.outcome) conditions.push(eq(reports.outcome, filter.outcome));
  if (filter.form) conditions.push(eq(reports.form, filter.form));
  if (filter.seasonFrom !== undefined) conditions.push(gte(reports.season, filter.seasonFrom));
  if (filter.seasonTo !== undefined) conditions.push(lte(reports.season, filter.seasonTo));
  return conditions;
}

const varietyName = sql<string>`coalesce(${varieties.name}, ${reports.proposedVarietyName}, '')`;

const SORT_COLUMNS: Record<ReportSort, SQL | typeof reports.season> = {
  season: reports.season,
  createdAt: sql`${reports.createdAt}`,
  updatedAt: sql`${reports.updatedAt}`,
  variety: sql`lower(${varietyName})`,
  crop: sql`${reports.crop}`,
  outcome: sql`${reports.outcome}`,
  form: sql`${reports.form}`,
  status: sql`${reports.status}`,
};

export interface ListOptions extends ReportFilter {
  mine: boolean;
  status?: ReportRow['status'];
  q?: string;
  treeId?: number;
  sort: ReportSort;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/**
 * The grower's own reports (mine, any status, exact place) or the public list (published only,
 * grid place only).
 */
export function listReports(db: Db, options: ListOptions, viewer: Viewer): { reports: ReportListItem[]; total: number } {
  const conditions = filterConditions(options);
  if (options.treeId !== undefined) conditions.push(eq(reports.treeId, options.treeId));
  if (options.mine) {
    conditions.push(eq(reports.userId, viewer!.id));
    if (options.status) conditions.push(eq(reports.status, options.status));
  } else {
    conditions.push(eq(reports.status, 'published'));
  }
  if (options.q) {
    const pattern = `%${options.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    conditions.push(options.mine ? sql`(lower(${varietyName}) LIKE ${pattern} ESCAPE '\\' OR lower(${trees.label}) LIKE ${pattern} ESCAPE '\\')` : sql`lower(${varietyName}) LIKE ${pattern} ESCAPE '\\'`);
  }
  const where = and(...conditions);
  const total = db.select({ n: count() }).from(reports).leftJoin(varieties, eq(varieties.id, reports.varietyId)).innerJoin(trees, eq(trees.id, reports.treeId)).where(where).get()!.n;
  const order = options.dir === 'asc' ? asc : desc;
  const rows = db
    .select({
      id: reports.id,
      userId: reports.userId,
      treeId: reports.treeId,
      treeLabel: trees.label,
      varietyId: reports.varietyId,
      varietyName,
      varietyStatus: varieties.status,
      figType: sql<ReportListItem['figType']>`coalesce(${varieties.figType}, 'unknown')`,
      lat: reports.lat,
      lon: reports.lon,
      gridLat: reports.gridLat,
      gridLon: reports.gridLon,
      form: reports.form,
      origin: reports.origin,
      season: reports.season,
      crop: reports.crop,
      outcome: reports.outcome,
      firstRipeDate: reports.firstRipeDate,
      status: reports.status,
      photoCount: sql<number>`(SELECT count(*) FROM ${reportPhotos} WHERE ${reportPhotos.reportId} = ${reports.id})`,
      thumbName: sql<string | null>`(SELECT ${reportPhotos.thumbName} FROM ${reportPhotos} WHERE ${reportPhotos.reportId} = ${reports.id} ORDER BY ${reportPhotos.position}, ${reportPhotos.id} LIMIT 1)`,
      growerName: users.displayName,
      createdAt: reports.createdAt,
      updatedAt: reports.updatedAt,
    })
    .from(reports)
    .leftJoin(varieties, eq(varieties.id, reports.varietyId))
    .innerJoin(trees, eq(trees.id, reports.treeId))
    .innerJoin(users, eq(users.id, reports.userId))
    .where(where)
    .orderBy(order(SORT_COLUMNS[options.sort]), order(reports.id))
    .limit(options.pageSize)
    .offset((options.page - 1) * options.pageSize)
    .all();
  return {
    total,
    reports: rows.map(({ userId, thumbName, lat, lon, treeLabel, ...row }) => {
      const exact = options.mine || seesExact({ userId }, viewer);
      return { ...row, lat: exact ? lat : null, lon: exact ? lon : null, treeLabel: exact ? treeLabel : null, thumbUrl: thumbName ? photoUrl(thumbName) : null };
    }),
  };
}

/**
 * Published reports for download. Only grid columns are selected, so an exact place cannot leak
 * into an export by mistake.
 */
export function exportPublicRows(db: Db, filter: ReportFilter): PublicReportRow[] {
  return db
    .select({
      reportId: reports.id,
      treeId: reports.treeId,
      variety: varietyName,
      varietyStatus: sql<string>`coalesce(${varieties.status}, 'proposed')`,
      figType: sql<PublicReportRow['figType']>`coalesce(${varieties.figType}, 'unknown')`,
      season: reports.season,
      crop: reports.crop,
      outcome: reports.outcome,
      form: reports.form,
      origin: reports.origin,
      yearPlanted: reports.yearPlanted,
      gridLat: reports.gridLat,
      gridLon: reports.gridLon,
      firstRipeDate: reports.firstRipeDate,
      lastHarvestDate: reports.lastHarvestDate,
      springFrostDate: reports.springFrostDate,
      fallFrostDate: reports.fallFrostDate,
      pinched: reports.pinched,
    })
    .from(reports)
    .leftJoin(varieties, eq(varieties.id, reports.varietyId))
    .where(and(eq(reports.status, 'published'), ...filterConditions(filter)))
    .orderBy(asc(reports.id))
    .all();
}

/** The grower's trees with what their latest report said, to prefill the form. */
export function listTrees(db: Db, userId: number): Tree[] {
  const rows = db.select().from(trees).where(eq(trees.userId, userId)).orderBy(asc(sql`lower(${trees.label})`)).all();
  return rows.map((tree) => {
    const latest = db
      .select({ varietyId: reports.varietyId, varietyName, lat: reports.lat, lon: reports.lon, form: reports.form, origin: reports.origin, yearPlanted: reports.yearPlanted })
      .from(reports)
      .leftJoin(varieties, eq(varieties.id, reports.varietyId))
      .where(eq(reports.treeId, tree.id))
      .orderBy(desc(reports.season), desc(reports.id))
      .limit(1)
      .get();
    const reportCount = db.select({ n: count() }).from(reports).where(eq(reports.treeId, tree.id)).get()!.n;
    return {
      id: tree.id,
      label: tree.label,
      reportCount,
      lastVarietyId: latest?.varietyId ?? null,
      lastVarietyName: latest?.varietyName || null,
      lastLat: latest?.lat ?? null,
      lastLon: latest?.lon ?? null,
      lastForm: latest?.form ?? null,
      lastOrigin: latest?.origin ?? null,
      lastYearPlanted: latest?.yearPlanted ?? null,
    };
  });
}

// ---------------------------------------------------------------- writes (call inside a transaction)

/** A catalogue variety by name or synonym (case-insensitive), for CSV rows. */
export function findVarietyByName(db: Db, name: string): { id: number; status: string } | undefined {
  // Compare with SQLite's own lower() on both sides: it folds ASCII only, exactly like the unique
  // index on lower(name), so a name the index would call a duplicate is always found here.
  const trimmed = name.trim();
  const direct = q.varietyByName(db).get({ name: trimmed });
  if (direct) return direct.status === 'merged' && direct.mergedIntoId ? { id: direct.mergedIntoId, status: 'accepted' } : direct;
  return q.varietyBySynonym(db).get({ name: trimmed });
}

/**
 * The variety a report links to: a listed one (accepted, or a proposal still waiting), or the
 * grower's proposed name, reusing a waiting proposal of the same name or creating one.
 */
export function resolveVariety(db: Db, input: Pick<CreateReportValues, 'varietyId' | 'proposedVarietyName'>, userId: number): { varietyId: number; proposedVarietyName: string | null; name: string; ref: VarietyRef } {
  const ref = (row: VarietyRef): VarietyRef => ({ id: row.id, name: row.name, figType: row.figType, status: row.status });
  if (input.varietyId !== null) {
    const row = q.varietyById(db).get({ id: input.varietyId });
    if (!row || (row.status !== 'accepted' && row.status !== 'proposed')) {
      throw new HttpError(400, 'invalid_input', 'Please check: varietyId', { varietyId: ['Choose a variety from the catalogue'] });
    }
    return { varietyId: row.id, proposedVarietyName: row.status === 'proposed' ? row.name : null, name: row.name, ref: ref(row) };
  }
  const name = input.proposedVarietyName!;
  const existing = findVarietyByName(db, name);
  if (existing) {
    if (existing.status === 'rejected') {
      throw new HttpError(400, 'invalid_input', 'Please check: proposedVarietyName', { proposedVarietyName: ['Editors have declined this name; choose a listed variety or a different name'] });
    }
    const row = q.varietyById(db).get({ id: existing.id })!;
    return { varietyId: row.id, proposedVarietyName: row.status === 'proposed' ? name : null, name: row.name, ref: ref(row) };
  }
  const created = db.insert(varieties).values({ name, status: 'proposed', proposedByUserId: userId, figType: 'unknown' }).returning().get();
  return { varietyId: created.id, proposedVarietyName: name, name, ref: ref(created) };
}

/** The grower's existing tree, or a new one with the given label. */
export function resolveTree(db: Db, userId: number, treeId: number | null, label: string | null, fallbackLabel: string): { id: number; label: string } {
  if (treeId !== null) {
    const tree = q.treeById(db).get({ id: treeId });
    if (!tree || tree.userId !== userId) throw new HttpError(400, 'invalid_input', 'Please check: treeId', { treeId: ['Choose one of your own trees, or a new tree'] });
    return { id: tree.id, label: tree.label };
  }
  const newLabel = label ?? fallbackLabel;
  return { id: q.insertTree(db).get({ userId, label: newLabel })!.id, label: newLabel };
}

/** A tree of this grower with this label (case-insensitive), for CSV rows. */
export function findTreeByLabel(db: Db, userId: number, label: string): number | undefined {
  return db.select({ id: trees.id }).from(trees).where(and(eq(trees.userId, userId), sql`lower(${trees.label}) = lower(${label})`)).get()?.id;
}

/** What a grower records about one tree's season: the same fields in the input, the row and the answer. */
const SEASON_DETAIL_KEYS = [
  'form', 'origin', 'yearPlanted', 'season', 'crop', 'outcome', 'firstRipeDate', 'lastHarvestDate', 'springFrostDate', 'fallFrostDate',
  'pinched', 'pinchedDate', 'winterProtection', 'feeding', 'watering', 'notes',
] as const satisfies readonly (keyof CreateReportValues & keyof ReportRow & keyof Report)[];
type SeasonDetailKey = (typeof SEASON_DETAIL_KEYS)[number];

/** The season details of an input, a stored row or anything else that has them. */
export function seasonDetails<T extends Pick<ReportRow, SeasonDetailKey> | Pick<CreateReportValues, SeasonDetailKey>>(source: T): Pick<T, SeasonDetailKey> {
  const details: Partial<Record<SeasonDetailKey, unknown>> = {};
  for (const key of SEASON_DETAIL_KEYS) details[key] = source[key];
  return details as Pick<T, SeasonDetailKey>;
}

/** The stored columns of a validated input (everything but variety and tree resolution). */
export function reportColumns(input: CreateReportValues) {
  const grid = toPublicPoint(input.lat, input.lon);
  return {
    lat: input.lat,
    lon: input.lon,
    gridLat: grid.lat,
    gridLon: grid.lon,
    ...seasonDetails(input),
  };
}

/** Every column a new report is written with (the hidden* columns start null, the id is SQLite's). */
const NEW_REPORT_KEYS = [
  'userId', 'treeId', 'varietyId', 'proposedVarietyName', 'lat', 'lon', 'gridLat', 'gridLon', 'form', 'origin', 'yearPlanted', 'season', 'crop', 'outcome',
  'firstRipeDate', 'lastHarvestDate', 'springFrostDate', 'fallFrostDate', 'pinched', 'pinchedDate', 'winterProtection', 'feeding', 'watering', 'notes',
  'status', 'publishedAt', 'createdAt', 'updatedAt', 'updatedById',
] as const satisfies readonly (keyof typeof reports.$inferInsert)[];
export type NewReport = Required<Pick<typeof reports.$inferInsert, (typeof NEW_REPORT_KEYS)[number]>>;

export function insertReport(db: Db, values: NewReport): ReportRow {
  return q.insertReport(db).get(values)!;
}

export function updateReportRow(db: Db, id: number, values: Partial<typeof reports.$inferInsert>): ReportRow {
  return db.update(reports).set(values).where(eq(reports.id, id)).returning().get()!;
}

export function deleteReportRow(db: Db, id: number): void {
  db.delete(reports).where(eq(reports.id, id)).run();
}

export function openFlagBy(db: Db, reportId: number, userId: number) {
  return db.select().from(reportFlags).where(and(eq(reportFlags.reportId, reportId), eq(reportFlags.userId, userId), eq(reportFlags.status, 'open'))).get();
}

export function insertFlag(db: Db, values: typeof reportFlags.$inferInsert) {
  return db.insert(reportFlags).values(values).returning().get();
}

export function insertPhotoRow(db: Db, values: typeof reportPhotos.$inferInsert) {
  return db.insert(reportPhotos).values(values).returning().get();
}

export function findPhotoRow(db: Db, reportId: number, photoId: number) {
  return db.select().from(reportPhotos).where(and(eq(reportPhotos.id, photoId), eq(reportPhotos.reportId, reportId))).get();
}

export function deletePhotoRow(db: Db, photoId: number): void {
  db.delete(reportPhotos).where(eq(reportPhotos.id, photoId)).run();
}

/** The photo row behind a stored file name (main or thumbnail) and its report, for serving files. */
export function findPhotoByFile(db: Db, name: string): { report: ReportRow } | undefined {
  const photo = db
    .select({ reportId: reportPhotos.reportId })
    .from(reportPhotos)
    .where(sql`${reportPhotos.fileName} = ${name} OR ${reportPhotos.thumbName} = ${name}`)
    .get();
  if (!photo) return undefined;
  const report = findReportRow(db, photo.reportId);
  return report ? { report } : undefined;
}


/** The report a grower's outbox already sent under this id, if any (drizzle/0019). */
export function reportIdForClientId(db: Db, userId: number, clientId: string): number | undefined {
  const row = db.sqlite.prepare('SELECT report_id AS reportId FROM report_client_ids WHERE user_id = ? AND client_id = ?').get(userId, clientId) as { reportId: number } | undefined;
  return row?.reportId;
}

export function rememberClientId(db: Db, userId: number, clientId: string, reportId: number): void {
  db.sqlite.prepare('INSERT INTO report_client_ids (user_id, client_id, report_id, created_at) VALUES (?, ?, ?, ?)').run(userId, clientId, reportId, new Date().toISOString());
}
