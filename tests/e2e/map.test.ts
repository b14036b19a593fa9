import type { Page } from 'playwright-core';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { firstPinsRequest } from '../../src/features/map/first-view';
import { openSite, recordRequests } from './harness';

/** Wait until the map has added our layers, then for it to be idle with its tiles loaded. */
async function waitForMap(page: Page): Promise<void> {
  // The map's first idle can come before react-map-gl adds sources and layers: wait for the layers first.
  await page.waitForFunction(() => {
    const map = (window as unknown as { syconiumMap?: { getLayer: (id: string) => unknown } }).syconiumMap;
    return !!map?.getLayer('pins-clusters') && !!map.getLayer('land');
  }, null, { timeout: 150_000, polling: 500 });
  await page.evaluate(
    () =>
      new Promise<void>((resolve) => {
        const map = (window as unknown as { syconiumMap: { loaded: () => boolean; areTilesLoaded: () => boolean; once: (e: string, f: () => void) => void; triggerRepaint: () => void } }).syconiumMap;
        if (map.loaded() && map.areTilesLoaded()) resolve();
        else {
          map.once('idle', () => resolve());
          map.triggerRepaint();
        }
      }),
  );
}

/** Screen position of the first rendered feature of a layer, or null. */
async function firstFeatureAt(page: Page, layer: string): Promise<{ x: number; y: number; reports: number } | null> {
  return page.evaluate((layerId) => {
    type M = { queryRenderedFeatures: (o: object) => { geometry: { coordinates: [number, number] }; properties: { reports: number } }[]; project: (c: [number, number]) => { x: number; y: number } };
    const map = (window as unknown as { syconiumMap: M }).syconiumMap;
    const feature = map.queryRenderedFeatures({ layers: [layerId] })[0];
    if (!feature) return null;
    const p = map.project(feature.geometry.coordinates);
    return { x: p.x, y: p.y, reports: feature.properties.reports };
  }, layer);
}

