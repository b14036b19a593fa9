import { boundingBox, type LatLon } from '../../shared/domain/geo';
import type { VarietyInfo } from '../../shared/domain/evidence';
import type { StationSeason } from '../../shared/domain/season-estimate';
import { stationsInBoxes } from '../stations/stations.repo';
import type { Db } from '../db/client';
import { statement } from '../db/prepared';

/*
 * Row gathering for the regional engine from SQLite: the catalogue, and stations through their
 * R*Tree (the exact distance is applied by estimateSeason). Tree rows come from the in-memory
 * snapshot (tree-snapshot.ts). The numbers themselves are computed by the pure functions in
 * shared/domain.
 */

/** Accepted varieties of the catalogue, by id (a small table: read on each request). */
export function acceptedVarieties(db: Db): Map<number, VarietyInfo> {
  const rows = statement(
    db,
    "SELECT id, name, fig_type AS figType, ripening_class AS ripeningClass, typical_days_to_ripen AS typicalDaysToRipen, is_fictional AS isFictional FROM varieties WHERE status = 'accepted'",
  ).all() as (Omit<VarietyInfo, 'isFictional'> & { isFictional: number })[];
  return new Map(rows.map((v) => [v.id, { ...v, isFictional: v.isFictional === 1 }]));
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
