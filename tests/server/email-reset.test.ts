import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { emailTokens, sessions, users } from '../../server/db/schema';
import { FORGOT_ANSWER } from '../../server/auth/password-reset.router';
import { TEST_PASSWORD } from '../helpers/test-app';
import { createMailTestContext, linkToken } from './email-helpers';

const NEW_PASSWORD = 'a brand new fig password';

describe('password reset, through the local SMTP server', async () => {
  const ctx = await createMailTestContext();

  /** The reset mail is sent after the answer (so timing tells nothing): wait for it to arrive. */
  async function resetToken(email: string, nth = 1): Promise<string> {
    await expect.poll(() => ctx.inbox(email).length, { timeout: 10_000 }).toBeGreaterThanOrEqual(nth);
    return linkToken(ctx.inbox(email)[nth - 1]!.text, '/reset-password');
  }

  it('answers the same for a known and an unknown address, and mails only the known one', async () => {
    await ctx.signedIn('grower', 'known@example.com');
    const known = await ctx.agent().post('/api/auth/forgot').send({ email: 'Known@Example.com' });
    const unknown = await ctx.agent().post('/api/auth/forgot').send({ email: 'nobody@example.com' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    expect(known.body.message).toBe(FORGOT_ANSWER);
    await resetToken('known@example.com');
    expect(ctx.inbox('nobody@example.com')).toHaveLength(0);

    const bad = await ctx.agent().post('/api/auth/forgot').send({ email: 'not an address' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.email).toBeDefined();
  });

  it('sets the new password once, and signs out every other session', async () => {
    const phone = await ctx.signedIn('grower', 'rosa@example.com');
    const laptop = ctx.agent();
    expect((await laptop.post('/api/auth/sign-in').send({ email: 'rosa@example.com', password: TEST_PASSWORD })).status).toBe(200);
    const userId = phone.userId;
    expect(ctx.db.select().from(sessions).where(eq(sessions.userId, userId)).all()).toHaveLength(2);

    await ctx.agent().post('/api/auth/forgot').send({ email: 'rosa@example.com' });
    const token = await resetToken('rosa@example.com');
    const message = ctx.inbox('rosa@example.com')[0]!;
    expect(message.subject).toBe('Choose a new Syconium password');
    expect(message.html).toContain('Choose a new password');

    const browser = ctx.agent();
    const tooShort = await browser.post('/api/auth/reset').send({ token, password: 'short' });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.error.fields.password).toBeDefined();

    const reset = await browser.post('/api/auth/reset').send({ token, password: NEW_PASSWORD });
    expect(reset.status).toBe(200);
    expect(reset.body.user.email).toBe('rosa@example.com');

    // Both earlier sessions are gone; the browser that reset is signed in afresh.
    expect((await phone.get('/api/auth/me')).body.user).toBeNull();
    expect((await laptop.get('/api/auth/me')).body.user).toBeNull();
    expect((await browser.get('/api/auth/me')).body.user.email).toBe('rosa@example.com');
    expect(ctx.db.select().from(sessions).where(eq(sessions.userId, userId)).all()).toHaveLength(1);

    // The new password works, the old one does not; the row holds an argon2 hash.
    expect((await ctx.agent().post('/api/auth/sign-in').send({ email: 'rosa@example.com', password: TEST_PASSWORD })).status).toBe(401);
    expect((await ctx.agent().post('/api/auth/sign-in').send({ email: 'rosa@example.com', password: NEW_PASSWORD })).status).toBe(200);
    expect(ctx.db.select().from(users).where(eq(users.id, userId)).get()!.passwordHash).toMatch(/^\$argon2id\$/);

    const again = await ctx.agent().post('/api/auth/reset').send({ token, password: 'yet another password' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('link_used');
    expect((await ctx.agent().post('/api/auth/sign-in').send({ email: 'rosa@example.com', password: NEW_PASSWORD })).status).toBe(200);
  });

  it('refuses an expired link and leaves the password as it was', async () => {
    const grower = await ctx.signedIn('grower', 'slow@example.com');
    await ctx.agent().post('/api/auth/forgot').send({ email: 'slow@example.com' });
    const token = await resetToken('slow@example.com');
    // An hour later: move the stored expiry into the past.
    ctx.db.update(emailTokens).set({ expiresAt: new Date(Date.now() - 1000).toISOString() }).where(eq(emailTokens.userId, grower.userId)).run();

    const expired = await ctx.agent().post('/api/auth/reset').send({ token, password: NEW_PASSWORD });
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('link_expired');
    expect((await grower.get('/api/auth/me')).body.user.email).toBe('slow@example.com');
    expect((await ctx.agent().post('/api/auth/sign-in').send({ email: 'slow@example.com', password: TEST_PASSWORD })).status).toBe(200);
  });

  it('limits reset requests per e-mail address, known or not', async () => {
    const limited = await createMailTestContext({ forgotLimit: { windowMs: 60_000, perAddress: 100, perEmail: 2 } });
    const answers = [];
    for (let i = 0; i < 3; i++) answers.push((await limited.agent().post('/api/auth/forgot').send({ email: 'ghost@example.com' })).status);
    expect(answers).toEqual([202, 202, 429]);
  });
});
