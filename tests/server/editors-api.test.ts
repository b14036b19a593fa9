import { beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';
import { seedDatabase } from '../../server/seed';

/*
 * The editors' API end to end on a real temporary SQLite with the demo seed: role boundaries,
 * the catalogue (merge, review, CSV), wasp areas, moderation and the audit log.
 */

let ctx: TestContext;
let editor: TestAgent & { userId: number };
let grower: TestAgent & { userId: number };

beforeAll(async () => {
  ctx = createTestContext();
  await seedDatabase(ctx.db, { seedDemo: true });
  [editor, grower] = await Promise.all([ctx.signedIn('editor'), ctx.signedIn('grower')]);
}, 120_000); // the demo seed loads real station data: slow on a busy machine

const sql = <T>(query: string, ...params: unknown[]) => ctx.db.sqlite.prepare(query).get(...params) as T;
const varietyId = (name: string) => sql<{ id: number }>('SELECT id FROM varieties WHERE name = ?', name).id;
const auditFor = (action: string, entityId?: number) =>
  ctx.db.sqlite.prepare(`SELECT * FROM audit_log WHERE action = ? ${entityId ? 'AND entity_id = ?' : ''} ORDER BY id DESC`).all(...(entityId ? [action, entityId] : [action])) as { actor_id: number; before: string | null; after: string | null }[];

const square = (lon: number, lat: number, size = 0.3) => ({
  type: 'Polygon',
  coordinates: [[[lon, lat], [lon + size, lat], [lon + size, lat + size], [lon, lat + size], [lon, lat]]],
});
const validVariety = { name: 'Testfield Brown', synonyms: ['TF Brown'], figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 150, notes: 'Test entry', sources: 'Test handbook, p. 1' };

describe('role boundaries on every editor route', () => {
  const routes: [method: 'get' | 'post' | 'patch', url: string, body?: object][] = [
    ['get', '/api/varieties/catalogue'],
    ['get', '/api/varieties/export.csv'],
    ['post', '/api/varieties/import', { csv: 'name\nx' }],
    ['post', '/api/varieties', validVariety],
    ['patch', '/api/varieties/1', validVariety],
    ['post', '/api/varieties/1/accept', validVariety],
    ['post', '/api/varieties/1/reject', { reason: 'Not a variety name' }],
    ['post', '/api/varieties/1/merge', { intoId: 2 }],
    ['get', '/api/wasp-areas/records'],
    ['get', '/api/wasp-areas/records/1'],
    ['post', '/api/wasp-areas', { name: 'x', source: 'y', observedOn: '2024-01-01', geometry: square(0, 0) }],
    ['patch', '/api/wasp-areas/1', { name: 'Renamed' }],
    ['post', '/api/wasp-areas/1/retire'],
    ['get', '/api/moderation/queue'],
    ['get', '/api/moderation/summary'],
    ['post', '/api/reports/1/hide', { reason: 'Looks invented' }],
    ['post', '/api/reports/1/restore'],
    ['post', '/api/moderation/reports/1/reviewed'],
    ['post', '/api/moderation/flags/1/clear'],
    ['get', '/api/audit'],
  ];

  it.each(routes)('%s %s: 401 for a visitor, 403 for a grower, and nothing written', async (method, url, body) => {
    const auditBefore = sql<{ n: number }>('SELECT count(*) n FROM audit_log').n;
    const visitor = ctx.agent();
    const asVisitor = body ? await visitor[method](url).send(body) : await visitor[method](url);
    expect(asVisitor.status).toBe(401);
    const asGrower = body ? await grower[method](url).send(body) : await grower[method](url);
    expect(asGrower.status).toBe(403);
    expect(sql<{ n: number }>('SELECT count(*) n FROM audit_log').n).toBe(auditBefore);
  });

  it('lets an editor read the catalogue, the queue and the log', async () => {
    for (const url of ['/api/varieties/catalogue', '/api/moderation/queue', '/api/audit', '/api/wasp-areas/records']) {
      expect((await editor.get(url)).status).toBe(200);
    }
  });
});

describe('variety catalogue', () => {
  it('creates a variety, audits it, and refuses a name already taken (as a synonym too)', async () => {
    const res = await editor.post('/api/varieties').send(validVariety);
    expect(res.status).toBe(201);
    expect(res.body.variety).toMatchObject({ name: 'Testfield Brown', synonyms: ['TF Brown'], status: 'accepted' });
    const [entry] = auditFor('variety.create', res.body.variety.id);
    expect(entry!.actor_id).toBe(editor.userId);
    expect(JSON.parse(entry!.after!)).toMatchObject({ name: 'Testfield Brown' });

    const clash = await editor.post('/api/varieties').send({ ...validVariety, name: 'tf brown', synonyms: [] });
    expect(clash.status).toBe(409);
    expect(clash.body.error.fields.name[0]).toMatch(/already used/);
  });

  it('asks for a source when claims are made, naming the field', async () => {
    const res = await editor.post('/api/varieties').send({ ...validVariety, name: 'No Source Fig', sources: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('sources');
  });

  it('edits a variety with before and after in the audit log', async () => {
    const id = varietyId('Testfield Brown');
    const res = await editor.patch(`/api/varieties/${id}`).send({ ...validVariety, ripeningClass: 'late', synonyms: ['TF Brown', 'Brownie'] });
    expect(res.status).toBe(200);
    const [entry] = auditFor('variety.update', id);
    expect(JSON.parse(entry!.before!)).toMatchObject({ ripeningClass: 'mid', synonyms: ['TF Brown'] });
    expect(JSON.parse(entry!.after!)).toMatchObject({ ripeningClass: 'late', synonyms: ['Brownie', 'TF Brown'] });
  });

  it('merges a proposed name into an existing variety without losing a report or a name', async () => {
    const from = varietyId('Amber Lanterne');
    const into = varietyId('Lantern Amber');
    const count = (id: number) => sql<{ n: number }>('SELECT count(*) n FROM reports WHERE variety_id = ?', id).n;
    const totalBefore = sql<{ n: number }>('SELECT count(*) n FROM reports').n;
    const fromBefore = count(from);
    const intoBefore = count(into);
    expect(fromBefore).toBeGreaterThan(0);

    const res = await editor.post(`/api/varieties/${from}/merge`).send({ intoId: into });
    expect(res.status).toBe(200);
    expect(res.body.movedReports).toBe(fromBefore);
    expect(count(from)).toBe(0);
    expect(count(into)).toBe(intoBefore + fromBefore);
    expect(sql<{ n: number }>('SELECT count(*) n FROM reports').n).toBe(totalBefore);
    // the kept variety keeps its own synonym and gains the merged name
    expect(res.body.kept.synonyms).toEqual(['Amber Lantern', 'Amber Lanterne']);
    expect(sql('SELECT status, merged_into_id FROM varieties WHERE id = ?', from)).toEqual({ status: 'merged', merged_into_id: into });
    const [entry] = auditFor('variety.merge', from);
    expect(JSON.parse(entry!.after!)).toMatchObject({ movedReports: fromBefore, kept: { id: into } });
    // the public search now finds the kept variety by the merged name
    const search = await ctx.agent().get('/api/varieties?q=lanterne');
    expect(search.body.varieties.map((v: { name: string }) => v.name)).toEqual(['Lantern Amber']);
  });

  it('moves the merged variety’s own synonyms over too', async () => {
    const a = (await editor.post('/api/varieties').send({ ...validVariety, name: 'Merge Source', synonyms: ['Source Alias'] })).body.variety.id;
    const b = (await editor.post('/api/varieties').send({ ...validVariety, name: 'Merge Target', synonyms: [] })).body.variety.id;
    const res = await editor.post(`/api/varieties/${a}/merge`).send({ intoId: b });
    expect(res.body.kept.synonyms).toEqual(['Merge Source', 'Source Alias']);
    expect((await editor.post(`/api/varieties/${b}/merge`).send({ intoId: b })).status).toBe(400);
  });

  it('accepts a proposed name with the editor’s details, or rejects one with a reason', async () => {
    const proposed = varietyId('Brambleford Speckled');
    const reject = await editor.post(`/api/varieties/${proposed}/reject`).send({ reason: 'A local name for an unknown seedling; no record.' });
    expect(reject.status).toBe(200);
    expect(sql('SELECT status, review_note FROM varieties WHERE id = ?', proposed)).toEqual({ status: 'rejected', review_note: 'A local name for an unknown seedling; no record.' });
    // the grower's report keeps its link
    expect(sql<{ n: number }>('SELECT count(*) n FROM reports WHERE variety_id = ?', proposed).n).toBeGreaterThan(0);
    expect(auditFor('variety.reject', proposed)).toHaveLength(1);

    const accept = await editor.post(`/api/varieties/${proposed}/accept`).send({ ...validVariety, name: 'Brambleford Speckled', synonyms: [] });
    expect(accept.status).toBe(200);
    expect(accept.body.variety).toMatchObject({ status: 'accepted', figType: 'common', typicalDaysToRipen: 150 });
    expect(JSON.parse(auditFor('variety.accept', proposed)[0]!.before!)).toMatchObject({ status: 'rejected' });
  });

  it('lists every status with server-side pagination, sorting and filters', async () => {
    const page = await editor.get('/api/varieties/catalogue?limit=3&offset=0&sort=reportCount&dir=desc');
    expect(page.body.items).toHaveLength(3);
    expect(page.body.total).toBeGreaterThan(8);
    const counts = page.body.items.map((v: { reportCount: number }) => v.reportCount);
    expect(counts).toEqual([...counts].sort((x, y) => y - x));
    const merged = await editor.get('/api/varieties/catalogue?status=merged&q=lanterne');
    expect(merged.body.items.map((v: { name: string; mergedIntoName: string }) => [v.name, v.mergedIntoName])).toEqual([['Amber Lanterne', 'Lantern Amber']]);
  });

  it('imports a CSV all or nothing, naming each bad row and column', async () => {
    const header = 'name,synonyms,figType,bearsBreba,bearsMain,ripeningClass,typicalDaysToRipen,notes,sources';
    const before = sql<{ n: number }>('SELECT count(*) n FROM varieties').n;
    const bad = [header, 'Import Alpha,,common,false,true,early,120,,Source A', 'Import Beta,,not-a-type,false,true,,,,'].join('\n');
    const refused = await editor.post('/api/varieties/import').send({ csv: bad });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields).toHaveProperty(['row 3.figType']);
    expect(sql<{ n: number }>('SELECT count(*) n FROM varieties').n).toBe(before);

    // a clash found only in the database (the synonym of an existing variety) also rolls back every row
    const clash = [header, 'Import Alpha,,common,false,true,early,120,,Source A', 'Import Gamma,Amber Lantern,common,false,true,,,,Source G'].join('\n');
    const refused2 = await editor.post('/api/varieties/import').send({ csv: clash });
    expect(refused2.status).toBe(400);
    expect(refused2.body.error.fields['row 3.synonyms'][0]).toMatch(/“Amber Lantern” already names variety/);
    expect(sql<{ n: number }>('SELECT count(*) n FROM varieties').n).toBe(before);

    const good = [header, 'Import Alpha,,common,false,true,early,120,,Source A', 'Testfield Brown,TF Brown,common,false,true,late,160,,Test handbook p. 2'].join('\n');
    const ok = await editor.post('/api/varieties/import').send({ csv: good });
    expect(ok.body).toEqual({ created: 1, updated: 1 });
    expect(sql('SELECT typical_days_to_ripen d FROM varieties WHERE name = ?', 'Testfield Brown')).toEqual({ d: 160 });
    expect(auditFor('variety.import')).toHaveLength(1);
    expect(auditFor('variety.import-create')).toHaveLength(1);
  });

  it('exports accepted varieties as CSV', async () => {
    const res = await editor.get('/api/varieties/export.csv');
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text.split('\r\n');
    expect(lines[0]).toBe('name,synonyms,figType,bearsBreba,bearsMain,ripeningClass,typicalDaysToRipen,notes,sources');
    // Text cells are quoted, booleans bare (shared/domain/spreadsheet-csv.ts).
    expect(res.text).toContain('"Lantern Amber","Amber Lantern; Amber Lanterne","common",');
    expect(res.text).not.toContain('\n"Amber Lanterne",');
  });
});

describe('wasp areas', () => {
  let id: number;

  it('creates an area from a GeoJSON Feature, storing its bounding box, and audits it', async () => {
    const res = await editor.post('/api/wasp-areas').send({ name: 'Test basin', source: 'Test survey', observedOn: '2025-06-01', geometry: { type: 'Feature', properties: {}, geometry: square(-100, 30) } });
    expect(res.status).toBe(201);
    id = res.body.area.id;
    expect(res.body.area).toMatchObject({ status: 'active', vertexCount: 5, geometry: square(-100, 30) });
    expect(sql('SELECT min_lat, max_lat, min_lon, max_lon FROM wasp_areas WHERE id = ?', id)).toEqual({ min_lat: 30, max_lat: 30.3, min_lon: -100, max_lon: -99.7 });
    expect(JSON.parse(auditFor('wasp-area.create', id)[0]!.after!)).toMatchObject({ name: 'Test basin', source: 'Test survey' });
    const pub = await ctx.agent().get('/api/wasp-areas');
    expect(pub.body.features.map((f: { properties: { name: string } }) => f.properties.name)).toContain('Test basin');
  });

  it('answers 400 naming each geometry problem and the missing source and date', async () => {
    const open = await editor.post('/api/wasp-areas').send({ name: 'Open', source: 'Test survey', observedOn: '2025-06-01', geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1]]] } });
    expect(open.status).toBe(400);
    expect(open.body.error.fields.geometry).toEqual(['The outer ring of the polygon is not closed: its last position must repeat its first']);
    const bowTie = await editor.post('/api/wasp-areas').send({ name: 'Bow', source: 'Test survey', observedOn: '2025-06-01', geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 1], [1, 0], [0, 1], [0, 0]]] } });
    expect(bowTie.body.error.fields.geometry[0]).toMatch(/crosses itself/);
    const missing = await editor.post('/api/wasp-areas').send({ name: 'No source', geometry: square(0, 0) });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['observedOn', 'source']);
  });

  it('edits name and geometry, recording both outlines in the audit entry', async () => {
    const res = await editor.patch(`/api/wasp-areas/${id}`).send({ name: 'Test basin (west)', geometry: square(-101, 30) });
    expect(res.status).toBe(200);
    expect(sql('SELECT name, min_lon FROM wasp_areas WHERE id = ?', id)).toEqual({ name: 'Test basin (west)', min_lon: -101 });
    const [entry] = auditFor('wasp-area.update', id);
    expect(JSON.parse(entry!.before!)).toMatchObject({ name: 'Test basin', geometry: square(-100, 30) });
    expect(JSON.parse(entry!.after!)).toMatchObject({ name: 'Test basin (west)', geometry: square(-101, 30) });
  });

  it('refuses an edit with unknown keys or nothing to change, naming why', async () => {
    const unknown = await editor.patch(`/api/wasp-areas/${id}`).send({ colour: 'red' });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error.fields)).toMatch(/colour/);
    const empty = await editor.patch(`/api/wasp-areas/${id}`).send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields._[0]).toMatch(/Nothing to change/);
  });

  it('retires an area: it leaves the public map but stays in the history list', async () => {
    const res = await editor.post(`/api/wasp-areas/${id}/retire`);
    expect(res.body.area).toMatchObject({ status: 'retired' });
    expect(res.body.area.retiredAt).toBeTruthy();
    const pub = await ctx.agent().get('/api/wasp-areas');
    expect(pub.body.features.map((f: { id: number }) => f.id)).not.toContain(id);
    const history = await editor.get('/api/wasp-areas/records?status=retired');
    expect(history.body.items.map((a: { name: string }) => a.name)).toEqual(expect.arrayContaining(['Test basin (west)', 'Old river-mouth orchards (demo, retired)']));
    expect(JSON.parse(auditFor('wasp-area.retire', id)[0]!.before!)).toMatchObject({ status: 'active' });
    expect((await editor.post(`/api/wasp-areas/${id}/retire`)).status).toBe(409);
  });
});

