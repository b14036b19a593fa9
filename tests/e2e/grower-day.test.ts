import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { DEMO_FOLLOWED_PLACE, DEMO_FOLLOWED_VARIETY } from '../../server/follows/follows.seed';
import { openSite, recordRequests, signIn } from './harness';

const ALBANY = '/here?lat=42.66&lon=-73.78&form=ground&radiusKm=100';

describe('the grower’s day in the browser', () => {
  const site = openSite();

  it('What ripens here: one sortable table for the named place, details on demand, the short-season summary on top, no "1 trees"', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 }, locale: 'en-US' });
    const requests = recordRequests(page);
    await page.goto(site.url + ALBANY);
    await expect.poll(() => page.getByTestId('here-title').textContent(), { timeout: 30_000 }).toBe('What ripens near Albany, NY');
    await expect.poll(() => page.getByTestId('variety-row').count(), { timeout: 30_000 }).toBeGreaterThan(3);
    // The short-season summary is there without ticking anything, above the table.
    const summary = page.getByTestId('short-season-summary');
    await summary.waitFor();
    expect((await summary.boundingBox())!.y).toBeLessThan((await page.getByTestId('variety-table').boundingBox())!.y);
    // The pollination sentence is said once per fig type, not once per variety.
    const rows = await page.getByTestId('variety-row').count();
    expect(await page.getByTestId('pollination-notes').getByRole('listitem').count()).toBeLessThan(rows);

    // Sort by evidence: the first row then has the most trees.
    const evidence = () => page.getByTestId('variety-row').evaluateAll((trs) => trs.map((tr) => Number(tr.querySelector('[title$="growers"], [title$="grower"]')?.textContent?.split('/')[0])));
    await page.getByRole('button', { name: /Trees \/ growers/ }).click();
    const counts = await evidence();
    expect(counts).toEqual([...counts].sort((a, b) => b - a));
    expect(await page.getByRole('columnheader', { name: /Trees \/ growers/ }).getAttribute('aria-sort')).toBe('descending');

    // Details open under the row.
    const first = page.getByTestId('variety-row').first();
    await first.getByRole('button', { name: /Show details of/ }).click();
    await page.getByTestId('variety-details').waitFor();
    expect(await page.getByTestId('variety-details').textContent()).toMatch(/days here vs/);
    expect(await page.locator('main').textContent()).not.toMatch(/\b1 trees\b/);
    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('on a phone the answer comes first, under a compact place control', async () => {
    const page = await site.newPage({ viewport: { width: 390, height: 844 }, locale: 'en-US' });
    await page.goto(site.url + ALBANY);
    const bar = page.getByTestId('place-bar');
    await expect.poll(() => bar.textContent(), { timeout: 30_000 }).toContain('Albany, NY');
    await expect.poll(() => page.getByTestId('variety-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    // The town search is folded away, and the first row shows on the first screen.
    expect(await page.getByLabel('Find a town').isVisible()).toBe(false);
    const firstRow = (await page.getByTestId('variety-row').first().boundingBox())!;
    expect(firstRow.y + firstRow.height).toBeLessThan(844 * 1.2);
    // Nothing wider than the phone but the table's own scroller.
    expect(await page.locator('main > div').first().evaluate((el) => el.scrollWidth)).toBeLessThanOrEqual(390);
    await bar.getByRole('button', { name: 'Change' }).click();
    expect(await page.getByLabel('Find a town').isVisible()).toBe(true);
  });

  it('compares two places side by side', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 }, locale: 'en-US' });
    await page.goto(`${site.url}/here/compare?a=42.66,-73.78&b=42.36,-71.06&form=ground&radiusKm=100`);
    await expect.poll(() => page.getByTestId('compare-side-a').textContent(), { timeout: 30_000 }).toContain('Near Albany, NY');
    await expect.poll(() => page.getByTestId('compare-side-b').textContent(), { timeout: 30_000 }).toContain('Near Boston, MA');
    await expect.poll(() => page.getByTestId('compare-row').count(), { timeout: 30_000 }).toBeGreaterThan(3);
    const header = await page.getByTestId('compare-table').locator('thead').textContent();
    expect(header).toContain('A: Albany, NY');
    expect(header).toContain('B: Boston, MA');
  });

  it('a variety name leads to its page; the demo grower follows a variety and a place, and follows or stops from the page', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 }, locale: 'en-US' });
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(site.url + ALBANY);
    await expect.poll(() => page.getByTestId('variety-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await page.getByTestId('variety-table').getByRole('link', { name: DEMO_FOLLOWED_VARIETY, exact: true }).click();
    await page.waitForURL(/\/varieties\/\d+$/);
    const profile = page.getByTestId('variety-profile');
    await expect.poll(() => profile.getByRole('heading', { level: 1 }).textContent(), { timeout: 30_000 }).toContain(DEMO_FOLLOWED_VARIETY);
    await page.getByTestId('variety-cells-map').waitFor();
    await page.getByText('First ripe figs, across the atlas').waitFor();
    expect(await page.getByTestId('days-needed').textContent()).toMatch(/^\d+ days$/);
    // Seeded: the demo grower follows this variety already.
    const following = page.getByRole('button', { name: `Following ${DEMO_FOLLOWED_VARIETY} ✓` });
    await following.waitFor({ timeout: 15_000 });
    await following.click();
    await page.getByRole('button', { name: `Follow ${DEMO_FOLLOWED_VARIETY}` }).waitFor();
    await page.getByRole('button', { name: `Follow ${DEMO_FOLLOWED_VARIETY}` }).click();
    await following.waitFor();

    // Follow the place What ripens here is showing, named after its town.
    await page.goto(site.url + ALBANY);
    await page.getByRole('button', { name: 'Follow this place' }).click();
    await page.getByRole('button', { name: 'Following this place ✓' }).waitFor({ timeout: 15_000 });

    await page.goto(`${site.url}/account`);
    const list = page.getByTestId('follow-list');
    await expect.poll(() => list.textContent(), { timeout: 15_000 }).toContain(DEMO_FOLLOWED_PLACE.name);
    expect(await list.textContent()).toContain(DEMO_FOLLOWED_VARIETY);
    expect(await list.textContent()).toContain('Albany, NY');
  });

  it('speaks the grower’s units and dates: the browser’s language first, then the choice saved to the account', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 }, locale: 'en-GB' });
    await page.goto(site.url + ALBANY);
    await expect.poll(() => page.getByTestId('here-title').textContent(), { timeout: 30_000 }).toContain('Albany');
    // en-GB: miles on the road, °C for the weather (common practice, no source); 100 km = 62 mi (NIST: 1 mi = 1.609344 km).
    await expect.poll(() => page.getByText(/within 62 mi/).count()).toBeGreaterThan(0);
    expect(await page.getByText(/At 0 °C\./).count()).toBe(1);
    // Dates in the one medium style of the language: day before month ("27 Apr").
    expect(await page.locator('#season-title').locator('..').textContent()).toMatch(/last spring frost \d{1,2} [A-Z][a-z]{2}/);

    // A visitor's choice lives in this browser.
    const menu = page.getByTestId('units-menu');
    expect(await menu.locator('summary').textContent()).toContain('°C · mi');
    await menu.locator('summary').click();
    await menu.getByLabel('Distances in').selectOption('km');
    await expect.poll(() => page.getByText(/within 100 km/).count()).toBeGreaterThan(0);
    await page.reload();
    await expect.poll(() => page.getByText(/within 100 km/).count(), { timeout: 30_000 }).toBeGreaterThan(0);

    // Signed in, the choice is saved to the account and follows the grower to another browser.
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/account`);
    const control = page.locator('main').getByTestId('units-control');
    await control.getByLabel('Temperatures in').selectOption('F');
    await control.getByLabel('Distances in').selectOption('mi');
    await expect.poll(() => control.textContent()).toContain('Saved to your account');
    const other = await site.newPage({ viewport: { width: 1440, height: 900 }, locale: 'de-DE' });
    await signIn(other, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await other.goto(`${site.url}/account`);
    const otherControl = other.locator('main').getByTestId('units-control');
    await expect.poll(() => otherControl.getByLabel('Distances in').inputValue(), { timeout: 15_000 }).toBe('mi');
    expect(await otherControl.getByLabel('Temperatures in').inputValue()).toBe('F');
    // The date language saved with it (en-GB) is used there too: "3 Dec 2026", not "03.12.2026".
    expect(await other.locator('main dl').textContent()).toMatch(/Member since\d{1,2} [A-Z][a-z]{2} \d{4}/);
  });
});
