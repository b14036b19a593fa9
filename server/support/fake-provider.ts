import express from 'express';
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import Stripe from 'stripe';
import type { Db } from '../db/client';
import { escapeHtml } from '../email/layout';
import { formatMoney } from '../../shared/domain/support';

/**
 * The local test payment provider for development and tests: it answers the few calls of the
 * provider's API that Syconium makes through the official SDK (create and retrieve a checkout
 * session, retrieve and cancel a subscription), serves a hosted checkout page where a tester pays
 * with a test card, and sends events back to the app signed as the provider signs them. Its objects
 * live in dev_payment_objects, so every server instance's provider knows them. It takes no card
 * data beyond checking the test card's number, and keeps none.
 */

export const FAKE_SECRET_KEY = 'sk_test_syconium_local_provider';

/** Test cards, as the provider's test mode documents them (docs.stripe.com/testing). */
export const TEST_CARDS = { paid: '4242424242424242', declined: '4000000000000002' } as const;

export interface FakeProvider {
  port: number;
  url: string;
  /** Where events go (the app's webhook route); tests point it at their own server. */
  setWebhookUrl: (url: string) => void;
  /** Send an event again, exactly as first sent (a provider's redelivery). */
  redeliver: (eventId: string) => Promise<number>;
  /** Every event sent so far, oldest first. */
  events: () => Stripe.Event[];
  close: () => Promise<void>;
}

type SessionObject = Stripe.Checkout.Session & { metadata: Record<string, string> };
type Kind = 'checkout.session' | 'subscription' | 'customer' | 'invoice' | 'event';

const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);
const MONTH_S = 30 * 86_400;

function stripeError(res: express.Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } });
}

