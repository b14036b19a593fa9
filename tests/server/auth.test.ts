import { describe, expect, it } from 'vitest';
import { createTestContext, TEST_PASSWORD } from '../helpers/test-app';
import { users } from '../../server/db/schema';

describe('accounts', () => {
  it('signs up (no session yet), signs in with the same details, says who I am, signs out', async () => {
    const { agent } = createTestContext();
    const a = agent();
    const signUp = await a.post('/api/auth/sign-up').send({ email: 'Ada@Example.com', displayName: 'Ada', acceptDataLicence: true, password: 'a long enough password' });
    expect(signUp.status).toBe(202);
    expect(signUp.headers['set-cookie']).toBeUndefined();
    expect((await a.get('/api/auth/me')).body.user).toBeNull();
    const signIn = await a.post('/api/auth/sign-in').send({ email: 'ada@example.com', password: 'a long enough password' });
    expect(signIn.body.user).toMatchObject({ email: 'ada@example.com', role: 'grower', emailVerified: false });
    expect(signIn.headers['set-cookie']?.[0]).toMatch(/HttpOnly/i);
    expect(signIn.headers['set-cookie']?.[0]).toMatch(/SameSite=Lax/i);

    expect((await a.get('/api/auth/me')).body.user.displayName).toBe('Ada');
    expect((await a.post('/api/auth/sign-out')).status).toBe(204);
    expect((await a.get('/api/auth/me')).body.user).toBeNull();
  });

  it('stores an argon2 hash, never the password', async () => {
    const { agent, db } = createTestContext();
    await agent().post('/api/auth/sign-up').send({ email: 'b@example.com', displayName: 'Bea', acceptDataLicence: true, password: 'another long password' });
    const row = db.select().from(users).get()!;
    expect(row.passwordHash).toMatch(/^\$argon2id\$/);
    expect(row.passwordHash).not.toContain('another long password');
  });

  it('a taken address gets the same answer as a new one, and creates nothing', async () => {
    const { agent, db } = createTestContext();
    const body = { email: 'c@example.com', displayName: 'Cy', acceptDataLicence: true, password: 'a long enough password' };
    const first = await agent().post('/api/auth/sign-up').send(body);
    const again = await agent().post('/api/auth/sign-up').send({ ...body, displayName: 'Someone else', email: 'C@EXAMPLE.COM' });
    expect(again.status).toBe(first.status);
    expect(again.body).toEqual(first.body);
    expect(db.select().from(users).all()).toHaveLength(1);
    expect(db.select().from(users).get()!.displayName).toBe('Cy');
  });

  it('gives the same answer for a wrong password and an unknown e-mail', async () => {
    const { agent, signedIn } = createTestContext();
    await signedIn('grower', 'dee@example.com');
    const wrongPassword = await agent().post('/api/auth/sign-in').send({ email: 'dee@example.com', password: 'not the password' });
    const unknownEmail = await agent().post('/api/auth/sign-in').send({ email: 'nobody@example.com', password: TEST_PASSWORD });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(wrongPassword.body).toEqual(unknownEmail.body);
  });

  it('issues a new session id at sign-in (no session fixation)', async () => {
    const { agent, signedIn } = createTestContext();
    await signedIn('grower', 'eve@example.com');
    const a = agent();
    // A first sign-in attempt that fails still sets no session; sign in twice and compare cookies.
    const first = await a.post('/api/auth/sign-in').send({ email: 'eve@example.com', password: TEST_PASSWORD });
    const second = await a.post('/api/auth/sign-in').send({ email: 'eve@example.com', password: TEST_PASSWORD });
    const sid = (res: typeof first) => res.headers['set-cookie']?.[0]?.split(';')[0];
    expect(sid(first)).toBeDefined();
    expect(sid(second)).toBeDefined();
    expect(sid(second)).not.toEqual(sid(first));
  });

  it('treats a forged session cookie as signed out', async () => {
    const { agent } = createTestContext();
    const res = await agent().get('/api/auth/me').set('Cookie', 'syconium.sid=s%3Aforged.signature');
    expect(res.status).toBe(200);
    expect(res.body.user).toBeNull();
  });

});

describe('validation and errors', () => {
  it('names each bad field and writes nothing', async () => {
    const { agent, db } = createTestContext();
    const res = await agent().post('/api/auth/sign-up').send({ email: 'not-an-email', displayName: 'x'.repeat(61), acceptDataLicence: true, password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['displayName', 'email', 'password']);
    expect(db.select().from(users).all()).toHaveLength(0);
  });

  it('answers malformed JSON with a 400', async () => {
    const { agent } = createTestContext();
    const res = await agent().post('/api/auth/sign-up').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_json');
  });

  it('answers wrong types with a 400 naming the field', async () => {
    const { agent } = createTestContext();
    const res = await agent().post('/api/auth/sign-up').send({ email: 42, displayName: ['a'], acceptDataLicence: true, password: true });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('email');
    expect(res.body.error.fields).toHaveProperty('displayName');
  });

  it('answers unknown API routes with JSON 404', async () => {
    const { agent } = createTestContext();
    const res = await agent().get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('refuses a write without the CSRF header', async () => {
    const { agent } = createTestContext();
    const res = await agent().raw.post('/api/auth/sign-up').send({ email: 'g@example.com', displayName: 'Gus', acceptDataLicence: true, password: 'a long enough password' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
  });
});

describe('roles', () => {
  it('lets only admins list users: 401 signed out, 403 for growers and editors', async () => {
    const { agent, signedIn } = createTestContext();
    expect((await agent().get('/api/users')).status).toBe(401);
    expect((await (await signedIn('grower')).get('/api/users')).status).toBe(403);
    expect((await (await signedIn('editor')).get('/api/users')).status).toBe(403);
    expect((await (await signedIn('admin')).get('/api/users')).status).toBe(200);
  });

  it('lets an admin change a role, and the change is audited', async () => {
    const { signedIn, db } = createTestContext();
    const grower = await signedIn('grower');
    const admin = await signedIn('admin');
    const res = await admin.patch(`/api/users/${grower.userId}/role`).send({ role: 'editor' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('editor');
    expect((await grower.get('/api/auth/me')).body.user.role).toBe('editor');
    const audit = db.query.auditLog.findMany().sync();
    expect(audit).toEqual([expect.objectContaining({ action: 'user.role', before: { role: 'grower' }, after: { role: 'editor' } })]);
  });

  it('rejects an unknown role naming the field', async () => {
    const { signedIn } = createTestContext();
    const admin = await signedIn('admin');
    const res = await admin.patch(`/api/users/${admin.userId}/role`).send({ role: 'overlord' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('role');
  });
});
