import type { Db } from '../db/client';
import { MEMBERSHIP_TIERS, SUPPORT_CURRENCIES, TIER_DETAILS, type MembershipStatus } from '../../shared/domain/support';
import { pick, seededRandom } from '../seed/random';

/** How many of the demo atlas's invented growers are members, and how their memberships stand. */
const DEMO_MEMBERS = 14;
const DEMO_GIFTS = 9;

/**
 * The demo's supporters (invented, like every demo account): a dozen memberships started over the
 * last months, one past due and two cancelled, some one-off gifts, and the supporter mark shown by
 * half the members, so the admins' Supporters tab and the mark on reports show working at once.
 * The demo grower is not a member: joining is theirs to try. The local test provider learns the
 * members' subscriptions too, so a demo member can cancel. Idempotent.
 */
export function seedDemoSupporters(db: Db, now = new Date()): void {
  if ((db.sqlite.prepare('SELECT count(*) FROM memberships').pluck().get() as number) > 0) return;
  const members = db.sqlite
    .prepare("SELECT id FROM users WHERE is_demo = 1 AND role = 'grower' AND email NOT LIKE 'grower@%' ORDER BY id LIMIT ?")
    .pluck()
    .all(DEMO_MEMBERS + DEMO_GIFTS) as number[];
  if (members.length === 0) return;
  const random = seededRandom(2020);
  const insertMembership = db.sqlite.prepare(
    'INSERT INTO memberships (user_id, provider_subscription_id, tier, amount_minor, currency, status, started_at, renews_on, cancelled_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
  );
  const insertContribution = db.sqlite.prepare('INSERT INTO contributions (user_id, kind, provider_ref, amount_minor, currency, paid_at) VALUES (?, ?, ?, ?, ?, ?)');
  const insertProviderObject = db.sqlite.prepare("INSERT OR IGNORE INTO dev_payment_objects (id, kind, data) VALUES (?, 'subscription', ?)");
  const markShown = db.sqlite.prepare('UPDATE users SET supporter_mark = 1 WHERE id = ?');
  const monthsAgo = (n: number, day: number) => new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - n, day, 10)).toISOString();

  db.transaction(() => {
    members.slice(0, DEMO_MEMBERS).forEach((userId, i) => {
      const tier = pick(random, MEMBERSHIP_TIERS);
      const currency = pick(random, SUPPORT_CURRENCIES);
      const amount = TIER_DETAILS[tier].monthlyMinor[currency];
      const started = 1 + Math.floor(random() * 6);
      const day = 1 + Math.floor(random() * 27);
      const status: MembershipStatus = i === 3 ? 'past_due' : i === 7 || i === 11 ? 'cancelled' : 'active';
      const paidMonths = status === 'cancelled' ? Math.max(1, started - 2) : status === 'past_due' ? started : started + 1;
      const subscriptionId = `sub_demo_${userId}`;
      insertMembership.run(userId, subscriptionId, tier, amount, currency, status, monthsAgo(started, day), status === 'cancelled' ? null : monthsAgo(-1, day).slice(0, 10), status === 'cancelled' ? monthsAgo(started - paidMonths, day) : null);
      for (let m = 0; m < paidMonths; m++) insertContribution.run(userId, 'monthly', `in_demo_${userId}_${m}`, amount, currency, monthsAgo(started - m, day));
      insertProviderObject.run(
        subscriptionId,
        JSON.stringify({ id: subscriptionId, object: 'subscription', status: status === 'cancelled' ? 'canceled' : status, customer: `cus_demo_${userId}`, metadata: { tier }, items: { object: 'list', data: [{ current_period_end: Math.floor(Date.parse(monthsAgo(-1, day)) / 1000), price: { unit_amount: amount, currency } }] } }),
      );
      if (i % 2 === 0) markShown.run(userId);
    });
    members.slice(DEMO_MEMBERS).forEach((userId, i) => {
      const currency = pick(random, SUPPORT_CURRENCIES);
      insertContribution.run(userId, 'one-off', `cs_demo_gift_${userId}`, pick(random, [500, 1000, 1000, 2500, 5000]), currency, monthsAgo(i % 6, 3 + i));
    });
  });
}
