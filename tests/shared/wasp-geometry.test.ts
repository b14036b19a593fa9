import { describe, expect, it } from 'vitest';
import { closeRing, validateWaspGeometry, WASP_AREA_LIMITS } from '../../shared/domain/wasp-geometry';

const square = [[[-121, 38], [-120, 38], [-120, 39], [-121, 39], [-121, 38]]];

function problems(input: unknown): string[] {
  const result = validateWaspGeometry(input);
  if (result.ok) throw new Error('expected problems');
  return result.problems;
}

describe('validateWaspGeometry', () => {
  it('accepts a bare Polygon, a Feature and a FeatureCollection of one, returning the same Polygon', () => {
    const polygon = { type: 'Polygon', coordinates: square };
    for (const input of [polygon, { type: 'Feature', properties: {}, geometry: polygon }, { type: 'FeatureCollection', features: [{ type: 'Feature', properties: null, geometry: polygon }] }]) {
      const result = validateWaspGeometry(input);
      expect(result.ok).toBe(true);
      if (result.ok) expect(result.geometry).toEqual(polygon);
    }
  });

  it('measures area on the sphere: a 1°×1° cell at the equator is about 12,364 km²', () => {
    // R² · Δλ · (sin φ2 − sin φ1) with turf's mean Earth radius 6371.0088 km = 12,363.5 km² (spherical formula, computed by hand)
    const result = validateWaspGeometry({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]] });
    expect(result.ok && result.areaKm2).toBeCloseTo(12363.5, -1);
  });

  it('accepts a MultiPolygon and a polygon with a hole', () => {
    const hole = [[-120.8, 38.2], [-120.2, 38.2], [-120.2, 38.8], [-120.8, 38.8], [-120.8, 38.2]];
    expect(validateWaspGeometry({ type: 'MultiPolygon', coordinates: [square, [[...square[0]!.map(([x, y]) => [x! + 2, y!])]]] }).ok).toBe(true);
    expect(validateWaspGeometry({ type: 'Polygon', coordinates: [square[0], hole] }).ok).toBe(true);
  });

  it('names an open ring (RFC 7946 §3.1.6: the first and last positions of a linear ring are equivalent)', () => {
    expect(problems({ type: 'Polygon', coordinates: [[[-121, 38], [-120, 38], [-120, 39], [-121, 39]]] })).toEqual([
      'The outer ring of the polygon is not closed: its last position must repeat its first',
    ]);
  });

  it('names a ring with fewer than 4 positions (RFC 7946 §3.1.6)', () => {
    expect(problems({ type: 'Polygon', coordinates: [[[-121, 38], [-120, 38], [-121, 38]]] })[0]).toMatch(/has 3 positions; a ring needs at least 4/);
  });

  it('names a longitude or latitude out of range, with its position', () => {
    expect(problems({ type: 'Polygon', coordinates: [[[-121, 38], [190, 38], [-120, 39], [-121, 38]]] })[0]).toBe('Position 2 of the outer ring of the polygon has longitude 190, outside -180 to 180');
    expect(problems({ type: 'Polygon', coordinates: [[[-121, 38], [-120, 95], [-120, 39], [-121, 38]]] })[0]).toBe('Position 2 of the outer ring of the polygon has latitude 95, outside -90 to 90');
    expect(problems({ type: 'Polygon', coordinates: [[[-121, 38], ['x', 38], [-120, 39], [-121, 38]]] })[0]).toMatch(/Position 2 .* not a \[longitude, latitude\] pair/);
  });

  it('names a self-intersecting bow-tie', () => {
    // corners visited in the order that makes the two diagonals cross once
    const bowTie = [[[0, 0], [1, 1], [1, 0], [0, 1], [0, 0]]];
    expect(problems({ type: 'Polygon', coordinates: bowTie })).toEqual(['The outer ring of the polygon crosses itself (1 crossing)']);
  });

  it('names too many vertices and too large an area', () => {
    const n = WASP_AREA_LIMITS.maxVertices + 10;
    const circle = Array.from({ length: n }, (_, i) => [-120 + 0.5 * Math.cos((2 * Math.PI * i) / n), 38 + 0.5 * Math.sin((2 * Math.PI * i) / n)]);
    circle.push(circle[0]!);
    expect(problems({ type: 'Polygon', coordinates: [circle] })[0]).toMatch(new RegExp(`has ${n + 1} vertices; the limit is ${WASP_AREA_LIMITS.maxVertices}`));
    expect(problems({ type: 'Polygon', coordinates: [[[-130, 30], [-100, 30], [-100, 45], [-130, 45], [-130, 30]]] })[0]).toMatch(/km²; the limit is 500,000 km²/);
  });

  it('names wrong shapes: a Point, a collection of two areas, no object at all', () => {
    expect(problems({ type: 'Point', coordinates: [0, 0] })).toEqual(['Expected a Polygon or MultiPolygon, got Point']);
    expect(problems({ type: 'FeatureCollection', features: [{}, {}] })[0]).toMatch(/exactly one area \(this one holds 2\)/);
    expect(problems('hello')).toEqual(['The file is not a GeoJSON object']);
  });

  it('closes a ring drawn point by point', () => {
    expect(closeRing([[0, 0], [1, 0], [1, 1]])).toEqual([[0, 0], [1, 0], [1, 1], [0, 0]]);
    expect(closeRing([[0, 0], [1, 0], [1, 1], [0, 0]])).toHaveLength(4);
  });
});
