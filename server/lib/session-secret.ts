import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Config } from './config';

/** A production secret shorter than this is refused: 32 characters of random text is at least ~160 bits. */
export const SESSION_SECRET_MIN_LENGTH = 32;

/** Where a local (non-production) run keeps the secret it generated: beside its database. */
export const localSecretFile = (dbFile: string) => path.join(path.dirname(path.resolve(dbFile)), 'session-secret');

export class SessionSecretError extends Error {}

/**
 * The secret that signs session cookies. Production (NODE_ENV=production) must bring its own in
 * SESSION_SECRET: a secret known to anyone who has read this code would let them forge a session.
 * A local run without one (`npm start`, `npm run dev`) generates a random secret once and keeps it in
 * `session-secret` beside the database (e.g. data/session-secret, readable by its owner only), so
 * sign-ins survive restarts and every instance of a cluster reads the same one. Tests get a fresh
 * random secret from readConfig.
 */
export function withSessionSecret(config: Config): Config & { sessionSecret: string } {
  const given = config.sessionSecret;
  if (config.env === 'production') {
    if (!given) {
      throw new SessionSecretError(
        'SESSION_SECRET is not set. A production server (NODE_ENV=production) needs its own secret to sign session cookies: ' +
          `set SESSION_SECRET to at least ${SESSION_SECRET_MIN_LENGTH} random characters, e.g. the output of \`openssl rand -hex 32\`.`,
      );
    }
    if (given.length < SESSION_SECRET_MIN_LENGTH) {
      throw new SessionSecretError(`SESSION_SECRET is too short (${given.length} characters): use at least ${SESSION_SECRET_MIN_LENGTH} random characters, e.g. \`openssl rand -hex 32\`.`);
    }
    return { ...config, sessionSecret: given };
  }
  if (given) return { ...config, sessionSecret: given };
  return { ...config, sessionSecret: readOrCreateLocalSecret(localSecretFile(config.dbFile)) };
}

function readOrCreateLocalSecret(file: string): string {
  const read = () => fs.readFileSync(file, 'utf8').trim();
  if (fs.existsSync(file)) {
    const secret = read();
    if (secret.length >= SESSION_SECRET_MIN_LENGTH) return secret;
  }
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  try {
    // 'wx' fails if another process wrote it meanwhile: then its secret is the one to share.
    fs.writeFileSync(file, `${secret}\n`, { flag: fs.existsSync(file) ? 'w' : 'wx', mode: 0o600 });
    return secret;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') return read();
    throw error;
  }
}
