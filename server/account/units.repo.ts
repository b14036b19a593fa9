import { eq } from 'drizzle-orm';
import type { UnitPrefs } from '../../shared/domain/units';
import type { Db } from '../db/client';
import { users } from '../db/schema';

/** The grower's saved units and date language; null until they choose (the browser decides meanwhile). */
export function findUnitPrefs(db: Db, userId: number): UnitPrefs | null {
  const row = db.select({ t: users.temperatureUnit, d: users.distanceUnit, l: users.dateLocale }).from(users).where(eq(users.id, userId)).get();
  return row?.t && row.d && row.l ? { temperature: row.t, distance: row.d, locale: row.l } : null;
}


export function saveUnitPrefs(db: Db, userId: number, units: UnitPrefs): void {
  db.update(users).set({ temperatureUnit: units.temperature, distanceUnit: units.distance, dateLocale: units.locale, updatedAt: new Date().toISOString() }).where(eq(users.id, userId)).run();
}
