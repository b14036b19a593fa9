import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTreeSnapshotCache, LARGE_ATLAS_TREES } from '../../server/atlas/tree-snapshot-cache';
import type { Db } from '../../server/db/client';
import { createTestDb } from '../helpers/test-app';

/*
 * The tree snapshot (every tree row in memory, with each variety's overall figures) is kept per data
 * version. A small atlas is always answered fresh, in the request; a large one is read in a worker
 * thread, and a changed one keeps answering while its replacement is read, at most once per
 * maxStaleMs.
 */

let db: Db;
const caches: ReturnType<typeof createTreeSnapshotCache>[] = [];
const cacheFor = (...args: Parameters<typeof createTreeSnapshotCache>) => {
  const cache = createTreeSnapshotCache(...args);
  caches.push(cache);
  return cache;
};
beforeAll(() => {
  db = createTestDb().db;
  db.sqlite.prepare("INSERT INTO varieties (id, name, fig_type, status) VALUES (1, 'Test Amber (fictional)', 'common', 'accepted')").run();
});
afterAll(async () => {
  for (const cache of caches) await cache.close();
  db.sqlite.close();
});

/** Tree rows written straight into tree_evidence (the triggers' output), `ripened` of each 1 report. */
function addTrees(count: number, ripened: 0 | 1, firstTreeId: number): void {
  const insert = db.sqlite.prepare("INSERT INTO tree_evidence (tree_id, user_id, variety_id, grid_lat, grid_lon, form, reports, ripened, breba_reports, breba_ripened) VALUES (?, 1, 1, 40, -100, 'ground', 1, ?, 0, 0)");
  db.sqlite.transaction(() => {
    for (let i = 0; i < count; i++) insert.run(firstTreeId + i, ripened);
  })();
}
/** Any change to a variety moves the atlas data version (tree_evidence itself has no version trigger). */
const touchCatalogue = () => db.sqlite.prepare("UPDATE varieties SET name = name || '.' WHERE id = 1").run();

describe('tree snapshot cache', () => {
  it('answers a small atlas fresh after every change, in the request', async () => {
    const cache = cacheFor(db);
    addTrees(2, 1, 1);
    touchCatalogue();
    const first = await cache.get();
    expect(first.columns.count).toBe(2);
    expect(first.overall.get(1)?.share).toBe(1);
    expect(await cache.get()).toBe(first); // same version: the same snapshot
    addTrees(2, 0, 3);
    touchCatalogue();
    const second = await cache.get();
    expect(second.overall.get(1)?.share).toBe(0.5);
    expect(cache.offThread()).toBe(false);
  });

  it('moves its reads to the worker thread once a small atlas has grown large', async () => {
    const grown = createTestDb().db;
    grown.sqlite.prepare("INSERT INTO varieties (id, name, fig_type, status) VALUES (1, 'Test Amber (fictional)', 'common', 'accepted')").run();
    const cache = cacheFor(grown);
    expect((await cache.get()).columns.count).toBe(0);
    expect(cache.offThread()).toBe(false);
    const insert = grown.sqlite.prepare("INSERT INTO tree_evidence (tree_id, user_id, variety_id, grid_lat, grid_lon, form, reports, ripened, breba_reports, breba_ripened) VALUES (?, 1, 1, 40, -100, 'ground', 1, 1, 0, 0)");
    grown.sqlite.transaction(() => {
      for (let i = 0; i < LARGE_ATLAS_TREES; i++) insert.run(i + 1);
    })();
    grown.sqlite.prepare("UPDATE varieties SET name = name || '.'").run();
    // This read still happens in the request (the atlas was small); it finds the atlas large, so later reads go to the worker.
    expect((await cache.get()).columns.count).toBe(LARGE_ATLAS_TREES);
    expect(cache.offThread()).toBe(true);
    grown.sqlite.close();
  });

  it('reads a large atlas in a worker thread, and re-reads it at most every maxStaleMs after a change', async () => {
    addTrees(LARGE_ATLAS_TREES, 1, 100);
    touchCatalogue();
    let clock = 1_000_000;
    const cache = cacheFor(db, { maxStaleMs: 5_000, now: () => clock });
    const first = await cache.get();
    expect(cache.offThread()).toBe(true);
    expect(first.columns.count).toBe(LARGE_ATLAS_TREES + 4);
    expect(first.overall.get(1)?.share).toBeCloseTo((LARGE_ATLAS_TREES + 2) / (LARGE_ATLAS_TREES + 4), 9);

    addTrees(100, 0, 100 + LARGE_ATLAS_TREES);
    touchCatalogue();
    // Within the bound the snapshot answers as it is (the 100 new unripe trees are not in yet) ...
    clock += 4_999;
    expect(await cache.get()).toBe(first);
    await cache.settled();
    expect(await cache.get()).toBe(first);
    // ... after it, the old one still answers at once while the new one is read ...
    clock += 1;
    expect(await cache.get()).toBe(first);
    await cache.settled();
    // ... and then the new one answers.
    const later = await cache.get();
    expect(later).not.toBe(first);
    expect(later.columns.count).toBe(LARGE_ATLAS_TREES + 104);
    expect(later.overall.get(1)?.share).toBeCloseTo((LARGE_ATLAS_TREES + 2) / (LARGE_ATLAS_TREES + 104), 9);
  }, 60_000); // a worker thread compiles its TypeScript first: seconds on a busy machine

  it('reads in the request thread when told never to use a worker, whatever the size', async () => {
    touchCatalogue();
    const cache = cacheFor(db, { worker: false });
    expect((await cache.get()).columns.count).toBe(LARGE_ATLAS_TREES + 104);
    expect(cache.offThread()).toBe(false);
  });
});
