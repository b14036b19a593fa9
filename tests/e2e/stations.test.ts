import fs from 'node:fs';
import path from 'node:path';
import { zipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, recordRequests, signIn } from './harness';

/** A decade of the Albany GHCN-Daily record (NOAA NCEI, public domain), under a test code. */
function albanyDecade(): Buffer {
  const [header, ...lines] = fs.readFileSync(path.resolve(import.meta.dirname, '../../server/seed/data/ghcnd-USW00014735-daily.csv'), 'utf8').split(/\r?\n/);
  return Buffer.from([header, ...lines.filter((l) => l >= '2001' && l < '2011')].join('\n'));
}

describe('editors’ climate stations in the browser', () => {
  const site = openSite();

  it('an editor uploads a station, sees its frost dates, and a bad file is refused with its row and column', async () => {
    const page = await site.newPage({ viewport: { width: 1280, height: 1000 } });
    const requests = recordRequests(page);
    await signIn(page, site.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/editors/stations`);
    await expect.poll(() => page.getByRole('link', { name: 'Stations', exact: true }).getAttribute('aria-current'), { timeout: 60_000 }).toBe('page');
    // The demo stations are listed (real NOAA ones and synthetic ones).
    await expect.poll(() => page.getByRole('link', { name: 'Albany International Airport, NY' }).isVisible(), { timeout: 30_000 }).toBe(true);

    const form = page.getByRole('form', { name: 'Upload a station' });
    await form.getByLabel('Station name').fill('Albany decade (e2e)');
    await form.getByLabel('Station code').fill('E2E-ALBANY');
    await form.getByLabel('Latitude').fill('42.7431');
    await form.getByLabel('Longitude').fill('-73.8092');
    await form.locator('input[type="file"]').setInputFiles({ name: 'albany.csv', mimeType: 'text/csv', buffer: albanyDecade() });
    await form.getByRole('button', { name: 'Upload and compute' }).click();

    await page.waitForURL(/\/editors\/stations\/\d+$/, { timeout: 60_000 });
    await expect.poll(() => page.getByRole('heading', { name: 'Albany decade (e2e)' }).isVisible(), { timeout: 30_000 }).toBe(true);
    const summary = page.getByRole('table', { name: /Freeze dates and frost-free season at 10, 50 and 90 %/ });
    await expect.poll(() => summary.textContent()).toContain('32 °F (0 °C)');
    const years = page.getByRole('table', { name: /for each year and threshold/ });
    await expect.poll(() => years.getByRole('rowheader', { name: '2005' }).isVisible()).toBe(true);
    await expect.poll(() => page.locator('.recharts-line').count(), { timeout: 30_000 }).toBeGreaterThanOrEqual(2);

    // The same code again with a bad row: refused, the rows named, the station unchanged.
    const bad = albanyDecade().toString('utf8').split('\n');
    bad[3] = '2001,01,03,   -1.1,   cold,    0.0,    0.0,    0.0';
    await form.getByLabel('Station name').fill('Albany decade (e2e)');
    await form.getByLabel('Station code').fill('E2E-ALBANY');
    await form.getByLabel('Latitude').fill('42.7431');
    await form.getByLabel('Longitude').fill('-73.8092');
    await form.locator('input[type="file"]').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad.join('\n')) });
    await form.getByRole('button', { name: 'Upload and compute' }).click();
    const problems = page.getByRole('list', { name: 'Problems in the file' });
    await expect.poll(() => problems.textContent(), { timeout: 60_000 }).toContain('Row 4, column TMIN');
    await expect.poll(() => years.getByRole('rowheader', { name: '2005' }).isVisible()).toBe(true);

    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('an editor imports a whole set: progress, the summary, and a bad set refused whole', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 } });
    const requests = recordRequests(page);
    await signIn(page, site.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/editors/stations`);
    const form = page.getByRole('form', { name: 'Import a file set' });
    // GHCN-Daily: NOAA's inventory line for Albany and a decade of its record, zipped (NOAA NCEI, public domain).
    const inventory = 'USW00014735  42.7431  -73.8092   85.6 NY ALBANY INTL AP                          HCN 72518\n';
    const zip = zipSync({ 'ghcnd-stations.txt': new TextEncoder().encode(inventory), 'USW00014735.csv': new Uint8Array(albanyDecade()) });
    await form.locator('input[type="file"]').setInputFiles({ name: 'ghcnd.zip', mimeType: 'application/zip', buffer: Buffer.from(zip) });
    await form.getByRole('button', { name: 'Import the set' }).click();
    await expect.poll(() => page.getByTestId('bulk-summary').textContent(), { timeout: 60_000 }).toContain('0 added, 1 replaced, 0 refused');

    // A 1991-2020 normals CSV with a latitude that is not one: nothing imported, the file and column named.
    const bad = 'STATION,LATITUDE,LONGITUDE,NAME,ANN-TMIN-PRBGSL-T32FP50\nUSW00099999,north,-73.8,BAD,160\n';
    await form.locator('input[type="file"]').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    await form.getByRole('button', { name: 'Import the set' }).click();
    await expect.poll(() => page.getByRole('list', { name: 'Problems in the file set' }).textContent(), { timeout: 60_000 }).toContain('bad.csv, column LATITUDE');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('What ripens here on the cool coast: NOAA normals as the source, and enough days but too little heat', async () => {
    const page = await site.newPage({ viewport: { width: 1280, height: 1000 } });
    await page.goto(`${site.url}/here?lat=40.8&lon=-124.16&form=ground`);
    await expect.poll(() => page.getByTestId('season-extras').textContent(), { timeout: 60_000 }).toContain('growing degree days');
    expect(await page.getByText(/NOAA normals 1981-2010/).first().isVisible()).toBe(true);
    // The fit's words sit in each row's details: open them all.
    const closed = page.getByRole('button', { name: /^Show details of/ });
    for (let i = 0; i < 20 && (await closed.count()) > 0; i++) await closed.first().click();
    await expect.poll(() => page.getByText(/Enough days, too little heat/).first().isVisible()).toBe(true);
  });
});
