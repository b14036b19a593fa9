import Supercluster from 'supercluster';
import { describe, expect, it } from 'vitest';
import { buildPinIndex, CLUSTER_MAX_ZOOM, CLUSTER_RADIUS_PX, type GridCell } from '../../server/atlas-pins/pin-index';
import { seededRandom } from '../../server/seed/random';
import { snapToGrid } from '../../shared/domain/public-grid';

const WORLD = { west: -180, south: -85, east: 180, north: 85 };

/** Invented cells around a few towns, each with a few reports (test data, not observations). */
function cellsAround(centres: [number, number][], perTown: number, seed = 7): GridCell[] {
  const random = seededRandom(seed);
  const byKey = new Map<string, GridCell>();
  for (const [lon, lat] of centres) {
    for (let i = 0; i < perTown; i++) {
      const gridLat = snapToGrid(lat + (random() - 0.5) * 0.6);
      const gridLon = snapToGrid(lon + (random() - 0.5) * 0.6);
      const key = `${gridLat},${gridLon}`;
      const cell = byKey.get(key) ?? { gridLat, gridLon, reports: 0, ripened: 0, unripe: 0, reportId: null };
      cell.reports += 1 + Math.floor(random() * 3);
      byKey.set(key, cell);
    }
  }
  return [...byKey.values()];
}

const sum = (features: ReturnType<ReturnType<typeof buildPinIndex>['query']>) => features.reduce((n, f) => n + f.properties.reports, 0);

describe('clustering report cells', () => {
  const cells = cellsAround([[-73.75, 42.65], [-87.91, 43.04], [-0.13, 51.51], [178.4, -18.1]], 60);
  const total = cells.reduce((n, c) => n + c.reports, 0);
  const index = buildPinIndex(cells);

  it('keeps every report counted at every zoom: clusters add up to the whole', () => {
    expect(index.totalReports).toBe(total);
    for (let zoom = 0; zoom <= CLUSTER_MAX_ZOOM + 2; zoom++) expect(sum(index.query(WORLD, zoom)), `zoom ${zoom}`).toBe(total);
  });

  it('groups at low zoom and shows single grid cells when zoomed in', () => {
    const world = index.query(WORLD, 1);
    expect(world.length).toBeLessThan(10);
    expect(world.some((f) => f.properties.kind === 'cluster')).toBe(true);
    const close = index.query(WORLD, CLUSTER_MAX_ZOOM + 1);
    expect(close.every((f) => f.properties.kind === 'cell')).toBe(true);
    expect(close).toHaveLength(cells.length);
  });

  it('puts single cells exactly on public grid centres, never anywhere finer', () => {
    for (const f of index.query(WORLD, CLUSTER_MAX_ZOOM + 1)) {
      const [lon, lat] = f.geometry.coordinates;
      expect(snapToGrid(lon)).toBeCloseTo(lon, 9);
      expect(snapToGrid(lat)).toBeCloseTo(lat, 9);
    }
  });

  it('tells how far to zoom to split a cluster', () => {
    const cluster = index.query(WORLD, 2).find((f) => f.properties.kind === 'cluster')!;
    expect(cluster.properties.kind === 'cluster' && cluster.properties.expansionZoom).toBeGreaterThan(2);
  });

  it('answers a view across the 180th meridian (west > east) with what lies on both sides', () => {
    const fiji = index.query({ west: 170, south: -30, east: -170, north: -10 }, 3);
    expect(sum(fiji)).toBe(cells.filter((c) => c.gridLon > 170 || c.gridLon < -170).reduce((n, c) => n + c.reports, 0));
    expect(sum(fiji)).toBeGreaterThan(0);
  });

  it('answers every view as supercluster itself does (the reference library, queried directly)', () => {
    const reference = new Supercluster<{ reports: number }, { reports: number }>({
      radius: CLUSTER_RADIUS_PX,
      maxZoom: CLUSTER_MAX_ZOOM,
      minPoints: 2,
      map: (p) => ({ reports: p.reports }),
      reduce: (acc, p) => {
        acc.reports += p.reports;
      },
    });
    reference.load(cells.map((c) => ({ type: 'Feature', geometry: { type: 'Point', coordinates: [c.gridLon, c.gridLat] }, properties: { reports: c.reports } })));
    const round = (v: number) => Math.round(v * 1e4) / 1e4;
    const views = [WORLD, { west: -80, south: 40, east: -70, north: 45 }, { west: -74, south: 42.5, east: -73.5, north: 42.8 }, { west: 170, south: -30, east: -170, north: -10 }, { west: -1, south: 51, east: 1, north: 52 }];
    for (const view of views) {
      for (const zoom of [0, 2, 5, 8, CLUSTER_MAX_ZOOM, CLUSTER_MAX_ZOOM + 1, 14]) {
        const expected = reference
          .getClusters([view.west, view.south, view.east, view.north], zoom)
          .map((f) => `${round(f.geometry.coordinates[0]!)},${round(f.geometry.coordinates[1]!)},${f.properties.reports},${'cluster' in f.properties ? f.properties.point_count : 1}`)
          .sort();
        const actual = index
          .query(view, zoom)
          .map((f) => `${f.geometry.coordinates[0]},${f.geometry.coordinates[1]},${f.properties.reports},${f.properties.kind === 'cluster' ? f.properties.cells : 1}`)
          .sort();
        expect(actual, `${JSON.stringify(view)} zoom ${zoom}`).toEqual(expected);
      }
    }
  });

  it('returns nothing for an empty index', () => {
    expect(buildPinIndex([]).query(WORLD, 3)).toEqual([]);
  });
});
