/**
 * Supporting the atlas: the membership levels, the currencies and the states a membership can be in.
 * Amounts are in minor units (cents, pence), as the payment provider counts them. Nothing here ever
 * decides what a person may see: every page, number and export stays open to all.
 */

export const SUPPORT_CURRENCIES = ['usd', 'eur', 'gbp'] as const;
export type SupportCurrency = (typeof SUPPORT_CURRENCIES)[number];

export const SUPPORT_KINDS = ['monthly', 'one-off'] as const;
export type SupportKind = (typeof SUPPORT_KINDS)[number];

/** Our own level names, after the stages of raising a fig from a cutting. */
export const MEMBERSHIP_TIERS = ['cutting', 'sapling', 'orchard'] as const;
export type MembershipTier = (typeof MEMBERSHIP_TIERS)[number];

export const TIER_DETAILS: Record<MembershipTier, { label: string; monthlyMinor: Record<SupportCurrency, number>; pitch: string }> = {
  cutting: { label: 'Cutting', monthlyMinor: { usd: 300, eur: 300, gbp: 300 }, pitch: 'Keeps the map tiles and climate data served for a few hundred growers.' },
  sapling: { label: 'Sapling', monthlyMinor: { usd: 700, eur: 600, gbp: 500 }, pitch: 'Pays for an hour of moderation and variety checking each season.' },
  orchard: { label: 'Orchard', monthlyMinor: { usd: 1500, eur: 1400, gbp: 1200 }, pitch: 'Funds new climate station work in regions the atlas barely knows.' },
};

/** Suggested one-off amounts; any whole amount between the bounds is accepted. */
export const ONE_OFF_SUGGESTIONS_MAJOR = [5, 10, 25, 50] as const;
export const ONE_OFF_MIN_MAJOR = 2;
export const ONE_OFF_MAX_MAJOR = 500;

/** Our states: `pending` until the provider confirms the first payment, `past_due` while a renewal is unpaid. */
export const MEMBERSHIP_STATUSES = ['pending', 'active', 'past_due', 'cancelled'] as const;
export type MembershipStatus = (typeof MEMBERSHIP_STATUSES)[number];

/**
 * The provider's subscription status in our words. Stripe's statuses (docs.stripe.com, "Subscription
 * statuses"): incomplete, incomplete_expired, trialing, active, past_due, canceled, unpaid, paused.
 */
export function membershipStatusFromProvider(status: string): MembershipStatus {
  switch (status) {
    case 'active':
    case 'trialing':
      return 'active';
    case 'past_due':
      return 'past_due';
    case 'incomplete':
      return 'pending';
    default:
      return 'cancelled';
  }
}

/** A supporter mark may show only while the membership is paid up or being retried. */
export const MARKED_STATUSES: readonly MembershipStatus[] = ['active', 'past_due'];

/** The currency a visitor most likely pays in, from the browser's locale (e.g. "en-GB" -> gbp, "fr-FR" -> eur). */
export function currencyForLocale(locale: string | undefined): SupportCurrency {
  const region = (locale ?? '').split(/[-_]/)[1]?.toUpperCase() ?? '';
  if (region === 'GB' || region === 'UK') return 'gbp';
  if (EURO_REGIONS.has(region)) return 'eur';
  return 'usd';
}

/** Countries using the euro (European Central Bank, "Euro area", 20 members plus those using it by agreement). */
const EURO_REGIONS = new Set(['AT', 'BE', 'HR', 'CY', 'EE', 'FI', 'FR', 'DE', 'GR', 'IE', 'IT', 'LV', 'LT', 'LU', 'MT', 'NL', 'PT', 'SK', 'SI', 'ES', 'AD', 'MC', 'SM', 'VA', 'ME', 'XK']);

/** An amount in minor units, written as people read money in that currency (two decimals, ISO 4217). */
export function formatMoney(minor: number, currency: string, locale = 'en'): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase(), minimumFractionDigits: minor % 100 === 0 ? 0 : 2 }).format(minor / 100);
}
