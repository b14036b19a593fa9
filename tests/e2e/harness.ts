import { chromium, type Browser, type Page } from 'playwright-core';
import { startTempServer } from '../helpers/temp-server';

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

export interface RunningServer {
  url: string;
  /** Stop the server and delete its files. */
  stop: () => Promise<void>;
}

/** Start the real production server (built client, demo seed) on a free port with its own database. */
export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  const temp = await startTempServer('e2e', env);
  return { url: temp.process.url, stop: temp.remove };
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
