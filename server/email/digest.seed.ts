import type { Db } from '../db/client';
import { findUserByEmail } from '../users/users.repo';
import { findSubscription, upsertSubscription } from './digest.repo';

/** The demo grower reads the weekly nearby digest (50 km). Idempotent: an existing row is kept as it is. */
export function seedDemoDigest(db: Db): void {
  const grower = findUserByEmail(db, 'grower@demo.syconium.test');
  if (!grower || findSubscription(db, grower.id)) return;
  upsertSubscription(db, grower.id, { active: true, radiusKm: 50 });
}
