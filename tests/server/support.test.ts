import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import Stripe from 'stripe';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createStripeClient } from '../../server/support/payments';
import { FAKE_SECRET_KEY, startFakeProvider, TEST_CARDS, type FakeProvider } from '../../server/support/fake-provider';
import { createTestDb, testConfig } from '../helpers/test-app';
import { addVariety, validReportBody } from './reliability/helpers';
import { createMailTestContext, type MailTestContext } from './email-helpers';

/*
 * Contributions through the provider's official SDK against the local test provider: a real HTTP
 * server speaking the provider's API, a hosted checkout page, and events signed with the provider's
 * scheme (verified by the SDK's own constructEvent). Test cards as the provider documents them
 * (docs.stripe.com/testing: 4242 4242 4242 4242 succeeds, 4000 0000 0000 0002 is declined).
 */

const WEBHOOK_SECRET = 'whsec_support_test_secret';
let fake: FakeProvider;
let ctx: MailTestContext;
let server: Server;
let webhookUrl: string;
const signer = new Stripe(FAKE_SECRET_KEY);

beforeAll(async () => {
  // The provider is another system: it keeps its objects in a database of its own.
  fake = await startFakeProvider(createTestDb().db, { webhookSecret: WEBHOOK_SECRET, webhookUrl: 'http://127.0.0.1:9/unset' });
  ctx = await createMailTestContext({ payments: { stripe: createStripeClient(FAKE_SECRET_KEY, fake.port), webhookSecret: WEBHOOK_SECRET, testMode: true } });
  server = ctx.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  webhookUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/support/webhook`;
  fake.setWebhookUrl(webhookUrl);
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
  await fake.close();
});

const sessionIdOf = (url: string) => url.split('/pay/')[1]!;
const count = (table: string) => ctx.db.sqlite.prepare(`SELECT count(*) FROM ${table}`).pluck().get() as number;

async function startMonthly(agent: Awaited<ReturnType<MailTestContext['signedIn']>>, tier = 'sapling', currency = 'eur') {
  const res = await agent.post('/api/support/checkout').send({ kind: 'monthly', tier, currency });
  expect(res.status, res.text).toBe(201);
  return sessionIdOf(res.body.url);
}

/** What a tester does on the hosted page. */
function pay(sessionId: string, card: string) {
  return supertest(fake.url).post(`/pay/${sessionId}`).type('form').send({ card, action: 'pay' });
}

async function until<T>(read: () => Promise<T> | T, ok: (value: T) => boolean, what: string): Promise<T> {
  const deadline = Date.now() + 5_000;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

const membershipOf = async (agent: Awaited<ReturnType<MailTestContext['signedIn']>>) => (await agent.get('/api/support/membership')).body;

function signedEvent(type: string, object: unknown, options: { secret?: string; timestamp?: number } = {}) {
  const payload = JSON.stringify({ id: `evt_manual_${Math.random().toString(36).slice(2)}`, object: 'event', created: Math.floor(Date.now() / 1000), type, data: { object } });
  const header = signer.webhooks.generateTestHeaderString({ payload, secret: options.secret ?? WEBHOOK_SECRET, timestamp: options.timestamp });
  return supertest(ctx.app).post('/api/support/webhook').set('content-type', 'application/json').set('stripe-signature', header).send(payload);
}

describe('the Support page and checkout', () => {
  it('says contributions are on, in test mode', async () => {
    expect((await ctx.agent().get('/api/support/options')).body).toEqual({ enabled: true, testMode: true });
  });

  it('without a provider, the page says contributions are off and checkout answers 404, not a crash', async () => {
    const app = createApp({ db: ctx.db, config: testConfig() });
    expect((await supertest(app).get('/api/support/options')).body).toEqual({ enabled: false, testMode: false });
    const res = await supertest(app).post('/api/support/checkout').set('X-Syconium-Request', '1').send({ kind: 'one-off', amount: 10, currency: 'usd' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('contributions_off');
  });

  it('refuses bad input naming the field, and a monthly membership for a visitor', async () => {
    const visitor = ctx.agent();
    const bad = await visitor.post('/api/support/checkout').send({ kind: 'one-off', amount: 1, currency: 'usd' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.amount[0]).toMatch(/at least 2/);
    expect((await visitor.post('/api/support/checkout').send({ kind: 'one-off', amount: 10, currency: 'jpy' })).body.error.fields.currency).toBeDefined();
    expect((await visitor.post('/api/support/checkout').send({ kind: 'monthly', tier: 'sapling', currency: 'usd' })).status).toBe(401);
  });

  it('a visitor gives once: the event records the gift and mails a receipt; the checkout then reads paid', async () => {
    const res = await ctx.agent().post('/api/support/checkout').send({ kind: 'one-off', amount: 25, currency: 'gbp' });
    const sessionId = sessionIdOf(res.body.url);
    const page = await supertest(fake.url).get(`/pay/${sessionId}`);
    expect(page.text).toContain('£25');
    const paid = await supertest(fake.url).post(`/pay/${sessionId}`).type('form').send({ card: '4242 4242 4242 4242', email: 'kind.visitor@example.com', action: 'pay' });
    expect(paid.status).toBe(303);
    expect(paid.headers.location).toBe(`${ctx.config.appUrl}/support/thanks?session=${sessionId}`);
    await until(() => ctx.agent().get(`/api/support/checkout/${sessionId}`).then((r) => r.body.state), (s) => s === 'paid', 'the paid state');
    const receipt = await until(() => ctx.inbox('kind.visitor@example.com'), (m) => m.length === 1, 'the receipt');
    expect(receipt[0]!.subject).toBe('Thank you for supporting Syconium');
    expect(receipt[0]!.text).toContain('£25');
    expect(receipt[0]!.text).toContain('One-off contribution');
  });
});

describe('a monthly membership follows the provider events', () => {
  let grower: Awaited<ReturnType<MailTestContext['signedIn']>>;
  let email: string;
  let reportId: number;
  beforeAll(async () => {
    email = `member-${Date.now()}@example.com`;
    grower = await ctx.signedIn('grower', email);
  });

  it('a declined card changes nothing: no membership, no contribution, no receipt', async () => {
    const before = count('contributions');
    const sessionId = await startMonthly(grower);
    const res = await pay(sessionId, TEST_CARDS.declined);
    expect(res.status).toBe(402);
    expect(res.text).toContain('declined');
    await new Promise((r) => setTimeout(r, 300));
    expect(count('contributions')).toBe(before);
    expect((await membershipOf(grower)).membership).toBeNull();
    expect((await grower.get(`/api/support/checkout/${sessionId}`)).body.state).toBe('waiting');
    expect(ctx.inbox(email)).toHaveLength(0);
  });

  it('paid with the test card: active after the signed event, one contribution, one receipt; no card data stored', async () => {
    const sessionId = await startMonthly(grower, 'sapling', 'eur');
    expect((await pay(sessionId, TEST_CARDS.paid)).status).toBe(303);
    const mine = await until(() => membershipOf(grower), (m) => m.membership?.status === 'active', 'an active membership');
    expect(mine.membership).toMatchObject({ tier: 'sapling', amountMinor: 600, currency: 'eur', cancelledAt: null });
    const receipts = await until(() => ctx.inbox(email), (m) => m.length === 1, 'the receipt');
    expect(receipts[0]!.text).toContain('Sapling membership');
    expect(receipts[0]!.text).toContain('€6');
    // No card number anywhere in the app's database.
    for (const table of ctx.db.sqlite.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'").pluck().all() as string[]) {
      const rows = JSON.stringify(ctx.db.sqlite.prepare(`SELECT * FROM "${table}"`).raw().all());
      expect(rows, table).not.toContain('4242');
    }
  });

  it('a redelivered event changes nothing (idempotent by event id)', async () => {
    const completed = fake.events().filter((e) => e.type === 'checkout.session.completed').at(-1)!;
    const before = { contributions: count('contributions'), mails: ctx.inbox(email).length };
    expect(await fake.redeliver(completed.id)).toBe(200);
    const again = await supertest(ctx.app).post('/api/support/webhook').set('content-type', 'application/json').set('stripe-signature', signer.webhooks.generateTestHeaderString({ payload: JSON.stringify(completed), secret: WEBHOOK_SECRET })).send(JSON.stringify(completed));
    expect(again.body).toEqual({ received: true, duplicate: true });
    await new Promise((r) => setTimeout(r, 200));
    expect(count('contributions')).toBe(before.contributions);
    expect(ctx.inbox(email)).toHaveLength(before.mails);
  });

  it('a failed renewal makes it past due, a paid one active again with a renewal receipt', async () => {
    const sub = fake.events().filter((e) => e.type === 'checkout.session.completed').at(-1)!.data.object as Stripe.Checkout.Session;
    await supertest(fake.url).post(`/__test/subscriptions/${sub.subscription}/renewal`).type('form').send({ outcome: 'failed' });
    expect((await membershipOf(grower)).membership.status).toBe('past_due');
    const before = count('contributions');
    await supertest(fake.url).post(`/__test/subscriptions/${sub.subscription}/renewal`).type('form').send({ outcome: 'paid' });
    expect((await membershipOf(grower)).membership.status).toBe('active');
    expect(count('contributions')).toBe(before + 1);
    await until(() => ctx.inbox(email), (m) => m.some((x) => x.subject === 'Your Syconium membership receipt'), 'the renewal receipt');
  });

  it('the opt-in mark shows on the grower’s reports only while the membership runs', async () => {
    const varietyId = addVariety(ctx.db);
    const posted = await grower.post('/api/reports').send(validReportBody(varietyId));
    expect(posted.status, posted.text).toBe(201);
    const id = (reportId = posted.body.report.id);
    expect((await ctx.agent().get(`/api/reports/${id}`)).body.report.grower.supporter).toBe(false);
    expect((await grower.put('/api/support/membership/mark').send({ showMark: true })).body.showMark).toBe(true);
    expect((await ctx.agent().get(`/api/reports/${id}`)).body.report.grower.supporter).toBe(true);
    expect((await grower.put('/api/support/membership/mark').send({ showMark: 'yes' })).body.error.fields.showMark).toBeDefined();
  });

  it('admins see totals per month and the active supporters; growers may not', async () => {
    const admin = await ctx.signedIn('admin');
    const summary = (await admin.get('/api/support/summary')).body;
    const month = new Date().toISOString().slice(0, 7);
    expect(summary.months).toContainEqual({ month, currency: 'eur', totalMinor: 1200, contributions: 2 });
    expect(summary.months).toContainEqual({ month, currency: 'gbp', totalMinor: 2500, contributions: 1 });
    expect(summary.activeSupporters.map((s: { tier: string }) => s.tier)).toContain('sapling');
    expect((await grower.get('/api/support/summary')).status).toBe(403);
  });

  it('cancelling ends it at the provider; the later event changes nothing and the mark goes', async () => {
    const res = await grower.post('/api/support/membership/cancel');
    expect(res.status, res.text).toBe(200);
    expect(res.body.membership.status).toBe('cancelled');
    await until(() => fake.events().filter((e) => e.type === 'customer.subscription.deleted').length, (n) => n === 1, 'the deletion event');
    await new Promise((r) => setTimeout(r, 200));
    expect((await membershipOf(grower)).membership.status).toBe('cancelled');
    expect((await grower.post('/api/support/membership/cancel')).status).toBe(409);
    expect((await ctx.agent().get(`/api/reports/${reportId}`)).body.report.grower.supporter).toBe(false);
  });
});

describe('webhooks done right', () => {
  it('a forged event (wrong secret) or one without a signature is refused and changes nothing', async () => {
    const before = count('payment_events');
    const forged = await signedEvent('checkout.session.completed', { id: 'cs_forged', payment_status: 'paid', mode: 'payment', amount_total: 99900, currency: 'usd' }, { secret: 'whsec_not_ours' });
    expect(forged.status).toBe(400);
    expect(forged.body.error.code).toBe('signature_invalid');
    const unsigned = await supertest(ctx.app).post('/api/support/webhook').set('content-type', 'application/json').send('{"id":"evt_x"}');
    expect(unsigned.body.error.code).toBe('signature_missing');
    expect(count('payment_events')).toBe(before);
  });

  it('a replayed event (signed ten minutes ago: past the SDK tolerance of 300 s) is refused', async () => {
    const replay = await signedEvent('checkout.session.completed', { id: 'cs_old', payment_status: 'paid', mode: 'payment', amount_total: 500, currency: 'usd' }, { timestamp: Math.floor(Date.now() / 1000) - 600 });
    expect(replay.status).toBe(400);
    expect(replay.body.error.code).toBe('signature_invalid');
  });

  it('an event that arrives before the browser returns: the thank-you page already reads paid', async () => {
    const grower = await ctx.signedIn('grower');
    const sessionId = await startMonthly(grower, 'cutting', 'usd');
    // The provider reports the payment before the browser comes back from checkout.
    const session = (await createStripeClient(FAKE_SECRET_KEY, fake.port).checkout.sessions.retrieve(sessionId)) as Stripe.Checkout.Session;
    const ok = await signedEvent('checkout.session.completed', { ...session, status: 'complete', payment_status: 'paid', subscription: 'sub_early_event', customer_details: { email: 'early@example.com' } });
    expect(ok.body).toEqual({ received: true, duplicate: false });
    expect((await grower.get(`/api/support/checkout/${sessionId}`)).body).toEqual({ kind: 'monthly', state: 'paid', amountMinor: 300, currency: 'usd' });
    expect((await membershipOf(grower)).membership.status).toBe('active');
  });

  it('a browser that returns before the event finds the membership still waiting: the redirect alone activates nothing', async () => {
    const grower = await ctx.signedIn('grower');
    const sessionId = await startMonthly(grower, 'orchard', 'gbp');
    fake.setWebhookUrl('http://127.0.0.1:9/nowhere');
    try {
      expect((await pay(sessionId, TEST_CARDS.paid)).status).toBe(303);
      expect((await grower.get(`/api/support/checkout/${sessionId}`)).body.state).toBe('waiting');
      expect((await membershipOf(grower)).membership).toBeNull();
    } finally {
      fake.setWebhookUrl(webhookUrl);
    }
    const undelivered = fake.events().filter((e) => e.type === 'checkout.session.completed' && (e.data.object as Stripe.Checkout.Session).id === sessionId);
    expect(await fake.redeliver(undelivered[0]!.id)).toBe(200);
    expect((await membershipOf(grower)).membership).toMatchObject({ status: 'active', tier: 'orchard', amountMinor: 1200, currency: 'gbp' });
  });
});

describe('the demo', () => {
  it('seeds invented members (one past due, two cancelled), gifts and shown marks, once; the demo grower is not a member', async () => {
    const { seedDatabase } = await import('../../server/seed');
    const { db } = createTestDb();
    await seedDatabase(db, { seedDemo: true, demoAtlas: true });
    await seedDatabase(db, { seedDemo: true, demoAtlas: true });
    const statuses = db.sqlite.prepare('SELECT status, count(*) AS n FROM memberships GROUP BY status ORDER BY status').all();
    expect(statuses).toEqual([
      { status: 'active', n: 11 },
      { status: 'cancelled', n: 2 },
      { status: 'past_due', n: 1 },
    ]);
    expect(db.sqlite.prepare("SELECT count(*) FROM contributions WHERE kind = 'one-off'").pluck().get()).toBe(9);
    expect(db.sqlite.prepare('SELECT count(*) FROM users WHERE supporter_mark = 1').pluck().get()).toBe(7);
    expect(db.sqlite.prepare("SELECT count(*) FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = 'grower@demo.syconium.test'").pluck().get()).toBe(0);
  }, 120_000);
});
