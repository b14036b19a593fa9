import { Router, type RequestHandler } from 'express';
import type passport from 'passport';
import { rateLimit, type Options } from 'express-rate-limit';
import { meResponseSchema, signInInputSchema, signUpInputSchema } from '../../shared/schemas/auth';
import { messageResponseSchema } from '../../shared/schemas/email';
import type { Db } from '../db/client';
import type { MailDeps } from '../email/mailer';
import { signUpAttemptMessage } from '../email/templates';
import { takeAllowance } from '../lib/allowance';
import { HttpError } from '../lib/http-error';
import { SESSION_COOKIE } from '../middleware/login-session';
import { findUserByEmail, insertUser, toCurrentUser } from '../users/users.repo';
import { BAD_CREDENTIALS } from './passport';
import { hashPassword } from './password';
import { SqliteRateLimitStore } from './rate-limit-store';
import { clearPair, DEFAULT_PAIR_THROTTLE, pairWaitMs, recordPairFailure, type PairThrottle } from './sign-in-throttle';

/** The one answer to every well-formed sign-up, whether or not the address already has an account. */
export const SIGN_UP_ANSWER = 'Thank you. We sent a message to that address: follow the link in it to confirm the address. If the address already has an account, the message says how to sign in instead.';

export interface SignInLimit extends Partial<PairThrottle> {
  windowMs: number;
  /** Failed sign-ins allowed per client address per window, whatever the accounts (successes do not count). */
  perAddress: number;
}

export interface AuthRouterDeps {
  db: Db;
  passport: passport.PassportStatic;
  /** Sign-in limits: failures per client address, and the slow-down per account and address pair. */
  signInLimit?: SignInLimit;
  /** Sign-ups allowed per client address per window. */
  signUpLimit?: { windowMs: number; perAddress: number };
  /** Called after an account is created (e-mail verification hooks in here). */
  onSignedUp?: (user: Express.User) => Promise<void> | void;
  /** Mail to the owner of an address someone tried to join with (no mail without it). */
  mail?: MailDeps;
}

/** Messages to an existing owner about sign-up attempts: one an hour at most, so nobody can flood a mailbox. */
const ATTEMPT_NOTICE_LIMIT = { limit: 1, windowMs: 60 * 60_000 };

const retryAfter: Options['handler'] = (req, res, _next, options) => {
  const resetTime = (req as typeof req & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
  res.set('Retry-After', String(Math.max(1, Math.ceil(((resetTime?.getTime() ?? Date.now() + options.windowMs) - Date.now()) / 1000))));
};

export function createAuthRouter({ db, passport, signInLimit, signUpLimit, onSignedUp, mail }: AuthRouterDeps): Router {
  const limits = { windowMs: 15 * 60_000, perAddress: 50, ...signInLimit };
  const pair: PairThrottle = { ...DEFAULT_PAIR_THROTTLE, ...signInLimit };
  const signUps = signUpLimit ?? { windowMs: 60 * 60_000, perAddress: 10 };
  // Per client address, over all accounts: only failures count (one address trying many accounts).
  const perAddress = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    store: new SqliteRateLimitStore(db, 'sign-in-ip:'),
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (req, res, next, options) => {
      retryAfter(req, res, next, options);
      throw new HttpError(429, 'rate_limited', 'Too many failed sign-ins from this address; please wait a few minutes');
    },
  });
  const signUpPerAddress = rateLimit({
    windowMs: signUps.windowMs,
    limit: signUps.perAddress,
    store: new SqliteRateLimitStore(db, 'sign-up-ip:'),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (req, res, next, options) => {
      retryAfter(req, res, next, options);
      throw new HttpError(429, 'rate_limited', 'Too many sign-ups from this address; please wait an hour');
    },
  });

  const router = Router();

  router.get('/me', (req, res) => {
    res.json(meResponseSchema.parse({ user: req.user ?? null }));
  });

  /**
   * The same 202 and message whether or not the address has an account, and no session either way:
   * a new address gets an account and its confirmation link, an existing one a note to its owner.
   * Both mails go after the answer, and the password is hashed in both cases, so the time taken
   * does not tell either. (The client then signs in with the same details, as anyone may.)
   */
  router.post('/sign-up', (req, _res, next) => (signUpInputSchema.parse(req.body), next()), signUpPerAddress, async (req, res) => {
    const input = signUpInputSchema.parse(req.body);
    const passwordHash = await hashPassword(input.password);
    let existing = findUserByEmail(db, input.email);
    let created: Express.User | undefined;
    if (!existing) {
      try {
        created = toCurrentUser(insertUser(db, { email: input.email, displayName: input.displayName, passwordHash, dataLicenceAgreedAt: new Date().toISOString() }));
      } catch (error) {
        // Two sign-ups for one new address at once: the other one made it.
        if ((error as { code?: string }).code !== 'SQLITE_CONSTRAINT_UNIQUE') throw error;
        existing = findUserByEmail(db, input.email);
      }
    }
    res.status(202).json(messageResponseSchema.parse({ message: SIGN_UP_ANSWER }));
    try {
      if (created) await onSignedUp?.(created);
      else if (existing && mail && takeAllowance(db, `sign-up-notice:${existing.email}`, 1, ATTEMPT_NOTICE_LIMIT).ok) {
        const message = signUpAttemptMessage({ displayName: existing.displayName, signInUrl: `${mail.appUrl}/sign-in`, forgotUrl: `${mail.appUrl}/forgot-password` });
        await mail.mailer.send({ to: existing.email, ...message });
      }
    } catch (error) {
      console.error('sign-up e-mail not sent:', error);
    }
  });

  /** A pair (account, address) that failed too often waits, growing, before its next try: 429 with Retry-After. */
  const pairThrottle: RequestHandler = (req, res, next) => {
    const { email } = signInInputSchema.parse(req.body);
    const wait = pairWaitMs(db, email, req.ip, pair);
    if (wait > 0) {
      const seconds = Math.max(1, Math.ceil(wait / 1000));
      res.set('Retry-After', String(seconds));
      throw new HttpError(429, 'rate_limited', `Too many failed sign-ins for this account from here; try again in ${seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`}, or choose a new password`);
    }
    next();
  };

  const authenticate: RequestHandler = (req, res, next) => {
    const { email } = signInInputSchema.parse(req.body);
    passport.authenticate('local', (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) {
        recordPairFailure(db, email, req.ip, pair);
        return next(new HttpError(401, 'bad_credentials', BAD_CREDENTIALS));
      }
      clearPair(db, email, req.ip);
      // passport 0.7 regenerates the session on logIn: a new id defeats session fixation.
      logIn(req, user).then(() => res.json({ user }), next);
    })(req, res, next);
  };
  router.post('/sign-in', (req, _res, next) => (signInInputSchema.parse(req.body), next()), perAddress, pairThrottle, authenticate);

  router.post('/sign-out', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie(SESSION_COOKIE);
        res.status(204).end();
      });
    });
  });

  return router;
}

function logIn(req: Express.Request, user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}
