import fs from 'node:fs';
import path from 'node:path';
import { zipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SHIPPED_NORMALS_DIR } from '../../server/normals/normals.repo';
import { dayOfYear } from '../../shared/domain/frost';
import { bulkImportLineSchema, normalsStationSchema, stationDetailSchema, type BulkImportLine } from '../../shared/schemas/stations';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';

/*
 * Editors' bulk imports (POST /api/stations/bulk): the three layouts, progress per station, all or
 * nothing per set, the summary and the audit entry. Real NOAA files where the layout is NOAA's own:
 * the shipped 1981-2010 normals (server/normals/data) and Albany's GHCN-Daily record (server/seed/data).
 */
const doy = (mmdd: string) => dayOfYear(`2001-${mmdd}`)!;
const lines = (text: string): BulkImportLine[] => text.trim().split('\n').map((l) => bulkImportLineSchema.parse(JSON.parse(l)));
const counts = (ctx: TestContext) => ctx.db.sqlite.prepare('SELECT (SELECT count(*) FROM stations) s, (SELECT count(*) FROM normals_stations) n, (SELECT count(*) FROM station_days) d').get();

/** The 1991-2020 per-station CSV layout with Albany's values (NOAA NCEI 1991-2020 normals, unverified copy, shared/CHECKS.md). */
const ALBANY_1991_2020 = [
  'STATION,DATE,LATITUDE,LONGITUDE,ELEVATION,NAME,ANN-TMIN-PRBLST-T32FP50,ANN-TMIN-PRBLST-T32FP90,ANN-TMIN-PRBFST-T32FP50,ANN-TMIN-PRBFST-T32FP90,ANN-TMIN-PRBGSL-T32FP50,ANN-GRDD-BASE50',
  'USW00014735,ANN,42.7431,-73.8092,85.6,"ALBANY INTERNATIONAL AIRPORT, NY US",0427,0416,1015,1101,169,2886.3',
].join('\n');

