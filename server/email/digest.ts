import { setImmediate as nextTurn } from 'node:timers/promises';
import { LABELS } from '../../shared/domain/codes';
import { formatDate, formatDistance, type UnitPrefs } from '../../shared/domain/units';
import { findUnitPrefs } from '../account/units.repo';
import { followedNews, hasNews } from '../follows/follows-digest';
import { DIGEST_RADIUS_KM } from '../../shared/schemas/email';
import type { MailDeps } from './mailer';
import { dueSubscriptions, findHomePlace, markDigestSent, nearbyRipenedReports, type NearbyRipening } from './digest.repo';
import { describePlace } from './digest-wording';
import { digestMessage, type DigestItem } from './templates';

export const DIGEST_PERIOD_MS = 7 * 86_400_000;

/** Units of a grower who never chose any: km and a day-month-year date, as the digest always wrote. */
export const EMAIL_DEFAULT_UNITS: UnitPrefs = { temperature: 'F', distance: 'km', locale: 'en-GB' };

function toItem(report: NearbyRipening, home: { name: string; lat: number; lon: number }, units: UnitPrefs): DigestItem {
  const longDate = (iso: string) => formatDate(iso, units.locale);
  return {
    variety: report.varietyName ?? `“${report.proposedVarietyName ?? 'unnamed'}” (name awaiting review)`,
    crop: report.crop === 'breba' ? 'breba' : 'main crop',
    form: LABELS.growingForm[report.form].toLowerCase(),
    season: report.season,
    firstRipe: report.firstRipeDate ? longDate(report.firstRipeDate) : 'date not given',
    where: describePlace(home, { lat: report.gridLat, lon: report.gridLon }, units),
    grid: `${report.gridLat.toFixed(3)}, ${report.gridLon.toFixed(3)}`,
  };
}

/**
 * The weekly nearby digest. Each active subscription whose last digest is a week old (or that
 * never had one) gets the 'ripened' reports published within its radius of the home place since
 * then (a first digest looks back one week), and the news of the varieties and places the grower
 * follows (server/follows/follows-digest.ts), by when they became public, not when they were written. A week with nothing new sends nothing but
 * still moves the window on. Growers without a home place are skipped until they save one.
 * The job runs in the server's own thread: it lets waiting requests go between subscriptions, so
 * a large atlas's hundreds of radius queries never hold the server for more than one of them.
 */
export async function runNearbyDigest(deps: MailDeps, now = new Date()): Promise<{ sent: number; checked: number }> {
  const nowIso = now.toISOString();
  const weekAgo = new Date(now.getTime() - DIGEST_PERIOD_MS).toISOString();
  let sent = 0;
  const due = dueSubscriptions(deps.db, weekAgo);
  for (const { sub, email, displayName } of due) {
    await nextTurn();
    const home = findHomePlace(deps.db, sub.userId);
    if (!home) continue;
    const since = sub.lastSentAt ?? weekAgo;
    // A radius saved before the public-grid minimum existed is read as that minimum.
    const radiusKm = Math.max(sub.radiusKm, DIGEST_RADIUS_KM.min);
    const reports = nearbyRipenedReports(deps.db, home, radiusKm, since, nowIso, sub.userId);
    const units = findUnitPrefs(deps.db, sub.userId) ?? EMAIL_DEFAULT_UNITS;
    const followed = followedNews(deps.db, sub.userId, since, nowIso, radiusKm);
    if (reports.length || hasNews(followed)) {
      const message = digestMessage({
        displayName,
        homeName: home.name,
        radius: formatDistance(radiusKm, units),
        since: formatDate(since, units.locale),
        items: reports.map((r) => toItem(r, home, units)),
        followed,
        varietyUrl: (id) => `${deps.appUrl}/varieties/${id}`,
        atlasUrl: `${deps.appUrl}/?lat=${home.lat.toFixed(3)}&lon=${home.lon.toFixed(3)}&zoom=9`,
        settingsUrl: `${deps.appUrl}/account`,
        unsubscribeUrl: `${deps.appUrl}/unsubscribe?token=${sub.unsubscribeToken}`,
      });
      await deps.mailer.send({ to: email, ...message, headers: { 'List-Unsubscribe': `<${deps.appUrl}/unsubscribe?token=${sub.unsubscribeToken}>` } });
      sent++;
    }
    markDigestSent(deps.db, sub.userId, nowIso);
  }
  return { sent, checked: due.length };
}
