import type { Db } from '../db/client';
import { atlasDataVersion } from '../db/data-version';
import { startTsWorker, type TsWorker } from '../lib/ts-worker';
import { readTreeSnapshot, treeSnapshotFrom, type TreeSnapshot, type TreeSnapshotData } from './tree-snapshot';

/**
 * On a large atlas, a snapshot whose data changed is re-read at most once per this many
 * milliseconds (counted from the start of its last read), and meanwhile keeps answering: the
 * regional figures lag writes by at most this plus one read (about a second at a million reports).
 * A small atlas (the demo, the tests) is always answered fresh.
 */
export const MAX_STALE_MS = 5_000;
/** An atlas with this many tree rows or more reads its snapshots in a worker thread. */
export const LARGE_ATLAS_TREES = 10_000;

export interface TreeSnapshotCacheOptions {
  /**
   * Read snapshots in a worker thread: `true` always (a database file only), `false` never,
   * `'auto'` (the default) for an atlas of `LARGE_ATLAS_TREES` tree rows or more.
   */
  worker?: boolean | 'auto';
  maxStaleMs?: number;
  now?: () => number;
}

/**
 * The atlas's tree snapshot (tree-snapshot.ts), kept for one data version (an O(1) check per
 * request). A small atlas re-reads a changed snapshot at once, in the request (a few milliseconds
 * for the demo). A large atlas reads it in a worker thread: the first request waits for that without
 * blocking others, and a changed snapshot keeps answering while its replacement is read
 * (stale-while-rebuilding: one read at a time, at most one per `maxStaleMs`).
 */
export function createTreeSnapshotCache(db: Db, options: TreeSnapshotCacheOptions = {}) {
  const maxStaleMs = options.maxStaleMs ?? MAX_STALE_MS;
  const now = options.now ?? Date.now;
  const canUseWorker = !db.sqlite.memory && options.worker !== false;
  // Decided at the first request (the tables may not exist yet when the cache is made).
  let offThread: boolean | undefined = canUseWorker ? (options.worker === true ? true : undefined) : false;
  let reader: TsWorker<null, TreeSnapshotData> | undefined;
  let current: { snapshot: TreeSnapshot; readAt: number } | undefined;
  let reading: Promise<TreeSnapshot> | undefined;

  const readHere = (): TreeSnapshot => {
    current = { snapshot: treeSnapshotFrom(readTreeSnapshot(db.sqlite).data), readAt: now() };
    // An atlas that has grown large while the server runs moves its next reads off the event loop.
    if (canUseWorker && options.worker !== false && current.snapshot.columns.count >= LARGE_ATLAS_TREES) offThread = true;
    return current.snapshot;
  };

  const readOffThread = (): Promise<TreeSnapshot> => {
    if (reading) return reading;
    const readAt = now();
    reader ??= startTsWorker<null, TreeSnapshotData>(new URL('./tree-snapshot.worker.ts', import.meta.url), { file: db.sqlite.name }, 'tree snapshot reader');
    reading = reader
      .request(null)
      .then((data) => {
        current = { snapshot: treeSnapshotFrom(data), readAt };
        return current.snapshot;
      })
      .catch((error: unknown) => {
        // A failed worker is replaced at the next read; this one is done in the request thread.
        console.error('The tree snapshot thread failed; reading the snapshot in the request thread:', error);
        void reader?.close();
        reader = undefined;
        return readHere();
      })
      .finally(() => (reading = undefined));
    return reading;
  };

  return {
    /** The snapshot of the current data version, or on a large atlas one at most `maxStaleMs` (plus a read) old. */
    async get(): Promise<TreeSnapshot> {
      const version = atlasDataVersion(db);
      if (current?.snapshot.version === version) return current.snapshot;
      offThread ??= (db.sqlite.prepare('SELECT count(*) FROM tree_evidence').pluck().get() as number) >= LARGE_ATLAS_TREES;
      if (!offThread) return readHere();
      if (!current) return readOffThread();
      if (now() - current.readAt >= maxStaleMs) readOffThread().catch((error: unknown) => console.error('Re-reading the tree snapshot failed:', error));
      return current.snapshot;
    },
    /** Resolves once no read is running (for tests and benchmarks). */
    async settled(): Promise<void> {
      while (reading) await reading.catch(() => undefined);
    },
    /** Whether snapshots are now read in the worker thread. */
    offThread: () => offThread === true,
    /** Stop the worker thread, if one was started. */
    async close(): Promise<void> {
      await reader?.close();
      reader = undefined;
    },
  };
}

export type TreeSnapshotCache = ReturnType<typeof createTreeSnapshotCache>;
