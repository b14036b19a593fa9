import { afterAll, describe, expect, it } from 'vitest';
import type { Db } from '../../server/db/client';
import { createWriteBatcher } from '../../server/db/write-batcher';
import { HttpError } from '../../server/lib/http-error';
import { createTestDb } from '../helpers/test-app';

/*
 * Group commit against a real SQLite file: concurrent writes share one transaction, each in its
 * own savepoint; callers hear back after the shared COMMIT.
 */

const opened: Db[] = [];
afterAll(() => opened.forEach((db) => db.sqlite.close()));

function scratchDb(): Db {
  const { db } = createTestDb();
  opened.push(db);
  db.sqlite.exec(`
    CREATE TABLE parent (id INTEGER PRIMARY KEY);
    CREATE TABLE child (id INTEGER PRIMARY KEY, parent_id INTEGER REFERENCES parent (id) DEFERRABLE INITIALLY DEFERRED, note TEXT NOT NULL);
    INSERT INTO parent (id) VALUES (1);
  `);
  return db;
}

const insertChild = (db: Db, note: string, parentId = 1) => () => Number(db.sqlite.prepare('INSERT INTO child (parent_id, note) VALUES (?, ?)').run(parentId, note).lastInsertRowid);
const notes = (db: Db) => db.sqlite.prepare('SELECT note FROM child ORDER BY id').pluck().all();

/** WAL frames written since the last truncating checkpoint: every commit appends the pages it changed. */
function walFramesSince(db: Db, work: () => Promise<unknown>): Promise<number> {
  db.sqlite.pragma('wal_autocheckpoint = 0');
  db.sqlite.pragma('wal_checkpoint(TRUNCATE)');
  return work().then(() => (db.sqlite.pragma('wal_checkpoint(PASSIVE)') as { log: number }[])[0]!.log);
}

describe('createWriteBatcher', () => {
  it('runs calls made in the same event-loop turn in one transaction and answers each caller', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db);
    const frames = await walFramesSince(db, async () => {
      const ids = await Promise.all(Array.from({ length: 20 }, (_, i) => batcher.run(insertChild(db, `post ${i}`))));
      expect(ids).toHaveLength(20);
    });
    expect(batcher.stats).toEqual({ batches: 1, items: 20 });
    // One commit writes the table's page once; twenty commits would write it twenty times (below).
    expect(frames).toBeLessThanOrEqual(3);

    const alone = createWriteBatcher(db);
    const separateFrames = await walFramesSince(db, async () => {
      for (let i = 0; i < 20; i++) await alone.run(insertChild(db, `alone ${i}`));
    });
    expect(alone.stats).toEqual({ batches: 20, items: 20 });
    expect(separateFrames).toBeGreaterThanOrEqual(20);
    expect(notes(db)).toHaveLength(40);
  });

  it('keeps the order the calls were made in, and gives each caller its own result', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db);
    const results = await Promise.all(Array.from({ length: 10 }, (_, i) => batcher.run(() => ({ i, id: insertChild(db, `post ${i}`)() }))));
    expect(results.map((r) => r.i)).toEqual([...Array(10).keys()]);
    const ids = results.map((r) => r.id);
    expect(ids).toEqual([...ids].sort((a, b) => a - b));
    for (const { i, id } of results) expect(db.sqlite.prepare('SELECT note FROM child WHERE id = ?').pluck().get(id)).toBe(`post ${i}`);
  });

  it('rolls back only the item that throws; the others commit', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db);
    const refused = new HttpError(400, 'invalid_input', 'Please check: treeId', { treeId: ['not yours'] });
    const settled = await Promise.allSettled([
      batcher.run(insertChild(db, 'first')),
      batcher.run(() => {
        // Half of its work is done when it fails: that half must not stay.
        insertChild(db, 'half-written')();
        throw refused;
      }),
      batcher.run(insertChild(db, 'third')),
    ]);
    expect(batcher.stats.batches).toBe(1);
    expect(settled.map((s) => s.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((settled[1] as PromiseRejectedResult).reason).toBe(refused);
    expect(notes(db)).toEqual(['first', 'third']);
  });

  it('fails every item when the COMMIT fails, and stores nothing of the batch', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db);
    // A deferred foreign key is checked at COMMIT: the orphan passes its savepoint, the commit refuses.
    const settled = await Promise.allSettled([batcher.run(insertChild(db, 'good')), batcher.run(insertChild(db, 'orphan', 999)), batcher.run(insertChild(db, 'also good'))]);
    expect(settled.every((s) => s.status === 'rejected')).toBe(true);
    for (const s of settled) expect((s as PromiseRejectedResult).reason).toMatchObject({ code: 'SQLITE_CONSTRAINT_FOREIGNKEY' });
    expect(notes(db)).toEqual([]);
    expect(db.sqlite.inTransaction).toBe(false);
    // The next batch starts afresh.
    await batcher.run(insertChild(db, 'later'));
    expect(notes(db)).toEqual(['later']);
  });

  it('fails the whole batch when SQLite rolls the transaction back under an item (as on SQLITE_FULL)', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db);
    const full = Object.assign(new Error('database or disk is full'), { code: 'SQLITE_FULL' });
    let ranAfter = false;
    const settled = await Promise.allSettled([
      batcher.run(insertChild(db, 'before')),
      batcher.run(() => {
        insertChild(db, 'during')();
        db.sqlite.exec('ROLLBACK'); // what SQLite itself does on some SQLITE_FULL and SQLITE_IOERR errors
        throw full;
      }),
      batcher.run(() => {
        ranAfter = true; // would run in autocommit mode, outside any transaction
        return insertChild(db, 'after')();
      }),
    ]);
    expect(settled.map((s) => (s as PromiseRejectedResult).reason)).toEqual([full, full, full]);
    expect(ranAfter).toBe(false);
    expect(notes(db)).toEqual([]);
  });

  it('fails every item when the transaction cannot begin (a read-only database)', async () => {
    const db = scratchDb();
    db.sqlite.pragma('query_only = ON');
    const batcher = createWriteBatcher(db);
    const settled = await Promise.allSettled([batcher.run(insertChild(db, 'a')), batcher.run(insertChild(db, 'b'))]);
    for (const s of settled) expect((s as PromiseRejectedResult).reason).toMatchObject({ code: expect.stringMatching(/^SQLITE_READONLY/) });
    db.sqlite.pragma('query_only = OFF');
    expect(notes(db)).toEqual([]);
  });

  it('splits more calls than maxItems over several transactions, in order', async () => {
    const db = scratchDb();
    const batcher = createWriteBatcher(db, { maxItems: 4 });
    const ids = await Promise.all(Array.from({ length: 10 }, (_, i) => batcher.run(insertChild(db, `post ${i}`))));
    expect(batcher.stats).toEqual({ batches: 3, items: 10 });
    expect(ids).toEqual([...ids].sort((a, b) => a - b));
    expect(notes(db)).toEqual(Array.from({ length: 10 }, (_, i) => `post ${i}`));
  });
});
