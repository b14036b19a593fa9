import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Db } from '../db/client';
import { emailTokens } from '../db/schema';

export type EmailTokenPurpose = (typeof emailTokens.$inferSelect)['purpose'];

const sha256 = (token: string) => createHash('sha256').update(token).digest('hex');

/** A fresh random token for an e-mailed link; only its hash is stored. */
export function issueEmailToken(db: Db, userId: number, purpose: EmailTokenPurpose, ttlMs: number, now = new Date()): string {
  const token = randomBytes(32).toString('base64url');
  db.insert(emailTokens).values({ userId, purpose, tokenHash: sha256(token), expiresAt: new Date(now.getTime() + ttlMs).toISOString() }).run();
  return token;
}

export type ConsumeResult = { ok: true; userId: number } | { ok: false; reason: 'unknown' | 'used' | 'expired' };

/**
 * Use a token once: one UPDATE marks it used only while unused and unexpired, so two requests
 * racing with the same link cannot both succeed.
 */
export function consumeEmailToken(db: Db, token: string, purpose: EmailTokenPurpose, now = new Date()): ConsumeResult {
  const tokenHash = sha256(token);
  const nowIso = now.toISOString();
  const used = db
    .update(emailTokens)
    .set({ usedAt: nowIso })
    .where(and(eq(emailTokens.tokenHash, tokenHash), eq(emailTokens.purpose, purpose), isNull(emailTokens.usedAt), gt(emailTokens.expiresAt, nowIso)))
    .returning({ userId: emailTokens.userId })
    .get();
  if (used) return { ok: true, userId: used.userId };
  const row = db.select().from(emailTokens).where(and(eq(emailTokens.tokenHash, tokenHash), eq(emailTokens.purpose, purpose))).get();
  if (!row) return { ok: false, reason: 'unknown' };
  return { ok: false, reason: row.usedAt ? 'used' : 'expired' };
}

/** Whether a token would be accepted now, without using it (to refuse bad links before costly work). */
export function checkEmailToken(db: Db, token: string, purpose: EmailTokenPurpose, now = new Date()): ConsumeResult {
  const row = db.select().from(emailTokens).where(and(eq(emailTokens.tokenHash, sha256(token)), eq(emailTokens.purpose, purpose))).get();
  if (!row) return { ok: false, reason: 'unknown' };
  if (row.usedAt) return { ok: false, reason: 'used' };
  if (row.expiresAt <= now.toISOString()) return { ok: false, reason: 'expired' };
  return { ok: true, userId: row.userId };
}

/** Retire every unused token of one purpose (after a reset, older reset links stop working). */
export function retireEmailTokens(db: Db, userId: number, purpose: EmailTokenPurpose, now = new Date()): void {
  db.update(emailTokens)
    .set({ usedAt: now.toISOString() })
    .where(and(eq(emailTokens.userId, userId), eq(emailTokens.purpose, purpose), isNull(emailTokens.usedAt)))
    .run();
}
