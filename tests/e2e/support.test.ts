import { describe, expect, it } from 'vitest';
import { openSite, recordRequests } from './harness';

/*
 * A grower joins, becomes a monthly member through the local test provider's hosted checkout (a
 * declined test card first, then the card that pays: docs.stripe.com/testing), sees the membership
 * active once the provider's signed event has arrived, finds the receipt in the development mailbox
 * and cancels from My account.
 */
describe('supporting the atlas in the browser', () => {
  const site = openSite({ SYCONIUM_DEV_MAIL: 'true', SYCONIUM_DEV_PAYMENTS: 'true' });

  it('joins, pays monthly with a test card, gets the receipt, and cancels', async () => {
    const page = await site.newPage();
    const requests = recordRequests(page);
    const email = `member-${Date.now()}@example.com`;
    await page.goto(`${site.url}/sign-up`);
    await page.getByLabel('Name shown with your reports').fill('Juniper Member');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('a long enough passphrase');
    await page.getByRole('checkbox', { name: /I agree that my published reports are shared/ }).check();
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-up'));

    await page.getByRole('link', { name: 'Support', exact: true }).first().click();
    await page.getByRole('heading', { name: 'Support the atlas' }).waitFor();
    await page.getByLabel('Currency').selectOption('usd');
    await page.getByText('Cutting', { exact: true }).click();
    await page.getByRole('button', { name: 'Continue to secure checkout' }).click();

    // The provider's hosted page (on this machine: the local test provider).
    await page.getByRole('heading', { name: 'Syconium membership: Cutting' }).waitFor();
    expect(await page.getByText('$3').first().isVisible()).toBe(true);
    await page.getByLabel('Test card number').fill('4000 0000 0000 0002');
    await page.getByRole('button', { name: /^Pay/ }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('declined');
    await page.getByLabel('Test card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: /^Pay/ }).click();

    await page.waitForURL((u) => u.pathname === '/support/thanks');
    await page.getByText('your membership of $3 a month is active').waitFor({ timeout: 15_000 });

    const inbox = async () => (await (await page.request.get(`${site.url}/api/dev/mail`)).json()) as { messages: { to: string; subject: string }[] };
    await expect.poll(async () => (await inbox()).messages.filter((m) => m.to.includes(email)).map((m) => m.subject), { timeout: 15_000 }).toContain('Thank you for supporting Syconium');

    await page.getByRole('link', { name: 'See your membership' }).click();
    const panel = page.getByRole('region', { name: 'Membership' });
    await expect.poll(() => panel.textContent()).toContain('Active');
    await panel.getByRole('button', { name: 'Cancel membership' }).click();
    await panel.getByRole('button', { name: 'Yes, cancel it' }).click();
    await expect.poll(() => panel.textContent()).toContain('Cancelled');

    // Nothing left the machine: the app and the local test provider, both on loopback.
    expect(requests.filter((u) => !/^https?:\/\/127\.0\.0\.1:\d+\//.test(u) && !u.startsWith('data:') && !u.startsWith('blob:'))).toEqual([]);
  });
});
