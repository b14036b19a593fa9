import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { reports, savedPlaces, users, varieties } from '../../server/db/schema';
import { DIGEST_PERIOD_MS, runNearbyDigest } from '../../server/email/digest';
import { createMailTestContext } from './email-helpers';

// One degree of latitude is 111.195 km on the IUGG mean sphere (shared CHECKS.md, "Distance on the sphere").
const KM_PER_DEG_LAT = 111.195;
const HOME = { lat: 45, lon: 3 };
const north = (km: number) => ({ lat: HOME.lat + km / KM_PER_DEG_LAT, lon: HOME.lon });

describe('the nearby digest goes by when a report was published, not when it was written', async () => {
  const ctx = await createMailTestContext();
  const subscriber = await ctx.signedIn('grower', 'subscriber@example.com');
  const drafter = await ctx.signedIn('grower', 'drafter@example.com');
  const writer = await ctx.signedIn('grower', 'writer@example.com');
  const editor = await ctx.signedIn('editor', 'editor@example.com');
  ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, drafter.userId)).run();

  const variety = (name: string) => ctx.db.insert(varieties).values({ name, isFictional: true }).returning().get().id;
  const body = (varietyName: string, km: number) => ({ varietyId: variety(varietyName), newTreeLabel: 'tree', ...north(km), form: 'ground', season: 2026, crop: 'main', outcome: 'ripened', firstRipeDate: '2026-08-20' });
  const row = (id: number) => ctx.db.select().from(reports).where(eq(reports.id, id)).get()!;

  let firstDigestAt: Date;
  let draftId: number;
  let seenId: number;

  it('a draft is left out of the digest until it is published', async () => {
    ctx.db.insert(savedPlaces).values({ userId: subscriber.userId, name: 'Orchard', ...HOME, isHome: true }).run();
    expect((await subscriber.put('/api/email/digest').send({ active: true, radiusKm: 50 })).status).toBe(200);

    const draft = await drafter.post('/api/reports').send(body('Late Draft', 20));
    expect(draft.status).toBe(201);
    expect(draft.body.report.status).toBe('draft');
    draftId = draft.body.report.id;
    expect(row(draftId).publishedAt).toBeNull();

    const seen = await writer.post('/api/reports').send(body('Seen Once', 30));
    expect(seen.status).toBe(201);
    seenId = seen.body.report.id;
    // Created published: public from the moment it was written.
    expect(row(seenId).publishedAt).toBe(row(seenId).createdAt);

    firstDigestAt = new Date();
    expect(await runNearbyDigest(ctx.mail, firstDigestAt)).toEqual({ sent: 1, checked: 1 });
    const [first] = ctx.inbox('subscriber@example.com');
    expect(first!.subject).toBe('1 new ripening report near Orchard');
    expect(first!.text).toContain('Seen Once');
    expect(first!.text).not.toContain('Late Draft');
  });

  it('a draft published after the last digest is in the next one; a report hidden and restored meanwhile is not sent again', async () => {
    // The publication must fall after the first digest's instant, even on a fast machine.
    while (Date.now() <= firstDigestAt.getTime()) await new Promise((r) => setTimeout(r, 1));
    ctx.db.update(users).set({ emailVerifiedAt: new Date().toISOString() }).where(eq(users.id, drafter.userId)).run();
    const published = await drafter.post(`/api/reports/${draftId}/publish`);
    expect(published.status).toBe(200);
    expect(published.body.report.status).toBe('published');
    // Written before the first digest, published after it: the case a created_at window misses.
    expect(row(draftId).createdAt < firstDigestAt.toISOString()).toBe(true);
    expect(row(draftId).publishedAt! > firstDigestAt.toISOString()).toBe(true);

    const seenPublishedAt = row(seenId).publishedAt;
    expect((await editor.post(`/api/reports/${seenId}/hide`).send({ reason: 'Checking the photo' })).status).toBe(200);
    expect((await editor.post(`/api/reports/${seenId}/restore`)).status).toBe(200);
    expect(row(seenId).status).toBe('published');
    expect(row(seenId).publishedAt).toBe(seenPublishedAt);

    const result = await runNearbyDigest(ctx.mail, new Date(firstDigestAt.getTime() + DIGEST_PERIOD_MS + 60_000));
    expect(result).toEqual({ sent: 1, checked: 1 });
    const second = ctx.inbox('subscriber@example.com')[1]!;
    expect(second.subject).toBe('1 new ripening report near Orchard');
    for (const part of [second.text!, second.html!]) {
      expect(part).toContain('Late Draft');
      expect(part).not.toContain('Seen Once');
    }
  });

  it('an already digested report does not appear in a later digest', async () => {
    const result = await runNearbyDigest(ctx.mail, new Date(firstDigestAt.getTime() + 2 * DIGEST_PERIOD_MS + 120_000));
    expect(result).toEqual({ sent: 0, checked: 1 });
    expect(ctx.inbox('subscriber@example.com')).toHaveLength(2);
  });
});

