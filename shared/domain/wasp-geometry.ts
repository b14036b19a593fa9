import { area, kinks, polygon as turfPolygon } from '@turf/turf';
import type { WaspAreaGeometry } from '../schemas/wasp-areas';

/** Limits on one wasp area: enough for a county-sized outline, small enough to draw quickly. */
export const WASP_AREA_LIMITS = {
  /** Positions over all rings. */
  maxVertices: 5000,
  /** Square kilometres (about the size of a large US state; larger records are probably mistakes). */
  maxAreaKm2: 500_000,
} as const;

export type WaspGeometryResult = { ok: true; geometry: WaspAreaGeometry; vertexCount: number; areaKm2: number } | { ok: false; problems: string[] };

type Json = Record<string, unknown>;
const isObject = (value: unknown): value is Json => typeof value === 'object' && value !== null && !Array.isArray(value);

/** Pull the one geometry out of a Feature, a FeatureCollection of one feature, or a bare geometry. */
function unwrap(input: unknown): { geometry?: Json; problem?: string } {
  if (!isObject(input)) return { problem: 'The file is not a GeoJSON object' };
  if (input.type === 'FeatureCollection') {
    const features = Array.isArray(input.features) ? input.features : [];
    if (features.length !== 1) return { problem: `A FeatureCollection must hold exactly one area (this one holds ${features.length})` };
    return unwrap(features[0]);
  }
  if (input.type === 'Feature') {
    if (!isObject(input.geometry)) return { problem: 'The Feature has no geometry' };
    return unwrap(input.geometry);
  }
  if (input.type === 'Polygon' || input.type === 'MultiPolygon') return { geometry: input };
  return { problem: `Expected a Polygon or MultiPolygon, got ${typeof input.type === 'string' ? input.type : 'no type'}` };
}

function samePosition(a: number[], b: number[]): boolean {
  return a[0] === b[0] && a[1] === b[1];
}

/**
 * Check a GeoJSON area drawn on the map or uploaded by an editor (RFC 7946 rules for polygons):
 * every ring has at least 4 positions and is closed, coordinates are numbers with longitude in
 * [-180, 180] and latitude in [-90, 90], no ring crosses itself, and the area stays within
 * WASP_AREA_LIMITS. Every problem found is named, with the polygon and ring it concerns.
 */
export function validateWaspGeometry(input: unknown): WaspGeometryResult {
  const { geometry, problem } = unwrap(input);
  if (!geometry) return { ok: false, problems: [problem!] };
  const raw = geometry.coordinates;
  if (!Array.isArray(raw) || raw.length === 0) return { ok: false, problems: [`The ${String(geometry.type)} has no coordinates`] };
  const polygons: unknown[] = geometry.type === 'Polygon' ? [raw] : raw;
  const multi = geometry.type === 'MultiPolygon';
  const problems: string[] = [];
  let vertexCount = 0;
  const clean: number[][][][] = [];

  polygons.forEach((poly, p) => {
    const polyName = multi ? `polygon ${p + 1}` : 'the polygon';
    if (!Array.isArray(poly) || poly.length === 0) {
      problems.push(`${polyName} has no rings`);
      return;
    }
    const rings: number[][][] = [];
    poly.forEach((ring, r) => {
      const ringName = `${r === 0 ? 'outer ring' : `hole ${r}`} of ${polyName}`;
      if (!Array.isArray(ring)) {
        problems.push(`The ${ringName} is not a list of positions`);
        return;
      }
      vertexCount += ring.length;
      const positions: number[][] = [];
      let badCoordinate = false;
      ring.forEach((position, i) => {
        if (badCoordinate) return;
        if (!Array.isArray(position) || position.length < 2 || !position.every((n) => typeof n === 'number' && Number.isFinite(n))) {
          problems.push(`Position ${i + 1} of the ${ringName} is not a [longitude, latitude] pair of numbers`);
          badCoordinate = true;
          return;
        }
        const [lon, lat] = position as number[];
        if (lon! < -180 || lon! > 180) {
          problems.push(`Position ${i + 1} of the ${ringName} has longitude ${lon}, outside -180 to 180`);
          badCoordinate = true;
        } else if (lat! < -90 || lat! > 90) {
          problems.push(`Position ${i + 1} of the ${ringName} has latitude ${lat}, outside -90 to 90`);
          badCoordinate = true;
        }
        positions.push([lon!, lat!]);
      });
      if (badCoordinate) return;
      if (positions.length < 4) {
        problems.push(`The ${ringName} has ${positions.length} positions; a ring needs at least 4 (3 corners and the first one again)`);
        return;
      }
      if (!samePosition(positions[0]!, positions[positions.length - 1]!)) {
        problems.push(`The ${ringName} is not closed: its last position must repeat its first`);
        return;
      }
      const crossings = kinks(turfPolygon([positions])).features.length;
      if (crossings > 0) problems.push(`The ${ringName} crosses itself (${crossings} crossing${crossings === 1 ? '' : 's'})`);
      rings.push(positions);
    });
    clean.push(rings);
  });

  if (vertexCount > WASP_AREA_LIMITS.maxVertices) {
    problems.push(`The area has ${vertexCount} vertices; the limit is ${WASP_AREA_LIMITS.maxVertices}. Simplify the outline first.`);
  }
  if (problems.length) return { ok: false, problems };

  const result: WaspAreaGeometry = multi ? { type: 'MultiPolygon', coordinates: clean } : { type: 'Polygon', coordinates: clean[0]! };
  const areaKm2 = area(result) / 1e6;
  if (areaKm2 > WASP_AREA_LIMITS.maxAreaKm2) {
    return { ok: false, problems: [`The area covers about ${Math.round(areaKm2).toLocaleString('en')} km²; the limit is ${WASP_AREA_LIMITS.maxAreaKm2.toLocaleString('en')} km²`] };
  }
  return { ok: true, geometry: result, vertexCount, areaKm2 };
}

/** Close a ring drawn point by point on the map (repeat the first vertex). */
export function closeRing(vertices: [number, number][]): [number, number][] {
  if (vertices.length === 0) return [];
  const first = vertices[0]!;
  const last = vertices[vertices.length - 1]!;
  return first[0] === last[0] && first[1] === last[1] ? vertices : [...vertices, first];
}
