import { beforeAll, describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { reports, stations, stationSummaries, trees, varieties } from '../../server/db/schema';
import { insertUser } from '../../server/users/users.repo';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();
const ALBANY = { lat: 42.65, lon: -73.75 };
let early = 0;
let late = 0;

type Outcome = 'ripened' | 'unripe' | 'dropped' | 'no-fruit';
function addReport(userId: number, varietyId: number, at: { lat: number; lon: number }, outcome: Outcome, extra: Partial<typeof reports.$inferInsert> = {}) {
  const treeId = extra.treeId ?? ctx.db.insert(trees).values({ userId, label: 't' }).returning().get().id;
  const grid = toPublicPoint(at.lat, at.lon);
  ctx.db
    .insert(reports)
    .values({ userId, treeId, varietyId, lat: at.lat, lon: at.lon, gridLat: grid.lat, gridLon: grid.lon, form: 'ground', season: 2024, crop: 'main', outcome, ...extra })
    .run();
  return treeId;
}

beforeAll(() => {
  const u1 = insertUser(ctx.db, { email: 'a@example.com', displayName: 'A', passwordHash: 'x' }).id;
  const u2 = insertUser(ctx.db, { email: 'b@example.com', displayName: 'B', passwordHash: 'x' }).id;
  early = ctx.db.insert(varieties).values({ name: 'Test Early', figType: 'common' }).returning().get().id;
  late = ctx.db.insert(varieties).values({ name: 'Test Late', figType: 'common' }).returning().get().id;
  // Near Albany: three ripe dates in two weeks, one tree reported twice.
  const tree = addReport(u1, early, { lat: 42.7, lon: -73.8 }, 'ripened', { firstRipeDate: '2024-08-01', springFrostDate: '2024-04-27', fallFrostDate: '2024-10-05' });
  addReport(u1, early, { lat: 42.7, lon: -73.8 }, 'ripened', { treeId: tree, season: 2023, firstRipeDate: '2023-08-03', springFrostDate: '2023-04-27', fallFrostDate: '2023-10-05' });
  addReport(u2, early, { lat: 42.6, lon: -73.7 }, 'ripened', { firstRipeDate: '2024-08-12' });
  addReport(u2, late, { lat: 42.6, lon: -73.7 }, 'unripe');
  addReport(u2, late, { lat: 42.6, lon: -73.7 }, 'no-fruit');
  // Far away (Sacramento): not within 100 km of Albany; a long season of its own.
  addReport(u1, early, { lat: 38.58, lon: -121.49 }, 'ripened', { firstRipeDate: '2024-06-20', springFrostDate: '2024-02-20', fallFrostDate: '2024-11-25' });
  addReport(u1, late, { lat: 38.58, lon: -121.49 }, 'ripened', { firstRipeDate: '2024-09-01', springFrostDate: '2024-02-20', fallFrostDate: '2024-11-25' });
  // A station near Albany with a 169-day season at 32 F, 50 % (the NCEI normal, CHECKS.md, unverified copy).
  const station = ctx.db.insert(stations).values({ name: 'Albany test station', lat: 42.7431, lon: -73.8092 }).returning().get().id;
  ctx.db.insert(stationSummaries).values({ stationId: station, thresholdF: 32, probability: 50, seasonDays: 169, lastSpringDoy: 117, firstFallDoy: 288, years: 30 }).run();
});

describe('GET /api/guidance/ripe-dates', () => {
  it('counts first-ripe dates near the point by week', async () => {
    const res = await ctx.agent().get(`/api/guidance/ripe-dates?varietyId=${early}&lat=${ALBANY.lat}&lon=${ALBANY.lon}&radiusKm=100`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ reports: 3, trees: 2, crop: 'main', variety: { name: 'Test Early' } });
    expect(res.body.bins.reduce((n: number, b: { count: number }) => n + b.count, 0)).toBe(3);
    // days of year: 2024-08-01 = 214 (leap year), 2023-08-03 = 215, 2024-08-12 = 225; median 215, shown as in a common year
    expect(res.body.medianDoy).toBe(215);
    expect(res.body.medianLabel).toBe('3 Aug');
    expect(JSON.stringify(res.body)).not.toContain('42.7'); // no report place leaves the server
  });

  it('answers 400 naming the parameter, and 404 for an unknown variety', async () => {
    const bad = await ctx.agent().get(`/api/guidance/ripe-dates?varietyId=${early}&lat=91&lon=0`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['lat']);
    const missing = await ctx.agent().get('/api/guidance/ripe-dates?lat=1&lon=1');
    expect(Object.keys(missing.body.error.fields)).toEqual(['varietyId']);
    expect((await ctx.agent().get('/api/guidance/ripe-dates?varietyId=9999&lat=1&lon=1')).status).toBe(404);
  });
});

describe('GET /api/guidance/season-success', () => {
  it('bins ripening against season length from frost dates, else the nearest station', async () => {
    const res = await ctx.agent().get('/api/guidance/season-success?binDays=20');
    expect(res.status).toBe(200);
    // 6 season-decided reports (the no-fruit one is left out); two take the station's 169 days.
    expect(res.body).toMatchObject({ reports: 6, withoutSeason: 0, fromOwnFrostDates: 4, fromStations: 2 });
    const band160 = res.body.bins.find((b: { fromDays: number }) => b.fromDays === 160);
    // 2024-04-27 to 2024-10-05 = 161 days (own dates, one tree twice), plus the station's 169 days for two trees
    expect(band160).toMatchObject({ reports: 4, trees: 3 });
    expect(band160.share).toBeCloseTo(2 / 3);
    expect(band160.interval90.low).toBeLessThan(band160.share);
  });

  it('rejects a bad bin width by name', async () => {
    const res = await ctx.agent().get('/api/guidance/season-success?binDays=2');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['binDays']);
  });
});

describe('GET /api/guidance/short-season', () => {
  it('lists only varieties that ripened in seasons as short as this one', async () => {
    const res = await ctx.agent().get('/api/guidance/short-season?seasonDays=165&toleranceDays=10');
    expect(res.status).toBe(200);
    expect(res.body.varieties.map((v: { name: string }) => v.name)).toEqual(['Test Early']);
    expect(res.body.varieties[0]).toMatchObject({ trees: 2, shortestRipeSeasonDays: 161 });
    const long = await ctx.agent().get('/api/guidance/short-season?seasonDays=300');
    expect(long.body.varieties.map((v: { name: string }) => v.name).sort()).toEqual(['Test Early', 'Test Late']);
  });

  it('needs a season length', async () => {
    const res = await ctx.agent().get('/api/guidance/short-season?form=pot');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['form', 'seasonDays']);
  });
});
