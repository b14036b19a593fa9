// The worker thread behind `createPinBuilder` (pin-builder.ts): counts pin cells on its own
// connection to the database file and clusters them, off the server's event loop.
import Database from 'better-sqlite3';
import { workerData } from 'node:worker_threads';
import { atlasDataVersion } from '../db/data-version';
import { answerRequests } from '../lib/ts-worker';
import { buildPinLayers, toGridCell } from './pin-index';
import type { BuildRequest, PinBuild } from './pin-builder';

const sqlite = new Database((workerData as { file: string }).file, { fileMustExist: true });
sqlite.pragma('busy_timeout = 5000');
// This connection only reads; in WAL mode it neither waits for the writers nor holds them up.
sqlite.pragma('query_only = ON');
const statements = new Map<string, Database.Statement>();
// One read transaction: the version returned is exactly that of the counted rows.
const read = sqlite.transaction((statement: Database.Statement, params: unknown[]) => ({
  version: atlasDataVersion({ sqlite }),
  rows: statement.all(...params) as [number, number, number, number, number, number][],
}));

answerRequests<BuildRequest, PinBuild>(({ sql, params }) => {
  const started = performance.now();
  let statement = statements.get(sql);
  if (!statement) statements.set(sql, (statement = sqlite.prepare(sql).raw()));
  const { version, rows } = read(statement, params);
  const cells = rows.map(([gridLat, gridLon, reports, firstId, ripened, unripe]) => toGridCell(gridLat, gridLon, reports, firstId, ripened, unripe));
  const clusterStarted = performance.now();
  const layers = buildPinLayers(cells);
  return {
    reply: { version, layers, queryMs: clusterStarted - started, clusterMs: performance.now() - clusterStarted },
    transfer: layers.zooms.map((zoom) => zoom.buffer as ArrayBuffer),
  };
});
