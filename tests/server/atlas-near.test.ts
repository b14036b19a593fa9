import { beforeAll, describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { nearResponseSchema } from '../../shared/schemas/atlas';
import { writeStation } from '../../server/stations/stations.repo';
import { createTestContext, type TestContext } from '../helpers/test-app';

/*
 * GET /api/atlas/near and /api/varieties/:id/fit on a small hand-made atlas around a point P.
 * Distances: one degree of latitude is 111.195 km on the IUGG mean sphere R1 = 6371.0088 km
 * (Moritz, Geodetic Reference System 1980; ../shared/CHECKS.md).
 */
const P = { lat: 40, lon: -100 };
const KM_PER_DEG_LAT = 111.195;
const north = (km: number) => ({ lat: P.lat + km / KM_PER_DEG_LAT, lon: P.lon });

let ctx: TestContext;
const ids = { amber: 0, violet: 0, smyrna: 0, rejected: 0 };

function addVariety(name: string, figType: string, status = 'accepted', typicalDays: number | null = 150): number {
  return Number(
    ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status, ripening_class, typical_days_to_ripen, bears_breba) VALUES (?, ?, ?, 'mid', ?, 1)").run(name, figType, status, typicalDays).lastInsertRowid,
  );
}

let userCounter = 0;
function addGrower(): number {
  userCounter++;
  return Number(ctx.db.sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES (?, ?, 'x')").run(`g${userCounter}@example.com`, `Grower ${userCounter}`).lastInsertRowid);
}

/** One tree with a report per season; outcomes in season order. */
function addTree(userId: number, varietyId: number, at: { lat: number; lon: number }, outcomes: string[], extra: { status?: string; form?: string; crop?: string } = {}): number {
  const treeId = Number(ctx.db.sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'tree')").run(userId).lastInsertRowid);
  const grid = toPublicPoint(at.lat, at.lon);
  outcomes.forEach((outcome, i) => {
    ctx.db.sqlite
      .prepare(
        `INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, first_ripe_date, spring_frost_date, status)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(userId, treeId, varietyId, at.lat, at.lon, grid.lat, grid.lon, extra.form ?? 'ground', 2021 + i, extra.crop ?? 'main', outcome, outcome === 'ripened' ? `${2021 + i}-08-20` : null, `${2021 + i}-04-20`, extra.status ?? 'published');
  });
  return treeId;
}

/** GET near; a 200 must match the contract (the route does not parse its own answer). */
async function near(query: string) {
  const res = await ctx.agent().get(`/api/atlas/near?${query}`);
  if (res.status === 200) nearResponseSchema.parse(res.body);
  return res;
}
const at = (p: { lat: number; lon: number }, radiusKm = 50) => `lat=${p.lat}&lon=${p.lon}&radiusKm=${radiusKm}`;

beforeAll(() => {
  ctx = createTestContext();
  ids.amber = addVariety('Test Amber (fictional)', 'common');
  ids.violet = addVariety('Test Violet (fictional)', 'common');
  ids.smyrna = addVariety('Test Smyrna (fictional)', 'smyrna');
  ids.rejected = addVariety('Test Rejected (fictional)', 'common', 'rejected');
  const ana = addGrower();
  const ben = addGrower();
  // Ana's one Amber tree, reported for five seasons (all ripened): one tree, five reports.
  addTree(ana, ids.amber, north(5), ['ripened', 'ripened', 'ripened', 'ripened', 'ripened']);
  // Ben's Amber tree in a container, one season, still unripe.
  addTree(ben, ids.amber, north(-10), ['unripe'], { form: 'container' });
  // Violet: just inside and just outside 50 km due north, and a box corner (inside the lat/lon
  // bounding box of the 50 km circle, 55 km away on the diagonal).
  addTree(ben, ids.violet, north(49.9), ['ripened']);
  addTree(ben, ids.violet, north(50.1), ['unripe']);
  const diagonalDeg = 55 / Math.SQRT2;
  addTree(ben, ids.violet, { lat: P.lat + diagonalDeg / KM_PER_DEG_LAT, lon: P.lon + diagonalDeg / (KM_PER_DEG_LAT * Math.cos((P.lat * Math.PI) / 180)) }, ['unripe']);
  // Hidden reports and rejected varieties never count.
  addTree(ana, ids.violet, north(1), ['unripe', 'unripe'], { status: 'hidden' });
  addTree(ana, ids.rejected, north(2), ['ripened']);
  // Smyrna near P (no wasp area there) and far away: the far tree only feeds the overall rate.
  addTree(ana, ids.smyrna, north(3), ['dropped']);
  addTree(ben, ids.smyrna, { lat: 10, lon: 10 }, ['ripened', 'ripened']);
  // A station 20 km away with a 200-day median season.
  ctx.db.transaction(() =>
    writeStation(ctx.db, { name: 'Test station', code: 'TEST1', lat: north(20).lat, lon: P.lon, elevationM: null }, {
      days: [],
      freezeYears: [],
      summaries: [10, 50, 90].map((probability) => ({ thresholdF: 32, probability, lastSpringDoy: 110, firstFallDoy: 290, seasonDays: probability === 10 ? 180 : probability === 50 ? 200 : 220, years: 30 })),
    }),
  );
});

describe('GET /api/atlas/near', () => {
  it('counts one tree once however many seasons it was reported', async () => {
    const res = await near(at(P));
    expect(res.status).toBe(200);
    const amber = res.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.amber);
    // Ana's tree (5 ripened seasons) and Ben's tree (1 unripe): 2 trees, 6 reports, half ripened.
    expect(amber.all).toMatchObject({ trees: 2, reports: 6, ripened: 1, share: 0.5 });
    expect(amber.growers).toBe(2);
    expect(amber.byForm.container).toMatchObject({ trees: 1, ripened: 0 });
    expect(amber.byForm.ground).toMatchObject({ trees: 1, ripened: 1 });
  });

  it('keeps exactly the reports within the radius (great-circle distance, not the bounding box)', async () => {
    const res = await near(at(P));
    const violet = res.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.violet);
    // Distances are to each tree's public grid cell centre (shared/domain/public-grid.ts), never
    // its exact place: the trees at 49.9 and 50.1 km stand in cells centred 47.31 and 52.86 km
    // from P, the 55 km box corner in one 54.18 km away. 47.31 km in; 52.86 km and the box corner
    // out; the hidden tree never counts.
    expect(violet.all).toMatchObject({ trees: 1, reports: 1, share: 1 });
    // With 53 km the tree in the cell 52.86 km away joins (the box corner, 54.18 km, does not).
    const wider = await near(at(P, 53));
    expect(wider.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.violet).all.trees).toBe(2);
  });

  it('leaves out rejected varieties and hidden reports, and totals trees and growers', async () => {
    const res = await near(at(P));
    expect(res.body.varieties.map((v: { varietyId: number }) => v.varietyId)).not.toContain(ids.rejected);
    // Amber 2 trees + Violet 1 + Smyrna 1; Ana and Ben.
    expect(res.body.totals).toEqual({ reports: 8, trees: 4, growers: 2 });
  });

  it('leans local shares toward the overall rate, which counts reports everywhere', async () => {
    const res = await near(at(P));
    const smyrna = res.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.smyrna);
    // Overall: the local dropped tree (0) and the far tree (2 of 2 ripened = 1): 0.5.
    expect(smyrna.overallShare).toBe(0.5);
    expect(smyrna.all.share).toBe(0);
    expect(smyrna.adjustedShare).toBeGreaterThan(0);
    expect(smyrna.adjustedShare).toBeLessThan(0.5);
    // Smyrna figs need the wasp, which is not recorded here (Texas A&M EHT-019): ranked last.
    expect(res.body.pollinationByFigType.smyrna.main.fruitExpected).toBe('no');
    expect(smyrna.rank).toBe(res.body.varieties.length);
  });

  it('recomputes the overall rate when reports change', async () => {
    const { lastInsertRowid } = ctx.db.sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES ('late@example.com', 'Late', 'x')").run();
    addTree(Number(lastInsertRowid), ids.smyrna, { lat: -30, lon: 20 }, ['dropped']);
    const res = await near(at(P));
    const smyrna = res.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.smyrna);
    expect(smyrna.overallShare).toBe(0.3333); // 1/3, sent to 4 decimals
  });

  it('estimates the season from the station in range, and says when nothing is in range', async () => {
    const res = await near(at(P));
    expect(res.body.season).toMatchObject({ stationCount: 1, days50: 200, nearestStationKm: 20 });
    const empty = await near('lat=-45&lon=170&radiusKm=100');
    expect(empty.status).toBe(200);
    expect(empty.body.season).toMatchObject({ stationCount: 0, days50: null });
    expect(empty.body.season.method).toMatch(/No weather station/);
    expect(empty.body.varieties).toEqual([]);
  });

  it('reports the wasp status from the areas editors recorded', async () => {
    expect((await near(at(P))).body.wasp).toEqual({ established: false, areas: [] });
    const ring = [
      [P.lon - 0.5, P.lat - 0.5],
      [P.lon + 0.5, P.lat - 0.5],
      [P.lon + 0.5, P.lat + 0.5],
      [P.lon - 0.5, P.lat + 0.5],
      [P.lon - 0.5, P.lat - 0.5],
    ];
    ctx.db.sqlite
      .prepare("INSERT INTO wasp_areas (name, geometry, min_lat, max_lat, min_lon, max_lon, source, observed_on) VALUES ('Test valley', ?, ?, ?, ?, ?, 'test survey', '2025-07-01')")
      .run(JSON.stringify({ type: 'Polygon', coordinates: [ring] }), P.lat - 0.5, P.lat + 0.5, P.lon - 0.5, P.lon + 0.5);
    const res = await near(at(P));
    expect(res.body.wasp.established).toBe(true);
    expect(res.body.wasp.areas).toEqual([expect.objectContaining({ name: 'Test valley', source: 'test survey', observedOn: '2025-07-01' })]);
    const smyrna = res.body.varieties.find((v: { varietyId: number }) => v.varietyId === ids.smyrna);
    expect(smyrna.figType).toBe('smyrna');
    expect(res.body.pollinationByFigType.smyrna.main.fruitExpected).toBe('yes');
    // Just outside the polygon, no wasp.
    expect((await near(at({ lat: P.lat + 0.6, lon: P.lon }))).body.wasp.established).toBe(false);
  });

  it('answers 400 naming lat, lon or radiusKm', async () => {
    for (const [query, field] of [
      ['lat=abc&lon=0', 'lat'],
      ['lon=0', 'lat'],
      ['lat=91&lon=0', 'lat'],
      ['lat=0&lon=-181', 'lon'],
      ['lat=0&lon=x', 'lon'],
      ['lat=0&lon=0&radiusKm=0', 'radiusKm'],
      ['lat=0&lon=0&radiusKm=7.9', 'radiusKm'],
      ['lat=0&lon=0&radiusKm=501', 'radiusKm'],
      ['lat=0&lon=0&radiusKm=far', 'radiusKm'],
      ['lat=0&lon=0&form=roof', 'form'],
    ] as const) {
      const res = await near(query);
      expect(res.status, query).toBe(400);
      expect(Object.keys(res.body.error.fields), query).toEqual([field]);
    }
  });
});

describe('GET /api/varieties/:id/fit', () => {
  it('judges the season against the variety with the numbers behind it', async () => {
    const res = await ctx.agent().get(`/api/varieties/${ids.amber}/fit?lat=${P.lat}&lon=${P.lon}&form=ground`);
    expect(res.status).toBe(200);
    expect(res.body.variety).toEqual({ id: ids.amber, name: 'Test Amber (fictional)', figType: 'common' });
    expect(res.body.season.days50).toBe(200);
    // Too few trees report days from frost to ripe, so the catalogue's 150 days are used: 200 - 150 = 50.
    expect(res.body.seasonFit).toMatchObject({ verdict: 'likely', neededFrom: 'catalogue', neededDays: 150, localSeasonDays: 200, marginDays: 50, headStartDays: 0 });
    const container = await ctx.agent().get(`/api/varieties/${ids.amber}/fit?lat=${P.lat}&lon=${P.lon}&form=container`);
    expect(container.body.seasonFit.marginDays).toBe(50 + container.body.seasonFit.headStartDays);
    expect(container.body.seasonFit.headStartDays).toBeGreaterThan(0);
    expect(res.body.pollination.main.fruitExpected).toBe('yes');
  });

  it('is unknown without a station in range, 404 for a variety not in the catalogue, 400 naming bad parameters', async () => {
    const far = await ctx.agent().get(`/api/varieties/${ids.amber}/fit?lat=-45&lon=170`);
    expect(far.body.seasonFit.verdict).toBe('unknown');
    expect((await ctx.agent().get(`/api/varieties/${ids.rejected}/fit?lat=0&lon=0`)).status).toBe(404);
    expect((await ctx.agent().get('/api/varieties/99999/fit?lat=0&lon=0')).status).toBe(404);
    const bad = await ctx.agent().get(`/api/varieties/${ids.amber}/fit?lat=0&lon=999`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('lon');
    // The variety's own page is still served by the varieties router.
    expect((await ctx.agent().get(`/api/varieties/${ids.amber}`)).status).toBe(200);
  });
});
