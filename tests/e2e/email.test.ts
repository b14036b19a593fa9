import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, recordRequests, startServer, type RunningServer } from './harness';

/** Open the newest development-mailbox message with this subject to this address and follow its link to `path`. */
async function followMailedLink(page: Page, url: string, subject: string, to: string, path: string): Promise<void> {
  await page.goto(`${url}/dev/mail`);
  const item = page.getByRole('list', { name: 'Messages' }).getByRole('button').filter({ hasText: subject }).filter({ hasText: to }).first();
  await item.waitFor({ timeout: 30_000 });
  await item.click();
  const link = page.locator(`a[href*="${path}?token="]`).first();
  await link.waitFor({ timeout: 30_000 });
  await link.click();
  await page.waitForURL((u) => u.pathname === path);
}

describe('e-mail in the browser, through the development mail server', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    // The production build with the local mail server asked for (it is off in production by default).
    [server, browser] = await Promise.all([startServer({ SYCONIUM_DEV_MAIL: 'true' }), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('verifies a new account from the mailed link, then resets its password; nothing leaves the machine', async () => {
    const page = await browser.newPage();
    const requests = recordRequests(page);
    const email = 'wren@example.com';

    await page.goto(`${server.url}/sign-up`);
    // The first page load fetches the whole client bundle: on a busy machine that takes a while.
    await page.getByLabel('Name shown with your reports').waitFor({ timeout: 90_000 });
    await page.getByLabel('Name shown with your reports').fill('Wren');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('a long enough password');
    await page.getByRole('button', { name: 'Create account' }).click();
    const banner = page.getByText('Please confirm your e-mail address.');
    await banner.waitFor({ timeout: 30_000 });

    await followMailedLink(page, server.url, 'Confirm your e-mail for Syconium', email, '/verify');
    await page.getByText('Your e-mail address is confirmed').waitFor({ timeout: 30_000 });
    await expect.poll(() => banner.isVisible(), { timeout: 30_000 }).toBe(false);

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.goto(`${server.url}/sign-in`);
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send me a reset link' }).click();
    await page.getByText('If an account uses that address').waitFor({ timeout: 30_000 });

    await followMailedLink(page, server.url, 'Choose a new Syconium password', email, '/reset-password');
    await page.getByLabel('New password').fill('a fresh fig password');
    await page.getByRole('button', { name: 'Set my new password' }).click();
    await page.getByText('Your new password is set').waitFor({ timeout: 30_000 });
    await expect.poll(() => page.getByRole('link', { name: /Wren/ }).isVisible(), { timeout: 30_000 }).toBe(true);

    expect(requests.filter((u) => !u.startsWith(server.url) && !/^(data|blob|about):/.test(u))).toEqual([]);
  }, 300_000);
});
