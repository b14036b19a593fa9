import type { LatLon } from '../../shared/domain/geo';
import type { VarietyInfo } from '../../shared/domain/evidence';
import type { StationSeason } from '../../shared/domain/season-estimate';
import { currentStationSnapshot, stationSeasonsInBoxes } from '../stations/station-snapshot';
import type { Db } from '../db/client';
import { statement } from '../db/prepared';

/*
 * Row gathering for the regional engine: the catalogue from SQLite, stations from the in-memory
 * station snapshot (server/stations/station-snapshot.ts; the exact distance is applied by
 * estimateSeason). Tree rows come from the in-memory tree snapshot (tree-snapshot.ts). The numbers
 * themselves are computed by the pure functions in shared/domain.
 */

/** Accepted varieties of the catalogue, by id (a small table: read on each request). */
export function acceptedVarieties(db: Db): Map<number, VarietyInfo> {
  const rows = statement(
    db,
    "SELECT id, name, fig_type AS figType, ripening_class AS ripeningClass, typical_days_to_ripen AS typicalDaysToRipen, is_fictional AS isFictional FROM varieties WHERE status = 'accepted'",
  ).all() as (Omit<VarietyInfo, 'isFictional'> & { isFictional: number })[];
  return new Map(rows.map((v) => [v.id, { ...v, isFictional: v.isFictional === 1 }]));
}

/**
 * Stations within the radius' boxes with their 32 deg F season at 10/50/90 % (estimateSeason filters
 * by distance), from the in-memory station snapshot, re-read whenever a station changes.
 */
export function stationSeasonsNear(db: Db, point: LatLon, radiusKm: number): StationSeason[] {
  return stationSeasonsInBoxes(currentStationSnapshot(db), point, radiusKm);
}
