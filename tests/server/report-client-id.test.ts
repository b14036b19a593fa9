import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestContext } from '../helpers/test-app';

/*
 * The outbox's idempotency key: POST /api/reports with `clientId` stores the report once, however
 * often the phone re-sends it (an answer lost on a weak signal, a tab closed mid-send).
 */

const ctx = createTestContext();
afterAll(() => ctx.db.sqlite.close());

const varietyId = Number(ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Outbox Amber (fictional)', 'common', 'accepted')").run().lastInsertRowid);
const body = (overrides: Record<string, unknown> = {}) => ({ varietyId, newTreeLabel: 'Outbox tree', lat: 42.65123, lon: -73.75456, form: 'ground', season: 2024, crop: 'main', outcome: 'no-fruit', ...overrides });
const count = (sql: string, ...args: unknown[]) => (ctx.db.sqlite.prepare(sql).pluck().get(...args) as number);

describe('POST /api/reports with a clientId', () => {
  it('a re-send with the same clientId answers 200 with the stored report and stores nothing more', async () => {
    const grower = await ctx.signedIn('grower');
    const clientId = randomUUID();
    const first = await grower.post('/api/reports').send(body({ clientId, notes: 'sent once' }));
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const again = await grower.post('/api/reports').send(body({ clientId, notes: 'sent once' }));
    expect(again.status).toBe(200);
    expect(again.body.report).toEqual(first.body.report);
    expect(count('SELECT count(*) FROM reports WHERE user_id = ?', grower.userId)).toBe(1);
    expect(count('SELECT count(*) FROM trees WHERE user_id = ?', grower.userId)).toBe(1);
    expect(count("SELECT count(*) FROM audit_log WHERE action = 'report.create' AND actor_id = ?", grower.userId)).toBe(1);
  });

  it('sent twice in the same instant (one batch), still one report', async () => {
    const grower = await ctx.signedIn('grower');
    const clientId = randomUUID();
    const answers = await Promise.all([1, 2, 3].map(() => grower.post('/api/reports').send(body({ clientId }))));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 201]);
    expect(new Set(answers.map((a) => a.body.report.id)).size).toBe(1);
    expect(count('SELECT count(*) FROM reports WHERE user_id = ?', grower.userId)).toBe(1);
  });

  it("keys are per grower, a new key is a new report, and no key behaves as before", async () => {
    const alice = await ctx.signedIn('grower');
    const bob = await ctx.signedIn('grower');
    const clientId = randomUUID();
    expect((await alice.post('/api/reports').send(body({ clientId }))).status).toBe(201);
    // Bob's phone happening on the same id does not get Alice's report.
    const bobs = await bob.post('/api/reports').send(body({ clientId }));
    expect(bobs.status).toBe(201);
    expect(bobs.body.report.treeLabel).toBe('Outbox tree');
    expect((await alice.post('/api/reports').send(body({ clientId: randomUUID() }))).status).toBe(201);
    expect((await alice.post('/api/reports').send(body())).status).toBe(201);
    expect((await alice.post('/api/reports').send(body())).status).toBe(201);
    expect(count('SELECT count(*) FROM reports WHERE user_id = ?', alice.userId)).toBe(4);
  });

  it('a malformed clientId is refused naming the field, and a refused report keeps no key', async () => {
    const grower = await ctx.signedIn('grower');
    const bad = await grower.post('/api/reports').send(body({ clientId: 'x; DROP TABLE reports' }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.clientId).toBeDefined();
    const clientId = randomUUID();
    const refused = await grower.post('/api/reports').send(body({ clientId, season: 1700 }));
    expect(refused.status).toBe(400);
    expect(count('SELECT count(*) FROM report_client_ids WHERE client_id = ?', clientId)).toBe(0);
    // Fixed and sent again under the same key: stored.
    expect((await grower.post('/api/reports').send(body({ clientId }))).status).toBe(201);
  });

  it('a deleted report frees its key', async () => {
    const grower = await ctx.signedIn('grower');
    const clientId = randomUUID();
    const first = await grower.post('/api/reports').send(body({ clientId }));
    await grower.delete(`/api/reports/${first.body.report.id}`).expect(204);
    expect((await grower.post('/api/reports').send(body({ clientId }))).status).toBe(201);
  });
});
