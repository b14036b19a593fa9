import type { GrowingForm } from '../../shared/domain/codes';
import { boundingBox, distanceKm, type LatLon } from '../../shared/domain/geo';
import { overallFromParts, type TreeEvidence, type VarietyOverall } from '../../shared/domain/ripening-stats';
import type { VarietyInfo } from '../../shared/domain/evidence';
import type { StationSeason } from '../../shared/domain/season-estimate';
import { stationsInBoxes } from '../stations/stations.repo';
import type { Db } from '../db/client';
import { statement } from '../db/prepared';

/*
 * Row gathering for the regional engine: R*Tree bounding boxes, then the exact great-circle
 * distance. The numbers themselves are computed by the pure functions in shared/domain.
 */

/** A tree row near the point (see TreeEvidence), with its reports' own frost-free seasons as 'season:days' pairs. */
export type NearTree = TreeEvidence & { frostSeasons: string | null };

type TreeTuple = [number, number, number, number, GrowingForm, number, number, number, number, number, number, string | null, string | null, string | null];

// tree_evidence holds published reports only (its triggers see to that); the variety's status is
// checked against the catalogue in memory. CROSS JOIN keeps the R*Tree as the outer loop (SQLite
// does not reorder it), so the query never walks the table itself.
const NEAR_TREES_SQL = `
  SELECT e.id, e.tree_id, e.user_id, e.variety_id, e.form, e.lat, e.lon, e.reports, e.ripened, e.breba_reports, e.breba_ripened,
         e.first_ripe_doys, e.frost_to_ripe_days, e.frost_seasons
    FROM tree_evidence_rtree t
    CROSS JOIN tree_evidence e ON e.id = t.id
   WHERE t.min_lat <= ? AND t.max_lat >= ? AND t.min_lon <= ? AND t.max_lon >= ?`;

// A variety's overall figures in two passes over covering indexes (drizzle/0005_tree-evidence-overall.sql):
// the mean of its trees' ripened fractions, and each in-ground tree's main-crop days lists.
const OVERALL_SHARE_SQL = `
  SELECT variety_id, avg(fraction), count(*)
    FROM (SELECT variety_id, tree_id, CAST(sum(ripened) AS real) / sum(reports) AS fraction FROM tree_evidence GROUP BY variety_id, tree_id)
   GROUP BY variety_id`;
const OVERALL_NEED_SQL = `
  SELECT variety_id, group_concat(frost_to_ripe_days)
    FROM tree_evidence WHERE form = 'ground' AND frost_to_ripe_days IS NOT NULL
   GROUP BY variety_id, tree_id`;

const NO_NUMBERS: number[] = [];

/** "230,241" -> [230, 241] (SQLite's group_concat of integers). */
function numbers(list: string | null): number[] {
  if (list === null) return NO_NUMBERS;
  const parts = list.split(',');
  const out = new Array<number>(parts.length);
  for (let i = 0; i < parts.length; i++) out[i] = +parts[i]!;
  return out;
}

function toTree(row: TreeTuple, distance: number): NearTree {
  return {
    treeId: row[1],
    userId: row[2],
    varietyId: row[3],
    form: row[4],
    distanceKm: distance,
    reports: row[7],
    ripened: row[8],
    brebaReports: row[9],
    brebaRipened: row[10],
    mainFirstRipeDoys: numbers(row[11]),
    mainFrostToRipeDays: numbers(row[12]),
    frostSeasons: row[13],
  };
}

/** Tree rows within `radiusKm` of the point (exact great-circle distance), from published reports. */
export function treesNear(db: Db, point: LatLon, radiusKm: number): NearTree[] {
  const near = statement(db, NEAR_TREES_SQL, true);
  const result: NearTree[] = [];
  const boxes = boundingBox(point, radiusKm);
  // Boxes either side of the antimeridian only touch at +-180; a point there could be read twice.
  const seen = boxes.length > 1 ? new Set<number>() : null;
  for (const box of boxes) {
    // all() rather than iterate(): one call into SQLite instead of one per row.
    for (const row of near.all(box.maxLat, box.minLat, box.maxLon, box.minLon) as TreeTuple[]) {
      const distance = distanceKm(point, { lat: row[5], lon: row[6] });
      if (distance > radiusKm) continue;
      if (seen) {
        if (seen.has(row[0])) continue;
        seen.add(row[0]);
      }
      result.push(toTree(row, distance));
    }
  }
  return result;
}

/**
 * Each variety's figures over all its trees everywhere (the same as varietyOverall on all its rows),
 * and how many trees they rest on in all.
 */
export function overallFigures(db: Db): { overall: Map<number, VarietyOverall>; trees: number } {
  const needByVariety = new Map<number, number[][]>();
  for (const [varietyId, days] of statement(db, OVERALL_NEED_SQL, true).all() as [number, string][]) {
    let list = needByVariety.get(varietyId);
    if (!list) needByVariety.set(varietyId, (list = []));
    list.push(numbers(days));
  }
  const overall = new Map<number, VarietyOverall>();
  let trees = 0;
  for (const [varietyId, share, count] of statement(db, OVERALL_SHARE_SQL, true).all() as [number, number, number][]) {
    overall.set(varietyId, overallFromParts(share, needByVariety.get(varietyId) ?? []));
    trees += count;
  }
  return { overall, trees };
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
export function reportFrostSeasons(trees: NearTree[]): { distanceKm: number; seasonDays: number }[] {
  const seen = new Set<string>();
  const seasons: { distanceKm: number; seasonDays: number }[] = [];
  for (const t of trees) {
    if (t.frostSeasons === null) continue;
    for (const pair of t.frostSeasons.split(',')) {
      const [season, days] = pair.split(':');
      const seasonDays = Number(days);
      if (!(seasonDays > 0 && seasonDays <= 366)) continue;
      const key = `${t.userId}:${season}`;
      if (seen.has(key)) continue;
      seen.add(key);
      seasons.push({ distanceKm: t.distanceKm, seasonDays });
    }
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
