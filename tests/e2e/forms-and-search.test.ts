import sharp from 'sharp';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, recordRequests, signIn } from './harness';

/*
 * Issue 18, items 4-8, in the browser as growers and admins use them: one town search everywhere,
 * the report form in the garden, phones and admins, small things, and the open-data licence.
 */

const offMachine = (site: { url: string }, requests: string[]) => requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'));

/** Go through Why no figs up to its place question (the last one), answering nothing. */
async function toPlaceQuestion(page: Page) {
  await page.getByRole('button', { name: /Fruit stayed hard and green/ }).click();
  for (let i = 0; i < 10; i++) {
    if (await page.getByRole('heading', { name: 'Where do you grow it? (optional)' }).isVisible()) return;
    await page.getByRole('button', { name: 'Next' }).click();
  }
  throw new Error('never reached the place question');
}

describe('the grower’s day: town search, report form, phones and admins, licence', () => {
  const site = openSite();

  it('one town search: near Albany "Alban" gives Albany, NY first; arrows, Enter and Escape work alike on every screen', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(60_000);
    const requests = recordRequests(page);
    // The atlas centred on Albany, NY (42.65 N, 73.75 W).
    await page.goto(`${site.url}/?lat=42.65&lon=-73.75&zoom=9`);
    const box = page.getByRole('combobox', { name: 'Find a town' });
    await box.fill('Alban');
    const options = page.getByRole('listbox', { name: 'Matching towns' }).getByRole('option');
    await expect.poll(() => options.first().textContent(), { timeout: 30_000 }).toMatch(/^Albany\s*NY, United States/);
    expect(await box.getAttribute('aria-expanded')).toBe('true');
    await box.press('ArrowDown');
    const second = await options.nth(1).getAttribute('id');
    expect(await box.getAttribute('aria-activedescendant')).toBe(second);
    await box.press('ArrowUp');
    expect(await box.getAttribute('aria-activedescendant')).toBe(await options.first().getAttribute('id'));
    await box.press('Escape');
    expect(await box.getAttribute('aria-expanded')).toBe('false');
    await box.press('Escape');
    expect(await box.inputValue()).toBe('');
    // Enter with nothing highlighted by hand takes the best match: the map moves to Albany.
    await page.goto(`${site.url}/?lat=40&lon=-100&zoom=4`);
    await page.getByRole('combobox', { name: 'Find a town' }).fill('Milwauk');
    await expect.poll(() => options.first().textContent(), { timeout: 30_000 }).toContain('Milwaukee');
    await page.getByRole('combobox', { name: 'Find a town' }).press('Enter');
    // Milwaukee, WI: 43.04 N, 87.91 W (GeoNames, recalled from memory).
    await expect.poll(() => Number(new URL(page.url()).searchParams.get('lat')), { timeout: 30_000 }).toBeCloseTo(43.04, 0);

    // The same combobox on What ripens here.
    await page.goto(`${site.url}/here`);
    const hereBox = page.getByRole('combobox', { name: 'Find a town' });
    await hereBox.fill('Albany');
    await expect.poll(() => options.first().textContent(), { timeout: 30_000 }).toContain('Albany');
    await hereBox.press('Enter');
    await expect.poll(() => new URL(page.url()).searchParams.get('lat'), { timeout: 30_000 }).not.toBeNull();
    expect(offMachine(site, requests)).toEqual([]);
  });

  it('Why no figs: a town typed and not picked is flagged, then resolved to its best match near the grower’s home', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(60_000);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/why-no-figs`);
    // Themed radio buttons: the app's fig colour, not the browser's blue.
    await page.getByRole('button', { name: /Fruit stayed hard and green/ }).click();
    await page.getByRole('button', { name: 'Next' }).click();
    const accent = await page.getByRole('radio').first().evaluate((el) => getComputedStyle(el).accentColor);
    expect(accent).not.toBe('auto');
    await page.goto(`${site.url}/why-no-figs`);
    await toPlaceQuestion(page);
    const box = page.getByRole('combobox', { name: 'Find a town' });
    await box.fill('Alban');
    await expect.poll(() => page.getByRole('listbox', { name: 'Matching towns' }).getByRole('option').first().textContent(), { timeout: 30_000 }).toContain('Albany');
    await box.press('Tab');
    const flag = page.getByTestId('place-search-flag');
    await expect.poll(() => flag.textContent(), { timeout: 15_000 }).toContain('“Alban” is not chosen yet');
    expect(await flag.textContent()).toContain('Use Albany, NY, United States');
    await page.getByRole('button', { name: 'See likely causes' }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Likely causes, most likely first' }).isVisible(), { timeout: 30_000 }).toBe(true);
    await expect.poll(() => page.getByText(/For Albany, NY, United States:/).isVisible(), { timeout: 30_000 }).toBe(true);
    // Cautions sit with the causes whose advice needs them, never as a blanket box.
    const cautions = page.locator('aside[aria-label="Caution"]');
    for (let i = 0; i < (await cautions.count()); i++) expect(await cautions.nth(i).evaluate((el) => !!el.closest('[data-testid="cause"]'))).toBe(true);
  });

  it('the report form in the garden: my location, my home garden, photo thumbnails with remove, a confirmation, and the tree’s seasons together', async () => {
    // The phone says it stands at an invented spot near Albany.
    const page = await site.newPage({ viewport: { width: 390, height: 844 }, geolocation: { latitude: 42.71234, longitude: -73.80123, accuracy: 12 }, permissions: ['geolocation'] });
    page.setDefaultTimeout(60_000);
    const requests = recordRequests(page);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/reports/new`);
    await page.getByRole('button', { name: 'Use my location' }).click();
    await expect.poll(() => page.getByLabel('Latitude').inputValue()).toBe('42.71234');
    expect(await page.getByLabel('Longitude').inputValue()).toBe('-73.80123');
    await expect.poll(() => page.getByText(/Placed at your location/).isVisible()).toBe(true);
    // The demo grower's home garden: 42.66, -73.78, grown in a container (server/saved-places/saved-places.seed.ts).
    await page.getByRole('button', { name: 'My home garden' }).click();
    await expect.poll(() => page.getByLabel('Latitude').inputValue()).toBe('42.66');
    expect(await page.getByRole('radio', { name: 'In a container' }).isChecked()).toBe(true);
    await expect.poll(() => page.getByTestId('mini-map').locator('canvas').count(), { timeout: 30_000 }).toBe(1);

    await page.getByLabel('Label for the new tree').fill('Patio tub (e2e)');
    await page.getByRole('combobox', { name: 'Variety' }).fill('Lantern');
    await page.getByRole('option', { name: /Lantern Amber/ }).click();
    await page.getByLabel('Season year').fill('2025');
    await page.getByRole('radio', { name: /^Ripened/ }).check();

    const jpeg = (colour: string) => sharp({ create: { width: 64, height: 48, channels: 3, background: colour } }).jpeg().toBuffer();
    expect(await page.getByTestId('photo-count').textContent()).toContain('No photos chosen yet');
    await page.getByLabel('Add photos').setInputFiles([
      { name: 'tub.jpg', mimeType: 'image/jpeg', buffer: await jpeg('#6b3a5b') },
      { name: 'fruit.jpg', mimeType: 'image/jpeg', buffer: await jpeg('#3d5e39') },
    ]);
    await expect.poll(() => page.getByAltText('Preview of fruit.jpg').isVisible()).toBe(true);
    expect(await page.getByTestId('photo-count').textContent()).toContain('2 photos chosen');
    await page.getByRole('button', { name: 'Do not upload fruit.jpg' }).click();
    expect(await page.getByAltText('Preview of fruit.jpg').count()).toBe(0);
    expect(await page.getByTestId('photo-count').textContent()).toContain('1 photo chosen');
    // The browser's own "No file chosen" button is replaced by ours.
    expect(await page.getByRole('button', { name: /Choose files?/ }).count()).toBe(0);

    await page.getByRole('button', { name: 'Post report' }).click();
    await page.waitForURL(/\/reports\/\d+$/, { timeout: 30_000 });
    const confirmation = page.getByTestId('saved-confirmation');
    await expect.poll(() => confirmation.textContent(), { timeout: 15_000 }).toContain('Thank you: your report is posted.');
    expect(await confirmation.evaluate((el) => el === document.activeElement)).toBe(true);
    const firstId = Number(new URL(page.url()).pathname.split('/').pop());

    // The same tree's next season: its seasons show together on the report page.
    await page.getByRole('link', { name: 'Post another report' }).click();
    await page.getByLabel('Tree', { exact: true }).selectOption({ label: 'Patio tub (e2e) (1 report)' });
    await page.getByLabel('Season year').fill('2024');
    await page.getByRole('radio', { name: /^Still hard and green/ }).check();
    await page.getByRole('button', { name: 'Post report' }).click();
    await page.waitForURL((u) => /\/reports\/\d+$/.test(u.pathname) && !u.pathname.endsWith(`/${firstId}`), { timeout: 30_000 });
    const timeline = page.getByTestId('tree-timeline');
    await expect.poll(() => timeline.textContent(), { timeout: 15_000 }).toMatch(/2024.*2025/);
    await expect.poll(() => timeline.locator(`a[href="/reports/${firstId}"]`).count()).toBe(1);
    await expect.poll(() => page.getByText('2 reports of this tree in 2 seasons').isVisible()).toBe(true);
    expect(offMachine(site, requests)).toEqual([]);
  }, 180_000);

  it('on a phone, My reports and the editors’ tables become cards with nothing cut off; the editors’ tabs scroll', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 } });
    page.setDefaultTimeout(60_000);
    await signIn(page, site.url, 'admin@demo.syconium.test', DEMO_PASSWORD);
    const fitsThePhone = async () =>
      page.evaluate(() => {
        const table = document.querySelector('table.table-cards');
        if (!table) return 'no table';
        const scroller = table.parentElement!;
        return scroller.scrollWidth <= scroller.clientWidth + 1 && document.documentElement.scrollWidth <= 390 ? 'fits' : `too wide: ${scroller.scrollWidth} > ${scroller.clientWidth}`;
      });
    for (const path of ['/editors/audit', '/editors/varieties', '/editors/people']) {
      await page.goto(`${site.url}${path}`);
      await page.locator('table.table-cards tbody tr td[data-label]').first().waitFor({ timeout: 30_000 });
      expect(await fitsThePhone(), path).toBe('fits');
      expect(await page.locator('table.table-cards td[data-label]').first().evaluate((td) => getComputedStyle(td, '::before').content), path).not.toBe('none');
    }
    const tabs = page.locator('nav[aria-label^="Editors"]');
    expect(await tabs.evaluate((nav) => getComputedStyle(nav).overflowX)).toBe('auto');
    expect(await tabs.evaluate((nav) => nav.scrollWidth > nav.clientWidth)).toBe(true);

    const grower = await site.newPage({ viewport: { width: 390, height: 844 } });
    await signIn(grower, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await grower.goto(`${site.url}/my/reports`);
    await grower.locator('table.table-cards tbody tr td[data-label]').first().waitFor({ timeout: 30_000 });
    expect(
      await grower.evaluate(() => {
        const scroller = document.querySelector('table.table-cards')!.parentElement!;
        return scroller.scrollWidth <= scroller.clientWidth + 1;
      }),
    ).toBe(true);
  });

  it('People: searched and paged on the server; a role change asks first, says it is done, and the audit log tells it in words', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(60_000);
    await signIn(page, site.url, 'admin@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/editors/people`);
    const search = page.getByLabel('Find a person');
    const answer = page.waitForResponse((r) => r.url().includes('/api/users?') && r.url().includes('q=Ines'));
    await search.fill('Ines');
    await answer;
    await expect.poll(() => page.locator('tbody tr').count()).toBe(1);
    const select = page.getByLabel('Role of Ines Talbot (demo)');
    await select.selectOption('editor');
    const dialog = page.getByRole('dialog', { name: 'Change Ines Talbot (demo)’s role?' });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await expect.poll(() => dialog.count()).toBe(0);
    expect(await select.inputValue()).toBe('grower');
    await select.selectOption('editor');
    await page.getByRole('dialog').getByRole('button', { name: 'Make editor' }).click();
    await expect.poll(() => page.getByTestId('role-done').textContent()).toContain('Done: Ines Talbot (demo) is now editor');
    expect(await select.inputValue()).toBe('editor');
    // Paging: the pager counts the whole list, not one page.
    await search.fill('');
    await expect.poll(async () => (await page.getByText(/^1–25 of \d+$/).textContent()) ?? '', { timeout: 15_000 }).toMatch(/of (\d{2,})/);

    await page.goto(`${site.url}/editors/audit`);
    const row = page.locator('tbody tr').filter({ hasText: 'Role changed' }).first();
    await expect.poll(() => row.textContent(), { timeout: 30_000 }).toContain('Person: Ines Talbot (demo)');
    expect(await row.textContent()).toContain('Role');
    expect(await row.textContent()).toMatch(/Grower\s*→\s*Editor/);
  });

  it('small things: a not-found page with a way back, a skip link first in the tab order, the map before the filters, no "1 trees"', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(60_000);
    await page.goto(`${site.url}/no-such-page`);
    await expect.poll(() => page.getByRole('heading', { name: 'Nothing grows here' }).isVisible()).toBe(true);
    await page.getByRole('link', { name: 'Back to the atlas' }).click();
    await page.waitForURL(`${site.url}/`);

    await page.goto(`${site.url}/?lat=42.65&lon=-73.75&zoom=8`);
    await page.locator('canvas.maplibregl-canvas').waitFor({ timeout: 30_000 });
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Skip to the page');
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');
    // From the page's start: the town search, its location button, then the map, before any filter.
    const reached: string[] = [];
    for (let i = 0; i < 8; i++) {
      await page.keyboard.press('Tab');
      const what = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        if (!el) return '';
        if (el.classList.contains('maplibregl-canvas')) return 'map';
        if (el.closest('#atlas-filters')) return 'filters';
        return el.getAttribute('role') ?? el.tagName.toLowerCase();
      });
      reached.push(what);
      if (what === 'map' || what === 'filters') break;
    }
    expect(reached.at(-1), reached.join(', ')).toBe('map');
    expect(reached[0]).toBe('combobox');

    // One plural helper: nowhere "1 trees", "1 reports", "1 growers".
    for (const path of ['/here?lat=42.65&lon=-73.75&form=ground', '/why-no-figs', '/about']) {
      await page.goto(`${site.url}${path}`);
      await page.waitForTimeout(2_000);
      expect(await page.locator('body').innerText(), path).not.toMatch(/\b1 (trees|reports|growers|photos|seasons|stations)\b/);
    }
  });

  it('open data: sign-up asks for the CC BY 4.0 agreement, exports carry the licence, the About page states it with the other sources', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 } });
    page.setDefaultTimeout(60_000);
    await page.goto(`${site.url}/sign-up`);
    await page.getByLabel('Name shown with your reports').fill('Open Data Grower');
    await page.getByLabel('E-mail').fill('open-data@example.com');
    await page.getByLabel('Password').fill('a long enough password');
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => page.getByText('Agree to share your published reports under CC BY 4.0 to join').isVisible()).toBe(true);
    await page.getByRole('checkbox', { name: /I agree that my published reports are shared as open data under Creative Commons Attribution 4.0 International \(CC BY 4\.0\)/ }).check();
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-up'), { timeout: 30_000 });

    const exported = await page.evaluate(async () => {
      const csv = await fetch('/api/reports/export.csv');
      const geo = await (await fetch('/api/reports/export.geojson')).json();
      return { link: csv.headers.get('link'), notice: csv.headers.get('x-data-licence'), licence: geo.licence, attribution: geo.attribution };
    });
    // CC BY 4.0's licence deed (creativecommons.org/licenses/by/4.0/).
    expect(exported.link).toBe('<https://creativecommons.org/licenses/by/4.0/>; rel="license"');
    expect(exported.notice).toContain('Syconium contributors');
    expect(exported.licence.name).toBe('CC BY 4.0');
    expect(exported.attribution).toBe('Syconium contributors');

    await page.goto(`${site.url}/about`);
    // Pages load as their own chunks: wait for the page itself, not the "Loading…" in its place.
    await page.getByText('How the numbers are made').first().waitFor();
    const text = await page.locator('main').innerText();
    for (const source of ['CC BY 4.0', 'Syconium contributors', 'NOAA', 'GeoNames', 'Natural Earth', 'US Census', 'lakes and rivers', 'How the numbers are made']) expect(text, source).toContain(source);
    // The atlas's download links say the licence too.
    await page.goto(`${site.url}/`);
    await page.getByRole('button', { name: 'Filters & layers' }).click();
    expect(await page.getByTestId('export-licence').textContent()).toContain('CC BY 4.0');
  });
});
