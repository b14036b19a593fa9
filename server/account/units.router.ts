import { Router } from 'express';
import { eq } from 'drizzle-orm';
import { unitPrefsSchema, type UnitPrefs } from '../../shared/domain/units';
import { unitPrefsResponseSchema } from '../../shared/schemas/account-units';
import type { Db } from '../db/client';
import { users } from '../db/schema';
import { requireSignedIn } from '../middleware/require-role';

/** The grower's saved units and date language; null until they choose (the browser decides meanwhile). */
export function findUnitPrefs(db: Db, userId: number): UnitPrefs | null {
  const row = db.select({ t: users.temperatureUnit, d: users.distanceUnit, l: users.dateLocale }).from(users).where(eq(users.id, userId)).get();
  return row?.t && row.d && row.l ? { temperature: row.t, distance: row.d, locale: row.l } : null;
}

/** GET/PUT /api/account/units: the signed-in grower's units (°F/°C, km/mi) and date language. */
export function createUnitsRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireSignedIn);
  router.get('/units', (req, res) => {
    res.json(unitPrefsResponseSchema.parse({ units: findUnitPrefs(db, req.user!.id) }));
  });
  router.put('/units', (req, res) => {
    const units = unitPrefsSchema.parse(req.body);
    db.update(users)
      .set({ temperatureUnit: units.temperature, distanceUnit: units.distance, dateLocale: units.locale, updatedAt: new Date().toISOString() })
      .where(eq(users.id, req.user!.id))
      .run();
    res.json(unitPrefsResponseSchema.parse({ units }));
  });
  return router;
}
