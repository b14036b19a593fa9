import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LARGE_ATLAS_TREES, MAX_STALE_MS, overallByVariety } from '../../server/atlas/overall-cache';
import type { Db } from '../../server/db/client';
import { createTestDb } from '../helpers/test-app';

/*
 * Each variety's overall rate is cached per data version. A small atlas is always answered fresh; a
 * large one (LARGE_ATLAS_TREES trees or more) is re-read at most every MAX_STALE_MS after a change,
 * so a stream of posts does not recompute it for every near request.
 */

let db: Db;
beforeAll(() => {
  db = createTestDb().db;
  db.sqlite.prepare("INSERT INTO varieties (id, name, fig_type, status) VALUES (1, 'Test Amber (fictional)', 'common', 'accepted')").run();
});
afterAll(() => db.sqlite.close());

/** Tree rows written straight into tree_evidence (the triggers' output), `ripened` of each 1 report. */
function addTrees(count: number, ripened: 0 | 1, firstTreeId: number): void {
  const insert = db.sqlite.prepare("INSERT INTO tree_evidence (tree_id, user_id, variety_id, lat, lon, form, reports, ripened, breba_reports, breba_ripened) VALUES (?, 1, 1, 40, -100, 'ground', 1, ?, 0, 0)");
  db.sqlite.transaction(() => {
    for (let i = 0; i < count; i++) insert.run(firstTreeId + i, ripened);
  })();
}
/** Any change to a variety moves the atlas data version. */
const touchCatalogue = () => db.sqlite.prepare("UPDATE varieties SET name = name || '.' WHERE id = 1").run();

describe('overallByVariety', () => {
  it('answers a small atlas fresh after every change', () => {
    addTrees(2, 1, 1);
    expect(overallByVariety(db, 0).get(1)?.share).toBe(1);
    addTrees(2, 0, 3);
    touchCatalogue();
    expect(overallByVariety(db, 1).get(1)?.share).toBe(0.5);
  });

  it('re-reads a large atlas at most every MAX_STALE_MS after a change', () => {
    addTrees(LARGE_ATLAS_TREES, 1, 100);
    touchCatalogue();
    const t0 = 1_000_000;
    const first = overallByVariety(db, t0);
    expect(first.get(1)?.share).toBeCloseTo((LARGE_ATLAS_TREES + 2) / (LARGE_ATLAS_TREES + 4), 9);
    addTrees(100, 0, 100 + LARGE_ATLAS_TREES);
    touchCatalogue();
    // Within the bound the cached figures answer (the 100 new unripe trees are not in yet) ...
    expect(overallByVariety(db, t0 + MAX_STALE_MS - 1)).toBe(first);
    // ... and after it the atlas is read again.
    const later = overallByVariety(db, t0 + MAX_STALE_MS);
    expect(later).not.toBe(first);
    expect(later.get(1)?.share).toBeCloseTo((LARGE_ATLAS_TREES + 2) / (LARGE_ATLAS_TREES + 104), 9);
  });
});
