/**
 * Web Mercator tile arithmetic ("slippy map" z/x/y numbering, as used by OpenStreetMap and by
 * MapLibre's vector tile sources). Pure functions, unit-tested against the published formula.
 */

/** The latitude where Web Mercator's square world ends (atan(sinh(pi)) in degrees). */
export const MAX_MERCATOR_LAT = 85.0511287798066;

export interface TileId {
  z: number;
  x: number;
  y: number;
}

/**
 * The tile that holds a longitude/latitude at zoom z:
 * x = floor((lon + 180) / 360 * 2^z), y = floor((1 - ln(tan(lat) + sec(lat)) / pi) / 2 * 2^z).
 * Points on the right or bottom edge of the world fall in the last tile rather than past it.
 */
export function lonLatToTile(lon: number, lat: number, z: number): TileId {
  const n = 2 ** z;
  const clampedLat = Math.max(-MAX_MERCATOR_LAT, Math.min(MAX_MERCATOR_LAT, lat));
  const latRad = (clampedLat * Math.PI) / 180;
  const wrappedLon = ((((lon + 180) % 360) + 360) % 360) - 180;
  const x = Math.floor(((wrappedLon + 180) / 360) * n);
  const y = Math.floor(((1 - Math.log(Math.tan(latRad) + 1 / Math.cos(latRad)) / Math.PI) / 2) * n);
  return { z, x: Math.min(n - 1, Math.max(0, x)), y: Math.min(n - 1, Math.max(0, y)) };
}

/** The north-west corner of a tile, in degrees (the inverse of lonLatToTile at tile corners). */
export function tileToLonLat(x: number, y: number, z: number): { lon: number; lat: number } {
  const n = 2 ** z;
  const lon = (x / n) * 360 - 180;
  const lat = (Math.atan(Math.sinh(Math.PI * (1 - (2 * y) / n))) * 180) / Math.PI;
  return { lon, lat };
}

/** The four tiles one zoom level down that split a tile. */
export function childTiles({ z, x, y }: TileId): TileId[] {
  return [
    { z: z + 1, x: 2 * x, y: 2 * y },
    { z: z + 1, x: 2 * x + 1, y: 2 * y },
    { z: z + 1, x: 2 * x, y: 2 * y + 1 },
    { z: z + 1, x: 2 * x + 1, y: 2 * y + 1 },
  ];
}
