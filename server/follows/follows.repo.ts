import { and, asc, desc, eq } from 'drizzle-orm';
import type { FollowList } from '../../shared/schemas/follows';
import type { Db } from '../db/client';
import { followedPlaces, followedVarieties, varieties } from '../db/schema';

/** What a grower follows, varieties by name and places in the order they were added. */
export function listFollows(db: Db, userId: number): FollowList {
  const vs = db
    .select({ varietyId: varieties.id, name: varieties.name, figType: varieties.figType, createdAt: followedVarieties.createdAt })
    .from(followedVarieties)
    .innerJoin(varieties, eq(varieties.id, followedVarieties.varietyId))
    .where(eq(followedVarieties.userId, userId))
    .orderBy(asc(varieties.name))
    .all();
  const ps = db
    .select({ id: followedPlaces.id, name: followedPlaces.name, lat: followedPlaces.lat, lon: followedPlaces.lon, createdAt: followedPlaces.createdAt })
    .from(followedPlaces)
    .where(eq(followedPlaces.userId, userId))
    .orderBy(asc(followedPlaces.id))
    .all();
  return { varieties: vs, places: ps };
}

export function followVariety(db: Db, userId: number, varietyId: number): void {
  db.insert(followedVarieties).values({ userId, varietyId }).onConflictDoNothing().run();
}

export function unfollowVariety(db: Db, userId: number, varietyId: number): boolean {
  return db.delete(followedVarieties).where(and(eq(followedVarieties.userId, userId), eq(followedVarieties.varietyId, varietyId))).run().changes > 0;
}

export function isFollowingVariety(db: Db, userId: number, varietyId: number): boolean {
  return !!db.select({ v: followedVarieties.varietyId }).from(followedVarieties).where(and(eq(followedVarieties.userId, userId), eq(followedVarieties.varietyId, varietyId))).get();
}

/** Follow a place; following the same point again returns the existing row. */
export function followPlace(db: Db, userId: number, place: { name: string; lat: number; lon: number }): number {
  const existing = db
    .select({ id: followedPlaces.id })
    .from(followedPlaces)
    .where(and(eq(followedPlaces.userId, userId), eq(followedPlaces.lat, place.lat), eq(followedPlaces.lon, place.lon)))
    .get();
  if (existing) return existing.id;
  return db.insert(followedPlaces).values({ userId, ...place }).returning({ id: followedPlaces.id }).get().id;
}

export function unfollowPlace(db: Db, userId: number, id: number): boolean {
  return db.delete(followedPlaces).where(and(eq(followedPlaces.userId, userId), eq(followedPlaces.id, id))).run().changes > 0;
}

export const FOLLOW_LIMITS = { varieties: 100, places: 20 } as const;

export function countFollows(db: Db, userId: number): { varieties: number; places: number } {
  const f = listFollows(db, userId);
  return { varieties: f.varieties.length, places: f.places.length };
}

/** Newest first: used by the digest to name the grower's followed places. */
export function followedPlacesOf(db: Db, userId: number) {
  return db.select().from(followedPlaces).where(eq(followedPlaces.userId, userId)).orderBy(desc(followedPlaces.id)).all();
}
