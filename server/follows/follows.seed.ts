import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { varieties } from '../db/schema';
import { findUserByEmail } from '../users/users.repo';
import { followPlace, followVariety, listFollows } from './follows.repo';

/** The demo grower follows a fictional variety and a second place (invented for the demo). */
export const DEMO_FOLLOWED_VARIETY = 'Northgate Violet';
export const DEMO_FOLLOWED_PLACE = { name: 'Boston allotment (demo)', lat: 42.36, lon: -71.06 } as const;

/** Idempotent: nothing happens once the demo grower follows anything. */
export function seedDemoFollows(db: Db): void {
  const grower = findUserByEmail(db, 'grower@demo.syconium.test');
  if (!grower) return;
  const existing = listFollows(db, grower.id);
  if (existing.varieties.length || existing.places.length) return;
  const variety = db.select({ id: varieties.id }).from(varieties).where(eq(sql`lower(${varieties.name})`, DEMO_FOLLOWED_VARIETY.toLowerCase())).get();
  if (variety) followVariety(db, grower.id, variety.id);
  followPlace(db, grower.id, DEMO_FOLLOWED_PLACE);
}
