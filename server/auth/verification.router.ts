import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { eq } from 'drizzle-orm';
import { messageResponseSchema, verifyInputSchema, verifyResponseSchema } from '../../shared/schemas/email';
import { users } from '../db/schema';
import type { MailDeps } from '../email/mailer';
import { HttpError } from '../lib/http-error';
import { requireSignedIn } from '../middleware/require-role';
import { findUserById, toCurrentUser } from '../users/users.repo';
import { consumeEmailToken } from './email-tokens.repo';
import { SqliteRateLimitStore } from './rate-limit-store';
import { publishDraftsOf } from '../reports/publish';
import { sendVerificationEmail } from './verification';

/** Why an e-mailed link did not work, in words a grower can act on. */
export function linkError(reason: 'unknown' | 'used' | 'expired'): HttpError {
  if (reason === 'used') return new HttpError(410, 'link_used', 'This link has already been used.');
  if (reason === 'expired') return new HttpError(410, 'link_expired', 'This link has expired. Please ask for a new one.');
  return new HttpError(400, 'link_invalid', 'This link is not valid. Please use the newest link we sent you.');
}

/** What the /verify page says once the address is confirmed. */
export function verifiedMessage(publishedDrafts: number): string {
  if (publishedDrafts === 0) return 'Your e-mail address is confirmed. New reports are published as soon as you save them.';
  const drafts = publishedDrafts === 1 ? 'your draft report is' : `your ${publishedDrafts} draft reports are`;
  return `Your e-mail address is confirmed, and ${drafts} now published. New reports are published as soon as you save them.`;
}

/** POST /verify (no sign-in needed: the link may be opened in another browser) and POST /verify/resend. */
export function createVerificationRouter(deps: MailDeps): Router {
  const { db } = deps;
  const router = Router();
  const resendLimit = rateLimit({
    windowMs: 60 * 60_000,
    limit: 5,
    store: new SqliteRateLimitStore(db, 'verify-resend:'),
    keyGenerator: (req) => `user:${req.user!.id}`,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: () => {
      throw new HttpError(429, 'rate_limited', 'We already sent several links this hour; please check your inbox (and spam folder) first');
    },
  });

  router.post('/verify', (req, res) => {
    const { token } = verifyInputSchema.parse(req.body);
    const result = consumeEmailToken(db, token, 'verify');
    if (!result.ok) throw linkError(result.reason);
    const user = findUserById(db, result.userId);
    let published = 0;
    if (user && !user.emailVerifiedAt) {
      // The draft notice promises publication on confirmation: both in one transaction, or neither.
      published = db.transaction(() => {
        const now = new Date().toISOString();
        db.update(users).set({ emailVerifiedAt: now, updatedAt: now }).where(eq(users.id, user.id)).run();
        return publishDraftsOf(db, user.id, now).length;
      });
    }
    // Whoever is signed in here, read again after the change: req.user was read before it. The page
    // writes this into its cache instead of trusting a GET /me that may have been answered earlier.
    const viewer = req.user ? findUserById(db, req.user.id) : undefined;
    res.json(verifyResponseSchema.parse({ message: verifiedMessage(published), user: viewer ? toCurrentUser(viewer) : null }));
  });

  router.post('/verify/resend', requireSignedIn, resendLimit, async (req, res) => {
    const user = req.user!;
    if (user.emailVerified) throw new HttpError(409, 'already_verified', 'Your e-mail address is already confirmed');
    const sent = await sendVerificationEmail(deps, user);
    if (!sent) throw new HttpError(503, 'mail_unavailable', 'We could not send the message just now; please try again later');
    res.json(messageResponseSchema.parse({ message: `We sent a new link to ${user.email}.` }));
  });

  return router;
}
