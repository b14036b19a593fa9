import { describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { modelAccuracySchema } from '../../shared/schemas/accuracy';
import { nearResponseSchema } from '../../shared/schemas/atlas';
import { runModelAccuracy } from '../../server/accuracy/accuracy-job';
import { createChanceFitCache } from '../../server/atlas/chance-fit-cache';
import { reports, stations, stationSummaries, trees, varieties } from '../../server/db/schema';
import { insertUser } from '../../server/users/users.repo';
import { createTestContext } from '../helpers/test-app';

/*
 * The chance through the real engine and the accuracy job on a real (temporary) database: growers
 * in a long-season valley and a short-season upland; a late variety ripens in the first and fails
 * in the second, an early one ripens in both. One lucky tree of a third variety must not outrank.
 */
const ctx = createTestContext();
const VALLEY = { lat: 36.7, lon: -119.8 };
const UPLAND = { lat: 44.0, lon: -121.3 };

const station = (name: string, at: { lat: number; lon: number }, days50: number) => {
  const id = ctx.db.insert(stations).values({ name, ...at }).returning().get().id;
  for (const [probability, days] of [[10, days50 - 15], [50, days50], [90, days50 + 15]] as const) {
    ctx.db.insert(stationSummaries).values({ stationId: id, thresholdF: 32, probability, seasonDays: days, lastSpringDoy: 100, firstFallDoy: 100 + days, years: 30 }).run();
  }
};
station('Valley (invented)', VALLEY, 240);
station('Upland (invented)', UPLAND, 120);

const late = ctx.db.insert(varieties).values({ name: 'Fictional Late', figType: 'common', ripeningClass: 'late', typicalDaysToRipen: 160 }).returning().get().id;
const early = ctx.db.insert(varieties).values({ name: 'Fictional Early', figType: 'common', ripeningClass: 'early', typicalDaysToRipen: 100 }).returning().get().id;
const lucky = ctx.db.insert(varieties).values({ name: 'Fictional Lucky', figType: 'common', ripeningClass: 'late', typicalDaysToRipen: 160 }).returning().get().id;
ctx.db.insert(varieties).values({ name: 'Fictional Proposed', figType: 'common', status: 'proposed' }).run();

let n = 0;
function grower(varietyId: number, place: { lat: number; lon: number }, outcomes: ('ripened' | 'unripe')[]) {
  n++;
  const userId = insertUser(ctx.db, { email: `g${n}@example.com`, displayName: `g${n}`, passwordHash: 'x' }).id;
  const treeId = ctx.db.insert(trees).values({ userId, label: 't' }).returning().get().id;
  const at = { lat: place.lat + (n % 5) * 0.02, lon: place.lon + (n % 3) * 0.02 };
  const grid = toPublicPoint(at.lat, at.lon);
  outcomes.forEach((outcome, i) => {
    ctx.db.insert(reports).values({ userId, treeId, varietyId, ...at, gridLat: grid.lat, gridLon: grid.lon, form: 'ground', season: 2020 + i, crop: 'main', outcome }).run();
  });
}
for (let i = 0; i < 12; i++) {
  grower(late, VALLEY, ['ripened', 'ripened', i % 4 === 0 ? 'unripe' : 'ripened']);
  grower(late, UPLAND, ['unripe', i % 3 === 0 ? 'ripened' : 'unripe', 'unripe']);
  grower(early, VALLEY, ['ripened', 'ripened', 'ripened']);
  grower(early, UPLAND, ['ripened', i % 3 === 0 ? 'unripe' : 'ripened', 'ripened']);
}
grower(lucky, UPLAND, ['ripened', 'ripened', 'ripened']);

const near = async (at: { lat: number; lon: number }) => {
  const res = await ctx.agent().get(`/api/atlas/near?lat=${at.lat}&lon=${at.lon}&radiusKm=50&form=ground`);
  expect(res.status).toBe(200);
  return nearResponseSchema.parse(res.body);
};

describe('the chance on GET /api/atlas/near', () => {
  it('gives every variety a chance with an interval, ranked by it; the late fig is likely in the valley, not in the upland', async () => {
    const valley = await near(VALLEY);
    const upland = await near(UPLAND);
    const chanceOf = (body: typeof valley, id: number) => body.varieties.find((v) => v.varietyId === id)!.chance!;
    expect(chanceOf(valley, late).probability).toBeGreaterThan(0.7);
    expect(chanceOf(upland, late).probability).toBeLessThan(0.3);
    for (const v of [...valley.varieties, ...upland.varieties]) {
      expect(v.chance!.low).toBeLessThanOrEqual(v.chance!.probability);
      expect(v.chance!.high).toBeGreaterThanOrEqual(v.chance!.probability);
      expect(Number.isInteger(v.chance!.trees)).toBe(true);
    }
    expect(upland.varieties[0].name).toBe('Fictional Early');
    expect(upland.method).toMatch(/logistic model/);
  });

  it('keeps one lucky tree from outranking well-evidenced varieties, says so in whole trees, and never names a proposed variety', async () => {
    const upland = await near(UPLAND);
    const luckyRow = upland.varieties.find((v) => v.varietyId === lucky)!;
    expect(luckyRow.chance).toMatchObject({ enoughEvidence: false, trees: 1 });
    expect(luckyRow.rank).toBe(upland.varieties.length);
    expect(luckyRow.reason).toMatch(/^Too little evidence \(1 tree\)/);
    expect(JSON.stringify(upland)).not.toMatch(/Proposed/);
    for (const v of upland.varieties) expect(v.reason).not.toMatch(/\d\.\d+ trees?/);
  });
});

describe('the chance fit cache', () => {
  it('fits the same model in the worker thread a large atlas uses as in the request thread', async () => {
    const here = createChanceFitCache(ctx.db, { worker: false });
    const there = createChanceFitCache(ctx.db, { worker: true });
    try {
      const [a, b] = [await here.get(), await there.get()];
      expect(b.version).toBe(a.version);
      expect([...b.model.varieties]).toEqual([...a.model.varieties]);
      expect(b.columns.count).toBe(49);
      // A fresh cache working in the worker answers "not yet" at once instead of waiting for its first fit.
      const fresh = createChanceFitCache(ctx.db, { worker: true });
      expect(await fresh.current()).toBeNull();
      await fresh.settled();
      expect((await fresh.current())!.version).toBe(a.version);
      await fresh.close();
      // Positions are the reports' public grid cells.
      const cells = new Set(ctx.db.sqlite.prepare('SELECT grid_lat FROM reports').pluck().all() as number[]);
      for (const lat of b.columns.lat) expect(cells.has(lat)).toBe(true);
    } finally {
      await there.close();
    }
  }, 60_000);
});

describe('GET /api/accuracy and the model-accuracy job', () => {
  it('is pending until the job ran, then gives leave-one-grower-out scores, dated, with n', async () => {
    const before = modelAccuracySchema.parse((await ctx.agent().get('/api/accuracy')).body);
    expect(before.status).toBe('pending');
    expect(await runModelAccuracy(ctx.db, new Date('2026-12-01T03:00:00Z'))).toBe(true);
    const after = modelAccuracySchema.parse((await ctx.agent().get('/api/accuracy')).body);
    expect(after).toMatchObject({ status: 'ready', computedAt: '2026-12-01T03:00:00.000Z', growers: 49, trees: 49, treeSeasons: 147, demoShare: 0 });
    // The season decides here: the chance beats the variety's overall rate.
    expect(after.brierSkillScore!).toBeGreaterThan(0);
    expect(after.scores!.chance.brier).toBeLessThan(after.scores!.overallRate.brier);
    expect(after.bins.reduce((s, b) => s + b.count, 0)).toBe(147);
    // Nothing changed: the job does not recompute.
    expect(await runModelAccuracy(ctx.db, new Date('2026-12-01T04:00:00Z'))).toBe(false);
  }, 60_000);
});