describe('bulk imports of stations', () => {
  let ctx: TestContext;
  let editor: TestAgent;
  beforeAll(async () => {
    ctx = createTestContext();
    editor = await ctx.signedIn('editor');
  });
  afterAll(() => ctx.db.sqlite.close());

  const send = (files: { name: string; content: Buffer | string }[], fields: Record<string, string> = {}) => {
    let req = editor.post('/api/stations/bulk');
    for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
    for (const f of files) req = req.attach('files', Buffer.from(f.content), f.name);
    return req;
  };

  it('takes a normals file set in the fixed-width layout, in a zip, with a line per station and a summary', async () => {
    const zip = zipSync(Object.fromEntries(fs.readdirSync(SHIPPED_NORMALS_DIR).filter((f) => f.endsWith('.txt')).map((f) => [`normals/${f}`, new Uint8Array(fs.readFileSync(path.join(SHIPPED_NORMALS_DIR, f)))])));
    const res = await send([{ name: 'normals-1981-2010.zip', content: Buffer.from(zip) }]).expect(200);
    expect(res.headers['content-type']).toMatch(/ndjson/);
    const all = lines(res.text);
    expect(all.filter((l) => l.type === 'progress')).toHaveLength(7501);
    const summary = all.at(-1)!;
    expect(summary).toMatchObject({ type: 'summary', summary: { kind: 'normals-fixed-width', release: '1981-2010', added: 7501, replaced: 0, refused: 0 } });
    const albany = normalsStationSchema.parse((await ctx.agent().get('/api/stations/normals/USW00014735')).body);
    // NOAA NCEI 1981-2010 normals, Albany (server/normals/data/ncei-normals-1981-2010/README.md).
    expect(albany).toMatchObject({ lastSpringDoy50: doy('04-28'), firstFallDoy50: doy('10-10'), seasonDays50: 163, gdd50F: 2649 });
    const audit = ctx.db.sqlite.prepare(`SELECT actor_id, "after" AS after_json FROM audit_log WHERE action = 'stations.bulk-import'`).all() as { actor_id: number; after_json: string }[];
    expect(audit).toHaveLength(1);
    expect(JSON.parse(audit[0]!.after_json)).toMatchObject({ kind: 'normals-fixed-width', added: 7501 });
  }, 60_000);

  it('takes 1991-2020 per-station CSVs: the newer release replaces the station', async () => {
    const res = await send([{ name: "USW00014735.csv", content: ALBANY_1991_2020 }]).expect(200);
    expect(lines(res.text).at(-1)).toMatchObject({ type: 'summary', summary: { kind: 'normals-csv', release: '1991-2020', added: 0, replaced: 1, refused: 0 } });
    const albany = normalsStationSchema.parse((await ctx.agent().get('/api/stations/normals/USW00014735')).body);
    expect(albany).toMatchObject({ release: '1991-2020', lastSpringDoy50: doy('04-27'), lastSpringDoy90: doy('04-16'), firstFallDoy50: doy('10-15'), firstFallDoy90: doy('11-01'), seasonDays50: 169, gdd50F: 2886.3 });
    // The older 1981-2010 set again: Albany is refused (kept at 1991-2020), the rest replaced.
    const again = await send(fs.readdirSync(SHIPPED_NORMALS_DIR).filter((f) => f.endsWith('.txt')).map((f) => ({ name: f, content: fs.readFileSync(path.join(SHIPPED_NORMALS_DIR, f)) }))).expect(200);
    const summary = lines(again.text).at(-1)!;
    expect(summary).toMatchObject({ type: 'summary', summary: { replaced: 7500, refused: 1 } });
    if (summary.type === 'summary') expect(summary.summary.stations.find((s) => s.status === 'refused')).toMatchObject({ code: 'USW00014735', reason: expect.stringContaining('newer') });
  }, 60_000);

  it('takes a zip of GHCN-Daily station files with their inventory', async () => {
    const albanyDays = fs.readFileSync(new URL('../../server/seed/data/ghcnd-USW00014735-daily.csv', import.meta.url), 'utf8').split('\n');
    const recent = [albanyDays[0], ...albanyDays.filter((l) => /^\d{4}/.test(l) && l.slice(0, 4) >= '2000')].join('\n');
    const inventory = 'USW00014735  42.7431  -73.8092   85.6 NY ALBANY INTL AP                          HCN 72518\n';
    const zip = zipSync({ 'ghcnd-stations.txt': new TextEncoder().encode(inventory), 'USW00014735.csv': new TextEncoder().encode(recent) });
    const res = await send([{ name: 'ghcnd.zip', content: Buffer.from(zip) }]).expect(200);
    const all = lines(res.text);
    expect(all[0]).toMatchObject({ type: 'progress', code: 'USW00014735', index: 1, total: 1, status: 'read' });
    expect(all.at(-1)).toMatchObject({ type: 'summary', summary: { kind: 'ghcn-daily', added: 1, replaced: 0, refused: 0 } });
    const list = (await ctx.agent().get('/api/stations')).body.stations as { id: number; code: string; name: string; firstDate: string }[];
    const station = list.find((s) => s.code === 'USW00014735')!;
    expect(station).toMatchObject({ name: 'ALBANY INTL AP, NY', firstDate: '2000-01-01' });
    // The record stops on 2018-04-25: 2018 is left out of the summaries, and its row says why.
    const detail = stationDetailSchema.parse((await ctx.agent().get(`/api/stations/${station.id}`)).body);
    const y2018 = detail.freezeYears.find((y) => y.year === 2018 && y.thresholdF === 32)!;
    expect(y2018.leftOutReason).toMatch(/^\d+ days missing in spring after the last freeze and \d+ days missing in fall/);
    expect(detail.freezeYears.find((y) => y.year === 2010 && y.thresholdF === 32)!.leftOutReason).toBeNull();
    expect(detail.summaries.find((s) => s.thresholdF === 32 && s.probability === 50)!.years).toBe(18);
  }, 60_000);

  it('writes nothing when one file of the set is bad, and names it', async () => {
    const before = counts(ctx);
    const bad = ALBANY_1991_2020.replace('USW00014735,ANN,42.7431', 'USW00099999,ANN,north');
    const res = await send([
      { name: 'good.csv', content: ALBANY_1991_2020.replaceAll('USW00014735', 'USW00088888') },
      { name: 'bad.csv', content: bad },
    ]).expect(200);
    const last = lines(res.text).at(-1)!;
    expect(last).toMatchObject({ type: 'failed', status: 400 });
    if (last.type === 'failed') expect(last.problems.join(' ')).toContain('bad.csv, column LATITUDE');
    expect(counts(ctx)).toEqual(before);
    expect((await ctx.agent().get('/api/stations/normals/USW00088888')).status).toBe(404);
  });

  it('refuses a set it does not know before reading it, naming the field', async () => {
    const res = await send([{ name: 'notes.txt', content: 'hello' }]).expect(400);
    expect(res.body.error.fields.files[0]).toContain('not a set the atlas knows');
    const none = await editor.post('/api/stations/bulk').field('release', '1991-2020').expect(400);
    expect(none.body.error.fields.files).toBeDefined();
  });
});
