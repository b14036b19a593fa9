import type { Db } from '../db/client';
import { findUserByEmail } from '../users/users.repo';
import { findSavedPlaceByName, insertSavedPlace } from './saved-places.repo';

/** The demo grower's home: near Albany, NY, in a container (invented for the demo). */
export const DEMO_HOME_PLACE = { name: 'Home garden (demo)', lat: 42.66, lon: -73.78, form: 'container', isHome: true } as const;

/** Give the demo grower a home place. Idempotent: does nothing when it is already there. */
export function seedDemoSavedPlaces(db: Db): void {
  const grower = findUserByEmail(db, 'grower@demo.syconium.test');
  if (!grower || findSavedPlaceByName(db, grower.id, DEMO_HOME_PLACE.name)) return;
  insertSavedPlace(db, grower.id, DEMO_HOME_PLACE);
}
