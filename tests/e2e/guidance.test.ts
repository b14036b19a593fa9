import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, recordRequests, signIn } from './harness';

describe('guidance in the browser', () => {
  const site = openSite();

  it('walks “Why no figs?” for a dropped Smyrna crop at the demo home to its causes; nothing leaves the machine', async () => {
    const page = await site.newPage();
    const requests = recordRequests(page);
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Why no figs?' }).click();
    await page.getByRole('button', { name: /Fruit formed, then dropped/ }).click();

    await page.getByRole('heading', { name: 'Which variety is it?' }).waitFor();
    await expect.poll(() => page.getByLabel('Variety', { exact: true }).locator('option', { hasText: 'Terrace Gold' }).count(), { timeout: 15_000 }).toBe(1);
    await page.getByLabel('Variety', { exact: true }).selectOption({ label: 'Terrace Gold (fictional demo)' });
    expect(await page.getByRole('radio', { name: /Smyrna/ }).isChecked()).toBe(true);
    await page.getByRole('button', { name: 'Next' }).click();

    await page.getByRole('heading', { name: 'Which crop did you watch?' }).waitFor();
    await page.getByRole('radio', { name: /Main crop/ }).check();
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByLabel('Years since it was planted or rooted').fill('5');
    await page.getByRole('button', { name: 'Next' }).click();
    for (const heading of ['How is it grown?', 'How was the watering this summer?', 'How was it fed?', 'How much sun and warmth does it get?']) {
      await page.getByRole('heading', { name: heading }).waitFor();
      await page.getByRole('button', { name: 'Next' }).click();
    }
    await page.getByRole('heading', { name: 'Where do you grow it? (optional)' }).waitFor();
    await page.getByRole('button', { name: /Home garden \(demo\)/ }).click();
    await page.getByRole('status').filter({ hasText: 'Using Home garden (demo)' }).waitFor();
    await page.getByRole('button', { name: 'See likely causes' }).click();

    await page.getByRole('heading', { name: 'Likely causes, most likely first' }).waitFor({ timeout: 30_000 });
    const first = page.getByTestId('cause').first();
    await expect.poll(() => first.getByRole('heading').textContent()).toBe('The figs needed the fig wasp');
    expect(await first.textContent()).toContain('Grow a common-type variety');
    expect(await page.getByRole('note', { name: 'Caution' }).last().textContent()).toContain('extension service');
    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('opens “What ripens here” on the demo grower’s saved home', async () => {
    const page = await site.newPage();
    await signIn(page, site.url, 'grower@demo.syconium.test', DEMO_PASSWORD);
    await page.goto(`${site.url}/here`);
    await page.waitForURL((u) => u.searchParams.get('lat') === '42.66' && u.searchParams.get('form') === 'container', { timeout: 30_000 });
    await expect.poll(() => page.getByLabel('Latitude').inputValue(), { timeout: 15_000 }).toBe('42.66');
    await expect.poll(() => page.getByTestId('variety-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await page.getByTestId('wasp-status').textContent()).toContain('Not recorded here');
  });

  it('links What ripens here to “How good are these odds?”, whose figures the background job fills, marked as demo data', async () => {
    const page = await site.newPage();
    await page.goto(`${site.url}/here?lat=38.58&lon=-121.49&form=ground`);
    await expect.poll(() => page.getByTestId('variety-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await page.getByRole('link', { name: 'How good are these odds?' }).click();
    await page.getByRole('heading', { name: 'How good are these odds?' }).waitFor();
    // The model-accuracy job runs a few seconds after start; until then the page says so.
    await expect
      .poll(
        async () => {
          if (await page.getByText('Brier skill score').count()) return true;
          await page.reload();
          return false;
        },
        { timeout: 90_000, interval: 3_000 },
      )
      .toBe(true);
    expect(await page.getByRole('note').textContent()).toContain('invented demo data');
    expect(await page.getByRole('row', { name: /The chance shown in What ripens here/ }).count()).toBe(1);
    expect(await page.locator('.recharts-surface').count()).toBeGreaterThan(0);
  });
});
