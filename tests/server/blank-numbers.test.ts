import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { IMPORT_COLUMNS } from '../../shared/domain/report-csv';
import { reports, stations, varieties } from '../../server/db/schema';
import { createTestContext } from '../helpers/test-app';

/*
 * z.coerce.number() turns '' and '  ' into 0, so an empty field could silently become the equator,
 * the prime meridian or season 0. Every number read from text goes through numberFromText
 * (shared/schemas/text-number.ts): an empty required one is a 400 naming the field, an empty
 * optional one is absent (or takes its default).
 */
const ctx = createTestContext();
const variety = ctx.db.insert(varieties).values({ name: 'Blank Test Brown', isFictional: true }).returning().get().id;
const WORLD = 'bbox=-180,-90,180,90';

async function expectFieldError(url: string, field: string) {
  const res = await ctx.agent().get(url);
  expect(res.status, url).toBe(400);
  expect(Object.keys(res.body.error.fields), url).toEqual([field]);
}

describe('empty numbers in query strings', () => {
  it('GET /api/atlas/near: an empty lat or lon is missing, an empty radiusKm takes its default', async () => {
    await expectFieldError('/api/atlas/near?lat=&lon=3', 'lat');
    await expectFieldError('/api/atlas/near?lat=45&lon=%20', 'lon');
    const res = await ctx.agent().get('/api/atlas/near?lat=45&lon=3&radiusKm=');
    expect(res.status).toBe(200);
    expect(res.body.radiusKm).toBe(100);
    expect(res.body.point).toEqual({ lat: 45, lon: 3 });
  });

  it('GET /api/varieties/:id/fit: the same', async () => {
    await expectFieldError(`/api/varieties/${variety}/fit?lat=&lon=3`, 'lat');
    await expectFieldError(`/api/varieties/${variety}/fit?lat=45&lon=`, 'lon');
    expect((await ctx.agent().get(`/api/varieties/${variety}/fit?lat=45&lon=3&radiusKm=`)).status).toBe(200);
  });

  it('GET /api/atlas/pins and /cell: an empty zoom or cell lat is missing, an empty filter is no filter', async () => {
    await expectFieldError(`/api/atlas/pins?${WORLD}&zoom=`, 'zoom');
    await expectFieldError('/api/atlas/pins?bbox=&zoom=3', 'bbox');
    await expectFieldError('/api/atlas/pins/cell?lat=&lon=3', 'lat');

    const grower = await ctx.signedIn('grower');
    const posted = await grower.post('/api/reports').send({ varietyId: variety, newTreeLabel: 'pins', lat: 45, lon: 3, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', firstRipeDate: '2024-08-20' });
    expect(posted.status).toBe(201);
    const total = async (query: string) => {
      const res = await ctx.agent().get(`/api/atlas/pins?${WORLD}&zoom=3${query}`);
      expect(res.status, query).toBe(200);
      return res.body.totalReports as number;
    };
    expect(await total('')).toBe(1);
    // Before: seasonFrom= was season >= 0 (harmless), varietyId= was variety 0 (nothing at all).
    expect(await total('&seasonFrom=&seasonTo=&varietyId=')).toBe(1);
    const cell = await ctx.agent().get(`/api/atlas/pins/cell?lat=${posted.body.report.gridLat}&lon=${posted.body.report.gridLon}&varietyId=`);
    expect(cell.status).toBe(200);
    expect(cell.body.total).toBe(1);
  });

  it('GET /api/reports and its exports: empty filters and paging are not given', async () => {
    const list = await ctx.agent().get('/api/reports?varietyId=&seasonFrom=%20&page=&pageSize=');
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ total: 1, page: 1, pageSize: 50 });
    const csv = await ctx.agent().get('/api/reports/export.csv?varietyId=&seasonTo=');
    expect(csv.status).toBe(200);
    expect(csv.text.trim().split('\n')).toHaveLength(2);
  });

  it('GET /api/guidance/*: empty required numbers are missing, empty optional ones take their default', async () => {
    await expectFieldError(`/api/guidance/ripe-dates?varietyId=${variety}&lat=&lon=3`, 'lat');
    await expectFieldError('/api/guidance/ripe-dates?varietyId=&lat=45&lon=3', 'varietyId');
    const dates = await ctx.agent().get(`/api/guidance/ripe-dates?varietyId=${variety}&lat=45&lon=3&radiusKm=`);
    expect(dates.status).toBe(200);
    expect(dates.body.radiusKm).toBe(100);
    await expectFieldError('/api/guidance/short-season?seasonDays=', 'seasonDays');
    expect((await ctx.agent().get('/api/guidance/short-season?seasonDays=150&toleranceDays=')).status).toBe(200);
    expect((await ctx.agent().get('/api/guidance/season-success?varietyId=&binDays=')).status).toBe(200);
  });

  it('GET /api/places: an empty limit takes its default', async () => {
    // The first search loads the gazetteer: slow on a busy machine.
    const res = await ctx.agent().get('/api/places?q=Al&limit=');
    expect(res.status).toBe(200);
    expect(res.body.places).toHaveLength(8);
  }, 60_000);

  it('editor lists: empty paging and id filters are not given', async () => {
    const editor = await ctx.signedIn('editor');
    const audit = await editor.get('/api/audit?actorId=&entityId=&limit=&offset=');
    expect(audit.status).toBe(200);
    expect(audit.body.total).toBeGreaterThan(0);
    expect((await editor.get('/api/varieties/catalogue?limit=&offset=')).status).toBe(200);
    expect((await editor.get('/api/moderation/queue?limit=&offset=')).status).toBe(200);
  });
});

