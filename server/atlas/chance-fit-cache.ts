import type { Db } from '../db/client';
import { atlasDataVersion, stationsDataVersion } from '../db/data-version';
import { createRebuildingCache, type RebuildingCacheSettings } from '../lib/rebuilding-cache';
import { startTsWorker, type TsWorker } from '../lib/ts-worker';
import { readStationSnapshot } from '../stations/station-snapshot';
import { chanceFitFrom, chanceFitVersion, computeChanceFit, type ChanceFit, type ChanceFitData } from './chance-fit';
import { LARGE_ATLAS_TREES } from './tree-snapshot-cache';

/**
 * On a large atlas the model is refitted at most once per this many milliseconds (a fit over a
 * million reports takes seconds in the worker); meanwhile the last fit keeps answering.
 */
export const CHANCE_FIT_MAX_STALE_MS = 60_000;

/**
 * The chance model fitted for the current atlas and stations data versions, OFF the request path
 * on a large atlas (the same policy as the tree snapshot: server/lib/rebuilding-cache.ts); the near
 * answer only evaluates it. A small atlas (the demo, tests) is fitted in the request, in a few ms.
 */
export function createChanceFitCache(db: Db, options: RebuildingCacheSettings = {}) {
  const cache = createRebuildingCache<null, ChanceFit, TsWorker<null, ChanceFitData>>({
    name: 'chance model',
    version: () => chanceFitVersion(atlasDataVersion(db), stationsDataVersion(db)),
    keyOf: () => 'all',
    maxKeys: 1,
    worker: db.sqlite.memory ? false : (options.worker ?? 'auto'),
    startsLarge: () => (db.sqlite.prepare('SELECT count(*) FROM tree_evidence').pluck().get() as number) >= LARGE_ATLAS_TREES,
    computeHere: () => {
      const fit = db.sqlite
        .transaction(() => chanceFitFrom(computeChanceFit(db.sqlite, readStationSnapshot(db), chanceFitVersion(atlasDataVersion(db), stationsDataVersion(db))).data))
        .deferred();
      return { version: fit.version, value: fit, large: fit.columns.count >= LARGE_ATLAS_TREES };
    },
    startWorker: () => startTsWorker<null, ChanceFitData>(new URL('./chance-fit.worker.ts', import.meta.url), { file: db.sqlite.name }, 'chance model fitter'),
    computeInWorker: async (_key, fitter) => {
      const fit = chanceFitFrom(await fitter.request(null));
      return { version: fit.version, value: fit };
    },
    maxStaleMs: options.maxStaleMs ?? CHANCE_FIT_MAX_STALE_MS,
    now: options.now ?? Date.now,
  });
  let fitted = false;
  const get = async (): Promise<ChanceFit> => {
    const fit = (await cache.get(null)).value;
    fitted = true;
    return fit;
  };
  return {
    get,
    /**
     * The fit, or null while a large atlas's first fit runs in the worker (seconds to a minute after
     * a start): the near answer then says the chance is not computed yet rather than wait for it.
     */
    current: async (): Promise<ChanceFit | null> => {
      if (fitted) return get();
      // get() decides synchronously where it computes (offThread is settled when it returns).
      const pending = get();
      if (!cache.offThread()) return pending;
      pending.catch((error: unknown) => console.error('Fitting the chance model failed:', error));
      return Promise.race([pending, new Promise<null>((resolve) => setImmediate(() => resolve(null)))]);
    },
    settled: cache.settled,
    close: cache.close,
  };
}

export type ChanceFitCache = ReturnType<typeof createChanceFitCache>;
