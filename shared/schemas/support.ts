import { z } from 'zod';
import { MEMBERSHIP_STATUSES, MEMBERSHIP_TIERS, ONE_OFF_MAX_MAJOR, ONE_OFF_MIN_MAJOR, SUPPORT_CURRENCIES, SUPPORT_KINDS } from '../domain/support';

/** GET /api/support/options: what the Support page offers, or that contributions are not set up here. */
export const supportOptionsSchema = z.object({
  enabled: z.boolean(),
  /** True when payments go to the local test provider (development and tests): no real money moves. */
  testMode: z.boolean(),
});
export type SupportOptions = z.infer<typeof supportOptionsSchema>;

/** POST /api/support/checkout */
export const checkoutInputSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('monthly'), tier: z.enum(MEMBERSHIP_TIERS, { message: 'tier must be one of the membership levels' }), currency: z.enum(SUPPORT_CURRENCIES, { message: 'currency must be usd, eur or gbp' }) }),
  z.object({
    kind: z.literal('one-off'),
    amount: z
      .number({ message: 'amount must be a whole number' })
      .int({ message: 'amount must be a whole number' })
      .min(ONE_OFF_MIN_MAJOR, { message: `amount must be at least ${ONE_OFF_MIN_MAJOR}` })
      .max(ONE_OFF_MAX_MAJOR, { message: `amount must be at most ${ONE_OFF_MAX_MAJOR}` }),
    currency: z.enum(SUPPORT_CURRENCIES, { message: 'currency must be usd, eur or gbp' }),
  }),
]);
export type CheckoutInput = z.infer<typeof checkoutInputSchema>;

export const checkoutStartedSchema = z.object({ url: z.string() });

/** GET /api/support/checkout/:sessionId: what our records say (they follow the provider's events). */
export const checkoutStatusSchema = z.object({
  kind: z.enum(SUPPORT_KINDS),
  /** `paid` once the provider's signed event has arrived; `waiting` until then. */
  state: z.enum(['waiting', 'paid', 'unpaid']),
  amountMinor: z.number().int(),
  currency: z.enum(SUPPORT_CURRENCIES),
});
export type CheckoutStatus = z.infer<typeof checkoutStatusSchema>;

export const membershipSchema = z.object({
  tier: z.enum(MEMBERSHIP_TIERS),
  amountMinor: z.number().int(),
  currency: z.enum(SUPPORT_CURRENCIES),
  status: z.enum(MEMBERSHIP_STATUSES),
  startedAt: z.string(),
  renewsOn: z.string().nullable(),
  cancelledAt: z.string().nullable(),
});
export type Membership = z.infer<typeof membershipSchema>;

/** GET /api/support/membership: the signed-in grower's own membership, and their opt-in mark. */
export const myMembershipSchema = z.object({ membership: membershipSchema.nullable(), showMark: z.boolean() });
export type MyMembership = z.infer<typeof myMembershipSchema>;

export const supporterMarkInputSchema = z.object({ showMark: z.boolean({ message: 'showMark must be true or false' }) });

/** GET /api/support/summary (admins): money in per month and currency, and who supports now. No card data exists to show. */
export const supportSummarySchema = z.object({
  months: z.array(z.object({ month: z.string(), currency: z.enum(SUPPORT_CURRENCIES), totalMinor: z.number().int(), contributions: z.number().int() })),
  activeSupporters: z.array(
    z.object({ displayName: z.string(), tier: z.enum(MEMBERSHIP_TIERS), amountMinor: z.number().int(), currency: z.enum(SUPPORT_CURRENCIES), status: z.enum(MEMBERSHIP_STATUSES), since: z.string() }),
  ),
});
export type SupportSummary = z.infer<typeof supportSummarySchema>;
