import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import supertest from 'supertest';
import { createApp, type AppDeps } from '../../server/app';
import { createDb, migrateDb, type Db } from '../../server/db/client';
import { readConfig, type Config } from '../../server/lib/config';
import { hashPassword } from '../../server/auth/password';
import { insertUser } from '../../server/users/users.repo';
import type { Role } from '../../shared/domain/codes';

/** A fresh, migrated SQLite file in a temporary folder (a real database, not a mock). */
export function createTestDb(): { db: Db; file: string; dir: string } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-test-'));
  const file = path.join(dir, 'test.db');
  const db = createDb(file);
  migrateDb(db);
  return { db, file, dir };
}

export function testConfig(overrides: Partial<Config> = {}): Config {
  return { ...readConfig({ NODE_ENV: 'test' }), seedDemo: false, ...overrides };
}

export interface TestContext {
  db: Db;
  dir: string;
  config: Config;
  app: ReturnType<typeof createApp>;
  /** A supertest agent that keeps cookies and sends the CSRF header on writes. */
  agent: () => TestAgent;
  /** Create an account with a role and return a signed-in agent for it. */
  signedIn: (role?: Role, email?: string) => Promise<TestAgent & { userId: number }>;
}

export type TestAgent = ReturnType<typeof wrapAgent>;

function wrapAgent(agent: ReturnType<typeof supertest.agent>) {
  return {
    get: (url: string) => agent.get(url),
    post: (url: string) => agent.post(url).set('X-Syconium-Request', '1'),
    patch: (url: string) => agent.patch(url).set('X-Syconium-Request', '1'),
    put: (url: string) => agent.put(url).set('X-Syconium-Request', '1'),
    delete: (url: string) => agent.delete(url).set('X-Syconium-Request', '1'),
    raw: agent,
  };
}

export const TEST_PASSWORD = 'correct horse battery';
let passwordHash: Promise<string> | undefined;

export function createTestContext(deps: Partial<AppDeps> = {}, configOverrides: Partial<Config> = {}): TestContext {
  const { db, dir } = createTestDb();
  const config = testConfig({ uploadsDir: path.join(dir, 'uploads'), ...configOverrides });
  const app = createApp({ db, config, ...deps });
  const agent = () => wrapAgent(supertest.agent(app));
  let counter = 0;
  return {
    db,
    dir,
    config,
    app,
    agent,
    signedIn: async (role = 'grower', email) => {
      const address = email ?? `${role}-${++counter}-${Date.now()}@example.com`;
      const user = insertUser(db, {
        email: address,
        displayName: `Test ${role} ${counter}`,
        passwordHash: await (passwordHash ??= hashPassword(TEST_PASSWORD)),
        role,
        emailVerifiedAt: new Date().toISOString(),
      });
      const a = agent();
      const res = await a.post('/api/auth/sign-in').send({ email: address, password: TEST_PASSWORD });
      if (res.status !== 200) throw new Error(`sign-in failed in test setup: ${res.status} ${JSON.stringify(res.body)}`);
      return Object.assign(a, { userId: user.id });
    },
  };
}

/**
 * Join as the client does: POST /api/auth/sign-up (the same 202 whether or not the address is taken,
 * and no session), then sign in with the same details. Answers the sign-in response.
 */
export async function signUpAndIn(agent: TestAgent, body: { email: string; displayName: string; password: string; acceptDataLicence?: boolean }): Promise<supertest.Response> {
  // Joining means agreeing to the open-data licence, as the sign-up form asks.
  const joined = await agent.post('/api/auth/sign-up').send({ acceptDataLicence: true, ...body });
  if (joined.status !== 202) throw new Error(`sign-up answered ${joined.status} ${JSON.stringify(joined.body)}`);
  return agent.post('/api/auth/sign-in').send({ email: body.email, password: body.password });
}
