import { inArray, sql } from 'drizzle-orm';
import { distanceKm } from '../../shared/domain/geo';
import { dayOfYear, seasonDaysFromFrostDates, type SeasonReport } from '../../shared/domain/guidance';
import type { Crop, FigType, GrowingForm } from '../../shared/domain/codes';
import type { Db } from '../db/client';
import { varieties } from '../db/schema';
import { publicDistanceKm, publicPositionInCircleBoxes } from '../reports/public-position';
import { currentStationSnapshot, stationSeasonsInBoxes } from '../stations/station-snapshot';

/*
 * Row gathering for the guidance charts (public: every report is placed by its grid cell, never
 * its exact place; server/reports/public-position.ts). Stations come from the in-memory station
 * snapshot (server/stations/station-snapshot.ts). The computation itself lives in
 * shared/domain/guidance.ts.
 */

/**
 * First-ripe days of year of one variety's ripened reports whose public position (grid cell
 * centre) lies within the radius: never the exact place, so that narrowing the radius or moving
 * the point cannot find where a grower lives (shared/domain/public-grid.ts).
 */
export function ripeDatesNear(db: Db, q: { varietyId: number; lat: number; lon: number; radiusKm: number; crop: Crop }): { doys: number[]; trees: number } {
  const centre = { lat: q.lat, lon: q.lon };
  const rows = db.all<{ treeId: number; gridLat: number; gridLon: number; firstRipeDate: string }>(sql`
    SELECT r.tree_id AS treeId, r.grid_lat AS gridLat, r.grid_lon AS gridLon, r.first_ripe_date AS firstRipeDate
      FROM reports r
     WHERE ${publicPositionInCircleBoxes('r', centre, q.radiusKm)}
       AND r.variety_id = ${q.varietyId} AND r.status = 'published' AND r.crop = ${q.crop} AND r.outcome = 'ripened' AND r.first_ripe_date IS NOT NULL
     ORDER BY r.id`);
  const doys: number[] = [];
  const trees = new Set<number>();
  for (const row of rows) {
    if (publicDistanceKm(centre, row) > q.radiusKm) continue;
    const doy = dayOfYear(row.firstRipeDate);
    if (doy === null) continue;
    doys.push(doy);
    trees.add(row.treeId);
  }
  return { doys, trees: trees.size };
}

/** How far to look for a station when a report has no frost dates of its own. */
export const STATION_SEARCH_KM = 150;

/**
 * The nearest station's frost-free days at 32 deg F, 50 % level, within STATION_SEARCH_KM (the
 * lower id on a tie), from the station snapshot as it is when called.
 */
function nearestStationSeason(db: Db): (lat: number, lon: number) => number | null {
  const snapshot = currentStationSnapshot(db);
  const cache = new Map<string, number | null>();
  return (lat, lon) => {
    const key = `${lat},${lon}`;
    if (cache.has(key)) return cache.get(key)!;
    let best: { km: number; id: number; days: number } | null = null;
    for (const s of stationSeasonsInBoxes(snapshot, { lat, lon }, STATION_SEARCH_KM)) {
      if (s.days50 === null) continue;
      const km = distanceKm({ lat, lon }, s);
      if (km <= STATION_SEARCH_KM && (!best || km < best.km || (km === best.km && s.id < best.id))) best = { km, id: s.id, days: s.days50 };
    }
    cache.set(key, best?.days ?? null);
    return best?.days ?? null;
  };
}

export interface SeasonRows {
  rows: SeasonReport[];
  /** Reports the season decided (ripened or unripe) that had no season length. */
  withoutSeason: number;
  fromOwnFrostDates: number;
  fromStations: number;
}

/**
 * Published reports whose outcome the season decides (ripened, or still unripe at frost), each with
 * a season length: the report's own frost dates when the grower gave both, else the nearest
 * station's 50 % value. Reports of no fruit or dropped fruit are left out: those come from other
 * causes (age, water, pollination) and would blur the picture.
 */
export function reportsWithSeason(db: Db, q: { crop: Crop; form?: GrowingForm; varietyId?: number }): SeasonRows {
  const rows = db.sqlite
    .prepare(
      `SELECT tree_id AS treeId, user_id AS userId, variety_id AS varietyId, outcome, spring_frost_date AS spring, fall_frost_date AS fall,
              grid_lat AS gridLat, grid_lon AS gridLon
         FROM reports
        WHERE status = 'published' AND variety_id IS NOT NULL AND crop = ? AND outcome IN ('ripened', 'unripe')
          ${q.form ? 'AND form = ?' : ''} ${q.varietyId ? 'AND variety_id = ?' : ''}`,
    )
    .all(...[q.crop, q.form, q.varietyId].filter((v) => v !== undefined)) as {
    treeId: number;
    userId: number;
    varietyId: number;
    outcome: string;
    spring: string | null;
    fall: string | null;
    gridLat: number;
    gridLon: number;
  }[];
  const stationSeason = nearestStationSeason(db);
  const out: SeasonReport[] = [];
  let withoutSeason = 0;
  let fromOwnFrostDates = 0;
  let fromStations = 0;
  for (const r of rows) {
    let seasonDays = seasonDaysFromFrostDates(r.spring, r.fall);
    if (seasonDays !== null) fromOwnFrostDates++;
    else {
      seasonDays = stationSeason(r.gridLat, r.gridLon);
      if (seasonDays === null) {
        withoutSeason++;
        continue;
      }
      fromStations++;
    }
    out.push({ treeId: r.treeId, userId: r.userId, varietyId: r.varietyId, ripened: r.outcome === 'ripened', seasonDays });
  }
  return { rows: out, withoutSeason, fromOwnFrostDates, fromStations };
}

/** Names and types of the varieties a list may show: accepted or still proposed (not rejected or merged away). */
export function varietyBriefs(db: Db): Map<number, { name: string; figType: FigType }> {
  return new Map(
    db
      .select({ id: varieties.id, name: varieties.name, figType: varieties.figType })
      .from(varieties)
      .where(inArray(varieties.status, ['accepted', 'proposed']))
      .all()
      .map((v) => [v.id, { name: v.name, figType: v.figType }]),
  );
}
