import fs from 'node:fs';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../../server/seed/demo-scenario';
import { startTempServer, type TempServer } from '../../helpers/temp-server';

/*
 * SYCONIUM_INSTANCES=2: two server processes share the port (node:cluster). A session made through
 * one answers through the other (sessions live in the database), a killed instance is replaced,
 * and SIGTERM stops them all cleanly.
 */

let temp: TempServer | undefined;
const server = () => temp!.process;

beforeAll(async () => {
  temp = await startTempServer('instances', { SYCONIUM_INSTANCES: '2', SYCONIUM_DEV_MAIL: 'false' });
}, 180_000);
afterAll(async () => {
  await temp?.remove();
});

/** The instance processes: children of the supervising process (Linux /proc). */
function instancePids(): number[] {
  const parent = String(server().child.pid);
  return fs
    .readdirSync('/proc')
    .filter((name) => /^\d+$/.test(name))
    .filter((pid) => {
      try {
        return fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')[1] === parent;
      } catch {
        return false;
      }
    })
    .map(Number);
}

/** GET on a new connection each time (the cluster hands out connections, not requests). */
function getOnNewConnection(url: string, cookie: string): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { agent: false, headers: { cookie } }, (res) => {
        let body = '';
        res.on('data', (chunk) => (body += chunk));
        res.on('end', () => resolve({ status: res.statusCode!, body }));
      })
      .on('error', reject);
  });
}

/** Run a wait; when it fails, its error carries the servers' output, to tell why (a slow start, a crash). */
async function withOutput(what: string, wait: () => Promise<unknown>): Promise<void> {
  try {
    await wait();
  } catch (error) {
    throw new Error(`${what}: ${(error as Error).message}\n--- server output ---\n${server().output()}\n--- instance pids: ${instancePids().join(', ')}`);
  }
}

describe('several instances on one port', { timeout: 120_000 }, () => {
  it('share sessions through the database, replace an instance that dies, and stop together', async () => {
    // Health answers once the first instance listens; the second may still be starting.
    await withOutput('two instance processes', () => expect.poll(() => instancePids().length, { timeout: 90_000, interval: 500 }).toBe(2));
    const listening = () => (server().output().match(/Syconium is running at .*one of 2/g) ?? []).length;
    await withOutput('both instances listening', () => expect.poll(listening, { timeout: 90_000, interval: 500 }).toBe(2));
    // Neither instance died on the way up.
    expect(server().output()).not.toMatch(/starting another/);
    const signIn = await fetch(`${server().url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-syconium-request': '1' },
      body: JSON.stringify({ email: 'grower@demo.syconium.test', password: DEMO_PASSWORD }),
    });
    expect(signIn.status).toBe(200);
    const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!;
    // Eight new connections go to both instances in turn: each knows the session.
    for (let i = 0; i < 8; i++) {
      const me = await getOnNewConnection(`${server().url}/api/auth/me`, cookie);
      expect(me.status).toBe(200);
      expect(JSON.parse(me.body).user.email).toBe('grower@demo.syconium.test');
    }

    const [victim] = instancePids();
    process.kill(victim!, 'SIGKILL');
    await withOutput('the supervisor noticed the kill', () => expect.poll(() => server().output(), { timeout: 60_000 }).toMatch(/stopped \(SIGKILL\); starting another/));
    await withOutput('the replacement listening', () => expect.poll(listening, { timeout: 90_000, interval: 500 }).toBe(3));
    expect(instancePids().filter((pid) => pid !== victim)).toHaveLength(2);
    for (let i = 0; i < 4; i++) expect((await getOnNewConnection(`${server().url}/api/health`, '')).status).toBe(200);

    await server().stop();
    expect(server().child.exitCode).toBe(0);
    expect(server().output().match(/SIGTERM: shutting down/g)).toHaveLength(2);
  });
});
