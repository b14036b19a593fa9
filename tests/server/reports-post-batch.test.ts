import { afterAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent } from '../helpers/test-app';

/*
 * POST /api/reports writes through the group-commit batcher (server/db/write-batcher.ts) and
 * answers from what the write resolved instead of reading the report back (toNewReport). The
 * answer must be what GET /api/reports/:id gives its author, and concurrent posts must each get
 * their own answer, a refused one rolling back alone.
 */

const ctx = createTestContext();
afterAll(() => ctx.db.sqlite.close());

const varietyId = Number(ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Batch Amber (fictional)', 'common', 'accepted')").run().lastInsertRowid);
const body = (overrides: Record<string, unknown> = {}) => ({ varietyId, newTreeLabel: 'Batch tree', lat: 42.65123, lon: -73.75456, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', firstRipeDate: '2024-08-20', ...overrides });

async function postedEqualsRead(agent: TestAgent, sent: Record<string, unknown>) {
  const posted = await agent.post('/api/reports').send(sent);
  expect(posted.status, JSON.stringify(posted.body)).toBe(201);
  const read = await agent.get(`/api/reports/${posted.body.report.id}`);
  expect(read.status).toBe(200);
  expect(posted.body.report).toEqual(read.body.report);
  return posted.body.report;
}

describe('POST /api/reports', { timeout: 60_000 }, () => {
  it('answers exactly what reading the report back gives its author', async () => {
    const grower = await ctx.signedIn('grower');
    const first = await postedEqualsRead(grower, body());
    expect(first.treeLabel).toBe('Batch tree');
    expect(first.variety).toMatchObject({ id: varietyId, name: 'Batch Amber (fictional)', figType: 'common', status: 'accepted' });
    // An existing tree and a proposed variety name (a new proposal, then the same one again).
    await postedEqualsRead(grower, body({ varietyId: null, proposedVarietyName: 'Batch Newcomer', newTreeLabel: null, treeId: first.treeId }));
    const again = await postedEqualsRead(grower, body({ varietyId: null, proposedVarietyName: 'batch newcomer', newTreeLabel: 'Second tree' }));
    expect(again.variety).toMatchObject({ name: 'Batch Newcomer', status: 'proposed' });
    // Without a label the new tree is named after the variety.
    expect((await postedEqualsRead(grower, body({ newTreeLabel: null }))).treeLabel).toBe('Batch Amber (fictional)');
    // An editor posting sees the moderation fields of their own new report.
    await postedEqualsRead(await ctx.signedIn('editor'), body());
    // A grower whose address is not verified yet writes a draft.
    const unverified = await ctx.signedIn('grower');
    ctx.db.sqlite.prepare('UPDATE users SET email_verified_at = NULL WHERE id = ?').run(unverified.userId);
    expect((await postedEqualsRead(unverified, body())).status).toBe('draft');
  });

  it('gives concurrent posts their own answers; a refused one is rolled back alone', async () => {
    const grower = await ctx.signedIn('grower');
    const other = await ctx.signedIn('grower');
    const othersTree = (await other.post('/api/reports').send(body())).body.report.treeId as number;
    const count = () => ctx.db.sqlite.prepare('SELECT count(*) FROM reports WHERE user_id = ?').pluck().get(grower.userId) as number;
    const trees = () => ctx.db.sqlite.prepare('SELECT count(*) FROM trees WHERE user_id = ?').pluck().get(grower.userId) as number;

    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, i) => grower.post('/api/reports').send(i === 3 ? body({ newTreeLabel: null, treeId: othersTree, notes: 'refused' }) : body({ notes: `post ${i}`, newTreeLabel: `Tree ${i}` }))),
    );
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201, 400, 201, 201, 201, 201]);
    expect(answers[3]!.body.error.fields).toHaveProperty('treeId');
    answers.forEach((a, i) => {
      if (i !== 3) expect(a.body.report).toMatchObject({ notes: `post ${i}`, treeLabel: `Tree ${i}` });
    });
    expect(count()).toBe(7);
    expect(trees()).toBe(7);
    expect(ctx.db.sqlite.prepare("SELECT count(*) FROM reports WHERE notes = 'refused'").pluck().get()).toBe(0);
    // Every stored post has its audit entry.
    expect(ctx.db.sqlite.prepare("SELECT count(*) FROM audit_log WHERE action = 'report.create' AND actor_id = ?").pluck().get(grower.userId)).toBe(7);
  });
});
