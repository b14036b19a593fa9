import { describe, expect, it } from 'vitest';
import { digestSubscriptions, reports, savedPlaces, trees, varieties } from '../../server/db/schema';
import { runNearbyDigest } from '../../server/email/digest';
import { createGazetteer } from '../../server/places/gazetteer';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { cellsOf, daysNeededOf } from '../../shared/domain/variety-page';
import type { Outcome } from '../../shared/domain/codes';
import { createMailTestContext } from './email-helpers';

// One degree of latitude is 111.195 km on the IUGG mean sphere (shared CHECKS.md, "Distance on the sphere").
const KM_PER_DEG_LAT = 111.195;
const DAY = 86_400_000;

describe('variety page figures (pure)', () => {
  it('counts each tree once per cell: ripened if it ever ripened, failed otherwise', () => {
    const cells = cellsOf([
      { treeId: 1, gridLat: 42.625, gridLon: -73.775, outcome: 'unripe' },
      { treeId: 1, gridLat: 42.625, gridLon: -73.775, outcome: 'ripened' },
      { treeId: 2, gridLat: 42.625, gridLon: -73.775, outcome: 'dropped' },
      { treeId: 3, gridLat: 43.025, gridLon: -73.775, outcome: 'no-fruit' },
    ]);
    expect(cells).toEqual([
      { gridLat: 42.625, gridLon: -73.775, ripenedTrees: 1, failedTrees: 1 },
      { gridLat: 43.025, gridLon: -73.775, ripenedTrees: 0, failedTrees: 1 },
    ]);
  });

  it('measures days from the last spring frost to the first ripe fig by calendar dates (worked by hand)', () => {
    // 2025-04-28 → 2025-09-01: 2 (April) + 31 + 30 + 31 + 31 + 1 = 126 days.
    // 2024-10-01 → 2025-02-15 (a southern season across the new year): 30 + 30 + 31 + 31 + 15 = 137 days.
    // 2025-05-10 → 2025-10-20: 21 + 30 + 31 + 31 + 30 + 20 = 163 days.
    const rows = [
      { springFrostDate: '2025-04-28', firstRipeDate: '2025-09-01' },
      { springFrostDate: '2024-10-01', firstRipeDate: '2025-02-15' },
      { springFrostDate: '2025-05-10', firstRipeDate: '2025-10-20' },
      { springFrostDate: '2025-06-01', firstRipeDate: '2025-05-01' }, // ripe before the frost: a typo, left out
      { springFrostDate: null, firstRipeDate: '2025-08-01' },
    ];
    expect(daysNeededOf(rows)).toEqual({ reports: 3, median: 137, low: 126, high: 163 });
  });
});

describe('nearest town', () => {
  // Coordinates and populations of these GeoNames towns recalled from memory (rounded); the rule is ours.
  const rows = [
    { cityId: 1, name: 'Albany', altName: '', country: 'US', adminCode: 'NY', population: 97_000, loc: { coordinates: [-73.756, 42.653] as [number, number] } },
    { cityId: 2, name: 'Menands', altName: '', country: 'US', adminCode: 'NY', population: 4_000, loc: { coordinates: [-73.725, 42.692] as [number, number] } },
    { cityId: 3, name: 'Lyon', altName: '', country: 'FR', adminCode: '84', population: 500_000, loc: { coordinates: [4.835, 45.758] as [number, number] } },
  ];
  const gazetteer = createGazetteer(rows);

  it('names a point by the city a grower would say, not the hamlet next door', () => {
    // At Menands itself Albany is ~5 km away: the city of 50,000+ within 30 km wins.
    expect(gazetteer.nearest({ lat: 42.692, lon: -73.725 }, 50)!.place.name).toBe('Albany');
    expect(gazetteer.nearest({ lat: 45.75, lon: 4.85 }, 50)!.place.context).toBe('France');
    expect(gazetteer.nearest({ lat: 0, lon: 0 }, 50)).toBeNull();
  });
});

