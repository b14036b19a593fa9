import { beforeAll, describe, expect, it } from 'vitest';
import { reports, trees, users, varieties } from '../../server/db/schema';
import { pinsResponseSchema, cellResponseSchema } from '../../shared/schemas/pins';
import { snapToGrid } from '../../shared/domain/public-grid';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();
const WORLD = 'bbox=-180,-85,180,85';

/** Invented exact spots (test data): a few trees near Albany, NY, and one in London. */
const ALBANY_SPOTS = [
  [42.65213, -73.75691],
  [42.65377, -73.75102],
  [42.70771, -73.8123],
];
let lanternId: number;
let smyrnaId: number;
let firstId: number;

function addReport(lat: number, lon: number, values: Partial<typeof reports.$inferInsert> = {}) {
  const userId = ctx.db.select({ id: users.id }).from(users).get()!.id;
  const treeId = ctx.db.insert(trees).values({ userId, label: 'test tree' }).returning().get().id;
  return ctx.db
    .insert(reports)
    .values({ userId, treeId, varietyId: lanternId, lat, lon, gridLat: snapToGrid(lat), gridLon: snapToGrid(lon), form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', ...values })
    .returning()
    .get().id;
}

beforeAll(async () => {
  await ctx.signedIn('grower');
  lanternId = ctx.db.insert(varieties).values({ name: 'Lantern Amber', figType: 'common', isFictional: true }).returning().get().id;
  smyrnaId = ctx.db.insert(varieties).values({ name: 'Terrace Test', figType: 'smyrna', isFictional: true }).returning().get().id;
  firstId = addReport(ALBANY_SPOTS[0]![0], ALBANY_SPOTS[0]![1], { form: 'container' });
  addReport(ALBANY_SPOTS[1]![0], ALBANY_SPOTS[1]![1], { crop: 'breba', outcome: 'dropped', season: 2022 });
  addReport(ALBANY_SPOTS[2]![0], ALBANY_SPOTS[2]![1], { varietyId: smyrnaId, outcome: 'dropped' });
  addReport(51.50912, -0.12771, { season: 2023 });
  addReport(42.6601, -73.7701, { status: 'hidden' });
  addReport(42.6602, -73.7702, { status: 'draft' });
});

describe('GET /api/atlas/pins', () => {
  it('counts only published reports and keeps the count at every zoom', async () => {
    for (const zoom of [0, 4, 8, 12]) {
      const res = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=${zoom}`);
      expect(res.status).toBe(200);
      const body = pinsResponseSchema.parse(res.body);
      expect(body.totalReports).toBe(4);
      expect(body.features.reduce((n, f) => n + f.properties.reports, 0)).toBe(4);
    }
  });

  it('never sends an exact coordinate: every position is a public grid centre, not a grower’s spot', async () => {
    const res = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=14`);
    const text = JSON.stringify(res.body);
    for (const [lat, lon] of [...ALBANY_SPOTS, [51.50912, -0.12771]]) {
      expect(text).not.toContain(String(lat));
      expect(text).not.toContain(String(lon));
    }
    for (const f of pinsResponseSchema.parse(res.body).features) {
      expect(f.properties.kind).toBe('cell');
      expect(snapToGrid(f.geometry.coordinates[1])).toBeCloseTo(f.geometry.coordinates[1], 9);
      expect(snapToGrid(f.geometry.coordinates[0])).toBeCloseTo(f.geometry.coordinates[0], 9);
    }
  });

  it('tells how the reports turned out: ripened and unripe counts summed into every cluster, following the filters', async () => {
    // The fixture above: four published reports, two dropped, two ripened, none unripe.
    for (const zoom of [0, 6, 12]) {
      const body = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=${zoom}`)).body);
      expect(body.features.reduce((n, f) => n + f.properties.ripened, 0)).toBe(2);
      expect(body.features.reduce((n, f) => n + f.properties.unripe, 0)).toBe(0);
      for (const f of body.features) expect(f.properties.ripened + f.properties.unripe).toBeLessThanOrEqual(f.properties.reports);
    }
    const dropped = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=0&outcome=dropped`)).body);
    expect(dropped.features.reduce((n, f) => n + f.properties.ripened, 0)).toBe(0);
    const id = addReport(42.6521, -73.7569, { outcome: 'unripe' });
    const withUnripe = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=12`)).body);
    expect(withUnripe.features.reduce((n, f) => n + f.properties.unripe, 0)).toBe(1);
    ctx.db.delete(reports).where((await import('drizzle-orm')).eq(reports.id, id)).run();
  });

  it('narrows by each filter', async () => {
    const total = async (query: string) => pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3&${query}`)).body).totalReports;
    expect(await total('crop=breba')).toBe(1);
    expect(await total('outcome=dropped')).toBe(2);
    expect(await total('figType=smyrna')).toBe(1);
    expect(await total(`varietyId=${lanternId}`)).toBe(3);
    expect(await total('form=container')).toBe(1);
    expect(await total('seasonFrom=2023&seasonTo=2024')).toBe(3);
  });

  it('only returns what lies in the view', async () => {
    const res = await ctx.agent().get('/api/atlas/pins?bbox=-10,45,10,60&zoom=12');
    const body = pinsResponseSchema.parse(res.body);
    expect(body.features).toHaveLength(1);
    expect(body.features[0]!.properties).toMatchObject({ kind: 'cell', reports: 1 });
  });

  it('sees a new report at once (the cached index follows the data)', async () => {
    const before = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3`)).body);
    const id = addReport(-33.87, 151.21);
    const after = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3`)).body);
    expect(after.totalReports).toBe(before.totalReports + 1);
    expect(after.dataVersion).not.toBe(before.dataVersion);
    ctx.db.delete(reports).where((await import('drizzle-orm')).eq(reports.id, id)).run();
    expect(pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3`)).body).totalReports).toBe(before.totalReports);
  });

  it('refuses a bad bbox or zoom with 400 naming the parameter', async () => {
    for (const bbox of ['1,2,3', 'a,b,c,d', '-200,0,10,10', '0,50,10,40', '']) {
      const res = await ctx.agent().get(`/api/atlas/pins?bbox=${bbox}&zoom=3`);
      expect(res.status, bbox).toBe(400);
      expect(Object.keys(res.body.error.fields)).toContain('bbox');
    }
    const noBbox = await ctx.agent().get('/api/atlas/pins?zoom=3');
    expect(noBbox.status).toBe(400);
    expect(noBbox.body.error.fields).toHaveProperty('bbox');
    const badZoom = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=99`);
    expect(badZoom.status).toBe(400);
    expect(badZoom.body.error.fields).toHaveProperty('zoom');
    const badCrop = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3&crop=winter`);
    expect(badCrop.body.error.fields).toHaveProperty('crop');
    const badSeasons = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3&seasonFrom=2024&seasonTo=2020`);
    expect(badSeasons.body.error.fields).toHaveProperty('seasonFrom');
  });
});

