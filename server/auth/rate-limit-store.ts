import type { IncrementResponse, Options, Store } from 'express-rate-limit';
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { rateLimitHits } from '../db/schema';

/** express-rate-limit counters in SQLite, so every app instance sees the same counts. */
export class SqliteRateLimitStore implements Store {
  localKeys = false;
  private windowMs = 60_000;

  constructor(
    private readonly db: Db,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  increment(key: string): IncrementResponse {
    const now = Date.now();
    const id = this.prefix + key;
    const row = this.db
      .insert(rateLimitHits)
      .values({ key: id, hits: 1, resetAt: now + this.windowMs })
      .onConflictDoUpdate({
        target: rateLimitHits.key,
        set: {
          hits: sql`CASE WHEN ${rateLimitHits.resetAt} <= ${now} THEN 1 ELSE ${rateLimitHits.hits} + 1 END`,
          resetAt: sql`CASE WHEN ${rateLimitHits.resetAt} <= ${now} THEN ${now + this.windowMs} ELSE ${rateLimitHits.resetAt} END`,
        },
      })
      .returning()
      .get();
    return { totalHits: row.hits, resetTime: new Date(row.resetAt) };
  }

  decrement(key: string): void {
    this.db
      .update(rateLimitHits)
      .set({ hits: sql`max(0, ${rateLimitHits.hits} - 1)` })
      .where(eq(rateLimitHits.key, this.prefix + key))
      .run();
  }

  resetKey(key: string): void {
    this.db.delete(rateLimitHits).where(eq(rateLimitHits.key, this.prefix + key)).run();
  }
}

/**
 * Deletes the counters whose window has passed (express-rate-limit's windows and the sign-in pairs'
 * forgetting time): such a row counts as absent anyway, so only the table's size changes. Run hourly
 * by the `rate-limit-prune` job; returns how many rows went.
 */
export function pruneExpiredRateLimits(db: Db, now: number): number {
  return db.delete(rateLimitHits).where(sql`${rateLimitHits.resetAt} <= ${now}`).run().changes;
}
