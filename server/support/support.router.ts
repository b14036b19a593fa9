import express, { Router } from 'express';
import type Stripe from 'stripe';
import type { Db } from '../db/client';
import type { Mailer } from '../email/mailer';
import { supportReceiptMessage } from '../email/templates';
import { HttpError, notFound } from '../lib/http-error';
import { jsonOrMultipartOnly } from '../middleware/json-only';
import { requireRole, requireSignedIn } from '../middleware/require-role';
import { TIER_DETAILS, formatMoney, MARKED_STATUSES } from '../../shared/domain/support';
import { checkoutInputSchema, supporterMarkInputSchema, type CheckoutStatus, type MyMembership, type SupportOptions } from '../../shared/schemas/support';
import type { Payments } from './payments';
import {
  checkoutAttempt,
  currentMembershipRow,
  recordCheckoutAttempt,
  setSupporterMark,
  supporterMark,
  supportSummary,
  toMembership,
  updateMembership,
} from './support.repo';
import { applyProviderEvent, type Receipt } from './webhook';

export interface SupportDeps {
  db: Db;
  payments: Payments;
  mailer: Mailer;
  appUrl: string;
}

function provider(payments: Payments): Stripe {
  // Not set up here: like a route this installation does not offer (a 4xx, not a server fault).
  if (!payments.stripe) throw new HttpError(404, 'contributions_off', 'Contributions are not set up on this installation');
  return payments.stripe;
}

async function sendReceipts(deps: SupportDeps, receipts: Receipt[]): Promise<void> {
  for (const r of receipts) {
    const message = supportReceiptMessage({
      kind: r.kind,
      amount: formatMoney(r.amountMinor, r.currency),
      paidOn: new Intl.DateTimeFormat('en', { dateStyle: 'long', timeZone: 'UTC' }).format(new Date(r.paidAt)),
      reference: r.reference,
      tierLabel: r.tier ? TIER_DETAILS[r.tier].label : null,
      membershipUrl: `${deps.appUrl}/account#membership`,
    });
    try {
      await deps.mailer.send({ to: r.to, ...message });
    } catch (err) {
      // The payment stands either way; the receipt can be sent again from the provider's dashboard.
      console.error('support receipt not sent:', (err as Error).message);
    }
  }
}

/**
 * POST /api/support/webhook: the provider's signed events. Mounted before the JSON parser (the
 * signature covers the raw bytes) and outside the CSRF guard (the provider sends no such header).
 * A missing, forged or stale signature (older than the SDK's five-minute tolerance: a replay) is
 * refused with 400; a redelivered event is acknowledged and changes nothing.
 */
export function createSupportWebhookRouter(deps: SupportDeps): Router {
  const router = Router();
  router.post('/', jsonOrMultipartOnly, express.raw({ type: 'application/json', limit: '256kb' }), async (req, res) => {
    const stripe = provider(deps.payments);
    const signature = req.get('stripe-signature');
    if (!signature) throw new HttpError(400, 'signature_missing', 'The event has no stripe-signature header');
    let event: Stripe.Event;
    try {
      event = stripe.webhooks.constructEvent(Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0), signature, deps.payments.webhookSecret);
    } catch {
      throw new HttpError(400, 'signature_invalid', 'The event signature does not match, or the event is too old to accept');
    }
    const outcome = applyProviderEvent(deps.db, event);
    res.json({ received: true, duplicate: !outcome.firstTime });
    await sendReceipts(deps, outcome.receipts);
  });
  return router;
}

