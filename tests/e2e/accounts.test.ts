import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { launchBrowser, recordRequests, signIn, startServer, type RunningServer } from './harness';

describe('accounts in the browser', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('signs the demo editor in and shows the editors’ area; all requests stay on this origin', async () => {
    const page = await browser.newPage();
    const requests = recordRequests(page);
    await signIn(page, server.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Editors', exact: true }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Editors’ workspace' }).isVisible()).toBe(true);
    expect(requests.filter((u) => !u.startsWith(server.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('shows a field error when signing up with a short password', async () => {
    const page = await browser.newPage();
    await page.goto(`${server.url}/sign-up`);
    await page.getByLabel('Name shown with your reports').fill('Test Grower');
    await page.getByLabel('E-mail').fill('new@example.com');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => page.getByText('Use at least 10 characters').isVisible()).toBe(true);
  });
});