export async function startFakeProvider(db: Db, options: { port?: number; webhookSecret: string; webhookUrl: string }): Promise<FakeProvider> {
  let webhookUrl = options.webhookUrl;
  const signer = new Stripe(FAKE_SECRET_KEY);
  const put = db.sqlite.prepare('INSERT INTO dev_payment_objects (id, kind, data) VALUES (?, ?, ?) ON CONFLICT(id) DO UPDATE SET data = excluded.data');
  const read = db.sqlite.prepare('SELECT data FROM dev_payment_objects WHERE id = ? AND kind = ?').pluck();
  const save = <T extends { id: string }>(kind: Kind, object: T): T => (put.run(object.id, kind, JSON.stringify(object)), object);
  const load = <T>(kind: Kind, key: string): T | undefined => {
    const data = read.get(key, kind) as string | undefined;
    return data ? (JSON.parse(data) as T) : undefined;
  };

  async function post(event: Stripe.Event): Promise<number> {
    const payload = JSON.stringify(event);
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret });
    // Like the provider, try a few times when the app does not answer 2xx.
    let status = 0;
    for (let attempt = 0; attempt < 3; attempt++) {
      try {
        const res = await fetch(webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload });
        status = res.status;
        if (res.ok) break;
      } catch {
        status = 0;
      }
      await new Promise((r) => setTimeout(r, 200 * (attempt + 1)));
    }
    return status;
  }

  function emit(type: string, object: unknown): Promise<number> {
    const event = save('event', { id: id('evt'), object: 'event', api_version: Stripe.API_VERSION, created: now(), livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, type, data: { object } } as unknown as Stripe.Event);
    return post(event);
  }

  function subscriptionFor(session: SessionObject): Stripe.Subscription {
    const start = now();
    return save('subscription', {
      id: id('sub'),
      object: 'subscription',
      status: 'active',
      customer: session.customer as string,
      metadata: session.metadata,
      start_date: start,
      cancel_at_period_end: false,
      canceled_at: null,
      currency: session.currency,
      items: { object: 'list', data: [{ id: id('si'), current_period_start: start, current_period_end: start + MONTH_S, price: { unit_amount: session.amount_total, currency: session.currency, recurring: { interval: 'month' } } }] },
    } as unknown as Stripe.Subscription);
  }

  function invoiceFor(sub: Stripe.Subscription, billingReason: string, paid: boolean): Stripe.Invoice {
    const item = sub.items.data[0] as unknown as { current_period_start: number; current_period_end: number; price: { unit_amount: number; currency: string } };
    return save('invoice', {
      id: id('in'),
      object: 'invoice',
      billing_reason: billingReason,
      status: paid ? 'paid' : 'open',
      amount_due: item.price.unit_amount,
      amount_paid: paid ? item.price.unit_amount : 0,
      currency: item.price.currency,
      customer: sub.customer,
      customer_email: load<{ email: string }>('customer', sub.customer as string)?.email ?? null,
      period_start: item.current_period_start,
      period_end: item.current_period_end,
      parent: { type: 'subscription_details', subscription_details: { subscription: sub.id, metadata: sub.metadata } },
    } as unknown as Stripe.Invoice);
  }

  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: true, limit: '100kb' }));

  // ---------------------------------------------------------------- the API the SDK calls
  const api = express.Router();
  api.use((req, res, next) => {
    if (req.get('authorization') !== `Bearer ${FAKE_SECRET_KEY}`) return stripeError(res, 401, 'Invalid API key provided');
    next();
  });
  api.post('/checkout/sessions', (req, res) => {
    const body = req.body as Record<string, any>;
    const item = body.line_items?.[0];
    const price = item?.price_data;
    if (!price?.currency || !price?.unit_amount) return stripeError(res, 400, 'line_items[0][price_data] is required', 'line_items');
    if (!body.success_url || !body.cancel_url) return stripeError(res, 400, 'success_url and cancel_url are required', 'success_url');
    const mode = body.mode === 'subscription' ? 'subscription' : 'payment';
    if (mode === 'subscription' && price.recurring?.interval !== 'month') return stripeError(res, 400, 'A subscription needs price_data[recurring][interval]', 'line_items');
    const sessionId = id('cs');
    const session = save('checkout.session', {
      id: sessionId,
      object: 'checkout.session',
      mode,
      status: 'open',
      payment_status: 'unpaid',
      amount_total: Number(price.unit_amount) * Number(item.quantity ?? 1),
      currency: String(price.currency),
      client_reference_id: body.client_reference_id ?? null,
      customer: id('cus'),
      customer_email: body.customer_email ?? null,
      customer_details: null,
      metadata: body.metadata ?? {},
      subscription: null,
      success_url: String(body.success_url),
      cancel_url: String(body.cancel_url),
      url: `${provider.url}/pay/${sessionId}`,
      created: now(),
      livemode: false,
      line_items_description: String(price.product_data?.name ?? 'Contribution'),
    } as unknown as SessionObject);
    res.json(session);
  });
  api.get('/checkout/sessions/:id', (req, res) => {
    const session = load<SessionObject>('checkout.session', req.params.id);
    if (!session) return stripeError(res, 404, `No such checkout.session: '${req.params.id}'`, 'id');
    res.json(session);
  });
  api.get('/subscriptions/:id', (req, res) => {
    const sub = load<Stripe.Subscription>('subscription', req.params.id);
    if (!sub) return stripeError(res, 404, `No such subscription: '${req.params.id}'`, 'id');
    res.json(sub);
  });
  api.delete('/subscriptions/:id', (req, res) => {
    const sub = load<Stripe.Subscription>('subscription', req.params.id);
    if (!sub) return stripeError(res, 404, `No such subscription: '${req.params.id}'`, 'id');
    if (sub.status === 'canceled') return stripeError(res, 400, 'This subscription is already cancelled');
    const cancelled = save('subscription', { ...sub, status: 'canceled', canceled_at: now(), ended_at: now() } as Stripe.Subscription);
    res.json(cancelled);
    void emit('customer.subscription.deleted', cancelled);
  });
  app.use('/v1', api);

  // ---------------------------------------------------------------- the hosted checkout page
  app.get('/pay/:id', (req, res) => {
    const session = load<SessionObject>('checkout.session', req.params.id);
    if (!session) return void res.status(404).type('html').send(page('Checkout not found', '<p>This checkout does not exist.</p>'));
    res.type('html').send(checkoutPage(session));
  });
  app.post('/pay/:id', async (req, res) => {
    const session = load<SessionObject>('checkout.session', req.params.id);
    if (!session) return void res.status(404).type('html').send(page('Checkout not found', '<p>This checkout does not exist.</p>'));
    if (session.status !== 'open') return void res.status(409).type('html').send(page('Already finished', '<p>This checkout is finished already.</p>'));
    if (req.body.action === 'cancel') return void res.redirect(303, session.cancel_url!);
    const card = String(req.body.card ?? '').replace(/\D/g, '');
    if (card === TEST_CARDS.declined) return void res.status(402).type('html').send(checkoutPage(session, 'The test bank declined this card. Try the card that always pays, or go back.'));
    if (card !== TEST_CARDS.paid) return void res.status(400).type('html').send(checkoutPage(session, 'That is not one of the test cards: use 4242 4242 4242 4242 (pays) or 4000 0000 0000 0002 (declined).'));
    const email = session.customer_email ?? String(req.body.email ?? '').trim();
    save('customer', { id: session.customer as string, object: 'customer', email });
    let paid: SessionObject = { ...session, status: 'complete', payment_status: 'paid', customer_details: { email } as Stripe.Checkout.Session.CustomerDetails };
    const sub = paid.mode === 'subscription' ? subscriptionFor(paid) : undefined;
    if (sub) paid = { ...paid, subscription: sub.id };
    save('checkout.session', paid);
    // The provider sends its events on its own schedule: the browser's redirect may come first or last.
    void (async () => {
      await emit('checkout.session.completed', paid);
      if (sub) await emit('invoice.paid', invoiceFor(sub, 'subscription_create', true));
    })();
    res.redirect(303, paid.success_url!.replace('{CHECKOUT_SESSION_ID}', paid.id));
  });

  // ---------------------------------------------------------------- test controls (not part of the provider's API)
  app.post('/__test/subscriptions/:id/renewal', async (req, res) => {
    const sub = load<Stripe.Subscription>('subscription', req.params.id);
    if (!sub) return void res.status(404).json({ error: 'no such subscription' });
    const paid = req.body.outcome !== 'failed';
    const item = sub.items.data[0] as unknown as { current_period_end: number };
    const next = save('subscription', {
      ...sub,
      status: paid ? 'active' : 'past_due',
      items: { ...sub.items, data: [{ ...sub.items.data[0], current_period_start: item.current_period_end, current_period_end: item.current_period_end + (paid ? MONTH_S : 0) }] },
    } as unknown as Stripe.Subscription);
    await emit(paid ? 'invoice.paid' : 'invoice.payment_failed', invoiceFor(next, 'subscription_cycle', paid));
    await emit('customer.subscription.updated', next);
    res.json({ status: next.status });
  });

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port ?? 0, '127.0.0.1', () => resolve(s));
    s.once('error', reject);
  });
  const port = (server.address() as AddressInfo).port;
  const provider: FakeProvider = {
    port,
    url: `http://127.0.0.1:${port}`,
    setWebhookUrl: (url) => void (webhookUrl = url),
    redeliver: (eventId) => {
      const event = load<Stripe.Event>('event', eventId);
      if (!event) throw new Error(`no such event ${eventId}`);
      return post(event);
    },
    events: () => (db.sqlite.prepare("SELECT data FROM dev_payment_objects WHERE kind = 'event' AND id LIKE 'evt_%' ORDER BY rowid").pluck().all() as string[]).map((d) => JSON.parse(d) as Stripe.Event),
    close: () => new Promise((done) => server.close(() => done())),
  };
  return provider;
}

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(title)}</title>
<style>
body{margin:0;background:#faf6ef;color:#2b2230;font:16px/1.5 'Fira Sans','Segoe UI',Helvetica,Arial,sans-serif}
main{max-width:26rem;margin:2rem auto;padding:1.5rem;background:#fff;border:1px solid #efdfe8;border-radius:12px}
h1{margin:0 0 .25rem;font-size:1.25rem;color:#552c48}.badge{display:inline-block;margin-bottom:1rem;padding:.1rem .5rem;border-radius:999px;background:#e4eedf;color:#35522f;font-size:.8rem;font-weight:600}
label{display:block;margin:1rem 0 .25rem;font-weight:600}input{box-sizing:border-box;width:100%;padding:.6rem;border:1px solid #cdb8c6;border-radius:8px;font:inherit}
.amount{font-size:1.6rem;font-weight:700;margin:.5rem 0}.error{padding:.6rem .8rem;border-left:4px solid #b4452f;background:#fbeae6}
.row{display:flex;gap:.75rem;margin-top:1.25rem}button{flex:1;padding:.7rem;border-radius:8px;border:0;font:inherit;font-weight:600;cursor:pointer}
.pay{background:#6b3a5b;color:#fff}.back{background:#f3ecef;color:#552c48}small{color:#6f6474}
</style></head><body><main>${body}</main></body></html>`;
}

function checkoutPage(session: SessionObject, error?: string): string {
  const monthly = session.mode === 'subscription';
  const amount = formatMoney(session.amount_total ?? 0, session.currency ?? 'usd');
  const description = (session as unknown as { line_items_description: string }).line_items_description;
  return page(
    'Test checkout',
    `<span class="badge">Local test provider: no real money moves</span>
<h1>${escapeHtml(description)}</h1>
<p class="amount">${escapeHtml(amount)}${monthly ? ' <small>each month</small>' : ''}</p>
${error ? `<p class="error" role="alert">${escapeHtml(error)}</p>` : ''}
<form method="post">
${session.customer_email ? `<p><small>Receipt to ${escapeHtml(session.customer_email)}</small></p>` : '<label for="email">E-mail for the receipt</label><input id="email" name="email" type="email" autocomplete="email">'}
<label for="card">Test card number</label>
<input id="card" name="card" inputmode="numeric" autocomplete="off" placeholder="4242 4242 4242 4242">
<p><small>4242 4242 4242 4242 pays; 4000 0000 0000 0002 is declined. Any future expiry date and any CVC would do on a real test form; this one asks only for the number.</small></p>
<div class="row"><button class="back" name="action" value="cancel" type="submit" formnovalidate>Go back</button><button class="pay" name="action" value="pay" type="submit">Pay ${escapeHtml(amount)}</button></div>
</form>`,
  );
}
