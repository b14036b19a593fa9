import { describe, expect, it } from 'vitest';
import { rateLimitHits, users } from '../../server/db/schema';
import { pairDelayMs, pairWaitMs, recordPairFailure, DEFAULT_PAIR_THROTTLE } from '../../server/auth/sign-in-throttle';
import { pruneExpiredRateLimits } from '../../server/auth/rate-limit-store';
import { SIGN_UP_ANSWER } from '../../server/auth/auth.router';
import { createTestContext, TEST_PASSWORD } from '../helpers/test-app';
import { createMailTestContext, linkToken } from './email-helpers';

/*
 * Sign-in and sign-up must not be usable against growers. Client addresses are set with
 * X-Forwarded-For: the app trusts it from a proxy on loopback ('trust proxy': 'loopback'), which is
 * where supertest connects from, so each request can come "from" another address.
 */
const from = (address: string) => ({ 'X-Forwarded-For': address });

describe('sign-in limits cannot lock a grower out', () => {
  it('failures for an address from many other addresses leave its owner free to sign in from home', async () => {
    const ctx = createTestContext({ signInLimit: { windowMs: 60_000, perAddress: 30 } });
    await ctx.signedIn('grower', 'victim@example.com');
    // 20 addresses, 7 wrong passwords each: 140 failures for one account.
    for (let a = 0; a < 20; a++) {
      for (let i = 0; i < 7; i++) {
        const res = await ctx.agent().post('/api/auth/sign-in').set(from(`203.0.113.${a}`)).send({ email: 'victim@example.com', password: `guess ${a}-${i}` });
        expect([401, 429]).toContain(res.status);
      }
    }
    const home = await ctx.agent().post('/api/auth/sign-in').set(from('198.51.100.7')).send({ email: 'victim@example.com', password: TEST_PASSWORD });
    expect(home.status).toBe(200);
    expect(home.body.user.email).toBe('victim@example.com');
  }, 120_000);

  it('one account and address that keeps failing is slowed down with a growing delay and Retry-After, not blocked', async () => {
    const ctx = createTestContext({ signInLimit: { windowMs: 60_000, perAddress: 1000, freeFailures: 3, baseDelayMs: 1000 } });
    await ctx.signedIn('grower', 'slow@example.com');
    const attempt = (password: string) => ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.10')).send({ email: 'slow@example.com', password });
    for (let i = 0; i < 3; i++) expect((await attempt('wrong password')).status).toBe(401);
    // Past the free failures the pair waits 1 s, then 2 s…; meanwhile not even the right password is checked.
    const first = await attempt(TEST_PASSWORD);
    expect(first.status).toBe(429);
    expect(first.body.error.code).toBe('rate_limited');
    expect(Number(first.headers['retry-after'])).toBe(1);
    await new Promise((r) => setTimeout(r, 1100));
    expect((await attempt('wrong password')).status).toBe(401);
    const waiting = await attempt(TEST_PASSWORD);
    expect(waiting.status).toBe(429);
    expect(Number(waiting.headers['retry-after'])).toBe(2);
    // Another address for the same account, and another account from this address, are not held up.
    expect((await ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.11')).send({ email: 'slow@example.com', password: TEST_PASSWORD })).status).toBe(200);
    expect((await ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.10')).send({ email: 'other@example.com', password: 'x' })).status).toBe(401);
    // After the wait the pair may try again.
    await new Promise((r) => setTimeout(r, 2100));
    expect((await attempt(TEST_PASSWORD)).status).toBe(200);
  }, 60_000);

  it('the delay doubles per failure past the free ones, up to a ceiling', () => {
    const t = DEFAULT_PAIR_THROTTLE;
    expect([4, 5, 6, 7, 8].map((f) => pairDelayMs(f, t))).toEqual([0, 1000, 2000, 4000, 8000]);
    expect(pairDelayMs(1000, t)).toBe(15 * 60_000);
  });

  it('successful sign-ins do not count, and one clears the pair\'s failures', async () => {
    const ctx = createTestContext({ signInLimit: { windowMs: 60_000, perAddress: 7, freeFailures: 3 } });
    await ctx.signedIn('grower', 'often@example.com');
    const attempt = (password: string) => ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.20')).send({ email: 'often@example.com', password });
    // Twenty good sign-ins from one address: far past its limit of 7 failures, all fine.
    for (let i = 0; i < 20; i++) expect((await attempt(TEST_PASSWORD)).status).toBe(200);
    // Two slips, a success, two slips: never past the three free failures of the pair.
    for (let round = 0; round < 3; round++) {
      expect((await attempt('typo one')).status).toBe(401);
      expect((await attempt('typo two')).status).toBe(401);
      expect((await attempt(TEST_PASSWORD)).status).toBe(200);
    }
  }, 120_000);

  it('one address failing on many accounts is still refused (429 with Retry-After)', async () => {
    const ctx = createTestContext({ signInLimit: { windowMs: 60_000, perAddress: 5 } });
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) statuses.push((await ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.30')).send({ email: `n${i}@example.com`, password: 'x' })).status);
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429]);
    const res = await ctx.agent().post('/api/auth/sign-in').set(from('192.0.2.30')).send({ email: 'z@example.com', password: 'x' });
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  }, 60_000);
});

describe('spent counters are forgotten', () => {
  it('the hourly prune deletes a pair once its failures are forgotten, and not a moment before', () => {
    const ctx = createTestContext();
    const t = Date.parse('2026-12-03T12:00:00Z');
    for (let i = 0; i < 7; i++) recordPairFailure(ctx.db, 'someone@example.com', '203.0.113.9', DEFAULT_PAIR_THROTTLE, t);
    const waiting = pairWaitMs(ctx.db, 'someone@example.com', '203.0.113.9', DEFAULT_PAIR_THROTTLE, t);
    expect(waiting).toBeGreaterThan(0);
    const rows = () => ctx.db.select().from(rateLimitHits).all().filter((r) => r.key.startsWith('sign-in-pair:'));
    expect(pruneExpiredRateLimits(ctx.db, t + DEFAULT_PAIR_THROTTLE.forgetAfterMs - 1)).toBe(0);
    expect(rows()).toHaveLength(1);
    expect(pruneExpiredRateLimits(ctx.db, t + DEFAULT_PAIR_THROTTLE.forgetAfterMs)).toBe(1);
    expect(rows()).toHaveLength(0);
    expect(pairWaitMs(ctx.db, 'someone@example.com', '203.0.113.9', DEFAULT_PAIR_THROTTLE, t + DEFAULT_PAIR_THROTTLE.forgetAfterMs)).toBe(0);
  });
});

describe('sign-up does not tell whether an address has an account', async () => {
  const ctx = await createMailTestContext({ signUpLimit: { windowMs: 60_000, perAddress: 1000 } });

  it('answers a taken address exactly as a new one, without a session, and mails the owner instead', async () => {
    await ctx.signedIn('grower', 'owner@example.com');
    const taken = await ctx.agent().post('/api/auth/sign-up').send({ email: 'Owner@Example.com', displayName: 'Intruder', acceptDataLicence: true, password: 'a long enough password' });
    const fresh = await ctx.agent().post('/api/auth/sign-up').send({ email: 'newcomer@example.com', displayName: 'Newcomer', acceptDataLicence: true, password: 'a long enough password' });
    for (const res of [taken, fresh]) {
      expect(res.status).toBe(202);
      expect(res.body).toEqual({ message: SIGN_UP_ANSWER });
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    expect(Object.keys(taken.headers).sort()).toEqual(Object.keys(fresh.headers).sort());

    // The owner hears of it (text and HTML), with the way to sign in or choose a new password.
    await expect.poll(() => ctx.inbox('owner@example.com').length, { timeout: 10_000 }).toBe(1);
    const notice = ctx.inbox('owner@example.com')[0]!;
    expect(notice.subject).toBe('Someone tried to join Syconium with your address');
    expect(notice.text).toContain(`${ctx.config.appUrl}/sign-in`);
    expect(notice.text).toContain(`${ctx.config.appUrl}/forgot-password`);
    expect(notice.html).toContain('href="' + `${ctx.config.appUrl}/forgot-password`);
    expect(notice.text).not.toContain('Intruder');
    // The newcomer gets the confirmation link; nothing about the owner's account changed.
    await expect.poll(() => ctx.inbox('newcomer@example.com').length, { timeout: 10_000 }).toBe(1);
    expect(linkToken(ctx.inbox('newcomer@example.com')[0]!.text, '/verify')).toBeTruthy();
    const owner = ctx.db.select().from(users).all().find((u) => u.email === 'owner@example.com')!;
    expect(owner.displayName).not.toBe('Intruder');
    expect((await ctx.agent().post('/api/auth/sign-in').send({ email: 'owner@example.com', password: 'a long enough password' })).status).toBe(401);
  });

  it('sends the owner one notice an hour at most, however many attempts', async () => {
    await ctx.signedIn('grower', 'busy@example.com');
    for (let i = 0; i < 5; i++) expect((await ctx.agent().post('/api/auth/sign-up').send({ email: 'busy@example.com', displayName: 'Flood', acceptDataLicence: true, password: 'a long enough password' })).status).toBe(202);
    await expect.poll(() => ctx.inbox('busy@example.com').length, { timeout: 10_000 }).toBe(1);
    await new Promise((r) => setTimeout(r, 300));
    expect(ctx.inbox('busy@example.com')).toHaveLength(1);
  });
});

describe('sign-up is limited per client address', () => {
  it('answers 429 with Retry-After past the limit, for new and taken addresses alike', async () => {
    const ctx = createTestContext({ signUpLimit: { windowMs: 60 * 60_000, perAddress: 3 } });
    await ctx.signedIn('grower', 'taken@example.com');
    const join = (email: string, address = '192.0.2.40') => ctx.agent().post('/api/auth/sign-up').set(from(address)).send({ email, displayName: 'Joiner', acceptDataLicence: true, password: 'a long enough password' });
    expect((await join('a1@example.com')).status).toBe(202);
    expect((await join('taken@example.com')).status).toBe(202);
    expect((await join('a2@example.com')).status).toBe(202);
    const over = await join('a3@example.com');
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe('rate_limited');
    expect(Number(over.headers['retry-after'])).toBeGreaterThan(3000);
    expect((await join('taken@example.com')).status).toBe(429);
    expect(ctx.db.select().from(users).all().map((u) => u.email)).not.toContain('a3@example.com');
    // Another address is not affected; malformed requests are refused before they count.
    expect((await join('a4@example.com', '192.0.2.41')).status).toBe(202);
  });
});
