import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-scenario';
import { openSite, recordRequests, signIn } from './harness';

describe('accounts in the browser', () => {
  const site = openSite();

  it('signs the demo editor in and shows the editors’ area; all requests stay on this origin', async () => {
    const page = await site.newPage();
    const requests = recordRequests(page);
    await signIn(page, site.url, 'editor@demo.syconium.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Editors', exact: true }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Editors’ workspace' }).isVisible()).toBe(true);
    expect(requests.filter((u) => !u.startsWith(site.url) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });

  it('shows a field error when signing up with a short password', async () => {
    const page = await site.newPage();
    await page.goto(`${site.url}/sign-up`);
    await page.getByLabel('Name shown with your reports').fill('Test Grower');
    await page.getByLabel('E-mail').fill('new@example.com');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => page.getByText('Use at least 10 characters').isVisible()).toBe(true);
  });
});
