import { Router, type RequestHandler } from 'express';
import type passport from 'passport';
import { rateLimit } from 'express-rate-limit';
import { meResponseSchema, signInInputSchema, signUpInputSchema } from '../../shared/schemas/auth';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import { SESSION_COOKIE } from '../middleware/login-session';
import { findUserByEmail, insertUser, toCurrentUser } from '../users/users.repo';
import { BAD_CREDENTIALS } from './passport';
import { hashPassword } from './password';
import { SqliteRateLimitStore } from './rate-limit-store';

export interface AuthRouterDeps {
  db: Db;
  passport: passport.PassportStatic;
  /** Sign-in attempts allowed per window, per address and per account. */
  signInLimit?: { windowMs: number; perAddress: number; perAccount: number };
  /** Called after an account is created (e-mail verification hooks in here). */
  onSignedUp?: (user: Express.User) => Promise<void> | void;
}

const tooMany = (what: string) => () => {
  throw new HttpError(429, 'rate_limited', `Too many sign-in attempts from this ${what}; please wait a few minutes`);
};

export function createAuthRouter({ db, passport, signInLimit, onSignedUp }: AuthRouterDeps): Router {
  const limits = signInLimit ?? { windowMs: 15 * 60_000, perAddress: 50, perAccount: 10 };
  const perAddress = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    store: new SqliteRateLimitStore(db, 'sign-in-ip:'),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('address'),
  });
  const perAccount = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAccount,
    store: new SqliteRateLimitStore(db, 'sign-in-account:'),
    keyGenerator: (req) => String(req.body?.email ?? '').trim().toLowerCase(),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany('account'),
  });

  const router = Router();

  router.get('/me', (req, res) => {
    res.json(meResponseSchema.parse({ user: req.user ?? null }));
  });

  router.post('/sign-up', async (req, res) => {
    const input = signUpInputSchema.parse(req.body);
    if (findUserByEmail(db, input.email)) {
      throw new HttpError(409, 'email_taken', 'An account with this e-mail already exists', {
        email: ['An account with this e-mail already exists'],
      });
    }
    const row = insertUser(db, { email: input.email, displayName: input.displayName, passwordHash: await hashPassword(input.password), dataLicenceAgreedAt: new Date().toISOString() });
    const user = toCurrentUser(row);
    await logIn(req, user);
    await onSignedUp?.(user);
    res.status(201).json({ user });
  });

  const authenticate: RequestHandler = (req, res, next) => {
    signInInputSchema.parse(req.body);
    passport.authenticate('local', (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) return next(new HttpError(401, 'bad_credentials', BAD_CREDENTIALS));
      // passport 0.7 regenerates the session on logIn: a new id defeats session fixation.
      logIn(req, user).then(() => res.json({ user }), next);
    })(req, res, next);
  };
  router.post('/sign-in', perAddress, perAccount, authenticate);

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
