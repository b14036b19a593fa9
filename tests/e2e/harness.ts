import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';

/** Chromium from Debian's package, never a downloaded browser. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

export interface RunningServer {
  url: string;
  dir: string;
  stop: () => Promise<void>;
}

/** Start the real production server (built client, demo seed) on a free port with its own database. */
export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  const port = await freePort();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-e2e-'));
  // One node process (tsx as a loader, not the tsx CLI, which forks a second one) in its own
  // process group, so stop() ends everything it started.
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    detached: true,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      SYCONIUM_DB: path.join(dir, 'e2e.db'),
      SYCONIUM_UPLOADS: path.join(dir, 'uploads'),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk) => (output += chunk));
  child.stderr?.on('data', (chunk) => (output += chunk));
  const url = `http://127.0.0.1:${port}`;
  // A cold start seeds the demo (two real station files): allow for a busy machine.
  const deadline = Date.now() + 180_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      killGroup(child, 'SIGKILL');
      throw new Error(`server did not start:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    url,
    dir,
    stop: async () => {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      killGroup(child, 'SIGTERM');
      const timer = setTimeout(() => killGroup(child, 'SIGKILL'), 5_000);
      await exited;
      clearTimeout(timer);
    },
  };
}

function killGroup(child: ChildProcess, signal: NodeJS.Signals): void {
  try {
    process.kill(-child.pid!, signal);
  } catch {
    // already gone
  }
}

/** Record every request a page makes, to prove none leaves the machine. */
export function recordRequests(page: Page): string[] {
  const urls: string[] = [];
  page.on('request', (request) => urls.push(request.url()));
  return urls;
}

export async function signIn(page: Page, url: string, email: string, password: string): Promise<void> {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}
