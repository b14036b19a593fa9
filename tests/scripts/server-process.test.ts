// The production server as the benchmarks and `npm run load` start it (scripts/server-process.ts).
// Production refuses to start without SESSION_SECRET (server/lib/session-secret.ts); a script run from
// a plain shell has none, so the helper gives the process its own: `npm run bench -- client` once
// stopped at "server exited early" for want of it.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { startServerProcess, type ServerProcess } from '../../scripts/server-process';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-server-process-'));
let server: ServerProcess | undefined;
afterAll(async () => {
  await server?.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

it('starts the production server from a shell without SESSION_SECRET', async () => {
  const { SESSION_SECRET: _unset, ...shell } = process.env;
  const saved = process.env;
  process.env = shell;
  try {
    server = await startServerProcess({ SYCONIUM_DB: path.join(dir, 'bench.db'), SYCONIUM_UPLOADS: path.join(dir, 'uploads'), LOG_LEVEL: 'warn' });
  } finally {
    process.env = saved;
  }
  const answer = await fetch(`${server.url}/api/health/ready`);
  expect(answer.status).toBe(200);
}, 180_000);
