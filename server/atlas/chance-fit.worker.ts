// The worker thread behind the chance fit cache (chance-fit-cache.ts): reads the reports on its own
// read-only connection, fits the model and hands the result over without a copy.
import { workerData } from 'node:worker_threads';
import { createDb } from '../db/client';
import { atlasDataVersion, stationsDataVersion } from '../db/data-version';
import { answerRequests } from '../lib/ts-worker';
import { readStationSnapshot } from '../stations/station-snapshot';
import { chanceFitVersion, computeChanceFit, type ChanceFitData } from './chance-fit';

const db = createDb((workerData as { file: string }).file);
db.sqlite.pragma('query_only = ON');

answerRequests<null, ChanceFitData>(() => {
  const { data, transfer } = db.sqlite.transaction(() => {
    const version = chanceFitVersion(atlasDataVersion(db), stationsDataVersion(db));
    return computeChanceFit(db.sqlite, readStationSnapshot(db), version);
  }).deferred();
  return { reply: data, transfer };
});
