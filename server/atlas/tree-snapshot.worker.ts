// The worker thread behind the tree snapshot cache (tree-snapshot-cache.ts): reads every tree row on
// its own read-only connection and hands the columns over without a copy.
import Database from 'better-sqlite3';
import { workerData } from 'node:worker_threads';
import { answerRequests } from '../lib/ts-worker';
import { readTreeSnapshot, type TreeSnapshotData } from './tree-snapshot';

const sqlite = new Database((workerData as { file: string }).file, { fileMustExist: true });
sqlite.pragma('busy_timeout = 5000');
// This connection only reads; in WAL mode it neither waits for the writers nor holds them up.
sqlite.pragma('query_only = ON');

answerRequests<null, TreeSnapshotData>(() => {
  const { data, transfer } = readTreeSnapshot(sqlite);
  return { reply: data, transfer };
});
