import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readConfig } from '../../server/lib/config';
import { localSecretFile, SESSION_SECRET_MIN_LENGTH, withSessionSecret } from '../../server/lib/session-secret';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-secret-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** Start server/index.ts as `npm run serve` would, and wait for it to give up (it must not start). */
function startProduction(extra: Record<string, string>) {
  const env: Record<string, string | undefined> = { ...process.env, NODE_ENV: 'production', PORT: '0', SYCONIUM_DB: path.join(dir, 'prod.db'), SYCONIUM_UPLOADS: path.join(dir, 'uploads'), SYCONIUM_DEV_MAIL: 'false', ...extra };
  if (!('SESSION_SECRET' in extra)) delete env.SESSION_SECRET;
  return spawnSync(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env, encoding: 'utf8', timeout: 60_000 });
}

describe('the session secret', () => {
  it('a production server without SESSION_SECRET refuses to start, naming the variable, before touching the database', () => {
    const run = startProduction({});
    expect(run.signal, 'the server started and had to be killed').toBeNull();
    expect(run.status).toBe(1);
    expect(run.stderr).toMatch(/SESSION_SECRET is not set/);
    expect(run.stderr).toMatch(/NODE_ENV=production/);
    expect(fs.existsSync(path.join(dir, 'prod.db'))).toBe(false);
  }, 70_000);

  it('a production server refuses a short SESSION_SECRET too', () => {
    const run = startProduction({ SESSION_SECRET: 'secret' });
    expect(run.status).toBe(1);
    expect(run.stderr).toMatch(/SESSION_SECRET is too short/);
  }, 70_000);

  it('production takes the secret it is given', () => {
    const secret = 'x'.repeat(SESSION_SECRET_MIN_LENGTH);
    expect(withSessionSecret(readConfig({ NODE_ENV: 'production', SESSION_SECRET: secret })).sessionSecret).toBe(secret);
    expect(() => withSessionSecret(readConfig({ NODE_ENV: 'production', SESSION_SECRET: '' }))).toThrow(/SESSION_SECRET is not set/);
  });

  it('a local run (npm start) without one generates a random secret beside its database, kept across restarts', () => {
    const env = { SYCONIUM_DB: path.join(dir, 'local', 'syconium.db') };
    const first = withSessionSecret(readConfig(env)).sessionSecret;
    expect(first).toMatch(/^[0-9a-f]{64}$/);
    const file = localSecretFile(env.SYCONIUM_DB);
    expect(file).toBe(path.join(dir, 'local', 'session-secret'));
    // Readable by its owner only (POSIX permission bits).
    expect(fs.statSync(file).mode & 0o077).toBe(0);
    expect(withSessionSecret(readConfig(env)).sessionSecret).toBe(first);
    // Another checkout gets another secret: nothing is shared through the code.
    expect(withSessionSecret(readConfig({ SYCONIUM_DB: path.join(dir, 'other', 'syconium.db') })).sessionSecret).not.toBe(first);
    // A secret given in the environment wins.
    expect(withSessionSecret(readConfig({ ...env, SESSION_SECRET: 'given-for-development' })).sessionSecret).toBe('given-for-development');
  });

  it('tests get a fresh random secret; there is no built-in default any more', () => {
    const a = readConfig({ NODE_ENV: 'test' }).sessionSecret;
    expect(a).toMatch(/^[0-9a-f]{64}$/);
    expect(readConfig({ NODE_ENV: 'test' }).sessionSecret).not.toBe(a);
    expect(readConfig({ NODE_ENV: 'production' }).sessionSecret).toBeUndefined();
    expect(readConfig({}).sessionSecret).toBeUndefined();
  });
});
