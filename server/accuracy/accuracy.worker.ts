// The worker thread of the model-accuracy job: cross-validation takes seconds on a large atlas, so
// it runs here, on its own read-only connection, never on the event loop.
import { workerData } from 'node:worker_threads';
import { createDb } from '../db/client';
import { answerRequests } from '../lib/ts-worker';
import { readStationSnapshot } from '../stations/station-snapshot';
import type { ModelAccuracy } from '../../shared/schemas/accuracy';
import { computeModelAccuracy } from './accuracy.compute';

const db = createDb((workerData as { file: string }).file);
db.sqlite.pragma('query_only = ON');

answerRequests<{ computedAt: string }, ModelAccuracy>(({ computedAt }) => ({
  reply: db.sqlite.transaction(() => computeModelAccuracy(db.sqlite, readStationSnapshot(db), computedAt)).deferred(),
}));
