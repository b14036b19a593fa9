import { Router } from 'express';
import type { ModelAccuracy } from '../../shared/schemas/accuracy';
import type { Db } from '../db/client';
import { ACCURACY_METHOD } from './accuracy.compute';
import { readModelAccuracy } from './accuracy.repo';

const PENDING: ModelAccuracy = {
  status: 'pending',
  computedAt: null,
  treeSeasons: 0,
  trees: 0,
  growers: 0,
  demoShare: 0,
  scores: null,
  brierSkillScore: null,
  bins: [],
  method: ACCURACY_METHOD,
};

/** GET /api/accuracy: the figures the model-accuracy job last stored (public: scores only, no place). */
export function createAccuracyRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.get('/', (_req, res) => {
    const stored = readModelAccuracy(db);
    if (!stored) return void res.json(PENDING);
    const { dataVersion: _version, ...body } = stored;
    res.json(body);
  });
  return router;
}
