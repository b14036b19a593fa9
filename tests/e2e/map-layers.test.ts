import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { nodeLat, nodeLon, SURFACE_CELLS } from '../../shared/domain/season-surface';
import { lonLatToTile } from '../../scripts/tiles/tile-math';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, signIn } from './harness';

type MapWindow = {
  syconiumMap: {
    getLayer: (id: string) => unknown;
    loaded: () => boolean;
    areTilesLoaded: () => boolean;
    once: (e: string, f: () => void) => void;
    triggerRepaint: () => void;
    project: (c: [number, number]) => { x: number; y: number };
    queryRenderedFeatures: (geometry?: unknown, options?: { layers: string[] }) => { properties: Record<string, unknown>; geometry: { coordinates: [number, number] } }[];
  };
  syconiumSeasonAt: (lon: number, lat: number) => number | null;
};

/** Wait until the map has added our layers (and `extra`), then for it to be idle with its tiles loaded. */
async function waitForMap(page: Page, extra: string[] = []): Promise<void> {
  await page.waitForFunction(
    (layers) => {
      const map = (window as unknown as Partial<MapWindow>).syconiumMap;
      return !!map && ['pins-clusters', 'land', ...layers].every((id) => !!map.getLayer(id));
    },
    extra,
    { timeout: 150_000, polling: 500 },
  );
  await page.evaluate(
    () =>
      new Promise<void>((resolve) => {
        const map = (window as unknown as MapWindow).syconiumMap;
        if (map.loaded() && map.areTilesLoaded()) resolve();
        else {
          map.once('idle', () => resolve());
          map.triggerRepaint();
        }
      }),
  );
}

/** Rendered features of `layers` around a place (a box of `px` screen pixels either side). */
function renderedAround(page: Page, lonLat: [number, number], layers: string[], px = 4) {
  return page.evaluate(
    ([at, ids, half]) => {
      const map = (window as unknown as MapWindow).syconiumMap;
      const p = map.project(at);
      return map.queryRenderedFeatures([[p.x - half, p.y - half], [p.x + half, p.y + half]], { layers: ids }).map((f) => f.properties);
    },
    [lonLat, layers, px] as const,
  );
}

