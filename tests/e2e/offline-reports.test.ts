import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { fillRipenedContainerReport, openSite, signIn } from './harness';

/*
 * Offline drafts: a grower in the garden with no signal writes a report with a photo; it is kept on
 * the phone (IndexedDB), survives the tab closing, and is stored exactly once when the connection
 * returns, even when the first answer is lost on the way back (the clientId idempotency key).
 */

const TREE = `Offline pot ${Date.now()}`;
/** A slow, shared machine: give each step room. */
const eventually = <T>(read: () => T | Promise<T>) => expect.poll(read, { timeout: 60_000, interval: 250 });

/** The grower's own reports for that tree label, as the server has them. */
async function storedReports(page: Page) {
  return page.evaluate(async (q) => {
    const res = await fetch(`/api/reports?mine=true&q=${encodeURIComponent(q)}`);
    return (await res.json()).reports as { id: number; photoCount: number; status: string }[];
  }, TREE);
}

describe('a report written with no signal', () => {
  const site = openSite();

  it('is kept on the phone, shown as waiting, survives closing the tab, and is stored once when the signal returns', async () => {
    const phone = await site.newContext({ viewport: { width: 390, height: 844 } });
    phone.setDefaultTimeout(60_000);
    const page = await phone.newPage();
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/reports/new`);
    // The service worker has cached the app shell (and controls the page after a reload).
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    await page.reload();
    await eventually(() => page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);

    // The variety list needs the server: chosen while there is still a signal, then it drops.
    await page.getByLabel('Label for the new tree').fill(TREE);
    await page.getByRole('combobox', { name: 'Variety' }).fill('Lantern');
    await page.getByRole('option', { name: /Lantern Amber/ }).click();
    await phone.setOffline(true);
    await fillRipenedContainerReport(page, 'garden-fig.jpg');
    await page.getByRole('button', { name: 'Post report' }).click();

    await eventually(() => page.getByText('Kept on this phone', { exact: true }).isVisible()).toBe(true);
    await eventually(() => page.getByRole('status').filter({ hasText: '1 report waiting to send' }).isVisible()).toBe(true);
    await page.screenshot({ path: '/tmp/h19-offline-kept.png' }).catch(() => undefined);

    // Still offline: the app opens from the service worker's cache and still shows the waiting report.
    await page.reload();
    await eventually(() => page.getByText('1 report waiting to send').isVisible()).toBe(true);
    await page.close();

    // The signal returns; the grower opens Syconium again. The first answer to the post is lost on
    // the way back (the server stored the report, the phone never heard), so the phone sends it again.
    await phone.setOffline(false);
    const again = await phone.newPage();
    let posts = 0;
    await again.route('**/api/reports', async (route) => {
      if (route.request().method() !== 'POST') return route.continue();
      posts++;
      if (posts === 1) {
        await route.fetch();
        return route.abort('connectionreset');
      }
      return route.continue();
    });
    await again.goto(`${site.url}/`);
    // The lost answer leaves it waiting; coming back to the tab (or the next start) sends it again.
    await eventually(() => posts).toBeGreaterThanOrEqual(1);
    await eventually(() => again.getByText('1 report waiting to send').isVisible()).toBe(true);
    await again.getByRole('button', { name: 'Send now' }).click();
    await eventually(() => again.getByText(/waiting to send/).count()).toBe(0);
    expect(posts).toBe(2);

    const stored = await storedReports(again);
    expect(stored).toHaveLength(1);
    expect(stored[0]!.photoCount).toBe(1);
    await phone.close();
  }, 240_000);

  it('a report the server refuses comes back with the reason for each field, and is not sent again by itself', async () => {
    const phone = await site.newContext({ viewport: { width: 390, height: 844 } });
    phone.setDefaultTimeout(60_000);
    const page = await phone.newPage();
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/`);
    const userId = await page.evaluate(async () => (await (await fetch('/api/auth/me')).json()).user.id as number);
    // A report kept while offline that the server will refuse (a variety that does not exist).
    await page.evaluate(async (userId) => {
      const request = indexedDB.open('syconium-outbox', 1);
      request.onupgradeneeded = () => request.result.createObjectStore('reports', { keyPath: 'clientId' });
      const db: IDBDatabase = await new Promise((resolve) => (request.onsuccess = () => resolve(request.result)));
      const values = { varietyId: 999999, newTreeLabel: 'Refused pot', lat: 44.08, lon: -103.23, form: 'ground', origin: 'unknown', season: 2025, crop: 'main', outcome: 'no-fruit', pinched: false, notes: '' };
      await new Promise((resolve) => {
        const tx = db.transaction('reports', 'readwrite');
        tx.objectStore('reports').put({ clientId: crypto.randomUUID(), userId, values, photos: [], keptAt: new Date().toISOString(), state: 'waiting' });
        tx.oncomplete = resolve;
      });
    }, userId);
    await page.reload();
    const alert = page.getByRole('alert').filter({ hasText: 'Not accepted: Refused pot, season 2025' });
    await eventually(() => alert.isVisible()).toBe(true);
    expect(await alert.textContent()).toMatch(/Variety: /);
    await page.screenshot({ path: '/tmp/h19-offline-refused.png' }).catch(() => undefined);
    await alert.getByRole('button', { name: 'Discard it' }).click();
    await eventually(() => alert.count()).toBe(0);
    await phone.close();
  }, 120_000);
});