describe('follows, units and the variety page over the API, and the digest', async () => {
  const ctx = await createMailTestContext();
  const grower = await ctx.signedIn('grower', 'follower@example.com');
  const other = await ctx.signedIn('grower', 'poster@example.com');
  const followedId = ctx.db.insert(varieties).values({ name: 'Followed Fig', isFictional: true, figType: 'common', sources: 'Invented for the test' }).returning().get().id;
  const plainId = ctx.db.insert(varieties).values({ name: 'Plain Fig', isFictional: true }).returning().get().id;
  const proposedId = ctx.db.insert(varieties).values({ name: 'Pending Fig', status: 'proposed' }).returning().get().id;
  let treeCount = 0;

  function report(varietyId: number, at: { lat: number; lon: number }, outcome: Outcome, publishedAt: Date, extra: { springFrostDate?: string; firstRipeDate?: string } = {}) {
    const treeId = ctx.db.insert(trees).values({ userId: other.userId, label: `tree ${++treeCount}` }).returning().get().id;
    const grid = toPublicPoint(at.lat, at.lon);
    ctx.db
      .insert(reports)
      .values({
        userId: other.userId,
        treeId,
        varietyId,
        ...at,
        gridLat: grid.lat,
        gridLon: grid.lon,
        form: 'ground',
        season: 2026,
        crop: 'main',
        outcome,
        status: 'published',
        firstRipeDate: extra.firstRipeDate ?? (outcome === 'ripened' ? '2026-08-20' : null),
        springFrostDate: extra.springFrostDate ?? null,
        publishedAt: publishedAt.toISOString(),
        createdAt: publishedAt.toISOString(),
      })
      .run();
  }

  it('follows a variety and a place, refuses bad input by field, and keeps them private', async () => {
    expect((await grower.post('/api/follows').send({ kind: 'variety', varietyId: followedId })).status).toBe(201);
    expect((await grower.post('/api/follows').send({ kind: 'variety', varietyId: followedId })).status).toBe(201); // again: no duplicate
    const bad = await grower.post('/api/follows').send({ kind: 'place', name: 'Somewhere', lat: 95, lon: 0 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.lat).toBeDefined();
    const pending = await grower.post('/api/follows').send({ kind: 'variety', varietyId: proposedId });
    expect(pending.status).toBe(400);
    expect(pending.body.error.fields.varietyId).toBeDefined();
    const list = await grower.post('/api/follows').send({ kind: 'place', name: 'Far orchard', lat: 50, lon: 10 });
    expect(list.body.varieties.map((v: { name: string }) => v.name)).toEqual(['Followed Fig']);
    expect(list.body.places).toHaveLength(1);
    expect((await other.get('/api/follows')).body).toEqual({ varieties: [], places: [] });
    expect((await other.delete(`/api/follows/places/${list.body.places[0].id}`)).status).toBe(404);
  });

  it('saves units and a date language to the account, and refuses an unknown unit by name', async () => {
    expect((await grower.get('/api/account/units')).body).toEqual({ units: null });
    const bad = await grower.put('/api/account/units').send({ temperature: 'K', distance: 'mi', locale: 'en-US' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.temperature).toBeDefined();
    expect((await grower.put('/api/account/units').send({ temperature: 'C', distance: 'mi', locale: 'en-GB' })).status).toBe(200);
    expect((await grower.get('/api/account/units')).body).toEqual({ units: { temperature: 'C', distance: 'mi', locale: 'en-GB' } });
  });

  it('gives a variety page from published reports on their public cells only', async () => {
    const longAgo = new Date(Date.now() - 30 * DAY);
    report(plainId, { lat: 42.6612, lon: -73.7734 }, 'ripened', longAgo, { springFrostDate: '2026-04-28', firstRipeDate: '2026-09-01' });
    report(plainId, { lat: 42.6612, lon: -73.7734 }, 'unripe', longAgo);
    const page = await ctx.agent().get(`/api/varieties/${plainId}/page`);
    expect(page.status).toBe(200);
    expect(page.body.totals).toEqual({ reports: 2, trees: 2, growers: 1, ripenedTrees: 1 });
    // Only the grid cell centre leaves the server, never the exact 42.6612, -73.7734.
    expect(JSON.stringify(page.body)).not.toContain('42.6612');
    expect(page.body.cells).toEqual([{ gridLat: 42.675, gridLon: -73.775, ripenedTrees: 1, failedTrees: 1 }]);
    // 2026-04-28 → 2026-09-01 is 126 days (worked by hand above).
    expect(page.body.daysNeeded).toMatchObject({ reports: 1, median: 126 });
    expect(page.body.ripeDates.reports).toBe(1);
    expect(page.body.following).toBe(false);
    expect((await grower.get(`/api/varieties/${followedId}/page`)).body.following).toBe(true);
    expect((await ctx.agent().get(`/api/varieties/${proposedId}/page`)).status).toBe(404);
  });

  it('puts the followed variety and place in the weekly digest, in the grower’s units', async () => {
    const home = { lat: 45, lon: 3 };
    ctx.db.insert(savedPlaces).values({ userId: grower.userId, name: 'Orchard', ...home, isHome: true }).run();
    expect((await grower.put('/api/email/digest').send({ active: true, radiusKm: 50 })).status).toBe(200);
    const now = new Date();
    // Far from home: only the follows bring these into the digest.
    report(followedId, { lat: 35, lon: 139 }, 'ripened', new Date(now.getTime() - DAY));
    report(plainId, { lat: 50 + 20 / KM_PER_DEG_LAT, lon: 10 }, 'ripened', new Date(now.getTime() - DAY));
    // Ripened near home as well, 30 km north.
    report(plainId, { lat: home.lat + 30 / KM_PER_DEG_LAT, lon: home.lon }, 'ripened', new Date(now.getTime() - DAY));
    const result = await runNearbyDigest(ctx.mail, now);
    expect(result.sent).toBe(1);
    const [message] = ctx.inbox('follower@example.com');
    expect(message!.text).toContain('Varieties you follow');
    expect(message!.text).toMatch(/Followed Fig: 1 new ripened report from 1 place/);
    expect(message!.text).toMatch(/Far orchard: 1 new ripened report \(Plain Fig\)/);
    // The grower chose miles: 50 km is 31 mi (NIST: 1 mi = 1.609344 km), 30 km about 19 mi.
    expect(message!.text).toContain('within 31 mi');
    expect(message!.text).toContain('about 19 mi north');
    expect(ctx.db.select().from(digestSubscriptions).all()[0]!.lastSentAt).toBe(now.toISOString());
  });
});
