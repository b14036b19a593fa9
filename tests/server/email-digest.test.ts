import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { digestSubscriptions, reports, savedPlaces, trees, users, varieties } from '../../server/db/schema';
import { DIGEST_PERIOD_MS, runNearbyDigest } from '../../server/email/digest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import type { Outcome, ReportStatus } from '../../shared/domain/codes';
import { createMailTestContext, linkToken } from './email-helpers';

// One degree of latitude is 111.195 km on the IUGG mean sphere (shared CHECKS.md, "Distance on the sphere").
const KM_PER_DEG_LAT = 111.195;
const HOME = { lat: 45, lon: 3 };
const DAY = 86_400_000;

describe('nearby digest and unsubscribe, through the local SMTP server', async () => {
  const ctx = await createMailTestContext();
  const grower = await ctx.signedIn('grower', 'hanna@example.com');
  const neighbour = await ctx.signedIn('grower', 'neighbour@example.com');
  const other = await ctx.signedIn('grower', 'other.grower@example.com');
  const treeId = ctx.db.insert(trees).values({ userId: other.userId, label: 'tree' }).returning().get().id;
  const ownTreeId = ctx.db.insert(trees).values({ userId: grower.userId, label: 'mine' }).returning().get().id;

  function report(variety: string, at: { lat: number; lon: number }, createdAt: Date, extra: { outcome?: Outcome; status?: ReportStatus; own?: boolean } = {}) {
    const varietyId = ctx.db.insert(varieties).values({ name: variety, isFictional: true }).returning().get().id;
    const grid = toPublicPoint(at.lat, at.lon);
    ctx.db
      .insert(reports)
      .values({
        userId: extra.own ? grower.userId : other.userId,
        treeId: extra.own ? ownTreeId : treeId,
        varietyId,
        lat: at.lat,
        lon: at.lon,
        gridLat: grid.lat,
        gridLon: grid.lon,
        form: 'ground',
        season: 2026,
        crop: 'main',
        outcome: extra.outcome ?? 'ripened',
        firstRipeDate: '2026-08-20',
        status: extra.status ?? 'published',
        createdAt: createdAt.toISOString(),
      })
      .run();
  }

  const start = new Date();
  const north = (km: number) => ({ lat: HOME.lat + km / KM_PER_DEG_LAT, lon: HOME.lon });

  it('needs a home place before subscribing', async () => {
    const refused = await grower.put('/api/email/digest').send({ active: true, radiusKm: 50 });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.active).toBeDefined();
    const badRadius = await grower.put('/api/email/digest').send({ active: true, radiusKm: 5000 });
    expect(badRadius.status).toBe(400);
    expect(badRadius.body.error.fields.radiusKm).toBeDefined();

    ctx.db.insert(savedPlaces).values({ userId: grower.userId, name: 'Orchard', ...HOME, isHome: true }).run();
    ctx.db.insert(savedPlaces).values({ userId: neighbour.userId, name: 'Yard', ...HOME, isHome: true }).run();
    const ok = await grower.put('/api/email/digest').send({ active: true, radiusKm: 50 });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ active: true, radiusKm: 50, home: { name: 'Orchard' } });
    expect((await neighbour.put('/api/email/digest').send({ active: true, radiusKm: 50 })).status).toBe(200);
    expect((await ctx.agent().get('/api/email/digest')).status).toBe(401);
  });

  it('lists only ripened, published reports of others within the radius since the last digest', async () => {
    const twoDaysAgo = new Date(start.getTime() - 2 * DAY);
    report('Inside Thirty', north(30), twoDaysAgo);
    report('Inside Fortynine', north(49), twoDaysAgo);
    report('Outside Fiftyone', north(51), twoDaysAgo);
    // In the R*Tree's bounding box but outside the circle: 38.9 km north and 35.4 km east is 52.6 km away.
    report('Box Corner', { lat: HOME.lat + 0.35, lon: HOME.lon + 0.45 }, twoDaysAgo);
    report('Still Green', north(10), twoDaysAgo, { outcome: 'unripe' });
    report('Only Drafted', north(10), twoDaysAgo, { status: 'draft' });
    report('My Own Tree', north(10), twoDaysAgo, { own: true });
    report('Last Month', north(10), new Date(start.getTime() - 30 * DAY));

    // A subscriber whose address is not confirmed gets nothing.
    const unconfirmed = await ctx.signedIn('grower', 'unconfirmed@example.com');
    ctx.db.insert(savedPlaces).values({ userId: unconfirmed.userId, name: 'Plot', ...HOME, isHome: true }).run();
    expect((await unconfirmed.put('/api/email/digest').send({ active: true, radiusKm: 50 })).status).toBe(200);
    ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, unconfirmed.userId)).run();

    const result = await runNearbyDigest(ctx.mail, start);
    expect(result).toEqual({ sent: 2, checked: 2 });
    expect(ctx.inbox('unconfirmed@example.com')).toHaveLength(0);
    const [message] = ctx.inbox('hanna@example.com');
    expect(message!.subject).toBe('2 new ripening reports near Orchard');
    for (const part of [message!.text!, message!.html!]) {
      expect(part).toContain('Inside Thirty');
      expect(part).toContain('Inside Fortynine');
      for (const absent of ['Outside Fiftyone', 'Box Corner', 'Still Green', 'Only Drafted', 'My Own Tree', 'Last Month']) expect(part).not.toContain(absent);
      // Privacy: town-level wording and the public grid, never the exact point or anyone's e-mail.
      // Measured to the grid cell centre (45.275, 3.025): 0.275 deg lat = 30.58 km north and about
      // 1.97 km east, so sqrt(30.58^2 + 1.97^2) = 30.6 km, bearing about 4 degrees: "31 km north".
      expect(part).toContain('about 31 km north · grid 45.275, 3.025');
      expect(part).not.toContain(north(30).lat.toFixed(4));
      expect(part).not.toContain('other.grower@example.com');
    }
    expect(message!.html).not.toMatch(/<img|src=/i);
  });

  it('sends nothing before a week has passed, then only what is new since the last digest', async () => {
    expect(await runNearbyDigest(ctx.mail, new Date(start.getTime() + DAY))).toEqual({ sent: 0, checked: 0 });
    report('Next Week', north(20), new Date(start.getTime() + 3 * DAY));
    const result = await runNearbyDigest(ctx.mail, new Date(start.getTime() + DIGEST_PERIOD_MS + 60_000));
    expect(result.sent).toBe(2);
    const second = ctx.inbox('hanna@example.com')[1]!;
    expect(second.text).toContain('Next Week');
    expect(second.text).not.toContain('Inside Thirty');
  });

  it('unsubscribes by the link without signing in; a wrong token changes nothing', async () => {
    const [hanna] = ctx.inbox('hanna@example.com');
    const token = linkToken(hanna!.text, '/unsubscribe');
    const neighbourToken = linkToken(ctx.inbox('neighbour@example.com')[0]!.text, '/unsubscribe');
    expect(token).not.toBe(neighbourToken);

    const wrong = await ctx.agent().post('/api/email/unsubscribe').send({ token: `${token.slice(0, -2)}xx` });
    expect(wrong.status).toBe(404);
    const active = () => ctx.db.select({ userId: digestSubscriptions.userId, active: digestSubscriptions.active }).from(digestSubscriptions).all();
    expect(active().every((s) => s.active)).toBe(true);

    const ok = await ctx.agent().post('/api/email/unsubscribe').send({ token });
    expect(ok.status).toBe(200);
    expect(ctx.db.select().from(digestSubscriptions).where(eq(digestSubscriptions.userId, grower.userId)).get()!.active).toBe(false);
    expect(ctx.db.select().from(digestSubscriptions).where(eq(digestSubscriptions.userId, neighbour.userId)).get()!.active).toBe(true);
    expect((await grower.get('/api/email/digest')).body.active).toBe(false);

    // The next digest goes to the neighbour only.
    report('After Unsubscribe', north(15), new Date(start.getTime() + 8 * DAY));
    await runNearbyDigest(ctx.mail, new Date(start.getTime() + 2 * DIGEST_PERIOD_MS + 120_000));
    expect(ctx.inbox('hanna@example.com')).toHaveLength(2);
    expect(ctx.inbox('neighbour@example.com')).toHaveLength(3);
  });

  it('lets waiting requests run between subscriptions (it runs in the server thread)', async () => {
    // Many due subscriptions with nothing new: no mail is sent, so nothing else would yield.
    for (let i = 0; i < 20; i++) {
      const { lastInsertRowid } = ctx.db.sqlite.prepare("INSERT INTO users (email, display_name, password_hash, email_verified_at) VALUES (?, 'Quiet', 'x', '2026-01-01')").run(`quiet-${i}@example.com`);
      const userId = Number(lastInsertRowid);
      ctx.db.insert(savedPlaces).values({ userId, name: 'Far away', lat: -40, lon: 170, isHome: true }).run();
      ctx.db.insert(digestSubscriptions).values({ userId, active: true, radiusKm: 10, unsubscribeToken: `quiet-token-${i}` }).run();
    }
    let turns = 0;
    let done = false;
    const tick = () => {
      turns++;
      if (!done) setImmediate(tick);
    };
    setImmediate(tick);
    const result = await runNearbyDigest(ctx.mail, new Date(start.getTime() + 5 * DIGEST_PERIOD_MS));
    done = true;
    expect(result.checked).toBeGreaterThanOrEqual(20);
    expect(turns).toBeGreaterThanOrEqual(result.checked);
  });
});
