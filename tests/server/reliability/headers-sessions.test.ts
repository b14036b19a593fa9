import supertest from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { createDb } from '../../../server/db/client';
import { createTestContext, signUpAndIn, TEST_PASSWORD } from '../../helpers/test-app';

const limit = { windowMs: 60_000, perAddress: 4 };
const ctx = createTestContext({ signInLimit: limit });
/** A second app instance over the same database file, as behind a load balancer. */
const otherDb = createDb(ctx.db.sqlite.name);
const other = createApp({ db: otherDb, config: ctx.config, signInLimit: limit });
afterAll(() => {
  otherDb.sqlite.close();
  ctx.db.sqlite.close();
});

/** The CSP directives as a map: name -> sources. */
function csp(header: string | undefined): Map<string, string[]> {
  return new Map(
    (header ?? '')
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((parts) => parts[0])
      .map(([name, ...sources]) => [name!, sources]),
  );
}

describe('security headers (helmet)', () => {
  it('sends a content security policy that keeps scripts local yet lets the map start blob: workers', async () => {
    const res = await ctx.agent().get('/api/health');
    const policy = csp(res.headers['content-security-policy']);
    // OWASP Secure Headers / MDN CSP reference: worker-src governs Worker scripts; MapLibre builds its worker from a blob: URL.
    expect(policy.get('worker-src')).toEqual(expect.arrayContaining(["'self'", 'blob:']));
    expect(policy.get('default-src')).toEqual(["'self'"]);
    // Our own scripts, and index.html's one inline script by its hash when the client is built (server/client/inline-scripts.ts).
    const scripts = policy.get('script-src')!;
    expect(scripts[0]).toBe("'self'");
    for (const source of scripts.slice(1)) expect(source).toMatch(/^'sha256-[A-Za-z0-9+/]+=*'$/);
    expect(policy.get('object-src')).toEqual(["'none'"]);
    expect(policy.get('frame-ancestors')).toEqual(["'self'"]);
    expect(policy.get('connect-src')).toEqual(["'self'"]);
    // No source off the machine anywhere in the policy.
    expect([...policy.values()].flat().filter((s) => /^https?:|^\*/.test(s))).toEqual([]);
  });

  it('sends the other helmet headers and hides the framework', async () => {
    const res = await ctx.agent().get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('sets the session cookie HttpOnly and SameSite=Lax, only after sign-in', async () => {
    const anonymous = await ctx.agent().get('/api/auth/me');
    expect(anonymous.headers['set-cookie']).toBeUndefined();
    const user = await ctx.signedIn('grower');
    const res = await user.raw.get('/api/auth/me');
    expect(res.body.user.id).toBe(user.userId);
    const signUp = await signUpAndIn(ctx.agent(), { email: `cookie-${Date.now()}@example.com`, password: TEST_PASSWORD, displayName: 'Cookie check' });
    expect(signUp.status).toBe(200);
    const cookie = String(signUp.headers['set-cookie']?.[0]);
    expect(cookie).toMatch(/^syconium\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });
});

describe('state shared through the database, not process memory', () => {
  it('signed-in reads do not write to the database (rolling sessions touch at most hourly)', async () => {
    const user = await ctx.signedIn('grower');
    await user.get('/api/auth/me');
    const changes = () => ctx.db.sqlite.prepare('SELECT total_changes()').pluck().get() as number;
    const before = changes();
    for (let i = 0; i < 3; i++) expect((await user.get('/api/auth/me')).body.user.id).toBe(user.userId);
    expect(changes()).toBe(before);
  });

  it('a session made on one instance is valid on another', async () => {
    const email = `shared-${Date.now()}@example.com`;
    const user = await ctx.signedIn('grower', email);
    const signIn = await supertest(ctx.app).post('/api/auth/sign-in').set('X-Syconium-Request', '1').send({ email, password: TEST_PASSWORD });
    const cookie = String(signIn.headers['set-cookie']?.[0]).split(';')[0]!;
    const res = await supertest(other).get('/api/auth/me').set('Cookie', cookie);
    expect(res.body.user?.id).toBe(user.userId);
  });

  it('throttles sign-in per address across different accounts, counted across instances', async () => {
    const attempt = (app: typeof other, n: number) =>
      supertest(app).post('/api/auth/sign-in').set('X-Syconium-Request', '1').send({ email: `nobody-${n}@example.com`, password: 'wrong password 1' });
    ctx.db.sqlite.prepare('DELETE FROM rate_limit_hits').run();
    // Four attempts on four accounts from one address, alternating between the two instances.
    for (let n = 0; n < limit.perAddress; n++) expect((await attempt(n % 2 ? other : ctx.app, n)).status).toBe(401);
    for (const app of [ctx.app, other]) {
      const res = await attempt(app, 99);
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
      expect(res.body.error.message).toMatch(/address/);
    }
    const row = ctx.db.sqlite.prepare("SELECT hits FROM rate_limit_hits WHERE key LIKE 'sign-in-ip:%'").pluck().get() as number;
    expect(row).toBeGreaterThan(limit.perAddress);
  });
});
