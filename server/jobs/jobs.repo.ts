import { and, eq, isNull, lte, or } from 'drizzle-orm';
import type { Db } from '../db/client';
import { jobs } from '../db/schema';

export type JobRow = typeof jobs.$inferSelect;

/** Register a job if it is new (first run at `firstRunAt`); an existing row keeps its schedule. */
export function ensureJob(db: Db, name: string, firstRunAt: number): void {
  db.insert(jobs).values({ name, nextRunAt: firstRunAt }).onConflictDoNothing().run();
}

/**
 * Take the job's lease if it is due and nobody holds a live lease: one UPDATE, so when several
 * instances tick together exactly one of them gets the row back.
 */
export function leaseJob(db: Db, name: string, owner: string, now: number, leaseMs: number): JobRow | undefined {
  return db
    .update(jobs)
    .set({ leaseUntil: now + leaseMs, leaseOwner: owner })
    .where(and(eq(jobs.name, name), lte(jobs.nextRunAt, now), or(isNull(jobs.leaseUntil), lte(jobs.leaseUntil, now))))
    .returning()
    .get();
}

/** Record the run and release the lease (only if this owner still holds it). */
export function finishJob(db: Db, name: string, owner: string, values: { nextRunAt: number; lastRunAt: string; lastError: string | null; state?: unknown }): void {
  db.update(jobs)
    .set({ ...values, leaseUntil: null, leaseOwner: null })
    .where(and(eq(jobs.name, name), eq(jobs.leaseOwner, owner)))
    .run();
}

export function findJob(db: Db, name: string): JobRow | undefined {
  return db.select().from(jobs).where(eq(jobs.name, name)).get();
}
