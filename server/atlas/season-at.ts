import type { LatLon } from '../../shared/domain/geo';
import { estimateSeason } from '../../shared/domain/season-estimate';
import type { SeasonEstimate } from '../../shared/schemas/atlas';
import type { Db } from '../db/client';
import { stationSeasonsNear } from './atlas.repo';
import { reportFrostSeasons, type FrostTree } from './tree-snapshot';

/**
 * The frost-free season at a point: the stations in range (station snapshot) and the frost seasons
 * of the growers among `trees` (the tree rows within the radius; rows without a frost season are
 * ignored, so frostTreesWithin's shorter list gives the same answer). The one path behind
 * GET /api/atlas/near, /varieties/:id/fit, /atlas/season-at and the map's season surface.
 */
export function seasonAt(db: Db, point: LatLon, radiusKm: number, trees: FrostTree[]): SeasonEstimate {
  return estimateSeason({ point, stations: stationSeasonsNear(db, point, radiusKm), reportFrostSeasons: reportFrostSeasons(trees), radiusKm });
}