describe('empty numbers in bodies, form fields and CSV cells', () => {
  it('POST and PATCH /api/saved-places: an empty lat or lon is a 400 naming it, never the equator', async () => {
    const grower = await ctx.signedIn('grower');
    const empty = await grower.post('/api/saved-places').send({ name: 'Allotment', lat: '', lon: ' ' });
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['lat', 'lon']);
    const made = await grower.post('/api/saved-places').send({ name: 'Allotment', lat: '45.5', lon: 3 });
    expect(made.status).toBe(201);
    const patch = await grower.patch(`/api/saved-places/${made.body.place.id}`).send({ lat: '' });
    expect(patch.status).toBe(400);
    expect(Object.keys(patch.body.error.fields)).toEqual(['lat']);
    expect((await grower.get('/api/saved-places')).body.places[0]).toMatchObject({ lat: 45.5, lon: 3 });
  });

  it('POST /api/reports/import: a blank required number names its cell; a blank optional one is absent', async () => {
    const grower = await ctx.signedIn('grower');
    const header = IMPORT_COLUMNS.map((c) => c.name);
    const row = (values: Record<string, string>) => header.map((name) => values[name] ?? '').join(',');
    const base = { variety: 'Blank Test Brown', lat: '44.1', lon: '4.1', form: 'ground', season: '2024', crop: 'main', outcome: 'unripe' };
    const bad = [header.join(','), row({ ...base, lat: '  ' }), row({ ...base, season: '' })].join('\n');
    const refused = await grower.post('/api/reports/import').attach('file', Buffer.from(bad), 'blank.csv');
    expect(refused.status).toBe(400);
    expect(Object.keys(refused.body.error.fields).sort()).toEqual(['rows.2.lat', 'rows.3.season']);

    const good = [header.join(','), row({ ...base, yearPlanted: ' ' })].join('\n');
    const imported = await grower.post('/api/reports/import').attach('file', Buffer.from(good), 'good.csv');
    expect(imported.status).toBe(201);
    const stored = ctx.db.select().from(reports).where(eq(reports.id, imported.body.reportIds[0])).get()!;
    expect(stored.yearPlanted).toBeNull();
  });

  it('POST /api/stations/upload: an empty elevation is not given, not 0 m', async () => {
    const editor = await ctx.signedIn('editor');
    const res = await editor
      .post('/api/stations/upload')
      .field('name', 'Blank Hill')
      .field('lat', '44.5')
      .field('lon', '4.5')
      .field('elevationM', ' ')
      .attach('file', Buffer.from('date,tmin_c\n2020-01-01,-3\n2020-12-31,-2\n', 'utf8'), { filename: 'blank.csv', contentType: 'text/csv' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const station = ctx.db.select().from(stations).where(eq(stations.name, 'Blank Hill')).get()!;
    expect(station.elevationM).toBeNull();
  });
});

describe('numbers written other than in plain decimals', () => {
  it('query strings: 0x10 and 1e3 are refused with the field named, not read as 16 or 1000', async () => {
    await expectFieldError('/api/atlas/near?lat=0x10&lon=3', 'lat');
    await expectFieldError('/api/atlas/near?lat=45&lon=3&radiusKm=1e2', 'radiusKm');
    await expectFieldError('/api/guidance/short-season?seasonDays=0xA0', 'seasonDays');
    await expectFieldError('/api/atlas/pins?bbox=0x10,-90,180,90&zoom=3', 'bbox');
  });

  it('path ids: digits only, so one record has one address ("0x10" and "1e1" are not 16 and 10)', async () => {
    for (const id of ['0x10', '1e1', '+1', '1.0', '-1', '0']) {
      await expectFieldError(`/api/reports/${id}`, 'id');
      await expectFieldError(`/api/varieties/${id}/page`, 'id');
    }
    expect((await ctx.agent().get(`/api/varieties/${variety}/page`)).status).toBe(200);
  });

  it('bodies and CSV cells: "0x10" is a 400 naming the field or cell', async () => {
    const grower = await ctx.signedIn('grower');
    const hex = await grower.post('/api/saved-places').send({ name: 'Hex', lat: '0x10', lon: '3' });
    expect(hex.status).toBe(400);
    expect(Object.keys(hex.body.error.fields)).toEqual(['lat']);
    const header = IMPORT_COLUMNS.map((c) => c.name);
    const row = (values: Record<string, string>) => header.map((name) => values[name] ?? '').join(',');
    const base = { variety: 'Blank Test Brown', lat: '44.1', lon: '4.1', form: 'ground', season: '2024', crop: 'main', outcome: 'unripe' };
    const csv = [header.join(','), row({ ...base, lat: '0x10' }), row({ ...base, season: '2.024e3' })].join('\n');
    const refused = await grower.post('/api/reports/import').attach('file', Buffer.from(csv), 'hex.csv');
    expect(refused.status).toBe(400);
    expect(Object.keys(refused.body.error.fields).sort()).toEqual(['rows.2.lat', 'rows.3.season']);
  });
});
