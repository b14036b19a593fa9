import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { eq } from 'drizzle-orm';
import { forgotInputSchema, messageResponseSchema, resetInputSchema, resetResponseSchema } from '../../shared/schemas/email';
import { sessions, users } from '../db/schema';
import type { MailDeps } from '../email/mailer';
import { resetPasswordMessage } from '../email/templates';
import { HttpError } from '../lib/http-error';
import { findUserByEmail, findUserById, toCurrentUser } from '../users/users.repo';
import { checkEmailToken, consumeEmailToken, issueEmailToken, retireEmailTokens } from './email-tokens.repo';
import { hashPassword } from './password';
import { SqliteRateLimitStore } from './rate-limit-store';
import { linkError } from './verification.router';

export const RESET_TTL_MINUTES = 60;

/** The one answer to every well-formed request, whether or not the address has an account. */
export const FORGOT_ANSWER = 'If an account uses that address, a link to choose a new password is on its way. It works for one hour.';

export interface PasswordResetDeps extends MailDeps {
  /** Requests allowed per window, per client address and per e-mail address. */
  forgotLimit?: { windowMs: number; perAddress: number; perEmail: number };
}

/** POST /forgot {email} and POST /reset {token, password}. */
export function createPasswordResetRouter(deps: PasswordResetDeps): Router {
  const { db } = deps;
  const limits = deps.forgotLimit ?? { windowMs: 60 * 60_000, perAddress: 20, perEmail: 5 };
  const tooMany = () => {
    throw new HttpError(429, 'rate_limited', 'Too many reset requests; please wait a while and check your inbox');
  };
  const perAddress = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    store: new SqliteRateLimitStore(db, 'forgot-ip:'),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany,
  });
  const perEmail = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perEmail,
    store: new SqliteRateLimitStore(db, 'forgot-email:'),
    keyGenerator: (req) => String(req.body?.email ?? '').trim().toLowerCase(),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany,
  });

  const router = Router();

  router.post('/forgot', (req, _res, next) => (forgotInputSchema.parse(req.body), next()), perAddress, perEmail, (req, res) => {
    const { email } = forgotInputSchema.parse(req.body);
    const user = findUserByEmail(db, email);
    // Answer first and send afterwards, so the time to answer does not tell whether the account exists.
    res.status(202).json(messageResponseSchema.parse({ message: FORGOT_ANSWER }));
    if (!user) return;
    const token = issueEmailToken(db, user.id, 'reset', RESET_TTL_MINUTES * 60_000);
    const message = resetPasswordMessage({ displayName: user.displayName, url: `${deps.appUrl}/reset-password?token=${token}`, expiresMinutes: RESET_TTL_MINUTES });
    deps.mailer.send({ to: user.email, ...message }).catch((err) => console.error(`reset e-mail to user ${user.id} not sent:`, err));
  });

  router.post('/reset', async (req, res) => {
    const input = resetInputSchema.parse(req.body);
    // A bad link is refused before the (deliberately slow) hash; the token is then used inside the
    // transaction that sets the password, so a used token always comes with the new password.
    const check = checkEmailToken(db, input.token, 'reset');
    if (!check.ok) throw linkError(check.reason);
    const passwordHash = await hashPassword(input.password);
    const userId = db.transaction(() => {
      const result = consumeEmailToken(db, input.token, 'reset');
      if (!result.ok) throw linkError(result.reason);
      const now = new Date();
      retireEmailTokens(db, result.userId, 'reset', now);
      const iso = now.toISOString();
      const row = findUserById(db, result.userId)!;
      // The link proved the grower reads this mailbox, so the address counts as confirmed too.
      db.update(users).set({ passwordHash, emailVerifiedAt: row.emailVerifiedAt ?? iso, updatedAt: iso }).where(eq(users.id, result.userId)).run();
      // Sign the account out everywhere: every session row of this user goes.
      db.delete(sessions).where(eq(sessions.userId, result.userId)).run();
      return result.userId;
    });
    const user = toCurrentUser(findUserById(db, userId)!);
    // This browser is signed in afresh (a new session id); all others were signed out above.
    await new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
    res.json(resetResponseSchema.parse({ user, message: 'Your new password is set. You are signed in here and signed out everywhere else.' }));
  });

  return router;
}
