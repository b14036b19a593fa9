import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, signIn } from './harness';

/*
 * Issue 18, item 9: axe-core (Deque's accessibility rules engine, run inside the page as its README
 * shows: inject axe.min.js, then `axe.run()`) on every screen, signed out and in each role, at a
 * desktop and a phone size, with no violation of impact "serious" or "critical"; and the main flows
 * done with the keyboard alone.
 */

const require = createRequire(import.meta.url);
const AXE_PATH = require.resolve('axe-core');
const SIZES = [
  { width: 1440, height: 900 },
  { width: 390, height: 844 },
];

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
}

/** Serious and critical violations on the page as it is now, in words a failing test can show. */
async function seriousViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ path: AXE_PATH });
  const result = (await page.evaluate(() => (window as unknown as { axe: { run: () => Promise<unknown> } }).axe.run())) as AxeResult;
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

/** Open a screen and wait until its data has arrived (the page is quiet), then check it. */
async function check(page: Page, url: string, ready?: (page: Page) => Promise<unknown>): Promise<string[]> {
  await page.goto(url);
  await page.waitForLoadState('networkidle', { timeout: 20_000 }).catch(() => undefined);
  await ready?.(page);
  return seriousViolations(page);
}

/** Press Tab until the focused element answers to `name` (its text or label), at most `max` times. */
async function tabTo(page: Page, name: RegExp, max = 60): Promise<void> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const label = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el) return '';
      const labelled = el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`)?.textContent : null;
      return `${el.getAttribute('aria-label') ?? ''} ${labelled ?? ''} ${el.closest('label')?.textContent ?? ''} ${el.textContent ?? ''}`.trim();
    });
    if (name.test(label)) return;
  }
  throw new Error(`Tab never reached ${name}`);
}

describe('accessibility: axe-core on every screen, in every role, and the keyboard alone', () => {
  const site = openSite();

  it('signed out: no serious or critical violation on any screen', async () => {
    const problems: string[] = [];
    for (const size of SIZES) {
      const page = await site.newPage({ viewport: size, bypassCSP: true });
      page.setDefaultTimeout(60_000);
      const reportId = await page.goto(`${site.url}/api/reports?pageSize=1`).then((r) => r!.json()).then((b: { reports: { id: number }[] }) => b.reports[0]!.id);
      const varietyId = await page.goto(`${site.url}/api/varieties`).then((r) => r!.json()).then((b: { varieties: { id: number }[] }) => b.varieties[0]!.id);
      const screens = ['/', '/?lat=42.65&lon=-73.75&zoom=10', '/here', '/here?lat=42.65&lon=-73.75&form=ground', '/here/compare?a=42.65,-73.75&b=43.04,-87.91&form=ground', `/varieties/${varietyId}`, '/accuracy', '/support', '/why-no-figs', '/about', '/sign-in', '/sign-up', '/forgot-password', `/reports/${reportId}`, '/no-such-page'];
      for (const path of screens) for (const v of await check(page, `${site.url}${path}`)) problems.push(`${size.width}px ${path}: ${v}`);
      // The town search with its list open, and Why no figs' result.
      await page.goto(`${site.url}/here`);
      await page.getByRole('combobox', { name: 'Find a town' }).fill('Alban');
      await page.getByRole('listbox', { name: 'Matching towns' }).getByRole('option').first().waitFor();
      for (const v of await seriousViolations(page)) problems.push(`${size.width}px /here with the town list open: ${v}`);
      await page.goto(`${site.url}/why-no-figs`);
      await page.getByRole('button', { name: /No fruit formed/ }).click();
      for (let i = 0; i < 9 && !(await page.getByRole('button', { name: 'See likely causes' }).isVisible()); i++) await page.getByRole('button', { name: 'Next' }).click();
      await page.getByRole('button', { name: 'See likely causes' }).click();
      await page.getByRole('heading', { name: 'Likely causes, most likely first' }).waitFor();
      for (const v of await seriousViolations(page)) problems.push(`${size.width}px Why no figs result: ${v}`);
      await page.close();
    }
    expect(problems).toEqual([]);
  }, 300_000);

  for (const role of ['grower', 'editor', 'admin'] as const) {
    it(`signed in as ${role}: no serious or critical violation on any screen`, async () => {
      const problems: string[] = [];
      for (const size of SIZES) {
        const page = await site.newPage({ viewport: size, bypassCSP: true });
        page.setDefaultTimeout(60_000);
        await signIn(page, site.url, `${role}@demo.syconium.test`, DEMO_PASSWORD);
        const screens = ['/', '/here?lat=42.65&lon=-73.75&form=ground', '/why-no-figs', '/account', '/reports/new', '/my/reports', '/my/reports/import', '/about', '/support'];
        if (role === 'grower') {
          const own = await page.evaluate(() => fetch('/api/reports?mine=true&pageSize=1').then((r) => r.json()));
          const id = (own as { reports: { id: number }[] }).reports[0]!.id;
          screens.push(`/reports/${id}`, `/reports/${id}/edit`);
        } else {
          screens.push('/editors', '/editors/varieties', '/editors/wasp-areas', '/editors/stations', '/editors/moderation', '/editors/audit');
          if (role === 'admin') screens.push('/editors/people', '/editors/supporters');
        }
        for (const path of screens) for (const v of await check(page, `${site.url}${path}`)) problems.push(`${size.width}px ${path}: ${v}`);
        if (role === 'admin') {
          // The role-change question, open.
          await page.goto(`${site.url}/editors/people`);
          await page.getByLabel('Role of Tobias Fenwick (demo)').selectOption('editor').catch(async () => {
            await page.getByLabel('Find a person').fill('Tobias');
            await page.getByLabel('Role of Tobias Fenwick (demo)').selectOption('editor');
          });
          await page.getByRole('dialog').waitFor();
          for (const v of await seriousViolations(page)) problems.push(`${size.width}px role-change dialog: ${v}`);
          await page.keyboard.press('Escape');
        }
        await page.close();
      }
      expect(problems).toEqual([]);
    }, 400_000);
  }

  it('by keyboard alone: sign in, find a town on the atlas, answer Why no figs to its result, post a report', async () => {
    const page = await site.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(60_000);

    // Sign in.
    await page.goto(`${site.url}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    await tabTo(page, /E-mail/);
    await page.keyboard.type('grower@demo.syconium.test');
    await page.keyboard.press('Tab');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));

    // The atlas: skip link, the town search, Enter on the best match.
    await page.goto(`${site.url}/?lat=40&lon=-100&zoom=4`);
    await page.locator('canvas.maplibregl-canvas').waitFor();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Enter');
    await tabTo(page, /Find a town/, 5);
    await page.keyboard.type('Milwauk');
    await page.getByRole('option', { name: /Milwaukee/ }).first().waitFor();
    await page.keyboard.press('Enter');
    // Milwaukee, WI: 43.04 N (GeoNames, recalled from memory).
    await expect.poll(() => Number(new URL(page.url()).searchParams.get('lat')), { timeout: 30_000 }).toBeCloseTo(43.04, 0);

    // Why no figs, through to the likely causes.
    await page.goto(`${site.url}/why-no-figs`);
    // The page is its own chunk: tab once it is drawn, not through its "Loading…" line.
    await page.getByText('Fruit formed, then dropped').first().waitFor();
    await tabTo(page, /Fruit formed, then dropped/);
    await page.keyboard.press('Enter');
    const stepTitle = () => page.locator('main h2').first().textContent();
    for (let i = 0; i < 10; i++) {
      if (await page.getByRole('heading', { name: 'Likely causes, most likely first' }).isVisible()) break;
      // On to the next step by Tab and Enter, once the step on screen is the new one.
      const title = await stepTitle();
      await tabTo(page, /^(Next|See likely causes)$/, 120);
      await page.keyboard.press('Enter');
      await expect.poll(stepTitle, { timeout: 10_000 }).not.toBe(title);
    }
    await expect.poll(() => page.getByRole('heading', { name: 'Likely causes, most likely first' }).isVisible()).toBe(true);

    // Post a report: the home garden, a variety, the season and outcome, all by keys.
    await page.goto(`${site.url}/reports/new`);
    await page.getByRole('heading', { name: 'Which tree' }).waitFor();
    await tabTo(page, /Label for the new tree/);
    await page.keyboard.type('Keyboard fig (e2e)');
    await tabTo(page, /^Variety/);
    await page.keyboard.type('Lantern');
    await page.getByRole('option', { name: /Lantern Amber/ }).waitFor();
    await tabTo(page, /Lantern Amber/, 5);
    await page.keyboard.press('Enter');
    await tabTo(page, /My home garden/);
    await page.keyboard.press('Enter');
    await expect.poll(() => page.getByLabel('Latitude').inputValue()).toBe('42.66');
    await tabTo(page, /Season year/);
    await page.keyboard.press('ControlOrMeta+a');
    await page.keyboard.type('2025');
    await tabTo(page, /No fruit formed/);
    // Arrow keys move within a radio group; Ripened is the last outcome.
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowDown');
    expect(await page.getByRole('radio', { name: /^Ripened/ }).isChecked()).toBe(true);
    await tabTo(page, /^Post report$/, 80);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/reports\/\d+$/, { timeout: 30_000 });
    await expect.poll(() => page.getByTestId('saved-confirmation').textContent()).toContain('your report is posted');
  }, 240_000);
});
