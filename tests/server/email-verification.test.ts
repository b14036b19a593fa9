import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { emailTokens, users } from '../../server/db/schema';
import { createMailTestContext, join, linkToken } from './email-helpers';

describe('e-mail verification, through the local SMTP server', async () => {
  const ctx = await createMailTestContext();

  it('sends a link at sign-up that verifies the address once', async () => {
    const a = ctx.agent();
    const signUp = await join(ctx, a, { email: 'Vera@Example.com', displayName: 'Vera', acceptDataLicence: true, password: 'a long enough password' });
    expect(signUp.status).toBe(200);
    expect(signUp.body.user.emailVerified).toBe(false);

    const [message, ...others] = ctx.inbox('vera@example.com');
    expect(others).toHaveLength(0);
    expect(message!.subject).toBe('Confirm your e-mail for Syconium');
    expect(message!.html).toContain('Confirm my e-mail');
    const token = linkToken(message!.text, '/verify');
    expect(message!.text).toContain(`${ctx.config.appUrl}/verify?token=${token}`);
    // Only a hash is stored, never the token itself.
    const stored = ctx.db.select().from(emailTokens).all();
    expect(stored.map((t) => t.tokenHash)).not.toContain(token);

    // The link works without being signed in (it may be opened in another browser).
    const verify = await ctx.agent().post('/api/auth/verify').send({ token });
    expect(verify.status).toBe(200);
    // Nobody is signed in on the browser that opened it.
    expect(verify.body.user).toBeNull();
    expect((await a.get('/api/auth/me')).body.user.emailVerified).toBe(true);

    const again = await ctx.agent().post('/api/auth/verify').send({ token });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('link_used');
  });

  it('answers with the account signed in on this browser as it is after the confirmation', async () => {
    // The page writes this answer into its cache: a GET /me answered just before the confirmation must
    // not decide what the page shows (tests/client/current-user-race.test.tsx, tests/e2e/email.test.ts).
    const a = ctx.agent();
    await join(ctx, a, { email: 'same@example.com', displayName: 'Same', acceptDataLicence: true, password: 'a long enough password' });
    const other = ctx.agent();
    await join(ctx, other, { email: 'other@example.com', displayName: 'Other', acceptDataLicence: true, password: 'a long enough password' });

    const own = await a.post('/api/auth/verify').send({ token: linkToken(ctx.inbox('same@example.com')[0]!.text, '/verify') });
    expect(own.status).toBe(200);
    expect(own.body.user).toEqual((await a.get('/api/auth/me')).body.user);
    expect(own.body.user).toMatchObject({ email: 'same@example.com', emailVerified: true });

    // A third grower's link opened where Other is signed in: the third is confirmed, and Other's own
    // account comes back, unchanged.
    await join(ctx, ctx.agent(), { email: 'third@example.com', displayName: 'Third', acceptDataLicence: true, password: 'a long enough password' });
    const foreign = await other.post('/api/auth/verify').send({ token: linkToken(ctx.inbox('third@example.com')[0]!.text, '/verify') });
    expect(foreign.status).toBe(200);
    expect(foreign.body.user).toMatchObject({ email: 'other@example.com', emailVerified: false });
    expect(ctx.db.select().from(users).where(eq(users.email, 'third@example.com')).get()!.emailVerifiedAt).not.toBeNull();
  });

  it('rejects an expired link and an unknown one', async () => {
    const a = ctx.agent();
    await join(ctx, a, { email: 'late@example.com', displayName: 'Late', acceptDataLicence: true, password: 'a long enough password' });
    const token = linkToken(ctx.inbox('late@example.com')[0]!.text, '/verify');
    const user = ctx.db.select().from(users).where(eq(users.email, 'late@example.com')).get()!;
    // 48 hours later: move the stored expiry into the past.
    ctx.db.update(emailTokens).set({ expiresAt: new Date(Date.now() - 1000).toISOString() }).where(eq(emailTokens.userId, user.id)).run();

    const expired = await a.post('/api/auth/verify').send({ token });
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('link_expired');
    expect((await a.get('/api/auth/me')).body.user.emailVerified).toBe(false);

    const unknown = await a.post('/api/auth/verify').send({ token: 'x'.repeat(43) });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.code).toBe('link_invalid');
    const malformed = await a.post('/api/auth/verify').send({});
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields.token).toBeDefined();
  });

  it('resends a fresh link to a signed-in unverified grower, and refuses when already verified', async () => {
    const a = ctx.agent();
    await join(ctx, a, { email: 'resend@example.com', displayName: 'Res', acceptDataLicence: true, password: 'a long enough password' });
    const resend = await a.post('/api/auth/verify/resend');
    expect(resend.status).toBe(200);
    const messages = ctx.inbox('resend@example.com');
    expect(messages).toHaveLength(2);
    const second = linkToken(messages[1]!.text, '/verify');
    expect(second).not.toBe(linkToken(messages[0]!.text, '/verify'));
    expect((await ctx.agent().post('/api/auth/verify').send({ token: second })).status).toBe(200);

    expect((await a.post('/api/auth/verify/resend')).status).toBe(409);
    expect((await ctx.agent().post('/api/auth/verify/resend')).status).toBe(401);
  });
});
