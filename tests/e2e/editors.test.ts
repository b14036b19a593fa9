import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, recordRequests, signIn } from './harness';

/** An invented area in central Texas, away from the demo's growers (not a real observation). */
const AREA_NAME = 'Llano test area (e2e)';
const GEOJSON = {
  type: 'FeatureCollection',
  features: [
    {
      type: 'Feature',
      properties: { note: 'invented for the browser test' },
      geometry: { type: 'Polygon', coordinates: [[[-99.5, 31.0], [-99.0, 31.0], [-99.0, 31.4], [-99.5, 31.4], [-99.5, 31.0]]] },
    },
  ],
};

describe('editors’ workspace in the browser', () => {
  const site = openSite();

  it('the demo editor uploads a GeoJSON wasp area, then sees it drawn on the editors’ map and on the atlas map’s wasp layer; nothing leaves the machine', async () => {
    const page = await site.newPage({ viewport: { width: 1280, height: 1000 } });
    const requests = recordRequests(page);
    await signIn(page, site.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Editors', exact: true }).click();
    // the overview counts what needs attention (demo: 2 proposed names)
    await expect.poll(() => page.getByRole('link', { name: /Proposed names/ }).textContent(), { timeout: 30_000 }).toMatch(/^2/);
    await page.getByRole('link', { name: 'Wasp areas', exact: true }).click();
    const map = page.getByTestId('wasp-area-map');
    // the demo's active areas are drawn before we add one
    await expect.poll(() => map.getAttribute('data-rendered-areas'), { timeout: 60_000 }).toContain('Lower Sacramento Valley (demo)');

    await page.getByRole('button', { name: 'New wasp area' }).click();
    await page.getByLabel('Area name').fill(AREA_NAME);
    await page.getByLabel('Source', { exact: true }).fill('Browser test: invented record');
    await page.getByLabel('Date observed').fill('2025-07-01');
    await page.getByLabel('Upload a GeoJSON file').check();
    await page.locator('input[type="file"]').setInputFiles({ name: 'llano.geojson', mimeType: 'application/geo+json', buffer: Buffer.from(JSON.stringify(GEOJSON)) });
    await expect.poll(() => page.getByText('llano.geojson: outline read').isVisible()).toBe(true);
    await page.getByRole('button', { name: 'Record area' }).click();

    await expect.poll(() => page.getByRole('status').textContent(), { timeout: 30_000 }).toContain(`Recorded “${AREA_NAME}”`);
    // MapLibre drew the new area: its name comes back from queryRenderedFeatures on the area layer
    await expect.poll(() => map.getAttribute('data-rendered-areas'), { timeout: 60_000 }).toContain(AREA_NAME);
    await expect.poll(() => page.getByRole('button', { name: AREA_NAME, exact: true }).isVisible()).toBe(true);
    // and the public layer every map reads now carries it
    const publicAreas = await (await fetch(`${site.url}/api/wasp-areas`)).json();
    expect(publicAreas.features.map((f: { properties: { name: string } }) => f.properties.name)).toContain(AREA_NAME);

    // the atlas map's wasp-area layer (switched on through its URL) shows it too: clicking inside opens its popup
    await page.goto(`${site.url}/?layers=wasp&lat=31.2&lon=-99.25&zoom=8`);
    const canvas = page.locator('canvas.maplibregl-canvas').first();
    await expect
      .poll(
        async () => {
          await canvas.click({ timeout: 5_000 }).catch(() => undefined);
          return page.getByText(`Fig wasp established: ${AREA_NAME}`).isVisible();
        },
        { timeout: 60_000, interval: 2_000 },
      )
      .toBe(true);

    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  }, 180_000); // two maps on a shared 2-core machine

  it('draws a wasp area corner by corner on the editors’ map', async () => {
    const page = await site.newPage({ viewport: { width: 1280, height: 1000 } });
    await signIn(page, site.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/editors/wasp-areas`);
    const map = page.getByTestId('wasp-area-map');
    await expect.poll(() => map.getAttribute('data-rendered-areas'), { timeout: 60_000 }).toContain('Lower Sacramento Valley (demo)');
    await page.getByRole('button', { name: 'New wasp area' }).click();
    await page.getByLabel('Area name').fill('Drawn test area (e2e)');
    await page.getByLabel('Source', { exact: true }).fill('Browser test: invented record');
    await page.getByLabel('Date observed').fill('2025-07-02');
    const box = (await map.boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    for (const [dx, dy] of [[-15, -15], [15, -15], [15, 15], [-15, 15]]) await page.mouse.click(cx + dx!, cy + dy!);
    await expect.poll(() => page.getByText('4 corners placed').isVisible()).toBe(true);
    await page.getByRole('button', { name: 'Record area' }).click();
    await expect.poll(() => page.getByRole('status').textContent(), { timeout: 30_000 }).toContain('Recorded “Drawn test area (e2e)”');
    await expect.poll(() => map.getAttribute('data-rendered-areas'), { timeout: 60_000 }).toContain('Drawn test area (e2e)');
    const record = (await (await fetch(`${site.url}/api/wasp-areas`)).json()).features.find((f: { properties: { name: string } }) => f.properties.name === 'Drawn test area (e2e)');
    // four corners and the first one again: a closed ring
    expect(record.geometry.coordinates[0]).toHaveLength(5);
    expect(record.geometry.coordinates[0][0]).toEqual(record.geometry.coordinates[0][4]);
  }, 180_000);
});
