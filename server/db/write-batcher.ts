import type { Db } from './client';
import { perDb } from './prepared';
import { writeBatchesTotal, writeBatchItems } from '../ops/metrics';

/*
 * Group commit. Each write transaction ends in a COMMIT that appends every page it touched to the
 * WAL; a report touches many (its indexes, its R*Tree, tree_evidence, data_versions), and under a
 * stream of posts the commits cost as much as the inserts. Writes that arrive in the same
 * event-loop turn are run in ONE transaction instead, each inside its own savepoint:
 *
 * - one item that throws rolls back only its own savepoint and gets its own error; the others commit;
 * - every caller hears back only after the shared COMMIT succeeded (durability as before);
 * - a failure of the transaction itself (BEGIN or COMMIT refused, a full disk or read-only file, or
 *   SQLite rolling the whole transaction back on SQLITE_FULL/IOERR mid-way) fails every item that
 *   had succeeded with that error, and nothing of the batch is stored;
 * - items run in the order they were handed in.
 *
 * The work must be synchronous (better-sqlite3); it runs in the check phase of the event loop
 * (setImmediate), after the requests that arrived in this turn have all been handed in. A batch
 * holds at most `maxItems`; the rest runs in the next turn, so one batch never holds the write
 * lock for long.
 */

export interface WriteBatcher {
  /** Run `work` inside the next shared transaction; resolves with its result once that is committed. */
  run<T>(work: () => T): Promise<T>;
  /** Transactions and items run so far (for tests and figures). */
  readonly stats: { batches: number; items: number };
}

interface Item {
  work: () => unknown;
  resolve: (value: unknown) => void;
  reject: (error: unknown) => void;
}

type Outcome = { ok: true; value: unknown } | { ok: false; error: unknown };

/** Thrown out of the shared transaction when SQLite ended it under an item (e.g. SQLITE_FULL). */
class TransactionLost extends Error {
  constructor(readonly cause: unknown) {
    super('The shared transaction was rolled back by SQLite');
  }
}

export function createWriteBatcher(db: Db, { maxItems = 64 }: { maxItems?: number } = {}): WriteBatcher {
  const { sqlite } = db;
  let queue: Item[] = [];
  let scheduled = false;
  const stats = { batches: 0, items: 0 };

  const flush = () => {
    scheduled = false;
    const batch = queue.slice(0, maxItems);
    queue = queue.slice(maxItems);
    if (queue.length) schedule();
    if (!batch.length) return;

    const outcomes: Outcome[] = [];
    let failure: { error: unknown } | undefined;
    try {
      // better-sqlite3: the outer call begins (IMMEDIATE, like every transaction here) and commits;
      // a nested call is a savepoint, rolled back and released when its function throws.
      sqlite
        .transaction(() => {
          for (const item of batch) {
            try {
              outcomes.push({ ok: true, value: sqlite.transaction(item.work)() });
            } catch (error) {
              outcomes.push({ ok: false, error });
              // SQLite rolls the whole transaction back on some errors (SQLITE_FULL, IOERR, NOMEM):
              // what the earlier items wrote is gone, and later items would run outside any transaction.
              if (!sqlite.inTransaction) throw new TransactionLost(error);
            }
          }
        })
        .immediate();
    } catch (error) {
      failure = { error: error instanceof TransactionLost ? error.cause : error };
    }
    stats.batches++;
    stats.items += batch.length;
    writeBatchesTotal.inc({ outcome: failure ? 'failed' : 'committed' });
    writeBatchItems.observe(batch.length);

    batch.forEach((item, i) => {
      const outcome = outcomes[i];
      // An item that failed on its own keeps its own error (it would have failed alone, too);
      // everything else shares the fate of the transaction.
      if (outcome && !outcome.ok) item.reject(outcome.error);
      else if (failure) item.reject(failure.error);
      else item.resolve(outcome!.value);
    });
  };

  const schedule = () => {
    if (scheduled) return;
    scheduled = true;
    setImmediate(flush);
  };

  return {
    stats,
    run<T>(work: () => T): Promise<T> {
      return new Promise<T>((resolve, reject) => {
        queue.push({ work, resolve: resolve as (value: unknown) => void, reject });
        schedule();
      });
    },
  };
}

/** The batcher of this database: every route that hands work to it shares its transactions. */
export const writeBatcher = perDb((db) => createWriteBatcher(db));
