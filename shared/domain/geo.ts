/**
 * Distances and look-up boxes on a spherical Earth.
 *
 * The sphere has the IUGG mean radius R1 = 6371.0088 km of GRS80 (Moritz, "Geodetic Reference
 * System 1980"), the same radius @turf/turf uses, so the two agree. A sphere is within about 0.5 %
 * of the ellipsoid: far finer than a 100 km search radius needs.
 */

/** Mean Earth radius in km (IUGG R1 of GRS80). */
export const EARTH_RADIUS_KM = 6371.0088;

export type LatLon = { lat: number; lon: number };
export type BoundingBox = { minLat: number; maxLat: number; minLon: number; maxLon: number };

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

/**
 * Great-circle distance in km between two points given in decimal degrees (haversine formula).
 * Nashville BNA to Los Angeles LAX is 2886.448 km.
 */
export function distanceKm(a: LatLon, b: LatLon): number {
  const dLat = (b.lat - a.lat) * RAD;
  const dLon = (b.lon - a.lon) * RAD;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * RAD) * Math.cos(b.lat * RAD) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_KM * Math.asin(Math.min(1, Math.sqrt(h)));
}

/**
 * A small outward margin (degrees) so that points exactly on the circle, and the rounding of an
 * R*Tree's 32-bit float coordinates, never fall outside the box. About 10 m at the equator.
 */
const BOX_PAD_DEG = 1e-4;

/**
 * Latitude/longitude boxes that together contain every point within `radiusKm` of `center`, for
 * pre-filtering with an R*Tree before the exact `distanceKm` check.
 *
 * - Latitude spans radius / R radians either side, clamped at the poles.
 * - Longitude spans asin(sin(d) / cos(lat)) either side (the widest point of the circle on the sphere).
 * - If the circle reaches a pole, every longitude is in range: one box from -180 to 180.
 * - If the longitude span crosses the antimeridian, two boxes are returned (one each side of 180).
 *
 * The boxes are slightly larger than the circle (a 1e-4 degree margin); callers must still filter by
 * exact distance.
 */
export function boundingBox(center: LatLon, radiusKm: number): BoundingBox[] {
  if (!(radiusKm >= 0) || !Number.isFinite(radiusKm)) throw new RangeError('radiusKm must be a finite number >= 0');
  const d = radiusKm / EARTH_RADIUS_KM; // angular radius, radians
  const dLatDeg = d * DEG + BOX_PAD_DEG;
  const minLat = center.lat - dLatDeg;
  const maxLat = center.lat + dLatDeg;
  if (minLat <= -90 || maxLat >= 90 || d >= Math.PI / 2) {
    return [{ minLat: Math.max(-90, minLat), maxLat: Math.min(90, maxLat), minLon: -180, maxLon: 180 }];
  }
  const ratio = Math.sin(d) / Math.cos(center.lat * RAD);
  if (ratio >= 1) return [{ minLat, maxLat, minLon: -180, maxLon: 180 }];
  const dLonDeg = Math.asin(ratio) * DEG + BOX_PAD_DEG;
  if (dLonDeg >= 180) return [{ minLat, maxLat, minLon: -180, maxLon: 180 }];
  const minLon = center.lon - dLonDeg;
  const maxLon = center.lon + dLonDeg;
  if (minLon < -180) {
    return [
      { minLat, maxLat, minLon: -180, maxLon },
      { minLat, maxLat, minLon: minLon + 360, maxLon: 180 },
    ];
  }
  if (maxLon > 180) {
    return [
      { minLat, maxLat, minLon, maxLon: 180 },
      { minLat, maxLat, minLon: -180, maxLon: maxLon - 360 },
    ];
  }
  return [{ minLat, maxLat, minLon, maxLon }];
}

/** Whether a point lies in any of the boxes (the same test an R*Tree query makes). */
export function inBoxes(point: LatLon, boxes: BoundingBox[]): boolean {
  return boxes.some((b) => point.lat >= b.minLat && point.lat <= b.maxLat && point.lon >= b.minLon && point.lon <= b.maxLon);
}
