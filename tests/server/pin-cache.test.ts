import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, migrateDb } from '../../server/db/client';
import { createPinCache, LARGE_ATLAS_REPORTS } from '../../server/atlas-pins/pin-cache';
import { listPinCells } from '../../server/atlas-pins/pins.repo';
import { reports, trees, users, varieties } from '../../server/db/schema';
import { snapToGrid } from '../../shared/domain/public-grid';
import type { PinFilters } from '../../shared/schemas/pins';
import { createTestDb } from '../helpers/test-app';

const { db } = createTestDb();
const WORLD = { west: -180, south: -85, east: 180, north: 85 };
const caches: ReturnType<typeof createPinCache>[] = [];
const cacheFor = (...args: Parameters<typeof createPinCache>) => {
  const cache = createPinCache(...args);
  caches.push(cache);
  return cache;
};
afterAll(async () => {
  for (const cache of caches) await cache.close();
});

let userId: number;
let commonId: number;
let smyrnaId: number;

/** An invented report at an invented spot (test data). */
function addReport(lat: number, lon: number, values: Partial<typeof reports.$inferInsert> = {}): number {
  const treeId = db.insert(trees).values({ userId, label: 'cache tree' }).returning().get().id;
  return db
    .insert(reports)
    .values({ userId, treeId, varietyId: commonId, lat, lon, gridLat: snapToGrid(lat), gridLon: snapToGrid(lon), form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', ...values })
    .returning()
    .get().id;
}

beforeAll(() => {
  userId = db.insert(users).values({ email: 'pin-cache@example.com', displayName: 'Pins', passwordHash: 'x' }).returning().get().id;
  commonId = db.insert(varieties).values({ name: 'Cache Common', figType: 'common', isFictional: true }).returning().get().id;
  smyrnaId = db.insert(varieties).values({ name: 'Cache Smyrna', figType: 'smyrna', isFictional: true }).returning().get().id;
  addReport(42.652, -73.757);
  addReport(42.653, -73.751, { crop: 'breba', season: 2022 });
  addReport(43.04, -87.91, { varietyId: smyrnaId, outcome: 'dropped' });
  addReport(51.509, -0.128, { form: 'container', season: 2023 });
  addReport(42.66, -73.77, { status: 'hidden' });
});

const total = (entry: { index: { totalReports: number } }) => entry.index.totalReports;

describe('pin cache with cells counted in a worker thread', () => {
  it('answers the same cells and totals as the request thread, for every filter', async () => {
    const cache = cacheFor(db, { worker: true });
    const filterSets: PinFilters[] = [{}, { crop: 'breba' }, { figType: 'smyrna' }, { figType: 'common', seasonFrom: 2023 }, { varietyId: commonId, form: 'container' }, { outcome: 'dropped' }, { seasonFrom: 2022, seasonTo: 2023 }];
    for (const filters of filterSets) {
      const entry = await cache.get(filters);
      expect(cache.lastBuild()?.where).toBe('worker');
      const expected = listPinCells(db, filters);
      expect(total(entry), JSON.stringify(filters)).toBe(expected.reduce((n, c) => n + c.reports, 0));
      // Every position is a public grid cell centre; a cell with one report links to it.
      const cells = entry.index.query(WORLD, 14).map((f) => ({ lon: f.geometry.coordinates[0], lat: f.geometry.coordinates[1], ...f.properties }));
      expect(cells).toHaveLength(expected.length);
      for (const cell of expected) expect(cells).toContainEqual({ lon: cell.gridLon, lat: cell.gridLat, kind: 'cell', reports: cell.reports, ripened: cell.ripened, unripe: cell.unripe, reportId: cell.reportId });
    }
    expect(total(await cache.get({}))).toBe(4);
  });

  it('keeps answering from the old index while the new one is built, then answers fresh', async () => {
    const cache = cacheFor(db, { worker: true, maxStaleMs: 0 });
    const before = await cache.get({});
    const id = addReport(-33.87, 151.21);
    const during = await cache.get({});
    expect(during.version).toBe(before.version);
    expect(total(during)).toBe(total(before));
    await cache.settled();
    const after = await cache.get({});
    expect(after.version).not.toBe(before.version);
    expect(total(after)).toBe(total(before) + 1);
    db.delete(reports).where(eq(reports.id, id)).run();
    await cache.get({});
    await cache.settled();
    expect(total(await cache.get({}))).toBe(total(before));
  });

  it('rebuilds a changed index at most once per staleness bound', async () => {
    let clock = 1_000_000;
    const cache = cacheFor(db, { worker: true, maxStaleMs: 5_000, now: () => clock });
    const first = await cache.get({});
    const id = addReport(-37.81, 144.96);
    clock += 4_999;
    expect((await cache.get({})).version).toBe(first.version);
    await cache.settled();
    expect((await cache.get({})).version).toBe(first.version); // no rebuild was started within the bound
    clock += 1;
    expect((await cache.get({})).version).toBe(first.version); // the rebuild starts now...
    await cache.settled();
    const fresh = await cache.get({});
    expect(total(fresh)).toBe(total(first) + 1); // ...and its index answers once built
    db.delete(reports).where(eq(reports.id, id)).run();
  });

  it('waits for the worker on the first request of a filter set and builds each set once at a time', async () => {
    const cache = cacheFor(db, { worker: true });
    const [a, b] = await Promise.all([cache.get({ crop: 'main' }), cache.get({ crop: 'main' })]);
    expect(a).toBe(b);
    expect(total(a)).toBe(3);
  });
});

describe('pin cache on a small atlas', () => {
  it('builds in the request thread and always answers fresh', async () => {
    const cache = cacheFor(db);
    const before = await cache.get({});
    expect(cache.lastBuild()?.where).toBe('thread');
    expect(cache.offThread()).toBe(false);
    const id = addReport(35.68, 139.69);
    expect(total(await cache.get({}))).toBe(total(before) + 1);
    db.delete(reports).where(eq(reports.id, id)).run();
    expect(total(await cache.get({}))).toBe(total(before));
  });

  it('takes a large atlas (by its highest report id) to the worker from the first request', async () => {
    const large = createTestDb().db;
    const u = large.insert(users).values({ email: 'large@example.com', displayName: 'Large', passwordHash: 'x' }).returning().get().id;
    const t = large.insert(trees).values({ userId: u, label: 'large tree' }).returning().get().id;
    large.insert(reports).values({ id: LARGE_ATLAS_REPORTS, userId: u, treeId: t, lat: 1, lon: 1, gridLat: 1, gridLon: 1, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened' }).run();
    const cache = cacheFor(large);
    expect(total(await cache.get({}))).toBe(1);
    expect(cache.lastBuild()?.where).toBe('worker');
    expect(cacheFor(db).offThread()).toBe(false);
  });

  it('never starts a worker for an in-memory database', async () => {
    const memory = createDb(':memory:');
    migrateDb(memory);
    const cache = cacheFor(memory, { worker: true });
    expect(total(await cache.get({}))).toBe(0);
    expect(cache.lastBuild()?.where).toBe('thread');
    memory.sqlite.close();
  });
});
