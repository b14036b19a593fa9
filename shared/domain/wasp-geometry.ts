import { area } from '@turf/turf';
import { pointInRing, ringCrossings } from './ring-crossings';
import type { WaspAreaGeometry } from '../schemas/wasp-areas';

/** Limits on one wasp area: enough for a county-sized outline, small enough to draw quickly. */
export const WASP_AREA_LIMITS = {
  /** Positions over all rings. */
  maxVertices: 5000,
  /** Rings over all polygons (outer rings and holes). */
  maxRings: 500,
  /** Problems listed in one answer; the rest are counted. */
  maxProblems: 20,
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

/** Count rings and positions without looking inside them: the cheap limits come before any geometry work. */
function countShape(polygons: unknown[]): { rings: number; vertices: number } {
  let rings = 0;
  let vertices = 0;
  for (const poly of polygons) {
    if (!Array.isArray(poly)) continue;
    rings += poly.length;
    for (const ring of poly) if (Array.isArray(ring)) vertices += ring.length;
  }
  return { rings, vertices };
}

/**
 * Check a GeoJSON area drawn on the map or uploaded by an editor (RFC 7946 rules for polygons):
 * every ring has at least 4 positions and is closed, coordinates are numbers with longitude in
 * [-180, 180] and latitude in [-90, 90], no ring crosses itself or another ring of its polygon,
 * every hole lies inside its outer ring, and the area stays within WASP_AREA_LIMITS. Every problem
 * found is named, with the polygon and ring it concerns.
 *
 * Cost: the vertex and ring counts are checked first, by counting array lengths, so an oversized
 * outline is refused before any position is read; crossings are found through an R-tree of the
 * segments (ring-crossings.ts), about n log n for n vertices, never all pairs.
 */
export function validateWaspGeometry(input: unknown): WaspGeometryResult {
  const { geometry, problem } = unwrap(input);
  if (!geometry) return { ok: false, problems: [problem!] };
  const raw = geometry.coordinates;
  if (!Array.isArray(raw) || raw.length === 0) return { ok: false, problems: [`The ${String(geometry.type)} has no coordinates`] };
  const polygons: unknown[] = geometry.type === 'Polygon' ? [raw] : raw;
  const multi = geometry.type === 'MultiPolygon';

  const size = countShape(polygons);
  if (size.vertices > WASP_AREA_LIMITS.maxVertices) {
    return { ok: false, problems: [`The area has ${size.vertices} vertices; the limit is ${WASP_AREA_LIMITS.maxVertices}. Simplify the outline first.`] };
  }
  if (size.rings > WASP_AREA_LIMITS.maxRings) {
    return { ok: false, problems: [`The area has ${size.rings} rings (outlines and holes); the limit is ${WASP_AREA_LIMITS.maxRings}. Simplify the outline first.`] };
  }

  const problems: string[] = [];
  const vertexCount = size.vertices;
  const clean: number[][][][] = [];

  polygons.forEach((poly, p) => {
    const polyName = multi ? `polygon ${p + 1}` : 'the polygon';
    if (!Array.isArray(poly) || poly.length === 0) {
      problems.push(`${polyName} has no rings`);
      return;
    }
    const rings: number[][][] = [];
    const ringNames: string[] = [];
    let ringProblem = false;
    poly.forEach((ring, r) => {
      const ringName = `${r === 0 ? 'outer ring' : `hole ${r}`} of ${polyName}`;
      if (!Array.isArray(ring)) {
        problems.push(`The ${ringName} is not a list of positions`);
        ringProblem = true;
        return;
      }
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
      if (badCoordinate) return void (ringProblem = true);
      if (positions.length < 4) {
        problems.push(`The ${ringName} has ${positions.length} positions; a ring needs at least 4 (3 corners and the first one again)`);
        return void (ringProblem = true);
      }
      if (!samePosition(positions[0]!, positions[positions.length - 1]!)) {
        problems.push(`The ${ringName} is not closed: its last position must repeat its first`);
        return void (ringProblem = true);
      }
      if (new Set(positions.map(([x, y]) => `${x},${y}`)).size < 3) {
        problems.push(`The ${ringName} has fewer than 3 different corners`);
        return void (ringProblem = true);
      }
      rings.push(positions);
      ringNames.push(ringName);
    });
    clean.push(rings);
    if (ringProblem) return;

    const crossings = ringCrossings(rings);
    crossings.self.forEach((count, r) => {
      if (count > 0) problems.push(`The ${ringNames[r]} crosses itself (${count} crossing${count === 1 ? '' : 's'})`);
    });
    for (const [r, t, count] of crossings.between) {
      problems.push(`The ${ringNames[t]} crosses or touches the ${ringNames[r]} (${count} place${count === 1 ? '' : 's'})`);
    }
    if (crossings.self.some((c) => c > 0) || crossings.between.length) return;
    // With no crossings, a hole is inside its outer ring exactly when any one of its corners is.
    rings.slice(1).forEach((hole, h) => {
      if (!pointInRing(hole[0]!, rings[0]!)) problems.push(`The ${ringNames[h + 1]} lies outside its outer ring; a hole must be inside the area`);
    });
  });

  if (problems.length > WASP_AREA_LIMITS.maxProblems) {
    const more = problems.length - WASP_AREA_LIMITS.maxProblems;
    problems.splice(WASP_AREA_LIMITS.maxProblems, more, `…and ${more} more problem${more === 1 ? '' : 's'}`);
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
