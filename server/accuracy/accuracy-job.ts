import type { Db } from '../db/client';
import { atlasDataVersion } from '../db/data-version';
import { startTsWorker } from '../lib/ts-worker';
import { LARGE_ATLAS_TREES } from '../atlas/tree-snapshot-cache';
import type { ModelAccuracy } from '../../shared/schemas/accuracy';
import { readModelAccuracy, storeModelAccuracy } from './accuracy.repo';

/** How often the job looks whether reports changed. */
export const ACCURACY_CHECK_EVERY_MS = 15 * 60_000;
/** A large atlas is cross-validated at most this often (a run takes minutes there). */
export const LARGE_ATLAS_MIN_INTERVAL_MS = 24 * 60 * 60_000;

/**
 * The model-accuracy job: when the atlas data version moved since the stored figures, recompute
 * them in a worker thread (accuracy.worker.ts) and store them; on a large atlas at most nightly.
 * Returns whether it recomputed.
 */
export async function runModelAccuracy(db: Db, now: Date): Promise<boolean> {
  const version = atlasDataVersion(db);
  const stored = readModelAccuracy(db);
  if (stored && stored.dataVersion === version) return false;
  const large = (db.sqlite.prepare('SELECT count(*) FROM tree_evidence').pluck().get() as number) >= LARGE_ATLAS_TREES;
  if (stored?.computedAt && large && now.getTime() - Date.parse(stored.computedAt) < LARGE_ATLAS_MIN_INTERVAL_MS) return false;
  const worker = startTsWorker<{ computedAt: string }, ModelAccuracy>(new URL('./accuracy.worker.ts', import.meta.url), { file: db.sqlite.name }, 'model accuracy');
  try {
    const body = await worker.request({ computedAt: now.toISOString() });
    storeModelAccuracy(db, body, version);
    return true;
  } finally {
    await worker.close();
  }
}
