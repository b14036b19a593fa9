import { secondsSince, snapshotRebuildDuration } from '../ops/metrics';
/*
 * Values computed from the whole atlas (pin indexes, the tree snapshot), kept in memory per key and
 * valid for one data version: checking one costs an O(1) version read per request.
 *
 * A small atlas computes a changed value at once, in the request, so it is always fresh. A large
 * one computes it in a worker thread: the first request for a key waits for that without blocking
 * other requests, and a changed value keeps answering while its replacement is computed
 * (stale-while-rebuilding: at most one computation per key at a time, at most one per `maxStaleMs`,
 * so answers lag writes by at most `maxStaleMs` plus one computation). If the worker fails, that
 * computation is done in the request thread and the next one gets a new worker.
 */

/** A value and the data version it was computed at. */
export interface Versioned<V> {
  version: number;
  value: V;
}

/** What the owner of a rebuilding cache lets its callers choose (tests and benchmarks do). */
export interface RebuildingCacheSettings {
  /** Compute in a worker thread: `true` always (a database file only), `false` never, `'auto'` when the atlas is large. */
  worker?: boolean | 'auto';
  maxStaleMs?: number;
  now?: () => number;
}

export interface RebuildingCacheOptions<K, V, W extends { close: () => Promise<void> }> {
  /** Names the values in log lines ("pin index"). */
  name: string;
  /** The data version now (O(1)). */
  version: () => number;
  /** A key as a string (equal keys, equal strings). */
  keyOf: (key: K) => string;
  /** How many keys are kept (least recently used go first). */
  maxKeys: number;
  /**
   * Compute in a worker thread: `true` always, `false` never, `'auto'` once `startsLarge()` said so
   * at the first request (the tables may not exist before), or a computation in the request thread
   * reported `large`.
   */
  worker: boolean | 'auto';
  startsLarge: () => boolean;
  /** Compute in the request thread; `large`: this computation shows the atlas is large. */
  computeHere: (key: K) => Versioned<V> & { large?: boolean };
  /** Starts the worker thread, at the first computation there (and again after it failed). */
  startWorker: () => W;
  computeInWorker: (key: K, worker: W) => Promise<Versioned<V>>;
  maxStaleMs: number;
  now: () => number;
}

interface Entry<V> extends Versioned<V> {
  /** When the computation of this value started (`now()`). */
  readAt: number;
}

export function createRebuildingCache<K, V, W extends { close: () => Promise<void> }>(options: RebuildingCacheOptions<K, V, W>) {
  const { keyOf, maxStaleMs, now } = options;
  let offThread: boolean | undefined = options.worker === 'auto' ? undefined : options.worker;
  const entries = new Map<string, Entry<V>>();
  const computing = new Map<string, Promise<Entry<V>>>();
  let worker: W | undefined;

  const store = (id: string, entry: Entry<V>): Entry<V> => {
    // Re-inserting keeps the map in least-recently-used order.
    entries.delete(id);
    entries.set(id, entry);
    while (entries.size > options.maxKeys) entries.delete(entries.keys().next().value!);
    return entry;
  };

  const computeHere = (id: string, key: K): Entry<V> => {
    const readAt = now();
    const start = performance.now();
    const { version, value, large } = options.computeHere(key);
    snapshotRebuildDuration.observe({ cache: options.name, thread: 'request' }, secondsSince(start));
    if (large && options.worker !== false) offThread = true;
    return store(id, { version, value, readAt });
  };

  const computeInWorker = (id: string, key: K): Promise<Entry<V>> => {
    const inFlight = computing.get(id);
    if (inFlight) return inFlight;
    const readAt = now();
    worker ??= options.startWorker();
    const start = performance.now();
    const promise = options
      .computeInWorker(key, worker)
      .then(({ version, value }) => {
        snapshotRebuildDuration.observe({ cache: options.name, thread: 'worker' }, secondsSince(start));
        return store(id, { version, value, readAt });
      })
      .catch((error: unknown) => {
        console.error(`The ${options.name} worker thread failed; computing it in the request thread:`, error);
        void worker?.close();
        worker = undefined;
        return computeHere(id, key);
      })
      .finally(() => computing.delete(id));
    computing.set(id, promise);
    return promise;
  };

  return {
    /** The value for `key` at the current data version, or on a large atlas one at most `maxStaleMs` (plus a computation) old. */
    async get(key: K): Promise<Versioned<V>> {
      const version = options.version();
      const id = keyOf(key);
      const hit = entries.get(id);
      if (hit && hit.version === version) return store(id, hit);
      offThread ??= options.startsLarge();
      if (!offThread) return computeHere(id, key);
      if (!hit) return computeInWorker(id, key);
      if (now() - hit.readAt >= maxStaleMs) {
        computeInWorker(id, key).catch((error: unknown) => console.error(`Recomputing the ${options.name} failed:`, error));
      }
      return store(id, hit);
    },
    /** Resolves once no computation is running (for tests and benchmarks). */
    async settled(): Promise<void> {
      while (computing.size > 0) await Promise.allSettled([...computing.values()]);
    },
    /** Whether values are now computed in the worker thread. */
    offThread: () => offThread === true,
    /** Stop the worker thread, if one was started. */
    async close(): Promise<void> {
      await worker?.close();
      worker = undefined;
    },
  };
}
