import RBush from 'rbush';

/** A ring's positions as [x, y] (longitude, latitude), closed (last = first). */
export type Ring = number[][];

interface Segment {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  ring: number;
  /** Index of its first position in the ring (with consecutive repeats removed). */
  index: number;
  ax: number;
  ay: number;
  bx: number;
  by: number;
}

/** Sign of the turn a→b→c: >0 left, <0 right, 0 in line. */
function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const v = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
  return v > 0 ? 1 : v < 0 ? -1 : 0;
}

const within = (a: number, b: number, c: number) => Math.min(a, b) <= c && c <= Math.max(a, b);

/** Do two closed segments share any point (crossing, touching or overlapping in line)? The orientation test. */
export function segmentsMeet(s: Segment, t: Segment): boolean {
  const o1 = orient(s.ax, s.ay, s.bx, s.by, t.ax, t.ay);
  const o2 = orient(s.ax, s.ay, s.bx, s.by, t.bx, t.by);
  const o3 = orient(t.ax, t.ay, t.bx, t.by, s.ax, s.ay);
  const o4 = orient(t.ax, t.ay, t.bx, t.by, s.bx, s.by);
  if (o1 !== o2 && o3 !== o4) return true;
  // In line: they meet when an end of one lies on the other.
  const on = (o: number, px: number, py: number, seg: { ax: number; ay: number; bx: number; by: number }) => o === 0 && within(seg.ax, seg.bx, px) && within(seg.ay, seg.by, py);
  return on(o1, t.ax, t.ay, s) || on(o2, t.bx, t.by, s) || on(o3, s.ax, s.ay, t) || on(o4, s.bx, s.by, t);
}

function withoutRepeats(ring: Ring): Ring {
  return ring.filter((p, i) => i === 0 || p[0] !== ring[i - 1]![0] || p[1] !== ring[i - 1]![1]);
}

/**
 * Where the rings of one polygon meet where they must not: `self[r]` counts the pairs of
 * non-neighbouring segments of ring r that share a point, `between` the pairs [r, s, count] of
 * rings that touch or cross each other. An R-tree of the segments' boxes (rbush) finds the
 * candidate pairs, so an outline of n segments costs about n log n, not the n² of testing all pairs.
 */
export function ringCrossings(rings: Ring[]): { self: number[]; between: [number, number, number][] } {
  const segments: Segment[] = [];
  const lengths: number[] = [];
  rings.forEach((raw, r) => {
    const ring = withoutRepeats(raw);
    lengths.push(ring.length - 1);
    for (let i = 0; i + 1 < ring.length; i++) {
      const [ax, ay] = ring[i] as [number, number];
      const [bx, by] = ring[i + 1] as [number, number];
      segments.push({ minX: Math.min(ax, bx), minY: Math.min(ay, by), maxX: Math.max(ax, bx), maxY: Math.max(ay, by), ring: r, index: i, ax, ay, bx, by });
    }
  });
  const tree = new RBush<Segment>();
  tree.load(segments);
  const self = rings.map(() => 0);
  const between = new Map<string, [number, number, number]>();
  for (const s of segments) {
    for (const t of tree.search(s)) {
      // Each pair once, in a fixed order.
      if (t.ring < s.ring || (t.ring === s.ring && t.index <= s.index)) continue;
      if (t.ring === s.ring) {
        const n = lengths[s.ring]!;
        // Neighbours share their common corner, which is no crossing (the closing one too).
        if (t.index === s.index + 1 || (s.index === 0 && t.index === n - 1)) continue;
      }
      if (!segmentsMeet(s, t)) continue;
      if (t.ring === s.ring) self[s.ring]!++;
      else {
        const key = `${s.ring}:${t.ring}`;
        const entry = between.get(key) ?? [s.ring, t.ring, 0];
        entry[2]++;
        between.set(key, entry);
      }
    }
  }
  return { self, between: [...between.values()] };
}

/** Is the point strictly inside the closed ring? (even-odd ray casting; a point on the edge counts as outside) */
export function pointInRing([x, y]: number[], ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i] as [number, number];
    const [xj, yj] = ring[j] as [number, number];
    if (yi > y! !== yj > y! && x! < ((xj - xi) * (y! - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}
