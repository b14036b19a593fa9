import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { loginSession, SESSION_COOKIE } from '../../server/middleware/login-session';
import { createTestContext } from '../helpers/test-app';

/** An app whose "session" only records that it ran, and a route that says whether it did. */
function recordingApp() {
  const app = express();
  app.use(
    loginSession(
      (req, _res, next) => {
        (req as { steps?: string[] }).steps = ['session'];
        next();
      },
      (req, _res, next) => {
        (req as { steps?: string[] }).steps?.push('user');
        next();
      },
    ),
  );
  app.all('/probe', (req, res) => void res.json({ steps: (req as { steps?: string[] }).steps ?? [] }));
  return app;
}

describe('loginSession', () => {
  it('skips the session for a read without the session cookie, and runs it in order otherwise', async () => {
    const app = recordingApp();
    expect((await request(app).get('/probe')).body.steps).toEqual([]);
    expect((await request(app).get('/probe').set('Cookie', 'other=1')).body.steps).toEqual([]);
    expect((await request(app).get('/probe').set('Cookie', `other=1; ${SESSION_COOKIE}=s%3Aabc`)).body.steps).toEqual(['session', 'user']);
    expect((await request(app).post('/probe')).body.steps).toEqual(['session', 'user']);
  });

  it('keeps a signed-in grower signed in on reads, and an anonymous read gets no cookie', async () => {
    const { agent, signedIn } = createTestContext();
    const anonymous = await agent().get('/api/auth/me');
    expect(anonymous.body.user).toBeNull();
    expect(anonymous.headers['set-cookie']).toBeUndefined();
    const grower = await signedIn('grower', 'kim@example.com');
    expect((await grower.get('/api/auth/me')).body.user.email).toBe('kim@example.com');
  });
});
