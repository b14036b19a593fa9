import { and, asc, desc, eq } from 'drizzle-orm';
import type { SavedPlace, SavedPlaceInput, SavedPlacePatch } from '../../shared/schemas/saved-places';
import type { Db } from '../db/client';
import { savedPlaces } from '../db/schema';

type Row = typeof savedPlaces.$inferSelect;

const toSavedPlace = (row: Row): SavedPlace => ({ id: row.id, name: row.name, lat: row.lat, lon: row.lon, form: row.form, isHome: row.isHome });

/** A grower's places, home first, then newest first. */
export function listSavedPlaces(db: Db, userId: number): SavedPlace[] {
  return db.select().from(savedPlaces).where(eq(savedPlaces.userId, userId)).orderBy(desc(savedPlaces.isHome), desc(savedPlaces.id)).all().map(toSavedPlace);
}

/** The place, only when it belongs to this grower (others' places are "not found"). */
export function findOwnSavedPlace(db: Db, userId: number, id: number): SavedPlace | undefined {
  const row = db.select().from(savedPlaces).where(and(eq(savedPlaces.id, id), eq(savedPlaces.userId, userId))).get();
  return row && toSavedPlace(row);
}

function clearHome(db: Db, userId: number): void {
  db.update(savedPlaces).set({ isHome: false }).where(and(eq(savedPlaces.userId, userId), eq(savedPlaces.isHome, true))).run();
}

/** Save a place; marking it home unmarks the previous home in the same transaction. */
export function insertSavedPlace(db: Db, userId: number, input: SavedPlaceInput): SavedPlace {
  return db.transaction(() => {
    if (input.isHome) clearHome(db, userId);
    return toSavedPlace(db.insert(savedPlaces).values({ ...input, userId }).returning().get());
  });
}

export function updateSavedPlace(db: Db, userId: number, id: number, patch: SavedPlacePatch): SavedPlace | undefined {
  // An empty patch (or one of only unknown keys, which the schema strips) changes nothing.
  if (Object.values(patch).every((v) => v === undefined)) return findOwnSavedPlace(db, userId, id);
  return db.transaction(() => {
    if (patch.isHome) clearHome(db, userId);
    const own = and(eq(savedPlaces.id, id), eq(savedPlaces.userId, userId));
    // An empty patch changes nothing (Drizzle refuses an UPDATE without values).
    const row = Object.keys(patch).length === 0 ? db.select().from(savedPlaces).where(own).get() : db.update(savedPlaces).set(patch).where(own).returning().get();
    return row && toSavedPlace(row);
  });
}

export function deleteSavedPlace(db: Db, userId: number, id: number): boolean {
  return db.delete(savedPlaces).where(and(eq(savedPlaces.id, id), eq(savedPlaces.userId, userId))).run().changes > 0;
}

/** The oldest place of a grower with this name (used by the idempotent demo seed). */
export function findSavedPlaceByName(db: Db, userId: number, name: string): SavedPlace | undefined {
  const row = db.select().from(savedPlaces).where(and(eq(savedPlaces.userId, userId), eq(savedPlaces.name, name))).orderBy(asc(savedPlaces.id)).get();
  return row && toSavedPlace(row);
}
