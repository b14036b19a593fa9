import type { PinFilters } from '../../shared/schemas/pins';
import type { Db } from '../db/client';
import { atlasDataVersion } from '../db/data-version';
import { createRebuildingCache, type RebuildingCacheSettings } from '../lib/rebuilding-cache';
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

/** A pin index and the data version it was built at (as the answer's `dataVersion`). */
interface PinEntry {
  version: string;
  index: PinIndex;
}

/**
 * `worker: 'auto'` (the default) counts cells in the worker thread for an atlas of
 * `LARGE_ATLAS_REPORTS` or more, or once a build of many cells in the request thread took `SLOW_MS`
 * or more. The demo and the tests stay in the request thread, always fresh.
 */
export type PinCacheOptions = RebuildingCacheSettings;

/**
 * Pin indexes kept in memory per filter set, valid for one atlas data version. A small atlas
 * rebuilds a changed index at once, in the request; a large one counts and clusters its cells in a
 * worker thread (`pin-builder.ts`) with stale-while-rebuilding, at most one rebuild per filter set
 * per `maxStaleMs` (the policy is server/lib/rebuilding-cache.ts).
 */
export function createPinCache(db: Db, options: PinCacheOptions = {}) {
  let lastBuild: BuildStats | undefined;

  const cache = createRebuildingCache<PinFilters, PinEntry, PinBuilder>({
    name: 'pin index',
    version: () => atlasDataVersion(db),
    keyOf: filterKey,
    maxKeys: MAX_CACHED_FILTER_SETS,
    worker: db.sqlite.memory ? false : (options.worker ?? 'auto'),
    startsLarge: () => maxReportId(db) >= LARGE_ATLAS_REPORTS,
    computeHere: (filters) => {
      const started = performance.now();
      // No write can come between these two reads: better-sqlite3 runs each statement to completion.
      const version = atlasDataVersion(db);
      const cells = listPinCells(db, filters);
      const clusterStarted = performance.now();
      const value = { version: String(version), index: pinIndexFromLayers(buildPinLayers(cells)) };
      lastBuild = { where: 'thread', queryMs: clusterStarted - started, clusterMs: performance.now() - clusterStarted, cells: cells.length };
      // Only an atlas with many cells is slow by size; a few cells built slowly mean a busy machine.
      return { version, value, large: cells.length >= SLOW_MIN_CELLS && performance.now() - started >= SLOW_MS };
    },
    startWorker: () => createPinBuilder(db.sqlite.name),
    computeInWorker: async (filters, builder) => {
      const { version, layers, queryMs, clusterMs } = await builder.build(pinCellsQuery(db, filters).toSQL());
      lastBuild = { where: 'worker', queryMs, clusterMs, cells: layers.cellCount };
      return { version, value: { version: String(version), index: pinIndexFromLayers(layers) } };
    },
    maxStaleMs: options.maxStaleMs ?? MAX_STALE_MS,
    now: options.now ?? Date.now,
  });

  return {
    /** The pin index for these filters and the data version it was built at. */
    get: async (filters: PinFilters): Promise<PinEntry> => (await cache.get(filters)).value,
    /** Resolves once no rebuild is running (for tests and benchmarks). */
    settled: cache.settled,
    /** How the last index was built (for the benchmark). */
    lastBuild: () => lastBuild,
    /** Whether cells are now counted in the worker thread. */
    offThread: cache.offThread,
    /** Stop the worker thread, if one was started. */
    close: cache.close,
  };
}

export type PinCache = ReturnType<typeof createPinCache>;