describe('the atlas map in the browser', () => {
  const site = openSite();

  it('draws the map with the demo pins, zooms into a cluster, opens a pin’s summary; every request stays on this origin', async () => {
    const page = await site.newPage({ viewport: { width: 1200, height: 800 } });
    const requests = recordRequests(page);
    await page.goto(`${site.url}/`);
    await waitForMap(page);

    // The canvas is not blank: the base map and pins give many different colours.
    const canvas = page.locator('.maplibregl-canvas');
    const { channels } = await sharp(await canvas.screenshot()).stats();
    expect(Math.max(...channels.slice(0, 3).map((c) => c.stdev))).toBeGreaterThan(8);

    // The demo reports show as clusters on first start.
    await expect.poll(() => firstFeatureAt(page, 'pins-clusters'), { timeout: 30_000 }).not.toBeNull();
    await expect.poll(() => page.getByText(/published reports match/).textContent()).toMatch(/\d+ published reports match/);

    // Clicking a cluster zooms in.
    const box = (await canvas.boundingBox())!;
    const zoomBefore = await page.evaluate(() => (window as unknown as { syconiumMap: { getZoom: () => number } }).syconiumMap.getZoom());
    const cluster = (await firstFeatureAt(page, 'pins-clusters'))!;
    await page.mouse.click(box.x + cluster.x, box.y + cluster.y);
    await expect
      .poll(() => page.evaluate(() => (window as unknown as { syconiumMap: { getZoom: () => number } }).syconiumMap.getZoom()), { timeout: 20_000 })
      .toBeGreaterThan(zoomBefore + 0.9);

    // Zoomed in over Albany, a single grid cell opens its summary with a link to the report.
    await page.goto(`${site.url}/?lat=42.68&lon=-73.80&zoom=11`);
    await waitForMap(page);
    await expect.poll(() => firstFeatureAt(page, 'pins-cells'), { timeout: 30_000 }).not.toBeNull();
    const cell = (await firstFeatureAt(page, 'pins-cells'))!;
    const box2 = (await page.locator('.maplibregl-canvas').boundingBox())!;
    await page.mouse.click(box2.x + cell.x, box2.y + cell.y);
    const popup = page.locator('.maplibregl-popup');
    await expect.poll(() => popup.getByRole('link', { name: 'Read the full report' }).first().isVisible(), { timeout: 20_000 }).toBe(true);
    expect(await popup.textContent()).toMatch(/20\d\d/);
    expect(await popup.getByRole('link', { name: 'Read the full report' }).first().getAttribute('href')).toMatch(/^\/reports\/\d+$/);
    expect(await popup.textContent()).toMatch(/In the ground|In a container|Against a warm wall|Greenhouse/);

    // The URL keeps the view for sharing.
    await expect.poll(() => new URL(page.url()).searchParams.get('zoom')).not.toBeNull();

    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
    expect(requests.some((u) => u.includes('/tiles/base/'))).toBe(true);
    await page.close();
  }, 300_000);

  it('draws the first view’s pins before MapLibre’s code has arrived (a phone on a weak signal sees them first)', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 }, serviceWorkers: 'block' });
    // Hold back every script that holds MapLibre (its worker pool's name is in its code) and answer the rest.
    const held: string[] = [];
    await page.route('**/assets/*.js', async (route) => {
      const response = await route.fetch();
      const body = await response.text();
      if (body.includes('maplibre_preloaded_worker_pool')) {
        held.push(route.request().url());
        return; // never answered while the test runs
      }
      await route.fulfill({ response, body });
    });
    await page.goto(`${site.url}/`, { waitUntil: 'domcontentloaded' });
    await expect.poll(() => page.locator('[data-pin-preview] circle').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    // MapLibre is asked for (the page starts it at once) and held: the pins above are the page’s own.
    await expect.poll(() => held.length, { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await page.locator('.maplibregl-canvas').count()).toBe(0);
    await page.close();
  });

  it('asks for the first view’s pins from index.html before the app’s JavaScript arrives, and only once', async () => {
    for (const address of ['/', '/?type=common&lat=42.68&lon=-73.80&zoom=7']) {
      const page = await site.newPage({ viewport: { width: 390, height: 844 } });
      const pins: string[] = [];
      const refused: string[] = [];
      page.on('console', (message) => {
        if (/Content Security Policy/i.test(message.text())) refused.push(message.text());
      });
      // The app's JavaScript is held until the pins have been asked for (10 s at most): only index.html's
      // own inline script can ask while it is held.
      let appHeld = true;
      let release = () => {};
      const released = new Promise<void>((resolve) => {
        release = resolve;
        setTimeout(resolve, 10_000);
      }).then(() => void (appHeld = false));
      let askedWhileHeld = false;
      page.on('request', (request) => {
        if (new URL(request.url()).pathname !== '/api/atlas/pins') return;
        pins.push(request.url());
        if (appHeld) askedWhileHeld = true;
        release();
      });
      await page.route('**/assets/*.js', async (route) => {
        await released;
        await route.continue();
      });
      await page.goto(`${site.url}${address}`, { waitUntil: 'commit' });
      await expect.poll(() => page.locator('[data-pin-preview] circle').count(), { timeout: 30_000 }).toBeGreaterThan(0);
      expect(askedWhileHeld).toBe(true);
      // It asked what the app's first view asks for (the app's own code computes it here)...
      const firstView = firstPinsRequest(new URL(`${site.url}${address}`), 390, 844)!;
      expect(pins[0]).toBe(`${site.url}${firstView.url}`);
      // ...and the app took that answer: once the map has drawn, that view was asked for once.
      await waitForMap(page);
      expect(pins.filter((url) => url === pins[0])).toHaveLength(1);
      expect(refused).toEqual([]);
      await page.close();
    }
  });

  it('keeps a filter in the URL and finds a town by name', async () => {
    const page = await site.newPage({ viewport: { width: 1200, height: 800 } });
    await page.goto(`${site.url}/`);
    await waitForMap(page);
    await page.getByLabel('Crop').selectOption('breba');
    await expect.poll(() => new URL(page.url()).searchParams.get('crop')).toBe('breba');
    // The download links carry the same filter; the export gives grid cells, never a garden's place.
    await expect.poll(() => page.getByRole('link', { name: 'CSV', exact: true }).getAttribute('href')).toBe('/api/reports/export.csv?crop=breba');
    const geojson = await (await fetch(`${site.url}${await page.getByRole('link', { name: 'GeoJSON', exact: true }).getAttribute('href')}`)).json();
    expect(geojson.features.length).toBeGreaterThan(0);
    expect(geojson.features.every((f: { properties: { crop: string } }) => f.properties.crop === 'breba')).toBe(true);

    await page.getByRole('combobox', { name: 'Find a town' }).fill('Milwaukee');
    await page.getByRole('option', { name: /Milwaukee/ }).first().click();
    await expect
      .poll(() => page.evaluate(() => (window as unknown as { syconiumMap: { getCenter: () => { lng: number } } }).syconiumMap.getCenter().lng), { timeout: 20_000 })
      .toBeLessThan(-86);

    // Keyboard: with the map focused, Enter opens what lies at its centre (a pin's reports, or the spot's
    // What ripens here link, depending on where the flight ended).
    // On a group of pins Enter zooms in first, as a click does: press again until something opens.
    await page.locator('.maplibregl-canvas').focus();
    const opened = page.locator('.maplibregl-popup').getByRole('link').first();
    await expect
      .poll(
        async () => {
          if (!(await opened.isVisible())) await page.keyboard.press('Enter');
          await page.waitForTimeout(1_500);
          return opened.isVisible();
        },
        { timeout: 40_000, interval: 500 },
      )
      .toBe(true);
    await page.close();
  }, 300_000);
});
