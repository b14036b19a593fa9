import { Router } from 'express';
import { unitPrefsSchema } from '../../shared/domain/units';
import { unitPrefsResponseSchema } from '../../shared/schemas/account-units';
import type { Db } from '../db/client';
import { findUnitPrefs, saveUnitPrefs } from './units.repo';
import { requireSignedIn } from '../middleware/require-role';

/** GET/PUT /api/account/units: the signed-in grower's units (°F/°C, km/mi) and date language. */
export function createUnitsRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireSignedIn);
  router.get('/units', (req, res) => {
    res.json(unitPrefsResponseSchema.parse({ units: findUnitPrefs(db, req.user!.id) }));
  });
  router.put('/units', (req, res) => {
    const units = unitPrefsSchema.parse(req.body);
    saveUnitPrefs(db, req.user!.id, units);
    res.json(unitPrefsResponseSchema.parse({ units }));
  });
  return router;
}
