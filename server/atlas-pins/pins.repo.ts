import { and, count, desc, eq, gte, lte, sql, type SQL } from 'drizzle-orm';
import type { CellQuery, PinFilters, PinReportSummary } from '../../shared/schemas/pins';
import type { Db } from '../db/client';
import { reports, varieties } from '../db/schema';
import { toGridCell, type GridCell } from './pin-index';

/** Conditions for published reports matching the map's filters. */
function filterConditions(filters: PinFilters): SQL[] {
  const conditions: SQL[] = [eq(reports.status, 'published')];
  if (filters.varietyId !== undefined) conditions.push(eq(reports.varietyId, filters.varietyId));
  if (filters.crop) conditions.push(eq(reports.crop, filters.crop));
  if (filters.outcome) conditions.push(eq(reports.outcome, filters.outcome));
  if (filters.form) conditions.push(eq(reports.form, filters.form));
  if (filters.seasonFrom !== undefined) conditions.push(gte(reports.season, filters.seasonFrom));
  if (filters.seasonTo !== undefined) conditions.push(lte(reports.season, filters.seasonTo));
  // A report whose variety is still a proposal has no type yet: it counts as "unknown".
  if (filters.figType) conditions.push(sql`coalesce(${varieties.figType}, 'unknown') = ${filters.figType}`);
  return conditions;
}

/**
 * The query behind `listPinCells`: published reports matching the filters, counted per public grid
 * cell. Its columns, in order: gridLat, gridLon, reports, firstId (the smallest report id), ripened
 * and unripe (how many of them turned out so).
 */
export function pinCellsQuery(db: Db, filters: PinFilters) {
  const query = db
    .select({
      gridLat: reports.gridLat,
      gridLon: reports.gridLon,
      reports: count(),
      firstId: sql<number>`min(${reports.id})`,
      ripened: sql<number>`sum(${reports.outcome} = 'ripened')`,
      unripe: sql<number>`sum(${reports.outcome} = 'unripe')`,
    })
    .from(reports)
    .$dynamic();
  // The join is only needed to filter by fig type; without it SQLite reads the reports table alone.
  if (filters.figType) query.leftJoin(varieties, eq(varieties.id, reports.varietyId));
  return query.where(and(...filterConditions(filters))).groupBy(reports.gridLat, reports.gridLon);
}

/** The highest report id: a size estimate read from the end of the primary key, in O(log n). */
export function maxReportId(db: Db): number {
  return db.select({ id: sql<number | null>`max(${reports.id})` }).from(reports).get()?.id ?? 0;
}

/** Published reports matching the filters, counted per public grid cell. */
export function listPinCells(db: Db, filters: PinFilters): GridCell[] {
  return pinCellsQuery(db, filters)
    .all()
    .map((r) => toGridCell(r.gridLat, r.gridLon, r.reports, r.firstId, r.ripened, r.unripe));
}

const CELL_EPSILON = 1e-6;

/** The published reports on one grid cell (newest first), as public summaries. */
export function listCellReports(db: Db, query: CellQuery, limit = 50): { total: number; reports: PinReportSummary[] } {
  const where = and(
    ...filterConditions(query),
    gte(reports.gridLat, query.lat - CELL_EPSILON),
    lte(reports.gridLat, query.lat + CELL_EPSILON),
    gte(reports.gridLon, query.lon - CELL_EPSILON),
    lte(reports.gridLon, query.lon + CELL_EPSILON),
  );
  const total = db.select({ n: count() }).from(reports).leftJoin(varieties, eq(varieties.id, reports.varietyId)).where(where).get()!.n;
  const rows = db
    .select({
      id: reports.id,
      // The variety's page exists only for accepted names (a proposed one links nowhere).
      varietyId: sql<number | null>`CASE WHEN ${varieties.status} = 'accepted' THEN ${varieties.id} END`,
      varietyName: sql<string>`coalesce(${varieties.name}, ${reports.proposedVarietyName}, 'Unnamed variety')`,
      figType: sql<PinReportSummary['figType']>`coalesce(${varieties.figType}, 'unknown')`,
      crop: reports.crop,
      outcome: reports.outcome,
      season: reports.season,
      form: reports.form,
    })
    .from(reports)
    .leftJoin(varieties, eq(varieties.id, reports.varietyId))
    .where(where)
    .orderBy(desc(reports.season), desc(reports.id))
    .limit(limit)
    .all();
  return { total, reports: rows };
}