describe('GET /api/atlas/pins/cell', () => {
  it('lists the published reports on one grid cell, with their public summary only', async () => {
    const lat = snapToGrid(ALBANY_SPOTS[0]![0]);
    const lon = snapToGrid(ALBANY_SPOTS[0]![1]);
    const res = await ctx.agent().get(`/api/atlas/pins/cell?lat=${lat}&lon=${lon}`);
    expect(res.status).toBe(200);
    const body = cellResponseSchema.parse(res.body);
    // Spots 0 and 1 share a cell; the hidden and draft reports nearby stay out.
    expect(body.total).toBe(2);
    expect(body.reports.map((r) => r.id)).toContain(firstId);
    expect(body.reports[0]).toMatchObject({ varietyName: 'Lantern Amber', figType: 'common', season: 2024 });
    expect(Object.keys(body.reports[0]!).sort()).toEqual(['crop', 'figType', 'form', 'id', 'outcome', 'season', 'varietyId', 'varietyName']);
    const filtered = cellResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins/cell?lat=${lat}&lon=${lon}&crop=breba`)).body);
    expect(filtered.total).toBe(1);
  });

  it('refuses a bad latitude with 400 naming it', async () => {
    const res = await ctx.agent().get('/api/atlas/pins/cell?lat=95&lon=0');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('lat');
  });
});
