import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';
import { listRoutes, validReportBody } from './reliability/helpers';

/*
 * Drafts stay private (issue 15 item 4): a draft's proposed variety name, notes and tree label are
 * seen by its author (and editors' tools) only, and count nowhere public, until it is published.
 * The draft is written through the API by a grower whose address is not verified yet (the app's
 * way to a draft); every public GET route without parameters (read from the router) and the
 * public routes that take a variety, a place or a report are searched for its text.
 */

const SECRET = { name: 'Quietgarden Blush 7Q (fictional)', notes: 'draft-note-7Q3', tree: 'draft-tree-7Q3' };
const HERE = { lat: 42.6512, lon: -73.7561 };

let ctx: TestContext;
let author: TestAgent & { userId: number };
let other: TestAgent;
let editor: TestAgent;
let acceptedId = 0;
let draftId = 0;
let proposedId = 0;

beforeAll(async () => {
  ctx = createTestContext();
  acceptedId = Number(ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Draftcheck Amber (fictional)', 'common', 'accepted')").run().lastInsertRowid);
  author = await ctx.signedIn('grower');
  other = await ctx.signedIn('grower');
  editor = await ctx.signedIn('editor');
  ctx.db.sqlite.prepare('UPDATE users SET email_verified_at = NULL WHERE id = ?').run(author.userId);
  const res = await author.post('/api/reports').send({
    ...validReportBody(acceptedId, { ...HERE, outcome: 'ripened', firstRipeDate: '2024-08-20', notes: SECRET.notes, newTreeLabel: SECRET.tree }),
    varietyId: null,
    proposedVarietyName: SECRET.name,
  });
  expect(res.status, res.text).toBe(201);
  expect(res.body.report.status).toBe('draft');
  draftId = res.body.report.id;
  proposedId = res.body.report.variety.id;
});
afterAll(() => ctx.db.sqlite.close());

/** Every public answer a visitor or another grower can ask for about this atlas. */
async function publicTexts(agent: TestAgent): Promise<string[]> {
  const bare = listRoutes(ctx.app).filter((r) => r.startsWith('GET ') && !/[:*]/.test(r) && !r.startsWith('GET /api/dev/mail'));
  const q = `lat=${HERE.lat}&lon=${HERE.lon}`;
  const paths = [
    ...bare.map((r) => r.slice(4)),
    `/api/varieties?status=proposed`,
    `/api/varieties?q=Quietgarden`,
    `/api/varieties?status=proposed&q=Quietgarden`,
    `/api/varieties/${proposedId}`,
    `/api/reports/${draftId}`,
    `/api/reports?q=Quietgarden`,
    `/api/atlas/near?${q}&radiusKm=50`,
    `/api/varieties/${proposedId}/fit?${q}`,
    `/api/guidance/ripe-dates?varietyId=${proposedId}&${q}`,
    `/api/guidance/short-season?seasonDays=200`,
    `/api/atlas/pins?bbox=-75,41,-72,44&zoom=12`,
    `/api/atlas/pins/cell?lat=42.675&lon=-73.775`,
  ];
  const texts: string[] = [];
  for (const path of paths) {
    const res = await agent.get(path);
    texts.push(`${res.status} ${res.text}`);
  }
  return texts;
}

const leaks = (texts: string[]) => texts.filter((t) => [SECRET.name, SECRET.notes, SECRET.tree, 'Quietgarden'].some((s) => t.includes(s))).map((t) => t.slice(0, 200));

describe('a draft', () => {
  it('is visible to its author, with its proposed name', async () => {
    expect((await author.get(`/api/reports/${draftId}`)).body.report.proposedVarietyName).toBe(SECRET.name);
    expect((await author.get('/api/varieties?status=proposed')).text).toContain(SECRET.name);
    expect((await author.get(`/api/varieties/${proposedId}`)).status).toBe(200);
  });

  it('reaches no visitor and no other grower: not its name, notes or tree, in no public answer', async () => {
    expect(leaks(await publicTexts(ctx.agent()))).toEqual([]);
    expect(leaks(await publicTexts(other))).toEqual([]);
  });

  it('counts nowhere public: the atlas is as it was without it', async () => {
    const near = await ctx.agent().get(`/api/atlas/near?lat=${HERE.lat}&lon=${HERE.lon}&radiusKm=50`);
    expect(near.body.totals).toMatchObject({ reports: 0, trees: 0 });
    expect((await ctx.agent().get('/api/atlas/pins?bbox=-75,41,-72,44&zoom=12')).body.totalReports).toBe(0);
    expect((await ctx.agent().get('/api/reports')).body.total).toBe(0);
    expect((await ctx.agent().get('/api/reports/export.csv')).text.trim().split('\r\n')).toHaveLength(1);
  });

  it('editors still see the proposal to review it', async () => {
    expect((await editor.get('/api/varieties?status=proposed')).text).toContain(SECRET.name);
    expect((await editor.get('/api/varieties/catalogue')).text).toContain(SECRET.name);
  });

  it('once published, its proposed name is public like any published report', async () => {
    ctx.db.sqlite.prepare("UPDATE users SET email_verified_at = '2025-01-01' WHERE id = ?").run(author.userId);
    expect((await author.post(`/api/reports/${draftId}/publish`)).status).toBe(200);
    expect((await ctx.agent().get('/api/varieties?status=proposed')).text).toContain(SECRET.name);
    expect((await other.get(`/api/varieties/${proposedId}`)).status).toBe(200);
    expect((await ctx.agent().get('/api/reports')).body.total).toBe(1);
  });
});