describe('moderation', () => {
  it('lists the demo’s flagged and suspicious reports, paginated', async () => {
    const all = await editor.get('/api/moderation/queue?kind=all&limit=50');
    expect(all.body.total).toBeGreaterThanOrEqual(4);
    const flagged = await editor.get('/api/moderation/queue?kind=flagged');
    expect(flagged.body.items.every((i: { flags: unknown[] }) => i.flags.length > 0)).toBe(true);
    const suspicious = await editor.get('/api/moderation/queue?kind=suspicious&rule=too-early');
    expect(suspicious.body.items[0].suspicions[0].message).toMatch(/First ripe 66 days after the spring frost; Solstice Green/);
    const page = await editor.get('/api/moderation/queue?kind=all&limit=1&offset=1');
    expect(page.body.items).toHaveLength(1);
    expect(page.body.items[0].report.id).toBe(all.body.items[1].report.id);
  });

  it('hides a flagged report with a reason (flags actioned, through the reports API), lists it as hidden, then restores it', async () => {
    const flagged = (await editor.get('/api/moderation/queue?kind=flagged')).body.items[0];
    const reportId = flagged.report.id;
    const hide = await editor.post(`/api/reports/${reportId}/hide`).send({ reason: 'The photo is of a different tree.' });
    expect(hide.status).toBe(200);
    expect(sql('SELECT status, hidden_reason FROM reports WHERE id = ?', reportId)).toEqual({ status: 'hidden', hidden_reason: 'The photo is of a different tree.' });
    expect(sql<{ n: number }>("SELECT count(*) n FROM report_flags WHERE report_id = ? AND status = 'open'", reportId).n).toBe(0);
    const hidden = await editor.get('/api/moderation/queue?kind=hidden');
    expect(hidden.body.items.map((i: { report: { id: number } }) => i.report.id)).toContain(reportId);
    expect(JSON.parse(auditFor('report.hide', reportId)[0]!.after!)).toMatchObject({ status: 'hidden', hiddenReason: 'The photo is of a different tree.' });

    const restore = await editor.post(`/api/reports/${reportId}/restore`);
    expect(restore.body.report).toMatchObject({ status: 'published', hiddenReason: null });
    expect(JSON.parse(auditFor('report.restore', reportId)[0]!.before!)).toMatchObject({ status: 'hidden' });
    expect((await editor.post(`/api/reports/${reportId}/hide`).send({ reason: 'x' })).status).toBe(400);
  });

  it('clears a flag and marks a suspicious report as reviewed, each audited', async () => {
    const summaryBefore = (await editor.get('/api/moderation/summary')).body;
    const flag = sql<{ id: number }>("SELECT id FROM report_flags WHERE status = 'open' LIMIT 1");
    expect((await editor.post(`/api/moderation/flags/${flag.id}/clear`)).status).toBe(200);
    expect(sql('SELECT status, resolved_by_id FROM report_flags WHERE id = ?', flag.id)).toEqual({ status: 'cleared', resolved_by_id: editor.userId });
    expect(JSON.parse(auditFor('flag.clear', flag.id)[0]!.before!)).toMatchObject({ status: 'open' });

    const suspicious = (await editor.get('/api/moderation/queue?kind=suspicious')).body.items[0].report.id;
    expect((await editor.post(`/api/moderation/reports/${suspicious}/reviewed`)).status).toBe(204);
    const after = (await editor.get('/api/moderation/summary')).body;
    expect(after.openFlags).toBe(summaryBefore.openFlags - 1);
    expect(after.suspiciousReports).toBe(summaryBefore.suspiciousReports - 1);
    expect(JSON.parse(auditFor('report.reviewed', suspicious)[0]!.before!).suspicions.length).toBeGreaterThan(0);
  });
});

describe('audit log', () => {
  it('filters by action, entity type, actor and date, newest first, paginated', async () => {
    const all = await editor.get('/api/audit?limit=5');
    expect(all.body.items).toHaveLength(5);
    expect(all.body.total).toBeGreaterThan(10);
    expect(all.body.facets.actions).toEqual(expect.arrayContaining(['variety.merge', 'wasp-area.retire', 'report.hide', 'flag.clear']));
    const merges = await editor.get('/api/audit?action=variety.merge');
    expect(merges.body.items.every((e: { action: string }) => e.action === 'variety.merge')).toBe(true);
    expect(merges.body.items[0].actor).toMatch(/^Test editor/);
    const areas = await editor.get(`/api/audit?entityType=wasp-area&actorId=${editor.userId}`);
    expect(areas.body.total).toBe(3);
    const today = new Date().toISOString().slice(0, 10);
    expect((await editor.get(`/api/audit?from=${today}&to=${today}`)).body.total).toBe(all.body.total);
    expect((await editor.get('/api/audit?to=2000-01-01')).body.total).toBe(0);
    const ids = all.body.items.map((e: { id: number }) => e.id);
    expect(ids).toEqual([...ids].sort((a: number, b: number) => b - a));
  });
});
