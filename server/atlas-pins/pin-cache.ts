import type { PinFilters } from '../../shared/schemas/pins';
import type { Db } from '../db/client';
import { atlasDataVersion } from '../db/data-version';
import { createPinBuilder, type PinBuilder } from './pin-builder';
import { buildPinLayers, pinIndexFromLayers, type PinIndex } from './pin-index';
import { listPinCells, maxReportId, pinCellsQuery } from './pins.repo';

const MAX_CACHED_FILTER_SETS = 24;

/**
 * On a large atlas, an index whose data changed is rebuilt at most once per this many milliseconds
 * (counted from the start of its last build), and meanwhile keeps answering: pins lag writes by at
 * most this plus one rebuild. A small atlas (the demo, the tests) is always answered fresh.
 */
export const MAX_STALE_MS = 5_000;
/** A build in the request thread slower than this, of at least `SLOW_MIN_CELLS` cells, marks a large atlas. */
export const SLOW_MS = 50;
const SLOW_MIN_CELLS = 1_000;
/** An atlas with this many reports (by the highest id) is large from its first build on. */
export const LARGE_ATLAS_REPORTS = 20_000;

/** A filter set as a stable cache key. */
export function filterKey(filters: PinFilters): string {
  const entries = Object.entries(filters).filter(([, v]) => v !== undefined);
  return JSON.stringify(entries.sort(([a], [b]) => a.localeCompare(b)));
}

export interface BuildStats {
  /** 'thread': built in the request thread (blocking it); 'worker': built in the worker thread. */
  where: 'thread' | 'worker';
  /** Milliseconds counting the cells (SQL) took. */
  queryMs: number;
  /** Milliseconds clustering them and laying out every zoom took. */
  clusterMs: number;
  cells: number;
}

interface Entry {
  version: string;
  index: PinIndex;
  /** When the data it holds was read (Date.now()). */
  readAt: number;
}

export interface PinCacheOptions {
  /**
   * Count cells in a worker thread: `true` always (a database file only), `false` never,
   * `'auto'` (the default) for an atlas of `LARGE_ATLAS_REPORTS` or more, or once a build of many
   * cells in the request thread took `SLOW_MS` or more. The demo and the tests stay in the request
   * thread, always fresh.
   */
  worker?: boolean | 'auto';
  maxStaleMs?: number;
  now?: () => number;
}

/**
 * Pin indexes kept in memory per filter set, valid for one atlas data version (an O(1) read per
 * request). A small atlas rebuilds a changed index at once, in the request. A large atlas counts and
 * clusters its cells in a worker thread (`pin-builder.ts`): the first request for a filter set waits
 * for that without blocking other requests, and a changed index keeps answering while its
 * replacement is built (stale-while-rebuilding: at most one rebuild per filter set at a time, at
 * most one per `maxStaleMs`, so pins lag writes by at most `maxStaleMs` plus one rebuild).
 */
export function createPinCache(db: Db, options: PinCacheOptions = {}) {
  const maxStaleMs = options.maxStaleMs ?? MAX_STALE_MS;
  const now = options.now ?? Date.now;
  const canUseWorker = !db.sqlite.memory && options.worker !== false;
  // Decided at the first request (the tables may not exist yet when the cache is made).
  let offThread: boolean | undefined = canUseWorker ? (options.worker === true ? true : undefined) : false;
  let builder: PinBuilder | undefined;
  const indexes = new Map<string, Entry>();
  const building = new Map<string, Promise<Entry>>();
  let lastBuild: BuildStats | undefined;

  const store = (key: string, entry: Entry): Entry => {
    // Re-inserting keeps the map in least-recently-used order.
    indexes.delete(key);
    indexes.set(key, entry);
    while (indexes.size > MAX_CACHED_FILTER_SETS) indexes.delete(indexes.keys().next().value!);
    return entry;
  };

  const buildHere = (key: string, filters: PinFilters): Entry => {
    const readAt = now();
    const started = performance.now();
    // No write can come between these two reads: better-sqlite3 runs each statement to completion.
    const version = atlasDataVersion(db);
    const cells = listPinCells(db, filters);
    const clusterStarted = performance.now();
    const index = pinIndexFromLayers(buildPinLayers(cells));
    lastBuild = { where: 'thread', queryMs: clusterStarted - started, clusterMs: performance.now() - clusterStarted, cells: cells.length };
    // Only an atlas with many cells is slow by size; a few cells built slowly mean a busy machine.
    if (canUseWorker && cells.length >= SLOW_MIN_CELLS && performance.now() - started >= SLOW_MS) offThread = true;
    return store(key, { version: String(version), index, readAt });
  };

  const buildOffThread = (key: string, filters: PinFilters): Promise<Entry> => {
    const inFlight = building.get(key);
    if (inFlight) return inFlight;
    const readAt = now();
    builder ??= createPinBuilder(db.sqlite.name);
    const promise = builder
      .build(pinCellsQuery(db, filters).toSQL())
      .then(({ version, layers, queryMs, clusterMs }) => {
        lastBuild = { where: 'worker', queryMs, clusterMs, cells: layers.cellCount };
        return store(key, { version: String(version), index: pinIndexFromLayers(layers), readAt });
      })
      .catch((error: unknown) => {
        // A failed worker is replaced at the next build; this one is done in the request thread.
        console.error('The pin builder thread failed; building the pin index in the request thread:', error);
        void builder?.close();
        builder = undefined;
        return buildHere(key, filters);
      })
      .finally(() => building.delete(key));
    building.set(key, promise);
    return promise;
  };

  return {
    /** The pin index for these filters and the data version it was built at. */
    async get(filters: PinFilters): Promise<{ version: string; index: PinIndex }> {
      const version = String(atlasDataVersion(db));
      const key = filterKey(filters);
      const hit = indexes.get(key);
      if (hit && hit.version === version) return store(key, hit);
      offThread ??= maxReportId(db) >= LARGE_ATLAS_REPORTS;
      if (!offThread) return buildHere(key, filters);
      if (!hit) return buildOffThread(key, filters);
      if (now() - hit.readAt >= maxStaleMs) {
        buildOffThread(key, filters).catch((error: unknown) => console.error('Rebuilding a pin index failed:', error));
      }
      return store(key, hit);
    },
    /** Resolves once no rebuild is running (for tests and benchmarks). */
    async settled(): Promise<void> {
      while (building.size > 0) await Promise.allSettled([...building.values()]);
    },
    /** How the last index was built (for the benchmark). */
    lastBuild: () => lastBuild,
    /** Whether cells are now counted in the worker thread. */
    offThread: () => offThread === true,
    /** Stop the worker thread, if one was started. */
    async close(): Promise<void> {
      await builder?.close();
      builder = undefined;
    },
  };
}

export type PinCache = ReturnType<typeof createPinCache>;
