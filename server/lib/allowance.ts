import type { Db } from '../db/client';
import { statement } from '../db/prepared';

export interface AllowanceLimit {
  /** Units allowed per window. */
  limit: number;
  windowMs: number;
}

export interface Allowance {
  ok: boolean;
  /** Units already used in this window (after taking, when ok). */
  used: number;
  /** When the window ends and the allowance is full again (epoch ms). */
  resetAt: number;
}

/**
 * A fixed-window allowance of `amount` units (photos, messages…) under `key`, in the same
 * rate_limit_hits table express-rate-limit's store uses, so every app instance shares it. Taken only
 * when all of `amount` fits; nothing is taken otherwise. `amount` 0 just reads it.
 */
export function takeAllowance(db: Db, key: string, amount: number, { limit, windowMs }: AllowanceLimit, now = Date.now()): Allowance {
  return db.transaction(() => {
    const row = statement(db, 'SELECT hits, reset_at AS resetAt FROM rate_limit_hits WHERE key = ?').get(key) as { hits: number; resetAt: number } | undefined;
    const current = row && row.resetAt > now ? row : { hits: 0, resetAt: now + windowMs };
    if (current.hits + amount > limit || (amount === 0 && current.hits >= limit)) return { ok: false, used: current.hits, resetAt: current.resetAt };
    if (amount > 0) {
      statement(db, 'INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES (?, ?, ?) ON CONFLICT (key) DO UPDATE SET hits = excluded.hits, reset_at = excluded.reset_at').run(
        key,
        current.hits + amount,
        current.resetAt,
      );
    }
    return { ok: true, used: current.hits + amount, resetAt: current.resetAt };
  });
}

/** Whole seconds until `resetAt`, at least 1: the Retry-After value. */
export const retryAfterSeconds = (resetAt: number, now = Date.now()) => Math.max(1, Math.ceil((resetAt - now) / 1000));
