import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent } from '../helpers/test-app';

const DATA = path.resolve(import.meta.dirname, '../../server/seed/data');
const ALBANY = fs.readFileSync(path.join(DATA, 'ghcnd-USW00014735-daily.csv'), 'utf8');

/** The Albany GHCN-Daily rows of some years, with the file's own header. */
function albanyYears(from: number, to: number): string {
  const [header, ...lines] = ALBANY.split(/\r?\n/);
  return [header, ...lines.filter((line) => Number(line.slice(0, 4)) >= from && Number(line.slice(0, 4)) <= to)].join('\n');
}

const ALBANY_FIELDS = { name: 'Albany International Airport, NY', code: 'USW00014735', lat: '42.7431', lon: '-73.8092', elevationM: '85.6', unit: 'C' };

function upload(agent: TestAgent, csv: string, fields: Record<string, string> = ALBANY_FIELDS, fileName = 'albany.csv') {
  let request = agent.post('/api/stations/upload');
  for (const [key, value] of Object.entries(fields)) request = request.field(key, value);
  return request.attach('file', Buffer.from(csv, 'utf8'), { filename: fileName, contentType: 'text/csv' });
}

/** Day of year of a month/day in a common year. */
const doy = (month: number, day: number) => Math.round((Date.UTC(2021, month - 1, day) - Date.UTC(2021, 0, 1)) / 86_400_000) + 1;

