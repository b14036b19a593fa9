import { createHmac, randomBytes } from 'node:crypto';
import Stripe from 'stripe';
import type { Db } from '../db/client';
import type { Config } from '../lib/config';
import { FAKE_SECRET_KEY, startFakeProvider } from './fake-provider';

/** What the support routes need from the payment provider. */
export interface Payments {
  /** The provider's official SDK client; null when contributions are not set up here. */
  stripe: Stripe | null;
  /** The secret the provider signs its webhook events with. */
  webhookSecret: string;
  /** True when the local test provider answers (no real money moves). */
  testMode: boolean;
}

export const PAYMENTS_OFF: Payments = { stripe: null, webhookSecret: '', testMode: false };

/** The SDK client: the real provider, or the local test provider on 127.0.0.1 when a port is given. */
export function createStripeClient(secretKey: string, localPort?: number): Stripe {
  return localPort
    ? new Stripe(secretKey, { host: '127.0.0.1', port: localPort, protocol: 'http', maxNetworkRetries: 0, telemetry: false })
    : new Stripe(secretKey, { maxNetworkRetries: 2, telemetry: false });
}

/**
 * The local provider's signing secret, derived from the session secret so that every server
 * instance verifies the events any instance's test provider sends.
 */
export function localWebhookSecret(sessionSecret: string): string {
  return `whsec_local_${createHmac('sha256', sessionSecret).update('syconium local payments').digest('hex').slice(0, 32)}`;
}

/**
 * Payments for the running server: the real provider when STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET
 * are set; otherwise, outside production, the local test provider (as the development mailbox does
 * for e-mail); otherwise none, and the Support page says contributions are not set up.
 */
export async function startPayments(config: Config, db: Db): Promise<{ payments: Payments; close: () => Promise<void> }> {
  const { secretKey, webhookSecret } = config.payments;
  if (secretKey && webhookSecret) {
    return { payments: { stripe: createStripeClient(secretKey), webhookSecret, testMode: secretKey.startsWith('sk_test_') }, close: async () => {} };
  }
  if (secretKey || webhookSecret) console.warn('Contributions are off: set both STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET.');
  if (!config.devPayments) return { payments: PAYMENTS_OFF, close: async () => {} };
  const secret = localWebhookSecret(config.sessionSecret ?? randomBytes(32).toString('hex'));
  const fake = await startFakeProvider(db, { port: config.devPaymentsPort, webhookSecret: secret, webhookUrl: `http://127.0.0.1:${config.port}/api/support/webhook` });
  console.log(`Local test payment provider on 127.0.0.1:${fake.port} (no real money moves; pay with the card 4242 4242 4242 4242)`);
  return { payments: { stripe: createStripeClient(FAKE_SECRET_KEY, fake.port), webhookSecret: secret, testMode: true }, close: fake.close };
}
