import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { fillRipenedContainerReport, openSite, recordRequests, signIn } from './harness';

describe('harvest reports in the browser', () => {
  const site = openSite();

  it('the demo grower posts a report with a photo through the form, then sees it on its page and in My reports', async () => {
    const page = await site.newPage();
    // A slow, shared machine: give the first page loads room.
    page.setDefaultTimeout(60_000);
    const requests = recordRequests(page);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);

    await page.getByRole('link', { name: 'Post a report' }).click();
    await page.getByLabel('Label for the new tree').fill('Balcony pot (e2e)');
    await page.getByRole('combobox', { name: 'Variety' }).fill('Lantern');
    await page.getByRole('option', { name: /Lantern Amber/ }).click();
    await fillRipenedContainerReport(page, 'my-fig.jpg');
    await expect.poll(() => page.getByAltText('Preview of my-fig.jpg').isVisible()).toBe(true);

    await page.getByRole('button', { name: 'Post report' }).click();
    await page.waitForURL(/\/reports\/\d+$/, { timeout: 30_000 });
    await expect.poll(() => page.getByRole('heading', { level: 1, name: /Lantern Amber/ }).isVisible(), { timeout: 15_000 }).toBe(true);
    const image = page.getByRole('list', { name: 'Photos' }).getByRole('img').first();
    await expect.poll(() => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 15_000 }).toBe(true);
    await expect.poll(() => page.getByText('Exact place').textContent()).toContain('44.08123');
    const reportId = Number(new URL(page.url()).pathname.split('/').pop());
    // The page's small map (our offline style) draws the public grid cell.
    await expect.poll(() => page.getByTestId('mini-map').locator('canvas').count(), { timeout: 30_000 }).toBe(1);

    await page.getByRole('link', { name: 'My reports' }).click();
    await expect.poll(() => page.getByRole('cell', { name: 'Balcony pot (e2e)' }).isVisible(), { timeout: 15_000 }).toBe(true);

    // On the atlas map, the pin at its grid cell (0.05 degree grid: 44.075, -103.225) opens a popup linking to it.
    await page.goto(`${site.url}/?lat=44.075&lon=-103.225&zoom=9`);
    const canvas = page.locator('canvas.maplibregl-canvas').first();
    const link = page.locator(`a[href="/reports/${reportId}"]`);
    // Click the pin where the map draws it (the ring pins sit in their own layer).
    const pinAt = () =>
      page.evaluate(() => {
        const map = (window as unknown as { syconiumMap?: { queryRenderedFeatures: (g: undefined, o: { layers: string[] }) => { geometry: { coordinates: [number, number] } }[]; project: (c: [number, number]) => { x: number; y: number }; getStyle: () => { layers: { id: string }[] } } }).syconiumMap;
        if (!map || !map.getStyle().layers.some((l) => l.id === 'pins-cells')) return null;
        const f = map.queryRenderedFeatures(undefined, { layers: ['pins-cells'] })[0];
        return f ? map.project(f.geometry.coordinates) : null;
      });
    await expect.poll(pinAt, { timeout: 60_000 }).not.toBeNull();
    await expect
      .poll(
        async () => {
          const at = await pinAt();
          const box = await canvas.boundingBox();
          if (at && box) await page.mouse.click(box.x + at.x, box.y + at.y);
          return link.isVisible();
        },
        { timeout: 60_000, interval: 2_000 },
      )
      .toBe(true);

    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  }, 240_000);

  it('names the field that is out of order before anything is sent', async () => {
    const page = await site.newPage();
    page.setDefaultTimeout(60_000);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/reports/new`);
    await page.getByLabel('Season year').fill('2025');
    await page.getByRole('radio', { name: /^Ripened/ }).check();
    await page.getByLabel('Last spring frost').fill('2025-05-01');
    await page.getByLabel('First ripe fig').fill('2025-04-20');
    await page.getByRole('button', { name: 'Post report' }).click();
    await expect.poll(() => page.getByText('The first ripe fig must come after the last spring frost (2025-05-01)').isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Choose a variety, or propose a name if it is not listed').isVisible()).toBe(true);
    // The first problem on the page (the variety, above the dates) takes the focus.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('combobox');
  }, 120_000);

  it('on a phone, My reports shows its rows as cards that fit, and the whole page never scrolls sideways', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 } });
    page.setDefaultTimeout(60_000);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/my/reports`);
    await expect.poll(() => page.getByRole('row').count()).toBeGreaterThan(2);
    const widths = await page.evaluate(() => {
      window.scrollTo(500, 0);
      const table = document.querySelector('table')!.parentElement!;
      return { page: document.documentElement.scrollWidth, scrolledX: window.scrollX, table: table.scrollWidth, tableBox: table.clientWidth };
    });
    expect(widths.page).toBeLessThanOrEqual(390);
    expect(widths.scrolledX).toBe(0);
    // Issue 18: the rows are cards on a phone (table-cards), so nothing is cut off or hidden sideways.
    expect(widths.table).toBeLessThanOrEqual(widths.tableBox);
  }, 120_000);
});
