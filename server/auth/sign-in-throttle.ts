import type { Db } from '../db/client';
import { statement } from '../db/prepared';

/**
 * Failed sign-ins counted per account and client address together, so failing for a grower's
 * address from elsewhere never slows the grower down at home. The first `freeFailures` cost nothing;
 * after that each further attempt from that pair must wait a delay that doubles per failure (1 s,
 * 2 s, 4 s… up to `maxDelayMs`), answered 429 with Retry-After before the password is checked. A
 * successful sign-in clears the pair; failures are forgotten `forgetAfterMs` after the last one.
 * Kept in rate_limit_hits (shared by every instance): hits = failures, reset_at = last failure + forgetAfterMs.
 */
export interface PairThrottle {
  freeFailures: number;
  baseDelayMs: number;
  maxDelayMs: number;
  forgetAfterMs: number;
}

export const DEFAULT_PAIR_THROTTLE: PairThrottle = { freeFailures: 5, baseDelayMs: 1000, maxDelayMs: 15 * 60_000, forgetAfterMs: 24 * 3_600_000 };

const pairKey = (email: string, address: string | undefined) => `sign-in-pair:${email.trim().toLowerCase()}|${address ?? '?'}`;

/** The delay after `failures` failed attempts (0 while they are free). */
export function pairDelayMs(failures: number, throttle: PairThrottle): number {
  if (failures < throttle.freeFailures) return 0;
  return Math.min(throttle.maxDelayMs, throttle.baseDelayMs * 2 ** Math.min(40, failures - throttle.freeFailures));
}

/** Milliseconds this pair must still wait before its next attempt (0: go ahead). */
export function pairWaitMs(db: Db, email: string, address: string | undefined, throttle: PairThrottle, now = Date.now()): number {
  const row = statement(db, 'SELECT hits, reset_at AS resetAt FROM rate_limit_hits WHERE key = ?').get(pairKey(email, address)) as { hits: number; resetAt: number } | undefined;
  if (!row || row.resetAt <= now) return 0;
  const lastFailure = row.resetAt - throttle.forgetAfterMs;
  return Math.max(0, lastFailure + pairDelayMs(row.hits, throttle) - now);
}

export function recordPairFailure(db: Db, email: string, address: string | undefined, throttle: PairThrottle, now = Date.now()): void {
  statement(
    db,
    `INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES (?, 1, ?)
     ON CONFLICT (key) DO UPDATE SET hits = CASE WHEN reset_at <= ? THEN 1 ELSE hits + 1 END, reset_at = excluded.reset_at`,
  ).run(pairKey(email, address), now + throttle.forgetAfterMs, now);
}

export function clearPair(db: Db, email: string, address: string | undefined): void {
  statement(db, 'DELETE FROM rate_limit_hits WHERE key = ?').run(pairKey(email, address));
}
