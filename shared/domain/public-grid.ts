/**
 * The public grid: the coarse cell on which everyone but the owner and editors sees a report.
 * 0.05 degrees of latitude is about 5.6 km; longitude cells use the same step in degrees, so they
 * narrow toward the poles but never reveal more than the latitude step does.
 */
export const PUBLIC_GRID_STEP_DEG = 0.05;

/** Snap one coordinate to the centre of its grid cell, rounded to 4 decimals to keep floats tidy. */
export function snapToGrid(value: number, step = PUBLIC_GRID_STEP_DEG): number {
  const centre = (Math.floor(value / step) + 0.5) * step;
  return Math.round(centre * 1e4) / 1e4;
}

/** The public (coarse) position of an exact point. */
export function toPublicPoint(lat: number, lon: number): { lat: number; lon: number } {
  return { lat: snapToGrid(lat), lon: snapToGrid(lon) };
}
