import sharp from 'sharp';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';
import { afterAll, beforeAll, inject } from 'vitest';
import { CHROMIUM_ARGS } from '../../scripts/ensure-chromium';
import { startTempServer, type TempServer } from '../helpers/temp-server';

function launchBrowser(): Promise<Browser> {
  // Chromium from Debian's package, never a downloaded browser: global-setup.ts found (or installed) it.
  return chromium.launch({ executablePath: inject('chromiumPath'), headless: true, args: CHROMIUM_ARGS });
}

/** The real server and a browser for the tests of one describe block. */
export interface Site {
  /** The server's address, e.g. http://127.0.0.1:41234. */
  readonly url: string;
  newPage: (options?: BrowserContextOptions) => Promise<Page>;
  /** A context of its own (one "phone"): its pages share storage, so a page can close and another reopen it. */
  newContext: (options?: BrowserContextOptions) => Promise<BrowserContext>;
}

/**
 * Before the block's tests, start the real production server (built client, demo seed) on a free
 * port with its own database, and the browser; after them, close both and delete the server's files.
 */
export function openSite(env: Record<string, string> = {}): Site {
  let server: TempServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    [server, browser] = await Promise.all([startTempServer('e2e', env), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.remove();
  });
  return {
    get url() {
      return server!.process.url;
    },
    newPage: (options) => browser!.newPage(options),
    newContext: (options) => browser!.newContext(options),
  };
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

/**
 * The report form after its tree and variety: an invented spot near Rapid City, SD (far from the demo's
 * towns), in a container, season 2025, ripened on 3 September, with one photo named `photoName`.
 */
export async function fillRipenedContainerReport(page: Page, photoName: string): Promise<void> {
  await page.getByLabel('Latitude').fill('44.08123');
  await page.getByLabel('Longitude').fill('-103.23111');
  await page.getByRole('radio', { name: 'In a container' }).check();
  await page.getByLabel('Season year').fill('2025');
  await page.getByRole('radio', { name: /^Ripened/ }).check();
  await page.getByLabel('First ripe fig').fill('2025-09-03');
  const photo = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#6b3a5b' } }).jpeg().toBuffer();
  await page.getByLabel('Add photos').setInputFiles({ name: photoName, mimeType: 'image/jpeg', buffer: photo });
}
