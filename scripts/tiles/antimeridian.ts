import type { MultiPolygon, Polygon, Position } from 'geojson';

/*
 * Rings that cross the 180th meridian (Russia's far east, Fiji, the Aleutians, Antarctica's edge)
 * come out of TopoJSON as a ring jumping from +179 to -179. Cut into tiles as they are, such a ring
 * draws a band right across the world. Here each ring is made continuous ("unwrapped") and then
 * clipped into the world's three copies, which are shifted back into -180..180.
 */

/** Make a ring continuous: each step of more than 180 degrees of longitude goes the short way. */
export function unwrapRing(ring: Position[]): Position[] {
  const out: Position[] = [];
  let offset = 0;
  for (let i = 0; i < ring.length; i++) {
    const [lon, lat] = ring[i]!;
    if (i > 0) {
      const previous = ring[i - 1]![0]!;
      const step = lon! - previous;
      if (step > 180) offset -= 360;
      else if (step < -180) offset += 360;
    }
    out.push([lon! + offset, lat!]);
  }
  // A ring around a pole (Antarctica) comes back 360 degrees away from where it started: close it
  // along the pole's edge of the map, so that it becomes an ordinary ring.
  const first = out[0];
  const last = out[out.length - 1];
  if (first && last && Math.abs(last[0]! - first[0]!) > 180) {
    const poleLat = out.reduce((sum, p) => sum + p[1]!, 0) < 0 ? -90 : 90;
    out.push([last[0]!, poleLat], [first[0]!, poleLat], [first[0]!, first[1]!]);
  }
  return out;
}

/** Sutherland-Hodgman clip of a closed ring to the half-plane lon >= edge (keep = 'east') or lon <= edge. */
function clipRingToEdge(ring: Position[], edge: number, keep: 'east' | 'west'): Position[] {
  const inside = (p: Position) => (keep === 'east' ? p[0]! >= edge : p[0]! <= edge);
  const out: Position[] = [];
  const points = ring.slice(0, -1);
  for (let i = 0; i < points.length; i++) {
    const current = points[i]!;
    const previous = points[(i + points.length - 1) % points.length]!;
    const cIn = inside(current);
    const pIn = inside(previous);
    if (cIn !== pIn) {
      const t = (edge - previous[0]!) / (current[0]! - previous[0]!);
      out.push([edge, previous[1]! + t * (current[1]! - previous[1]!)]);
    }
    if (cIn) out.push(current);
  }
  if (out.length > 0) out.push(out[0]!);
  return out;
}

function clipRing(ring: Position[], west: number, east: number): Position[] {
  return clipRingToEdge(clipRingToEdge(ring, west, 'east'), east, 'west');
}

function ringArea(ring: Position[]): number {
  let sum = 0;
  for (let i = 0; i + 1 < ring.length; i++) sum += ring[i]![0]! * ring[i + 1]![1]! - ring[i + 1]![0]! * ring[i]![1]!;
  return sum / 2;
}

/** Split one polygon (outer ring and holes) into parts that each lie within -180..180. */
export function splitPolygonAtAntimeridian(rings: Position[][]): Position[][][] {
  const unwrapped = rings.map(unwrapRing);
  const outer = unwrapped[0]!;
  // Holes are unwrapped on their own; shift each into the same world copy as the outer ring.
  const outerMid = (Math.min(...outer.map((p) => p[0]!)) + Math.max(...outer.map((p) => p[0]!))) / 2;
  const aligned = unwrapped.map((ring, i) => {
    if (i === 0) return ring;
    const mid = (Math.min(...ring.map((p) => p[0]!)) + Math.max(...ring.map((p) => p[0]!))) / 2;
    const shift = Math.round((outerMid - mid) / 360) * 360;
    return shift ? ring.map(([lon, lat]) => [lon! + shift, lat!]) : ring;
  });
  const lons = aligned.flat().map((p) => p[0]!);
  const minLon = Math.min(...lons);
  const maxLon = Math.max(...lons);
  if (minLon >= -180 && maxLon <= 180) return [aligned];

  const parts: Position[][][] = [];
  for (let copy = Math.floor((minLon + 180) / 360); copy <= Math.floor((maxLon + 180) / 360); copy++) {
    const west = -180 + copy * 360;
    const east = west + 360;
    const keep = (ring: Position[]) => ring.length >= 4 && Math.abs(ringArea(ring)) > 1e-12;
    const shiftBack = (ring: Position[]) => ring.map(([lon, lat]) => [lon! - copy * 360, lat!]);
    // Only a part whose outer ring survives the clip is kept; holes follow their outer ring.
    const outerClipped = clipRing(aligned[0]!, west, east);
    if (!keep(outerClipped)) continue;
    const holes = aligned.slice(1).map((ring) => clipRing(ring, west, east)).filter(keep);
    parts.push([outerClipped, ...holes].map(shiftBack));
  }
  return parts;
}

/** A Polygon or MultiPolygon as a MultiPolygon whose every ring stays within -180..180. */
export function splitAtAntimeridian(geometry: Polygon | MultiPolygon): MultiPolygon {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return { type: 'MultiPolygon', coordinates: polygons.flatMap(splitPolygonAtAntimeridian) };
}

/** Does any segment of the geometry jump by more than 180 degrees of longitude? */
export function crossesAntimeridian(geometry: Polygon | MultiPolygon): boolean {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  // An edge along a pole (latitude +-90 at both ends) is the map's top or bottom edge, not a band.
  const jumps = (p: Position, q: Position) => Math.abs(p[0]! - q[0]!) > 180 && !(Math.abs(p[1]!) === 90 && p[1] === q[1]);
  return polygons.some((rings) => rings.some((ring) => ring.some((p, i) => i > 0 && jumps(p, ring[i - 1]!))));
}
