/**
 * The season surface: the frost-free season sampled on a regular grid of nodes inside each web map
 * tile, every node computed by the same estimate as the season at a point (GET /api/atlas/near),
 * and blended between nodes when drawn. Pure geometry and the evidence rule, shared by the server
 * (which computes the nodes) and the map (which draws and reads them).
 */

/** Cells per tile side: (SURFACE_CELLS + 1)² nodes, a node every 32 screen pixels of a 256 px tile (the season changes over tens of km; a finer grid cost more than it showed). */
export const SURFACE_CELLS = 8;
/** Zooms the server computes; the map enlarges the last one's tiles past it. */
export const SURFACE_MIN_ZOOM = 2;
export const SURFACE_MAX_ZOOM = 9;
/** The radius the surface asks the estimate for: GET /api/atlas/near's default radius. */
export const SURFACE_RADIUS_KM = 100;

/** Longitude of the node column `i` (0..SURFACE_CELLS) of tile column x at zoom z (web Mercator). */
export function nodeLon(z: number, x: number, i: number): number {
  return ((x + i / SURFACE_CELLS) / 2 ** z) * 360 - 180;
}

/** Latitude of the node row `j` (0..SURFACE_CELLS, north to south) of tile row y at zoom z. */
export function nodeLat(z: number, y: number, j: number): number {
  const n = Math.PI * (1 - (2 * (y + j / SURFACE_CELLS)) / 2 ** z);
  return (Math.atan(Math.sinh(n)) * 180) / Math.PI;
}

/**
 * How much an estimate stands on: 1 when two or more stations lie within 40 km, falling to 0 as the
 * nearest evidence moves out to the radius or only grower reports remain. The map fades and hatches
 * where this is low. The 40 km is a judgement, not a standard: frost dates change noticeably over
 * a few tens of km with elevation and water (common practice, no source).
 */
export function evidenceStrength(stationCount: number, reportCount: number, nearestStationKm: number | null, radiusKm = SURFACE_RADIUS_KM): number {
  if (stationCount === 0) return reportCount >= 3 ? 0.25 : reportCount > 0 ? 0.1 : 0;
  const near = nearestStationKm ?? radiusKm;
  const byDistance = near <= 40 ? 1 : Math.max(0, 1 - (near - 40) / (radiusKm - 40));
  const byCount = stationCount >= 2 ? 1 : 0.6;
  return Math.max(0.1, byDistance * byCount);
}

/** Below this strength the surface is hatched: the value is a thin guess. */
export const THIN_EVIDENCE = 0.5;
