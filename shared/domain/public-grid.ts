import type { LatLon } from './geo';

/**
 * The public grid: the coarse cell on which everyone but the owner and editors sees a report.
 * 0.05 degrees of latitude is about 5.6 km; longitude cells use the same step in degrees, so they
 * narrow toward the poles but never reveal more than the latitude step does.
 *
 * THE RULE (issue 15): every public answer, count, chart, export and e-mail is computed from a
 * report's public position (`publicPosition`: its cell's centre, stored as grid_lat/grid_lon),
 * never from its exact place (lat/lon). Only the owner's own views and the editors' tools read the
 * exact place. Two gardens in one cell are then indistinguishable to everyone else, however a
 * radius is narrowed or a point moved (tests/server/public-position.property.test.ts proves it
 * for every public route).
 */
export const PUBLIC_GRID_STEP_DEG = 0.05;

/** Snap one coordinate to the centre of its grid cell, rounded to 4 decimals to keep floats tidy. */
export function snapToGrid(value: number, step = PUBLIC_GRID_STEP_DEG): number {
  const centre = (Math.floor(value / step) + 0.5) * step;
  return Math.round(centre * 1e4) / 1e4;
}

/** The public (coarse) position of an exact point: what is stored as a report's grid_lat/grid_lon. */
export function toPublicPoint(lat: number, lon: number): { lat: number; lon: number } {
  return { lat: snapToGrid(lat), lon: snapToGrid(lon) };
}

/** A report (or tree row) as public code may hold it: with its grid cell, never its exact place. */
export type PublicPlaced = { gridLat: number; gridLon: number };

/**
 * The one accessor for "where is this report" in any public computation: its grid cell's centre.
 * Server reads of a report's place for anything public go through the grid columns
 * (server/reports/public-position.ts for SQL), never reports.lat/lon.
 */
export function publicPosition(report: PublicPlaced): LatLon {
  return { lat: report.gridLat, lon: report.gridLon };
}

/** A cell's size in km: the latitude step (the longitude step is never longer). */
export const PUBLIC_CELL_KM = PUBLIC_GRID_STEP_DEG * 111.2;

/**
 * The smallest radius any public radius query accepts: the cell's diagonal, rounded up (8 km).
 * A narrower radius could not be answered honestly (the answer is per cell, and a cell's centre
 * may lie up to half a diagonal from any point in it), and refusing it keeps scripts from probing
 * below the grid at all.
 */
export const MIN_PUBLIC_RADIUS_KM = Math.ceil(PUBLIC_CELL_KM * Math.SQRT2);
