import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { checkoutAttempts, contributions, memberships, paymentEvents, users } from '../db/schema';
import type { MembershipStatus, MembershipTier, SupportCurrency, SupportKind } from '../../shared/domain/support';
import { MARKED_STATUSES } from '../../shared/domain/support';
import type { Membership, SupportSummary } from '../../shared/schemas/support';

/** Drizzle queries for supporters; what an event means is decided in webhook.ts. */

export function recordCheckoutAttempt(db: Db, attempt: { sessionId: string; userId: number | null; kind: SupportKind; tier: MembershipTier | null; amountMinor: number; currency: SupportCurrency }): void {
  db.insert(checkoutAttempts).values(attempt).run();
}

export function checkoutAttempt(db: Db, sessionId: string) {
  return db.select().from(checkoutAttempts).where(eq(checkoutAttempts.sessionId, sessionId)).get();
}

export function setCheckoutState(db: Db, sessionId: string, state: 'paid' | 'unpaid'): void {
  db.update(checkoutAttempts).set({ state }).where(eq(checkoutAttempts.sessionId, sessionId)).run();
}

/** True the first time an event id is seen; false for a redelivery (nothing more to do). */
export function claimEvent(db: Db, eventId: string, type: string): boolean {
  return db.insert(paymentEvents).values({ eventId, type }).onConflictDoNothing().run().changes === 1;
}

export function addContribution(db: Db, row: { userId: number | null; kind: SupportKind; providerRef: string; amountMinor: number; currency: SupportCurrency; paidAt: string }): boolean {
  return db.insert(contributions).values(row).onConflictDoNothing().run().changes === 1;
}

export function userExists(db: Db, id: number): boolean {
  return !!db.select({ id: users.id }).from(users).where(eq(users.id, id)).get();
}

export function startMembership(db: Db, row: { userId: number; providerSubscriptionId: string; tier: MembershipTier; amountMinor: number; currency: SupportCurrency; startedAt: string; renewsOn: string | null }): void {
  db.insert(memberships)
    .values({ ...row, status: 'active' })
    .onConflictDoNothing()
    .run();
}

export function membershipBySubscription(db: Db, subscriptionId: string) {
  return db.select().from(memberships).where(eq(memberships.providerSubscriptionId, subscriptionId)).get();
}

export function updateMembership(db: Db, subscriptionId: string, change: { status?: MembershipStatus; renewsOn?: string | null; cancelledAt?: string | null }): void {
  db.update(memberships)
    .set({ ...change, updatedAt: sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))` })
    .where(eq(memberships.providerSubscriptionId, subscriptionId))
    .run();
}

/** A grower's membership to show: the one still running, else the latest. */
export function currentMembershipRow(db: Db, userId: number) {
  return db
    .select()
    .from(memberships)
    .where(eq(memberships.userId, userId))
    .orderBy(sql`${memberships.status} = 'cancelled'`, desc(memberships.id))
    .limit(1)
    .get();
}

export function toMembership(row: NonNullable<ReturnType<typeof currentMembershipRow>>): Membership {
  return { tier: row.tier, amountMinor: row.amountMinor, currency: row.currency, status: row.status, startedAt: row.startedAt, renewsOn: row.renewsOn, cancelledAt: row.cancelledAt };
}

export function supporterMark(db: Db, userId: number): boolean {
  return db.select({ mark: users.supporterMark }).from(users).where(eq(users.id, userId)).get()?.mark ?? false;
}

export function setSupporterMark(db: Db, userId: number, showMark: boolean): void {
  db.update(users).set({ supporterMark: showMark }).where(eq(users.id, userId)).run();
}

/** Money in per calendar month (UTC) and currency, newest first, and who supports the atlas now. */
export function supportSummary(db: Db): SupportSummary {
  const months = db
    .select({
      month: sql<string>`substr(${contributions.paidAt}, 1, 7)`,
      currency: contributions.currency,
      totalMinor: sql<number>`sum(${contributions.amountMinor})`,
      contributions: sql<number>`count(*)`,
    })
    .from(contributions)
    .groupBy(sql`1`, contributions.currency)
    .orderBy(sql`1 desc`, contributions.currency)
    .all();
  const activeSupporters = db
    .select({ displayName: users.displayName, tier: memberships.tier, amountMinor: memberships.amountMinor, currency: memberships.currency, status: memberships.status, since: memberships.startedAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(inArray(memberships.status, [...MARKED_STATUSES]))
    .orderBy(memberships.startedAt)
    .all();
  return { months, activeSupporters };
}

/** Whether any membership of this user is paid up (for the opt-in mark). */
export function hasRunningMembership(db: Db, userId: number): boolean {
  return !!db
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), inArray(memberships.status, [...MARKED_STATUSES])))
    .get();
}
