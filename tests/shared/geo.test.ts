import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as turf from '@turf/turf';
import { boundingBox, distanceKm, EARTH_RADIUS_KM, inBoxes } from '../../shared/domain/geo';

describe('distanceKm', { timeout: 30_000 }, () => {
  it('gives the published Nashville BNA to Los Angeles LAX distance', () => {
    // Haversine with R = 6371.0088 km (IUGG mean radius R1 of GRS80, Moritz, Geodetic Reference System 1980):
    // 2886.448 km; Rosetta Code "Haversine formula" gives 2886.444 km with R = 6371.0 km.
    const km = distanceKm({ lat: 36.12, lon: -86.67 }, { lat: 33.94, lon: -118.4 });
    expect(km).toBeCloseTo(2886.448, 3);
    expect(km * (6371.0 / 6371.0088)).toBeCloseTo(2886.444, 3);
  });

  it('gives 111.195 km for one degree of latitude', () => {
    // One degree on the sphere of radius 6371.0088 km (IUGG R1, Moritz 1980): 2 pi R / 360 = 111.195 km.
    expect(distanceKm({ lat: 10, lon: 20 }, { lat: 11, lon: 20 })).toBeCloseTo(111.195, 3);
  });

  /**
   * distanceKm agrees with turf.distance (reference library) to a millimetre. Within 10 km of the
   * antipode the haversine is ill-conditioned (d = 2R·asin(√h) with h → 1: a last-bit difference in h
   * moves d by up to a few centimetres, and the two libraries sum h in a different order), so there:
   * to a metre. At an exact antipode turf's atan2(√a, √(1−a)) is NaN when a rounds above 1; ours
   * gives πR, to a metre for the same reason (h may round just under 1: 4.0267° N 0° E against its
   * antipode gave πR − 19 cm).
   */
  function expectAgreesWithTurf(a: { lat: number; lon: number }, b: { lat: number; lon: number }) {
    const ours = distanceKm(a, b);
    const theirs = turf.distance([a.lon, a.lat], [b.lon, b.lat], { units: 'kilometers' });
    if (Number.isNaN(theirs)) return void expect(Math.abs(ours - Math.PI * EARTH_RADIUS_KM)).toBeLessThan(1e-3);
    const nearAntipode = theirs > Math.PI * EARTH_RADIUS_KM - 10;
    expect(Math.abs(ours - theirs)).toBeLessThan(nearAntipode ? 1e-3 : 1e-6 + 1e-10 * theirs);
  }

  it('agrees with @turf/turf distance (reference library)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        (lat1, lon1, lat2, lon2) => expectAgreesWithTurf({ lat: lat1, lon: lon1 }, { lat: lat2, lon: lon2 }),
      ),
    );
    // Pairs within a few kilometres of antipodal, where the tolerance near the antipode matters.
    fc.assert(
      fc.property(
        fc.double({ min: -89, max: 89, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -0.05, max: 0.05, noNaN: true }),
        fc.double({ min: -0.05, max: 0.05, noNaN: true }),
        (lat, lon, dLat, dLon) => expectAgreesWithTurf({ lat, lon }, { lat: -lat + dLat, lon: (lon > 0 ? lon - 180 : lon + 180) + dLon }),
      ),
      { numRuns: 2000 },
    );
  });
});

describe('boundingBox', { timeout: 30_000 }, () => {
  it('returns one box around an ordinary point', () => {
    const boxes = boundingBox({ lat: 42.74, lon: -73.81 }, 100);
    expect(boxes).toHaveLength(1);
    // 100 km is 0.8993 degrees of latitude on the IUGG sphere (100 / 111.195).
    expect(boxes[0].maxLat - 42.74).toBeCloseTo(0.8994, 3);
  });

  it('splits into two boxes across the antimeridian', () => {
    const boxes = boundingBox({ lat: -17.7, lon: 179.5 }, 200); // Fiji
    expect(boxes).toHaveLength(2);
    expect(inBoxes({ lat: -17.7, lon: -179.5 }, boxes)).toBe(true);
    expect(inBoxes({ lat: -17.7, lon: 178.5 }, boxes)).toBe(true);
    expect(inBoxes({ lat: -17.7, lon: 0 }, boxes)).toBe(false);
  });

  it('covers every longitude when the circle reaches a pole', () => {
    const boxes = boundingBox({ lat: 89.5, lon: 10 }, 100);
    expect(boxes).toEqual([{ minLat: expect.any(Number), maxLat: 90, minLon: -180, maxLon: 180 }]);
  });

  it('contains every point within the radius (property test)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -89.9, max: 89.9, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: 0.1, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        (lat, lon, radiusKm, fraction, bearing) => {
          // A point at a random bearing and distance inside the circle, placed with turf's destination.
          const [dlon, dlat] = turf.destination([lon, lat], radiusKm * fraction, bearing, { units: 'kilometers' }).geometry
            .coordinates;
          const point = { lat: dlat, lon: ((((dlon + 180) % 360) + 360) % 360) - 180 };
          expect(distanceKm({ lat, lon }, point)).toBeLessThanOrEqual(radiusKm + 1e-6);
          expect(inBoxes(point, boundingBox({ lat, lon }, radiusKm))).toBe(true);
        },
      ),
      { numRuns: 2000 },
    );
  });
});
