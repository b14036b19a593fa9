import { randomBytes } from 'node:crypto';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { CurrentUser } from '../../shared/schemas/auth';
import type { Db } from '../db/client';
import { findUserByEmail, findUserById, toCurrentUser } from '../users/users.repo';
import { hashPassword, verifyPassword } from './password';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // The signed-in user on req.user is the same shape the API returns from /api/auth/me.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends CurrentUser {}
  }
}

/** One message for an unknown e-mail and a wrong password, so neither is revealed. */
export const BAD_CREDENTIALS = 'That e-mail and password do not match an account';

export function createPassport(db: Db): passport.PassportStatic {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      const row = findUserByEmail(db, email);
      // Verify against a throwaway hash when the account does not exist, to keep timing alike.
      (row ? Promise.resolve(row.passwordHash) : dummyHash())
        .then((passwordHash) => verifyPassword(passwordHash, password))
        .then(
        (ok) => done(null, row && ok ? toCurrentUser(row) : false, { message: BAD_CREDENTIALS }),
        done,
      );
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((id: number, done) => {
    const row = findUserById(db, id);
    // A session for a deleted account is simply signed out.
    done(null, row ? toCurrentUser(row) : false);
  });
  return instance;
}

let dummy: Promise<string> | undefined;
/** A real argon2 hash of random bytes, made once: verifying against it costs what a real check costs. */
const dummyHash = () => (dummy ??= hashPassword(randomBytes(24).toString('hex')));
