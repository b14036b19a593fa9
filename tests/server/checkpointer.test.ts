import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { startCheckpointer } from '../../server/db/checkpointer';
import { createTestDb } from '../helpers/test-app';

/*
 * The checkpointer moves WAL checkpoints off the event loop: the server's connection stops
 * checkpointing inside commits, and a worker thread copies committed pages into the database file.
 */
describe('startCheckpointer', { timeout: 60_000 }, () => {
  it('copies committed pages into the database file from its own thread, and hands checkpoints back on stop', async () => {
    const { db, file } = createTestDb();
    const checkpointer = startCheckpointer(db, 50);
    expect(db.sqlite.pragma('wal_autocheckpoint', { simple: true })).toBe(0);
    const before = fs.statSync(file).size;
    db.sqlite.exec('CREATE TABLE filler (text TEXT)');
    const insert = db.sqlite.prepare('INSERT INTO filler VALUES (?)');
    db.sqlite.transaction(() => {
      for (let i = 0; i < 2_000; i++) insert.run('x'.repeat(1_000));
    })();
    // About 2 MB committed to the WAL; the main connection never checkpoints, yet the file grows.
    await expect.poll(() => fs.statSync(file).size, { timeout: 30_000, interval: 100 }).toBeGreaterThan(before + 1_500_000);
    await checkpointer.stop();
    expect(db.sqlite.pragma('wal_autocheckpoint', { simple: true })).toBe(1000);
    expect(db.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
    db.sqlite.close();
  });

  it('does nothing for an in-memory database', async () => {
    const { createDb } = await import('../../server/db/client');
    const db = createDb(':memory:');
    const checkpointer = startCheckpointer(db);
    expect(db.sqlite.pragma('wal_autocheckpoint', { simple: true })).toBe(1000);
    await checkpointer.stop();
    db.sqlite.close();
  });
});