/** /api/support: the Support page, a grower's membership and the admins' totals. Nothing here gates any other route. */
export function createSupportRouter(deps: SupportDeps): Router {
  const { db, payments, appUrl } = deps;
  const router = Router();

  router.get('/options', (_req, res) => {
    const options: SupportOptions = { enabled: !!payments.stripe, testMode: payments.testMode };
    res.json(options);
  });

  router.post('/checkout', async (req, res) => {
    const input = checkoutInputSchema.parse(req.body);
    if (input.kind === 'monthly' && !req.user) throw new HttpError(401, 'unauthenticated', 'Sign in (or join) to become a monthly member; a one-off contribution needs no account');
    const stripe = provider(payments);
    const monthly = input.kind === 'monthly';
    const amountMinor = monthly ? TIER_DETAILS[input.tier].monthlyMinor[input.currency] : input.amount * 100;
    const name = monthly ? `Syconium membership: ${TIER_DETAILS[input.tier].label}` : 'A contribution to the Syconium atlas';
    const metadata = { kind: input.kind, tier: monthly ? input.tier : '', userId: req.user ? String(req.user.id) : '' };
    const session = await stripe.checkout.sessions.create({
      mode: monthly ? 'subscription' : 'payment',
      line_items: [{ quantity: 1, price_data: { currency: input.currency, unit_amount: amountMinor, product_data: { name }, ...(monthly ? { recurring: { interval: 'month' as const } } : {}) } }],
      ...(req.user ? { customer_email: req.user.email, client_reference_id: String(req.user.id) } : {}),
      metadata,
      ...(monthly ? { subscription_data: { metadata } } : { submit_type: 'donate' as const }),
      success_url: `${appUrl}/support/thanks?session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${appUrl}/support?returned=1`,
    });
    if (!session.url) throw new HttpError(502, 'provider_error', 'The payment provider did not return a checkout page');
    recordCheckoutAttempt(db, { sessionId: session.id, userId: req.user?.id ?? null, kind: input.kind, tier: monthly ? input.tier : null, amountMinor, currency: input.currency });
    res.status(201).json({ url: session.url });
  });

  /** The thank-you page asks here: our records (moved only by the provider's events), plus whether the provider has the money yet. */
  router.get('/checkout/:sessionId', async (req, res) => {
    const attempt = checkoutAttempt(db, req.params.sessionId);
    if (!attempt) throw notFound('This checkout');
    let state = attempt.state;
    if (state === 'waiting' && payments.stripe) {
      const session = await payments.stripe.checkout.sessions.retrieve(attempt.sessionId);
      if (session.status === 'expired') state = 'unpaid';
    }
    const status: CheckoutStatus = { kind: attempt.kind, state, amountMinor: attempt.amountMinor, currency: attempt.currency };
    res.json(status);
  });

  router.get('/membership', requireSignedIn, (req, res) => {
    const row = currentMembershipRow(db, req.user!.id);
    const body: MyMembership = { membership: row ? toMembership(row) : null, showMark: supporterMark(db, req.user!.id) };
    res.json(body);
  });

  router.put('/membership/mark', requireSignedIn, (req, res) => {
    const { showMark } = supporterMarkInputSchema.parse(req.body);
    setSupporterMark(db, req.user!.id, showMark);
    const row = currentMembershipRow(db, req.user!.id);
    const body: MyMembership = { membership: row ? toMembership(row) : null, showMark };
    res.json(body);
  });

  router.post('/membership/cancel', requireSignedIn, async (req, res) => {
    const row = currentMembershipRow(db, req.user!.id);
    if (!row || !MARKED_STATUSES.includes(row.status)) throw new HttpError(409, 'no_membership', 'You have no running membership to cancel');
    let sub: Stripe.Subscription;
    try {
      sub = await provider(payments).subscriptions.cancel(row.providerSubscriptionId);
    } catch (err) {
      if (err instanceof HttpError) throw err;
      throw new HttpError(502, 'provider_error', `The payment provider could not cancel the membership: ${(err as Error).message}`);
    }
    // The provider's answer (not the browser) moves the state; its event will say the same and change nothing.
    if (sub.status === 'canceled') updateMembership(db, row.providerSubscriptionId, { status: 'cancelled', renewsOn: null, cancelledAt: new Date((sub.canceled_at ?? Date.now() / 1000) * 1000).toISOString() });
    const after = currentMembershipRow(db, req.user!.id)!;
    const body: MyMembership = { membership: toMembership(after), showMark: supporterMark(db, req.user!.id) };
    res.json(body);
  });

  router.get('/summary', requireRole('admin'), (_req, res) => {
    res.json(supportSummary(db));
  });

  return router;
}