describe('station upload', () => {
  it('stores the days, per-year freeze dates and the 10/50/90 % summaries, close to the NCEI normals', async () => {
    const { agent, signedIn, db } = createTestContext();
    const editor = await signedIn('editor');
    // 1991-2017: the 1991-2020 normals period as far as the file goes (it ends in April 2018).
    const res = await upload(editor, albanyYears(1991, 2017));
    expect(res.status).toBe(201);
    const { station, freezeYears, summaries } = res.body;
    expect(station).toMatchObject({ code: 'USW00014735', firstDate: '1991-01-01', lastDate: '2017-12-31', elevationM: 85.6 });
    expect(station.dayCount).toBeGreaterThan(9800);
    expect(summaries).toHaveLength(9); // 3 thresholds x 3 probabilities
    expect(freezeYears.filter((y: { thresholdF: number }) => y.thresholdF === 32).length).toBeGreaterThanOrEqual(25);

    const at32 = summaries.find((s: { thresholdF: number; probability: number }) => s.thresholdF === 32 && s.probability === 50);
    // NOAA NCEI U.S. Climate Normals 1991-2020, Albany International Airport USW00014735 (unverified
    // copy, see ../shared/CHECKS.md): 50 % last spring freeze at 32 F 04/27, first fall freeze 10/15.
    // Our quantiles are empirical, NCEI fits a distribution: within 5 days.
    expect(Math.abs(at32.lastSpringDoy - doy(4, 27))).toBeLessThanOrEqual(5);
    expect(Math.abs(at32.firstFallDoy - doy(10, 15))).toBeLessThanOrEqual(5);
    const at28 = summaries.find((s: { thresholdF: number; probability: number }) => s.thresholdF === 28 && s.probability === 50);
    // Same source: 50 % at 28 F, 04/16 and 10/28.
    expect(Math.abs(at28.lastSpringDoy - doy(4, 16))).toBeLessThanOrEqual(5);
    expect(Math.abs(at28.firstFallDoy - doy(10, 28))).toBeLessThanOrEqual(5);

    // Stored, not only answered: the tables hold the same rows, and the public list carries days50.
    const stored = db.sqlite.prepare('SELECT (SELECT count(*) FROM station_days) d, (SELECT count(*) FROM station_summaries) s, (SELECT count(*) FROM station_freeze_years) y').get() as { d: number; s: number; y: number };
    expect(stored).toEqual({ d: station.dayCount, s: 9, y: freezeYears.length });
    const list = await agent().get('/api/stations');
    expect(list.status).toBe(200);
    expect(list.body.stations).toEqual([expect.objectContaining({ id: station.id, days50: at32.seasonDays })]);
    const detail = await agent().get(`/api/stations/${station.id}`);
    expect(detail.body.summaries).toEqual(summaries);
  });

  it('reads a deg F year/month/day file (Milwaukee) with NA as missing', async () => {
    const { signedIn } = createTestContext();
    const editor = await signedIn('editor');
    const [header, ...lines] = fs.readFileSync(path.join(DATA, 'ghcnd-USW00014839-daily.csv'), 'utf8').split(/\r?\n/);
    const csv = [header, ...lines.filter((line) => line.startsWith('2010') || line.startsWith('2011'))].join('\n');
    const res = await upload(editor, csv, { name: 'Milwaukee', code: 'USW00014839', lat: '42.955', lon: '-87.904', unit: '' });
    expect(res.status).toBe(201);
    expect(res.body.station.dayCount).toBeGreaterThan(700);
    // A Milwaukee July night is far above freezing: the deg F values were converted to deg C.
    expect(res.body.freezeYears.find((y: { thresholdF: number; year: number }) => y.thresholdF === 32 && y.year === 2010).lastSpringDoy).toBeLessThan(doy(6, 1));
  });

  it('rejects a file with a bad row, naming the row and column, and keeps the earlier data', async () => {
    const { signedIn, db } = createTestContext();
    const editor = await signedIn('editor');
    const first = await upload(editor, albanyYears(2000, 2005));
    expect(first.status).toBe(201);
    const before = first.body;

    const lines = albanyYears(2006, 2010).split('\n');
    lines[5] = lines[5]!.replace(/^(\d{4},\d{2},\d{2},\s*[-\d.]+,)\s*[-\d.]+/, '$1 warm'); // row 6: TMIN not a number
    const second = await upload(editor, lines.join('\n'));
    expect(second.status).toBe(400);
    expect(second.body.error.code).toBe('invalid_csv');
    expect(second.body.error.fields.file).toEqual(['Row 6, column TMIN: “warm” is not a number.']);

    const after = await editor.get(`/api/stations/${before.station.id}`);
    expect(after.body).toEqual(before);
    expect(db.sqlite.prepare('SELECT count(*) n FROM stations').get()).toEqual({ n: 1 });
    const audits = db.sqlite.prepare("SELECT action FROM audit_log WHERE entity_type = 'station'").all();
    expect(audits).toEqual([{ action: 'station.create' }]);
  });

  it('replaces a station uploaded again with the same code, and audits both', async () => {
    const { signedIn, db } = createTestContext();
    const editor = await signedIn('editor');
    const first = await upload(editor, albanyYears(2000, 2005));
    const second = await upload(editor, albanyYears(2010, 2012), { ...ALBANY_FIELDS, name: 'Albany airport' });
    expect(second.status).toBe(201);
    expect(second.body.station).toMatchObject({ id: first.body.station.id, name: 'Albany airport', firstDate: '2010-01-01', lastDate: '2012-12-31' });
    expect(db.sqlite.prepare('SELECT min(date) d FROM station_days').get()).toEqual({ d: '2010-01-01' });
    const audits = db.sqlite.prepare("SELECT action, actor_id AS actorId FROM audit_log WHERE entity_type = 'station' ORDER BY id").all();
    expect(audits).toEqual([
      { action: 'station.create', actorId: editor.userId },
      { action: 'station.replace', actorId: editor.userId },
    ]);
  });

  it('names bad form fields and a missing file', async () => {
    const { signedIn } = createTestContext();
    const editor = await signedIn('editor');
    const res = await upload(editor, 'date,tmin_c\n2020-01-01,-3', { name: '', lat: '91', lon: 'east', unit: 'K' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['lat', 'lon', 'name', 'unit']);
    // Empty coordinates are missing, not 0.
    const empty = await upload(editor, 'date,tmin_c\n2020-01-01,-3', { name: 'No place', lat: '', lon: ' ' });
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['lat', 'lon']);
    const noFile = await editor.post('/api/stations/upload').field('name', 'X').field('lat', '1').field('lon', '1');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.fields).toHaveProperty('file');
  });

  it('keeps uploads and deletes to editors: 401 signed out, 403 for a grower', async () => {
    const { agent, signedIn, db } = createTestContext();
    const csv = albanyYears(2000, 2001);
    expect((await upload(agent(), csv)).status).toBe(401);
    const grower = await signedIn('grower');
    expect((await upload(grower, csv)).status).toBe(403);
    const editor = await signedIn('editor');
    const created = await upload(editor, csv);
    const id = created.body.station.id;
    expect((await agent().delete(`/api/stations/${id}`)).status).toBe(401);
    expect((await grower.delete(`/api/stations/${id}`)).status).toBe(403);
    // Reads are public.
    expect((await agent().get(`/api/stations/${id}`)).status).toBe(200);

    const admin = await signedIn('admin');
    expect((await admin.delete(`/api/stations/${id}`)).status).toBe(204);
    expect((await agent().get(`/api/stations/${id}`)).status).toBe(404);
    expect(db.sqlite.prepare('SELECT count(*) n FROM station_days').get()).toEqual({ n: 0 });
    expect(db.sqlite.prepare("SELECT action, actor_id AS actorId FROM audit_log WHERE action = 'station.delete'").all()).toEqual([{ action: 'station.delete', actorId: admin.userId }]);
  });
});