describe('the published-at migration', () => {
  const folder = path.resolve(import.meta.dirname, '../../drizzle');
  const journal = JSON.parse(fs.readFileSync(path.join(folder, 'meta/_journal.json'), 'utf8')) as { entries: { tag: string }[] };
  const tags = journal.entries.map((e) => e.tag);
  const target = tags.findIndex((t) => t.endsWith('_published-at'));
  const apply = (db: Database.Database, tag: string) => {
    for (const statement of fs.readFileSync(path.join(folder, `${tag}.sql`), 'utf8').split('--> statement-breakpoint')) if (statement.trim()) db.exec(statement);
  };

  it('backfills public reports with created_at, leaves drafts empty, and fills rows inserted without it', () => {
    expect(target).toBeGreaterThan(0);
    const db = new Database(':memory:');
    for (const tag of tags.slice(0, target)) apply(db, tag);
    db.exec(`INSERT INTO users (email, display_name, password_hash) VALUES ('m@example.com', 'M', 'x'); INSERT INTO trees (user_id, label) VALUES (1, 't');`);
    const insert = (status: string, createdAt: string) =>
      db
        .prepare(`INSERT INTO reports (user_id, tree_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, status, created_at) VALUES (1, 1, 45, 3, 45, 3, 'ground', 2025, 'main', 'ripened', ?, ?)`)
        .run(status, createdAt).lastInsertRowid;
    const old = { published: insert('published', '2025-01-01T00:00:00.000Z'), draft: insert('draft', '2025-01-02T00:00:00.000Z'), hidden: insert('hidden', '2025-01-03T00:00:00.000Z') };
    apply(db, tags[target]!);
    const later = { published: insert('published', '2025-02-01T00:00:00.000Z'), draft: insert('draft', '2025-02-02T00:00:00.000Z') };
    const publishedAt = (id: number | bigint) => (db.prepare('SELECT published_at AS p FROM reports WHERE id = ?').get(id) as { p: string | null }).p;
    expect(publishedAt(old.published)).toBe('2025-01-01T00:00:00.000Z');
    expect(publishedAt(old.draft)).toBeNull();
    // Hidden reports were public before they were hidden (only a published report can be hidden).
    expect(publishedAt(old.hidden)).toBe('2025-01-03T00:00:00.000Z');
    expect(publishedAt(later.published)).toBe('2025-02-01T00:00:00.000Z');
    expect(publishedAt(later.draft)).toBeNull();
    // A time the app gives is kept.
    const given = db
      .prepare(`INSERT INTO reports (user_id, tree_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, status, created_at, published_at) VALUES (1, 1, 45, 3, 45, 3, 'ground', 2025, 'main', 'ripened', 'published', '2025-03-01T00:00:00.000Z', '2025-03-09T00:00:00.000Z')`)
      .run().lastInsertRowid;
    expect(publishedAt(given)).toBe('2025-03-09T00:00:00.000Z');
    db.close();
  });
});
