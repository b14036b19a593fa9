import type Stripe from 'stripe';
import type { Db } from '../db/client';
import { MEMBERSHIP_TIERS, SUPPORT_CURRENCIES, membershipStatusFromProvider, type MembershipTier, type SupportCurrency } from '../../shared/domain/support';
import {
  addContribution,
  checkoutAttempt,
  claimEvent,
  membershipBySubscription,
  setCheckoutState,
  startMembership,
  updateMembership,
  userExists,
} from './support.repo';

/** A receipt to send once the event's changes are committed. */
export interface Receipt {
  to: string;
  kind: 'first-monthly' | 'renewal' | 'one-off';
  amountMinor: number;
  currency: SupportCurrency;
  paidAt: string;
  reference: string;
  tier: MembershipTier | null;
}

export interface EventOutcome {
  /** False for a redelivered event: it changed nothing. */
  firstTime: boolean;
  receipts: Receipt[];
}

const iso = (unixSeconds: number) => new Date(unixSeconds * 1000).toISOString();
const day = (unixSeconds: number | null | undefined) => (unixSeconds ? iso(unixSeconds).slice(0, 10) : null);
const currencyOf = (value: string | null | undefined): SupportCurrency | null => ((SUPPORT_CURRENCIES as readonly string[]).includes(value ?? '') ? (value as SupportCurrency) : null);
const tierOf = (value: string | null | undefined): MembershipTier | null => ((MEMBERSHIP_TIERS as readonly string[]).includes(value ?? '') ? (value as MembershipTier) : null);
const idOf = (value: string | { id: string } | null | undefined) => (typeof value === 'string' ? value : (value?.id ?? null));

function periodEnd(sub: Stripe.Subscription): number | null {
  return (sub.items?.data?.[0] as { current_period_end?: number } | undefined)?.current_period_end ?? null;
}

function invoiceSubscription(invoice: Stripe.Invoice): string | null {
  return idOf(invoice.parent?.subscription_details?.subscription ?? null);
}

/**
 * Apply one verified provider event to our records, in one transaction, at most once per event id.
 * Memberships change here and only here: never on the browser's return from checkout.
 */
export function applyProviderEvent(db: Db, event: Stripe.Event): EventOutcome {
  return db.transaction(() => {
    if (!claimEvent(db, event.id, event.type)) return { firstTime: false, receipts: [] };
    const receipts: Receipt[] = [];
    const at = iso(event.created);
    switch (event.type) {
      case 'checkout.session.completed': {
        const session = event.data.object;
        if (session.payment_status !== 'paid') break;
        const attempt = checkoutAttempt(db, session.id);
        const currency = currencyOf(session.currency) ?? attempt?.currency;
        const amountMinor = session.amount_total ?? attempt?.amountMinor;
        if (!currency || amountMinor == null) break;
        const userId = attempt?.userId ?? (session.client_reference_id && userExists(db, Number(session.client_reference_id)) ? Number(session.client_reference_id) : null);
        const monthly = session.mode === 'subscription';
        const tier = attempt?.tier ?? tierOf(session.metadata?.tier);
        if (attempt) setCheckoutState(db, session.id, 'paid');
        if (!addContribution(db, { userId, kind: monthly ? 'monthly' : 'one-off', providerRef: session.id, amountMinor, currency, paidAt: at })) break;
        const subscriptionId = idOf(session.subscription);
        if (monthly && subscriptionId && userId && tier) {
          const renews = new Date(event.created * 1000);
          renews.setUTCMonth(renews.getUTCMonth() + 1);
          startMembership(db, { userId, providerSubscriptionId: subscriptionId, tier, amountMinor, currency, startedAt: at, renewsOn: renews.toISOString().slice(0, 10) });
        }
        const to = session.customer_details?.email ?? session.customer_email;
        if (to) receipts.push({ to, kind: monthly ? 'first-monthly' : 'one-off', amountMinor, currency, paidAt: at, reference: session.id, tier });
        break;
      }
      case 'checkout.session.expired':
        if (checkoutAttempt(db, event.data.object.id)) setCheckoutState(db, event.data.object.id, 'unpaid');
        break;
      case 'invoice.paid': {
        const invoice = event.data.object;
        // The first invoice is the checkout's payment, recorded from checkout.session.completed.
        if (invoice.billing_reason === 'subscription_create') break;
        const subscriptionId = invoiceSubscription(invoice);
        const membership = subscriptionId ? membershipBySubscription(db, subscriptionId) : undefined;
        const currency = currencyOf(invoice.currency);
        if (!membership || !currency || !invoice.id) break;
        addContribution(db, { userId: membership.userId, kind: 'monthly', providerRef: invoice.id, amountMinor: invoice.amount_paid, currency, paidAt: at });
        updateMembership(db, membership.providerSubscriptionId, { status: 'active', renewsOn: day(invoice.period_end) ?? membership.renewsOn });
        if (invoice.customer_email) receipts.push({ to: invoice.customer_email, kind: 'renewal', amountMinor: invoice.amount_paid, currency, paidAt: at, reference: invoice.id, tier: membership.tier });
        break;
      }
      case 'invoice.payment_failed': {
        const subscriptionId = invoiceSubscription(event.data.object);
        if (subscriptionId && membershipBySubscription(db, subscriptionId)?.status === 'active') updateMembership(db, subscriptionId, { status: 'past_due' });
        break;
      }
      case 'customer.subscription.updated':
      case 'customer.subscription.deleted': {
        const sub = event.data.object;
        const membership = membershipBySubscription(db, sub.id);
        if (!membership || membership.status === 'cancelled') break;
        const status = event.type === 'customer.subscription.deleted' ? 'cancelled' : membershipStatusFromProvider(sub.status);
        updateMembership(db, sub.id, { status, renewsOn: status === 'cancelled' ? null : (day(periodEnd(sub)) ?? membership.renewsOn), cancelledAt: status === 'cancelled' ? iso(sub.canceled_at ?? event.created) : null });
        break;
      }
      default:
        // Other events are acknowledged and kept out of the way.
        break;
    }
    return { firstTime: true, receipts };
  });
}
