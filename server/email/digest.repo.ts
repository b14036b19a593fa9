import { randomBytes } from 'node:crypto';
import { and, desc, eq, isNotNull, isNull, lte, or, sql } from 'drizzle-orm';
import type { LatLon } from '../../shared/domain/geo';
import type { Crop, GrowingForm } from '../../shared/domain/codes';
import type { Db } from '../db/client';
import { digestSubscriptions, savedPlaces, users } from '../db/schema';
import { publicDistanceKm, publicPositionInCircleBoxes } from '../reports/public-position';

export type DigestSubscriptionRow = typeof digestSubscriptions.$inferSelect;

export const newUnsubscribeToken = () => randomBytes(24).toString('base64url');

export function findSubscription(db: Db, userId: number): DigestSubscriptionRow | undefined {
  return db.select().from(digestSubscriptions).where(eq(digestSubscriptions.userId, userId)).get();
}

/** Create or change a grower's subscription; the unsubscribe token is made once and kept. */
export function upsertSubscription(db: Db, userId: number, values: { active: boolean; radiusKm: number }): DigestSubscriptionRow {
  const updatedAt = new Date().toISOString();
  return db
    .insert(digestSubscriptions)
    .values({ userId, ...values, unsubscribeToken: newUnsubscribeToken() })
    .onConflictDoUpdate({ target: digestSubscriptions.userId, set: { ...values, updatedAt } })
    .returning()
    .get();
}

/** Turn a subscription off by its token alone. A token that matches nothing changes nothing. */
export function unsubscribeByToken(db: Db, token: string): boolean {
  const row = db
    .update(digestSubscriptions)
    .set({ active: false, updatedAt: new Date().toISOString() })
    .where(eq(digestSubscriptions.unsubscribeToken, token))
    .returning({ userId: digestSubscriptions.userId })
    .get();
  return !!row;
}

/** The grower's home place (the newest one marked as home). */
export function findHomePlace(db: Db, userId: number): { name: string; lat: number; lon: number } | undefined {
  return db
    .select({ name: savedPlaces.name, lat: savedPlaces.lat, lon: savedPlaces.lon })
    .from(savedPlaces)
    .where(and(eq(savedPlaces.userId, userId), eq(savedPlaces.isHome, true)))
    .orderBy(desc(savedPlaces.id))
    .limit(1)
    .get();
}

/**
 * Active subscriptions of confirmed addresses whose last digest is at least `dueBefore` old (or
 * that never had one). No weekly mail goes to an address its owner has not confirmed.
 */
export function dueSubscriptions(db: Db, dueBefore: string) {
  return db
    .select({ sub: digestSubscriptions, email: users.email, displayName: users.displayName })
    .from(digestSubscriptions)
    .innerJoin(users, eq(users.id, digestSubscriptions.userId))
    .where(
      and(
        eq(digestSubscriptions.active, true),
        isNotNull(users.emailVerifiedAt),
        or(isNull(digestSubscriptions.lastSentAt), lte(digestSubscriptions.lastSentAt, dueBefore)),
      ),
    )
    .all();
}

export function markDigestSent(db: Db, userId: number, at: string): void {
  db.update(digestSubscriptions).set({ lastSentAt: at }).where(eq(digestSubscriptions.userId, userId)).run();
}

export interface NearbyRipening {
  id: number;
  gridLat: number;
  gridLon: number;
  season: number;
  crop: Crop;
  form: GrowingForm;
  firstRipeDate: string | null;
  publishedAt: string;
  varietyName: string | null;
  proposedVarietyName: string | null;
  distanceKm: number;
}

/**
 * Published 'ripened' reports that became public in (since, until] whose public position (grid
 * cell centre) lies within radiusKm of a point, other growers' only: membership and distance are
 * the grid cell's, never the exact place's (shared/domain/public-grid.ts), so a subscriber cannot
 * learn more than the cell by moving their home or radius. Publication time, not creation time: a
 * draft written before the last digest and published after it is news in the next one, and a
 * report restored after hiding keeps its first publication time, so it is never announced twice.
 */
export function nearbyRipenedReports(db: Db, centre: LatLon, radiusKm: number, since: string, until: string, excludeUserId: number): NearbyRipening[] {
  const rows = db.all<Omit<NearbyRipening, 'distanceKm'>>(sql`
    SELECT r.id, r.grid_lat AS gridLat, r.grid_lon AS gridLon, r.season, r.crop, r.form,
           r.first_ripe_date AS firstRipeDate, r.published_at AS publishedAt,
           v.name AS varietyName, r.proposed_variety_name AS proposedVarietyName
    FROM reports r
    LEFT JOIN varieties v ON v.id = r.variety_id
    WHERE ${publicPositionInCircleBoxes('r', centre, radiusKm)}
      AND r.status = 'published' AND r.outcome = 'ripened'
      AND r.published_at > ${since} AND r.published_at <= ${until}
      AND r.user_id <> ${excludeUserId}
    ORDER BY r.published_at, r.id`);
  return rows.map((row) => ({ ...row, distanceKm: publicDistanceKm(centre, row) })).filter((row) => row.distanceKm <= radiusKm);
}
