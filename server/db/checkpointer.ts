import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import type { Db } from './client';

/*
 * WAL checkpoints off the event loop. A checkpoint copies the pages written to the WAL back into the
 * database file and syncs it; SQLite runs one inside whichever commit crosses wal_autocheckpoint, so
 * under a stream of posts every so many writes one request stopped the server for tens of
 * milliseconds. With the checkpointer the server's own connection never checkpoints: a worker
 * thread with its own connection runs PASSIVE checkpoints (they never wait for or block a writer)
 * every `intervalMs`.
 */

// Plain CommonJS: the worker needs only the SQLite driver, found by absolute path.
const WORKER = `
const { parentPort, workerData } = require('node:worker_threads');
const Database = require(workerData.driver);
const db = new Database(workerData.file, { fileMustExist: true });
db.pragma('busy_timeout = 1000');
const checkpoint = () => { try { db.pragma('wal_checkpoint(PASSIVE)'); } catch {} };
const timer = setInterval(checkpoint, workerData.intervalMs);
parentPort.on('message', () => { clearInterval(timer); checkpoint(); db.close(); parentPort.close(); });
`;

export function startCheckpointer(db: Db, intervalMs = 250): { stop: () => Promise<void> } {
  const file = db.sqlite.name;
  if (db.sqlite.memory || !file) return { stop: async () => {} };
  const worker = new Worker(WORKER, { eval: true, workerData: { file, intervalMs, driver: createRequire(import.meta.url).resolve('better-sqlite3') } });
  worker.unref();
  db.sqlite.pragma('wal_autocheckpoint = 0');
  return {
    stop: async () => {
      // Back to checkpoints inside commits, then one last checkpoint by the worker.
      db.sqlite.pragma('wal_autocheckpoint = 1000');
      const exited = new Promise((resolve) => worker.once('exit', resolve));
      worker.postMessage('stop');
      await exited;
    },
  };
}
