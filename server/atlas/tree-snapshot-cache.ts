import type { Db } from '../db/client';
import { atlasDataVersion } from '../db/data-version';
import { createRebuildingCache, type RebuildingCacheSettings } from '../lib/rebuilding-cache';
import { startTsWorker, type TsWorker } from '../lib/ts-worker';
import { readTreeSnapshot, treeSnapshotFrom, type TreeSnapshot, type TreeSnapshotData } from './tree-snapshot';

/**
 * On a large atlas, a snapshot whose data changed is re-read at most once per this many
 * milliseconds (counted from the start of its last read), and meanwhile keeps answering: the
 * regional figures lag writes by at most this plus one read (about 3 s at a million reports).
 * A small atlas (the demo, the tests) is always answered fresh.
 */
export const MAX_STALE_MS = 5_000;
/** An atlas with this many tree rows or more reads its snapshots in a worker thread. */
export const LARGE_ATLAS_TREES = 10_000;

/** `worker: 'auto'` (the default) reads snapshots in the worker thread for an atlas of `LARGE_ATLAS_TREES` tree rows or more. */
export type TreeSnapshotCacheOptions = RebuildingCacheSettings;

/**
 * The atlas's tree snapshot (tree-snapshot.ts), kept for one data version. A small atlas re-reads a
 * changed snapshot at once, in the request (a few milliseconds for the demo); a large one reads it
 * in a worker thread with stale-while-rebuilding, at most once per `maxStaleMs` (the policy is
 * server/lib/rebuilding-cache.ts). An atlas that grows large while the server runs moves its later
 * reads to the worker.
 */
export function createTreeSnapshotCache(db: Db, options: TreeSnapshotCacheOptions = {}) {
  const cache = createRebuildingCache<null, TreeSnapshot, TsWorker<null, TreeSnapshotData>>({
    name: 'tree snapshot',
    version: () => atlasDataVersion(db),
    keyOf: () => 'all',
    maxKeys: 1,
    worker: db.sqlite.memory ? false : (options.worker ?? 'auto'),
    startsLarge: () => (db.sqlite.prepare('SELECT count(*) FROM tree_evidence').pluck().get() as number) >= LARGE_ATLAS_TREES,
    computeHere: () => {
      const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
      return { version: snapshot.version, value: snapshot, large: snapshot.columns.count >= LARGE_ATLAS_TREES };
    },
    startWorker: () => startTsWorker<null, TreeSnapshotData>(new URL('./tree-snapshot.worker.ts', import.meta.url), { file: db.sqlite.name }, 'tree snapshot reader'),
    computeInWorker: async (_key, reader) => {
      const snapshot = treeSnapshotFrom(await reader.request(null));
      return { version: snapshot.version, value: snapshot };
    },
    maxStaleMs: options.maxStaleMs ?? MAX_STALE_MS,
    now: options.now ?? Date.now,
  });

  return {
    /** The snapshot of the current data version, or on a large atlas one at most `maxStaleMs` (plus a read) old. */
    get: async (): Promise<TreeSnapshot> => (await cache.get(null)).value,
    /** Resolves once no read is running (for tests and benchmarks). */
    settled: cache.settled,
    /** Whether snapshots are now read in the worker thread. */
    offThread: cache.offThread,
    /** Stop the worker thread, if one was started. */
    close: cache.close,
  };
}

export type TreeSnapshotCache = ReturnType<typeof createTreeSnapshotCache>;