describe('the atlas base map, season surface and phone sheet', () => {
  const site = openSite();

  it('draws Lake Michigan as water, and at zoom 10 near Albany the Hudson, lakes and several town names', async () => {
    const page = await site.newPage({ viewport: { width: 1200, height: 800 } });
    // The middle of Lake Michigan (43.8 N, 87.0 W; the lake spans about 86.2-87.9 W at this latitude).
    await page.goto(`${site.url}/?lat=43.8&lon=-87.0&zoom=7`);
    await waitForMap(page);
    await expect.poll(() => renderedAround(page, [-87.0, 43.8], ['lakes']).then((f) => f.length), { timeout: 30_000 }).toBeGreaterThan(0);

    // Albany, NY at zoom 10: the Hudson flows through the city (42.65 N, 73.75 W).
    await page.goto(`${site.url}/?lat=42.70&lon=-73.75&zoom=10`);
    await waitForMap(page);
    await expect.poll(() => renderedAround(page, [-73.745, 42.70], ['rivers'], 200).then((f) => f.length), { timeout: 30_000 }).toBeGreaterThan(0);
    const everywhere = (layers: string[]) => page.evaluate((ids) => (window as unknown as MapWindow).syconiumMap.queryRenderedFeatures(undefined, { layers: ids }).map((f) => String(f.properties.name ?? '')), layers);
    expect((await everywhere(['lakes'])).length).toBeGreaterThan(0);
    // Town names of the GeoNames list around Albany (Troy, Schenectady, Cohoes... have 1,000+ people).
    const names = new Set(await everywhere(['town-labels', 'city-labels']));
    expect(names.size).toBeGreaterThanOrEqual(4);
    expect([...names].some((n) => /Albany|Troy|Schenectady|Cohoes|Rensselaer|Watervliet/.test(n))).toBe(true);
    // No label is drawn under a pin: the pins are placed first and a label that would touch one is
    // left out, so no shown label's anchor lies within a pin's ring (30 px wide at most here).
    const tooClose = await page.evaluate(() => {
      const map = (window as unknown as MapWindow).syconiumMap;
      const at = (layers: string[]) => map.queryRenderedFeatures(undefined, { layers }).map((f) => map.project(f.geometry.coordinates));
      const pins = at(['pins-cells', 'pins-clusters']);
      return at(['town-labels', 'city-labels']).filter((l) => pins.some((p) => Math.hypot(p.x - l.x, p.y - l.y) < 12)).length;
    });
    expect(tooClose).toBe(0);
    await page.close();
  }, 300_000);

  it('shows the season surface with, at its nodes, the season GET /api/atlas/near gives there', async () => {
    const page = await site.newPage({ viewport: { width: 1200, height: 800 } });
    await page.goto(`${site.url}/?lat=42.70&lon=-73.80&zoom=7&layers=frost`);
    await waitForMap(page, ['season-surface']);
    const tile = lonLatToTile(-73.8, 42.7, 7);
    // Nodes of the zoom-7 tile holding Albany that have a station in range (also nodes of every
    // deeper tile over them), as the server lists them.
    const grid = (await (await fetch(`${site.url}/api/atlas/season-grid/7/${tile.x}/${tile.y}`)).json()) as { stations: number[] };
    const side = SURFACE_CELLS + 1;
    // Only nodes inside the view: the surface draws (and so knows) the tiles on screen.
    const [[west, south], [east, north]] = await page.evaluate(() => (window as unknown as { syconiumMap: { getBounds: () => { toArray: () => [number, number][] } } }).syconiumMap.getBounds().toArray());
    const inView = (i: number, j: number) => {
      const lon = nodeLon(7, tile.x, i);
      const lat = nodeLat(7, tile.y, j);
      return lon > west && lon < east && lat > south && lat < north;
    };
    const withStation = grid.stations.flatMap((n, k) => (n > 0 && inView(k % side, Math.floor(k / side)) ? [[k % side, Math.floor(k / side)] as const] : []));
    expect(withStation.length).toBeGreaterThan(2);
    for (const [i, j] of [withStation[0]!, withStation[Math.floor(withStation.length / 2)]!, withStation[withStation.length - 1]!]) {
      const lat = nodeLat(7, tile.y, j);
      const lon = nodeLon(7, tile.x, i);
      await expect.poll(() => page.evaluate(([x, y]) => (window as unknown as MapWindow).syconiumSeasonAt(x, y), [lon, lat] as const), { timeout: 30_000 }).not.toBeNull();
      const drawn = await page.evaluate(([x, y]) => (window as unknown as MapWindow).syconiumSeasonAt(x, y), [lon, lat] as const);
      const near = (await (await fetch(`${site.url}/api/atlas/near?lat=${lat}&lon=${lon}`)).json()) as { season: { days50: number | null } };
      expect(near.season.days50).not.toBeNull();
      expect(drawn!).toBeCloseTo(near.season.days50!, 6);
    }
    // The surface stops at the coast: the sea is drawn again above it. Open Atlantic south of Rhode
    // Island (41.0 N, 71.0 W) is sea; Albany is not.
    const order = await page.evaluate(() => (window as unknown as { syconiumMap: { getStyle: () => { layers: { id: string }[] } } }).syconiumMap.getStyle().layers.map((l) => l.id));
    expect(order.indexOf('season-surface')).toBeLessThan(order.indexOf('sea'));
    expect(order.indexOf('land')).toBeLessThan(order.indexOf('season-surface'));
    await expect.poll(() => renderedAround(page, [-71.0, 41.0], ['sea']).then((f) => f.length), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await renderedAround(page, [-73.8, 42.7], ['sea'])).toHaveLength(0);
    // Clicking an empty spot reads the value there with its stations and distance.
    const canvas = page.locator('.maplibregl-canvas');
    const box = (await canvas.boundingBox())!;
    await page.mouse.click(box.x + 300, box.y + box.height - 120);
    const readout = page.getByTestId('season-readout');
    await expect.poll(() => readout.textContent(), { timeout: 20_000 }).toMatch(/frost-free days[\s\S]*station/);
    await page.close();
  }, 300_000);

  it('opens a pin’s details on a 390x844 phone as a sheet inside the viewport, under no control, every report reachable', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    await page.goto(`${site.url}/?lat=42.68&lon=-73.80&zoom=11`);
    await waitForMap(page);
    const firstCell = () =>
      page.evaluate(() => {
        const map = (window as unknown as MapWindow).syconiumMap;
        const features = map.queryRenderedFeatures(undefined, { layers: ['pins-cells'] }).sort((a, b) => Number(b.properties.reports) - Number(a.properties.reports));
        const f = features[0];
        return f ? { ...map.project(f.geometry.coordinates), reports: Number(f.properties.reports) } : null;
      });
    await expect.poll(firstCell, { timeout: 30_000 }).not.toBeNull();
    const cell = (await firstCell())!;
    const box = (await page.locator('.maplibregl-canvas').boundingBox())!;
    await page.mouse.click(box.x + cell.x, box.y + cell.y);
    const sheet = page.getByTestId('map-sheet');
    await expect.poll(() => sheet.getByRole('link', { name: 'Read the full report' }).count(), { timeout: 20_000 }).toBeGreaterThan(0);

    const rect = (await sheet.boundingBox())!;
    expect(rect.x).toBeGreaterThanOrEqual(0);
    expect(rect.y).toBeGreaterThanOrEqual(0);
    expect(rect.x + rect.width).toBeLessThanOrEqual(390);
    expect(rect.y + rect.height).toBeLessThanOrEqual(844);
    // Nothing lies over it: at its corners, its title and its close button, the topmost element is the sheet's own.
    const covered = await page.evaluate(() => {
      const el = document.querySelector('[data-testid="map-sheet"]')!;
      const r = el.getBoundingClientRect();
      const title = el.querySelector('h2')!.getBoundingClientRect();
      const close = el.querySelector('button[aria-label="Close details"]')!.getBoundingClientRect();
      const points = [
        [r.left + 2, r.top + 2], [r.right - 2, r.top + 2], [r.left + 2, r.bottom - 2], [r.right - 2, r.bottom - 2], [(r.left + r.right) / 2, (r.top + r.bottom) / 2],
        [title.left + 4, title.top + title.height / 2], [close.left + close.width / 2, close.top + close.height / 2],
      ];
      return points.filter(([x, y]) => !el.contains(document.elementFromPoint(x!, y!))).length;
    });
    expect(covered).toBe(0);
    // Every report listed can be scrolled into view inside the sheet.
    const links = sheet.getByRole('link', { name: 'Read the full report' });
    const count = await links.count();
    expect(count).toBe(Math.min(cell.reports, 50));
    await links.nth(count - 1).scrollIntoViewIfNeeded();
    const last = (await links.nth(count - 1).boundingBox())!;
    expect(last.y).toBeGreaterThanOrEqual(rect.y);
    expect(last.y + last.height).toBeLessThanOrEqual(rect.y + rect.height + 1);
    await sheet.getByRole('button', { name: 'Close details' }).click();
    await expect.poll(() => sheet.count()).toBe(0);
    await page.close();
  }, 300_000);

  it('shows a signed-in grower their home place, and Near me moves the atlas and a report’s small map', async () => {
    const page = await site.newPage({ viewport: { width: 1200, height: 800 }, geolocation: { latitude: 43.04, longitude: -87.91 }, permissions: ['geolocation'] });
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/?lat=42.66&lon=-73.78&zoom=9`);
    await waitForMap(page);
    await expect.poll(() => page.getByTestId('home-marker').textContent(), { timeout: 20_000 }).toMatch(/your home place/);

    // The browser says it is in Milwaukee (43.04 N, 87.91 W): Near me takes the atlas there.
    await page.getByRole('button', { name: /use my location/i }).click();
    const centreLon = () => page.evaluate(() => (window as unknown as { syconiumMap: { getCenter: () => { lng: number } } }).syconiumMap.getCenter().lng);
    await expect.poll(centreLon, { timeout: 20_000 }).toBeLessThan(-87);

    // And on a report's small map.
    await page.goto(`${site.url}/reports/1`);
    const nearMe = page.getByTestId('mini-map').getByRole('button', { name: /near me/i });
    await expect.poll(() => nearMe.isVisible(), { timeout: 30_000 }).toBe(true);
    await nearMe.click();
    await expect.poll(() => page.getByTestId('mini-map').getAttribute('data-centre-lon'), { timeout: 20_000 }).toMatch(/^-87\./);
    await page.close();
  }, 300_000);
});
