import type { Statement } from 'better-sqlite3';
import type { Crop, GrowingForm, Outcome } from '../../shared/domain/codes';
import { boundingBox, distanceKm, type LatLon } from '../../shared/domain/geo';
import type { EvidenceReport } from '../../shared/domain/ripening-stats';
import type { VarietyInfo } from '../../shared/domain/evidence';
import type { StationSeason } from '../../shared/domain/season-estimate';
import { stationsInBoxes } from '../stations/stations.repo';
import type { Db } from '../db/client';

/*
 * Row gathering for the regional engine: R*Tree bounding boxes, then the exact great-circle
 * distance. The numbers themselves are computed by the pure functions in shared/domain.
 */

/** A report near the point, as the engine reads it, with the frost-free days its grower reported. */
export type NearReport = EvidenceReport & { frostSeasonDays: number | null };

type ReportTuple = [number, number, number, number, Crop, GrowingForm, Outcome, number, number, number, number | null, number | null, number | null];

// Only published reports of accepted varieties count. CROSS JOIN keeps the R*Tree as the outer
// loop (SQLite does not reorder it), so the query never walks the reports table itself.
const NEAR_REPORTS_SQL = `
  SELECT r.id, r.tree_id, r.user_id, r.variety_id, r.crop, r.form, r.outcome, r.season, r.lat, r.lon,
         CAST(strftime('%j', r.first_ripe_date) AS INTEGER),
         CAST(strftime('%j', r.spring_frost_date) AS INTEGER),
         CAST(julianday(r.fall_frost_date) - julianday(r.spring_frost_date) - 1 AS INTEGER)
    FROM reports_rtree t
    CROSS JOIN reports r ON r.id = t.id
    CROSS JOIN varieties v ON v.id = r.variety_id
   WHERE t.min_lat <= ? AND t.max_lat >= ? AND t.min_lon <= ? AND t.max_lon >= ?
     AND r.status = 'published' AND v.status = 'accepted'`;

const ALL_REPORTS_SQL = `
  SELECT r.id, r.tree_id, r.user_id, r.variety_id, r.crop, r.form, r.outcome, r.season, 0, 0,
         CAST(strftime('%j', r.first_ripe_date) AS INTEGER),
         CAST(strftime('%j', r.spring_frost_date) AS INTEGER),
         NULL
    FROM reports r
   WHERE r.variety_id = ? AND r.status = 'published'`;

const statementCache = new WeakMap<Db, Map<string, Statement>>();

/** A prepared statement per database, prepared once (the hot path runs it on every request). */
function statement(db: Db, sql: string, raw = false): Statement {
  let perDb = statementCache.get(db);
  if (!perDb) statementCache.set(db, (perDb = new Map()));
  let prepared = perDb.get(sql);
  if (!prepared) {
    prepared = db.sqlite.prepare(sql);
    if (raw) prepared.raw(true);
    perDb.set(sql, prepared);
  }
  return prepared;
}

function toReport(row: ReportTuple, distance: number): NearReport {
  return {
    reportId: row[0],
    treeId: row[1],
    userId: row[2],
    varietyId: row[3],
    crop: row[4],
    form: row[5],
    outcome: row[6],
    season: row[7],
    distanceKm: distance,
    firstRipeDoy: row[10],
    springFrostDoy: row[11],
    frostSeasonDays: row[12],
  };
}

/** Published reports of accepted varieties within `radiusKm` of the point (exact great-circle distance). */
export function reportsNear(db: Db, point: LatLon, radiusKm: number): NearReport[] {
  const near = statement(db, NEAR_REPORTS_SQL, true);
  const result: NearReport[] = [];
  const boxes = boundingBox(point, radiusKm);
  // Boxes either side of the antimeridian only touch at +-180; a point there could be read twice.
  const seen = boxes.length > 1 ? new Set<number>() : null;
  for (const box of boxes) {
    // all() rather than iterate(): one call into SQLite instead of one per row.
    for (const row of near.all(box.maxLat, box.minLat, box.maxLon, box.minLon) as ReportTuple[]) {
      const distance = distanceKm(point, { lat: row[8], lon: row[9] });
      if (distance > radiusKm) continue;
      if (seen) {
        if (seen.has(row[0])) continue;
        seen.add(row[0]);
      }
      result.push(toReport(row, distance));
    }
  }
  return result;
}

/** Every published report of each accepted variety, one variety at a time (its index). */
export function* reportsByVariety(db: Db): Generator<{ varietyId: number; reports: NearReport[] }> {
  const ids = statement(db, "SELECT id FROM varieties WHERE status = 'accepted' ORDER BY id", true).all() as [number][];
  const ofVariety = statement(db, ALL_REPORTS_SQL, true);
  for (const [varietyId] of ids) yield { varietyId, reports: (ofVariety.all(varietyId) as ReportTuple[]).map((row) => toReport(row, 0)) };
}

/** Accepted varieties of the catalogue, by id (a small table: read on each request). */
export function acceptedVarieties(db: Db): Map<number, VarietyInfo> {
  const rows = statement(
    db,
    "SELECT id, name, fig_type AS figType, ripening_class AS ripeningClass, typical_days_to_ripen AS typicalDaysToRipen, is_fictional AS isFictional FROM varieties WHERE status = 'accepted'",
  ).all() as (Omit<VarietyInfo, 'isFictional'> & { isFictional: number })[];
  return new Map(rows.map((v) => [v.id, { ...v, isFictional: v.isFictional === 1 }]));
}

/**
 * Growers' own frost-free seasons near the point: one per grower and season (a garden's frost does
 * not count again for each of its trees and crops).
 */
export function reportFrostSeasons(reports: NearReport[]): { distanceKm: number; seasonDays: number }[] {
  const seen = new Set<string>();
  const seasons: { distanceKm: number; seasonDays: number }[] = [];
  for (const r of reports) {
    if (r.frostSeasonDays === null || r.frostSeasonDays <= 0 || r.frostSeasonDays > 366) continue;
    const key = `${r.userId}:${r.season}`;
    if (seen.has(key)) continue;
    seen.add(key);
    seasons.push({ distanceKm: r.distanceKm, seasonDays: r.frostSeasonDays });
  }
  return seasons;
}

/** Stations within the radius' boxes with their 32 deg F season at 10/50/90 % (estimateSeason filters by distance). */
export function stationSeasonsNear(db: Db, point: LatLon, radiusKm: number): StationSeason[] {
  const byId = new Map<number, StationSeason>();
  for (const row of stationsInBoxes(db, boundingBox(point, radiusKm), 32)) {
    let station = byId.get(row.id);
    if (!station) {
      station = { id: row.id, name: row.name, lat: row.lat, lon: row.lon, days10: null, days50: null, days90: null, lastSpringDoy50: null, firstFallDoy50: null };
      byId.set(row.id, station);
    }
    if (row.probability === 10) station.days10 = row.seasonDays;
    if (row.probability === 90) station.days90 = row.seasonDays;
    if (row.probability === 50) {
      station.days50 = row.seasonDays;
      station.lastSpringDoy50 = row.lastSpringDoy;
      station.firstFallDoy50 = row.firstFallDoy;
    }
  }
  return [...byId.values()];
}

/**
 * A cheap marker of "the data may have changed": this connection's write count and SQLite's
 * data_version (which moves when another connection commits). Both are O(1) to read.
 */
export function dataVersion(db: Db): string {
  const changes = (statement(db, 'SELECT total_changes() AS n').get() as { n: number }).n;
  const version = (statement(db, 'PRAGMA data_version').get() as { data_version: number }).data_version;
  return `${changes}:${version}`;
}
