import { sql, type SQL } from 'drizzle-orm';
import { boundingBox, distanceKm, type LatLon } from '../../shared/domain/geo';
import { publicPosition, type PublicPlaced } from '../../shared/domain/public-grid';

/*
 * The server's side of the public-position rule (shared/domain/public-grid.ts): a public query
 * finds reports by their grid cell (reports.grid_lat/grid_lon, indexed by reports_grid_idx), then
 * keeps those whose cell centre lies within the radius. reports.lat/lon and reports_rtree (built
 * on the exact place) are for the owner's own views and the editors' tools only.
 */

/**
 * SQL condition: the report's public position (`alias`.grid_lat/grid_lon) lies in one of the
 * bounding boxes of the circle (antimeridian-safe). Follow it with `withinPublicRadius` per row.
 */
export function publicPositionInCircleBoxes(alias: string, centre: LatLon, radiusKm: number): SQL {
  const lat = sql.raw(`${alias}.grid_lat`);
  const lon = sql.raw(`${alias}.grid_lon`);
  const boxes = boundingBox(centre, radiusKm).map((b) => sql`(${lat} BETWEEN ${b.minLat} AND ${b.maxLat} AND ${lon} BETWEEN ${b.minLon} AND ${b.maxLon})`);
  return sql`(${sql.join(boxes, sql` OR `)})`;
}

/** The great-circle distance from `centre` to the report's public position (its cell centre). */
export function publicDistanceKm(centre: LatLon, report: PublicPlaced): number {
  return distanceKm(centre, publicPosition(report));
}
