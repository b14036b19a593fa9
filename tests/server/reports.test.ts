import exifr from 'exifr';
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditLog, reports, varieties } from '../../server/db/schema';
import { eq } from 'drizzle-orm';
import { createTestContext, type TestAgent } from '../helpers/test-app';
import { snapToGrid } from '../../shared/domain/public-grid';
import { seedDatabase } from '../../server/seed';

type Grower = TestAgent & { userId: number };

const ctx = createTestContext();
let lanternId: number;

/** A report a grower might post: a fictional variety near Albany, NY (invented test data). */
function validReport(overrides: Record<string, unknown> = {}) {
  return {
    varietyId: lanternId,
    newTreeLabel: 'South wall fig',
    lat: 42.652581,
    lon: -73.756232,
    form: 'wall',
    origin: 'cutting',
    yearPlanted: 2020,
    season: 2024,
    crop: 'main',
    outcome: 'ripened',
    springFrostDate: '2024-04-28',
    firstRipeDate: '2024-09-02',
    lastHarvestDate: '2024-10-01',
    fallFrostDate: '2024-10-14',
    pinched: true,
    pinchedDate: '2024-06-20',
    notes: 'Sweet, amber flesh.',
    ...overrides,
  };
}

/** A JPEG that carries GPS tags (Albany, NY) and a camera make, like a phone photo. */
async function jpegWithGps(): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: '#6b3a5b' } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'TestCam', Copyright: 'A grower' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '42/1 39/1 912/100', GPSLongitudeRef: 'W', GPSLongitude: '73/1 45/1 2232/100' },
    })
    .toBuffer();
}

let alice: Grower;
let bob: Grower;
let editor: Grower;

beforeAll(async () => {
  lanternId = ctx.db.insert(varieties).values({ name: 'Lantern Amber', figType: 'common', isFictional: true }).returning().get().id;
  alice = await ctx.signedIn('grower');
  bob = await ctx.signedIn('grower');
  editor = await ctx.signedIn('editor');
});

async function postReport(agent: TestAgent, overrides: Record<string, unknown> = {}) {
  const res = await agent.post('/api/reports').send(validReport(overrides));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.report as { id: number; treeId: number; lat: number; lon: number; gridLat: number; gridLon: number };
}

describe('posting, editing and deleting a report', () => {
  it('creates a published report with the grid computed on the server and a create audit entry', async () => {
    const report = await postReport(alice);
    // The public grid step is 0.05 degrees (shared/domain/public-grid.ts): 42.652581 lies in the
    // cell 42.65..42.70 whose centre is 42.675; -73.756232 lies in -73.80..-73.75, centre -73.775.
    expect(report.gridLat).toBeCloseTo(42.675, 6);
    expect(report.gridLon).toBeCloseTo(-73.775, 6);
    expect(report.lat).toBe(42.652581);
    const entry = ctx.db.select().from(auditLog).where(eq(auditLog.entityId, report.id)).all().find((e) => e.action === 'report.create');
    expect(entry?.actorId).toBe(alice.userId);
  });

  it('refuses signed-out posting with 401', async () => {
    const res = await ctx.agent().post('/api/reports').send(validReport());
    expect(res.status).toBe(401);
  });

  it('names the field of a bad value', async () => {
    const res = await alice.post('/api/reports').send(validReport({ form: 'pot', lat: 123 }));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['form', 'lat']);
  });

  it('names the date that is out of order', async () => {
    const res = await alice.post('/api/reports').send(validReport({ firstRipeDate: '2024-04-10' }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.firstRipeDate[0]).toMatch(/after the last spring frost/);
    const late = await alice.post('/api/reports').send(validReport({ lastHarvestDate: '2024-10-20' }));
    expect(late.body.error.fields.fallFrostDate[0]).toMatch(/on or after the last harvest/);
    const wrongYear = await alice.post('/api/reports').send(validReport({ pinchedDate: '2023-06-20' }));
    expect(wrongYear.body.error.fields.pinchedDate[0]).toMatch(/season year 2024/);
  });

  it('lets only the author edit or delete: 403 for another grower, 401 signed out', async () => {
    const report = await postReport(alice);
    expect((await bob.patch(`/api/reports/${report.id}`).send({ outcome: 'unripe' })).status).toBe(403);
    expect((await bob.delete(`/api/reports/${report.id}`)).status).toBe(403);
    expect((await ctx.agent().patch(`/api/reports/${report.id}`).send({ notes: 'x' })).status).toBe(401);

    const edit = await alice.patch(`/api/reports/${report.id}`).send({ notes: 'Edited', lat: 42.7012 });
    expect(edit.status, JSON.stringify(edit.body)).toBe(200);
    expect(edit.body.report.notes).toBe('Edited');
    expect(edit.body.report.gridLat).toBeCloseTo(42.725, 6); // cell 42.70..42.75
    // A partial edit keeps the other fields.
    expect(edit.body.report.pinchedDate).toBe('2024-06-20');
    const row = ctx.db.select().from(reports).where(eq(reports.id, report.id)).get()!;
    expect(row.updatedById).toBe(alice.userId);
    const update = ctx.db.select().from(auditLog).where(eq(auditLog.entityId, report.id)).all().find((e) => e.action === 'report.update');
    expect((update?.before as { notes: string }).notes).toBe('Sweet, amber flesh.');
    expect((update?.after as { notes: string }).notes).toBe('Edited');

    expect((await alice.patch(`/api/reports/${report.id}`).send({ colour: 'purple' })).status).toBe(400);
    const badEdit = await alice.patch(`/api/reports/${report.id}`).send({ outcome: 'unripe' });
    expect(badEdit.status).toBe(400); // a first ripe date on an unripe crop
    expect(badEdit.body.error.fields).toHaveProperty('firstRipeDate');

    expect((await alice.delete(`/api/reports/${report.id}`)).status).toBe(204);
    expect((await alice.get(`/api/reports/${report.id}`)).status).toBe(404);
  });

  it('keeps one tree across seasons and lists the grower’s trees', async () => {
    const first = await postReport(alice, { newTreeLabel: 'Container by the door', form: 'container' });
    const second = await postReport(alice, { newTreeLabel: undefined, treeId: first.treeId, season: 2023, springFrostDate: null, firstRipeDate: null, lastHarvestDate: null, fallFrostDate: null, pinched: false, pinchedDate: null, outcome: 'unripe' });
    expect(second.treeId).toBe(first.treeId);
    const trees = await alice.get('/api/reports/trees');
    expect(trees.body.trees.find((t: { id: number }) => t.id === first.treeId)).toMatchObject({ label: 'Container by the door', reportCount: 2 });
    // Someone else's tree is refused.
    const res = await bob.post('/api/reports').send(validReport({ treeId: first.treeId, newTreeLabel: undefined }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('treeId');
  });

  it('turns a name that is not listed into one proposal, reused by the next grower', async () => {
    const a = await alice.post('/api/reports').send(validReport({ varietyId: null, proposedVarietyName: 'Grandpa’s Purple' }));
    const b = await bob.post('/api/reports').send(validReport({ varietyId: null, proposedVarietyName: 'grandpa’s purple' }));
    expect(a.status).toBe(201);
    expect(a.body.report.variety.status).toBe('proposed');
    expect(b.body.report.variety.id).toBe(a.body.report.variety.id);
    const row = ctx.db.select().from(varieties).where(eq(varieties.id, a.body.report.variety.id)).get()!;
    expect(row.proposedByUserId).toBe(alice.userId);
    // SQLite's lower() folds ASCII only (sqlite.org/lang_corefunc.html#lower); a non-ASCII name
    // proposed twice must still be found, not collide with the unique index.
    const first = await alice.post('/api/reports').send(validReport({ varietyId: null, proposedVarietyName: 'Ärtig Violette' }));
    const again = await bob.post('/api/reports').send(validReport({ varietyId: null, proposedVarietyName: 'Ärtig Violette' }));
    expect([first.status, again.status]).toEqual([201, 201]);
    expect(again.body.report.variety.id).toBe(first.body.report.variety.id);
    const neither = await alice.post('/api/reports').send(validReport({ varietyId: null }));
    expect(neither.body.error.fields).toHaveProperty('varietyId');
  });

  it('saves an unverified grower’s report as a draft, seen only by its owner', async () => {
    const carol = await ctx.signedIn('grower');
    ctx.db.sqlite.prepare('UPDATE users SET email_verified_at = NULL WHERE id = ?').run(carol.userId);
    const res = await carol.post('/api/reports').send(validReport());
    expect(res.status).toBe(201);
    expect(res.body.report.status).toBe('draft');
    expect(res.body.notice).toMatch(/once your e-mail address is verified/);
    expect((await bob.get(`/api/reports/${res.body.report.id}`)).status).toBe(404);
    expect((await editor.get(`/api/reports/${res.body.report.id}`)).status).toBe(404);
    expect((await carol.post(`/api/reports/${res.body.report.id}/publish`)).status).toBe(403);
  });
});

describe('privacy of reads', () => {
  it('shows others only the grid position, never exact place or e-mail', async () => {
    const report = await postReport(alice);
    for (const viewer of [ctx.agent(), bob]) {
      const res = await viewer.get(`/api/reports/${report.id}`);
      expect(res.status).toBe(200);
      expect(res.body.report.lat).toBeNull();
      expect(res.body.report.treeLabel).toBeNull();
      const text = JSON.stringify(res.body);
      expect(text).not.toContain('42.652581');
      expect(text).not.toContain('73.756232');
      expect(text).not.toContain('@example.com');
    }
    expect((await editor.get(`/api/reports/${report.id}`)).body.report.lat).toBe(42.652581);
    const list = await ctx.agent().get('/api/reports?pageSize=500');
    expect(JSON.stringify(list.body)).not.toContain('42.652581');
    const mine = await alice.get('/api/reports?mine=true&sort=season&dir=asc');
    expect(mine.body.reports.some((r: { lat: number }) => r.lat === 42.652581)).toBe(true);
    expect((await ctx.agent().get('/api/reports?mine=true')).status).toBe(401);
  });
});

describe('moderation', () => {
  it('lets an editor hide with a reason and restore, audited; the owner sees the reason', async () => {
    const report = await postReport(alice);
    const flag = await bob.post(`/api/reports/${report.id}/flags`).send({ reason: 'Ripe figs in April? Looks wrong.' });
    expect(flag.status).toBe(201);
    expect((await bob.post(`/api/reports/${report.id}/flags`).send({ reason: 'Again' })).status).toBe(409);
    expect((await alice.post(`/api/reports/${report.id}/flags`).send({ reason: 'My own' })).status).toBe(400);

    expect((await bob.post(`/api/reports/${report.id}/hide`).send({ reason: 'nope' })).status).toBe(403);
    const hidden = await editor.post(`/api/reports/${report.id}/hide`).send({ reason: 'Dates do not fit the place' });
    expect(hidden.status).toBe(200);
    expect(hidden.body.report.status).toBe('hidden');
    expect((await bob.get(`/api/reports/${report.id}`)).status).toBe(404);
    const own = await alice.get(`/api/reports/${report.id}`);
    expect(own.body.report.hiddenReason).toBe('Dates do not fit the place');

    const restored = await editor.post(`/api/reports/${report.id}/restore`);
    expect(restored.body.report.status).toBe('published');
    const actions = ctx.db.select().from(auditLog).where(eq(auditLog.entityId, report.id)).all().map((e) => [e.action, e.actorId]);
    expect(actions).toEqual(expect.arrayContaining([['report.hide', editor.userId], ['report.restore', editor.userId], ['report.flag', bob.userId]]));
  });
});

describe('photos', () => {
  it('refuses a text file named like a JPEG', async () => {
    const report = await postReport(alice);
    const res = await alice.post(`/api/reports/${report.id}/photos`).attach('photos', Buffer.from('just some words, not a picture\n'), { filename: 'x.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('unsupported_image');
    expect(res.body.error.fields).toHaveProperty('photos');
  });

  it('strips GPS and all EXIF, stores under a random name, serves it, and lets only the author add or delete', async () => {
    const report = await postReport(alice);
    const original = await jpegWithGps();
    // Precondition: the fixture really carries GPS (read with exifr, an outside EXIF reader).
    expect(await exifr.gps(original)).toMatchObject({ latitude: expect.closeTo(42.6525, 3), longitude: expect.closeTo(-73.7562, 3) });

    expect((await bob.post(`/api/reports/${report.id}/photos`).attach('photos', original, 'fig.jpg')).status).toBe(403);
    const res = await alice.post(`/api/reports/${report.id}/photos`).attach('photos', original, 'IMG_0001 my house.jpg');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const photo = res.body.photos[0] as { id: number; url: string; thumbUrl: string };
    expect(photo.url).toMatch(/^\/uploads\/reports\/[a-f0-9]{32}\.webp$/);
    expect(photo.url).not.toContain('IMG_0001');

    const served = await ctx.agent().get(photo.url).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(served.status).toBe(200);
    const stored = served.body as Buffer;
    expect(await exifr.gps(stored).catch(() => undefined)).toBeUndefined();
    expect(await exifr.parse(stored).catch(() => undefined)).toBeUndefined();
    const meta = await sharp(stored).metadata();
    expect(meta.format).toBe('webp');
    expect(meta.exif).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    const onDisk = fs.readFileSync(path.join(ctx.config.uploadsDir, 'reports', path.basename(photo.url)));
    expect(onDisk.includes(Buffer.from('TestCam'))).toBe(false);

    expect((await bob.delete(`/api/reports/${report.id}/photos/${photo.id}`)).status).toBe(403);
    expect((await alice.delete(`/api/reports/${report.id}/photos/${photo.id}`)).status).toBe(204);
    expect(fs.existsSync(path.join(ctx.config.uploadsDir, 'reports', path.basename(photo.url)))).toBe(false);
  });

  it('turns a sideways photo upright before stripping its orientation tag', async () => {
    const report = await postReport(alice);
    const sideways = await sharp({ create: { width: 60, height: 30, channels: 3, background: '#5e8a57' } }).jpeg().withMetadata({ orientation: 6 }).toBuffer();
    const res = await alice.post(`/api/reports/${report.id}/photos`).attach('photos', sideways, 'side.jpg');
    expect(res.status).toBe(201);
    // EXIF orientation 6 means "rotate 90 degrees clockwise to view" (EXIF 2.32, Orientation tag).
    expect(res.body.photos[0]).toMatchObject({ width: 30, height: 60 });
  });

  it('keeps photos of a hidden report from the public', async () => {
    const report = await postReport(alice);
    const png = await sharp({ create: { width: 20, height: 20, channels: 4, background: '#f3d9a4' } }).png().toBuffer();
    const res = await alice.post(`/api/reports/${report.id}/photos`).attach('photos', png, 'a.png');
    const url = res.body.photos[0].url as string;
    // While public: cacheable, but every use asks again (a cheap 304), never `immutable` or long-lived,
    // so hiding the report takes effect at once (RFC 9111 section 5.2.2.4 no-cache; RFC 8246 immutable).
    const published = await ctx.agent().get(url);
    expect(published.headers['cache-control']).toBe('public, no-cache');
    expect(published.headers['cache-control']).not.toMatch(/immutable|max-age=[1-9]/);
    const etag = published.headers.etag as string;
    expect(etag).toBeTruthy();
    expect((await ctx.agent().get(url).set('If-None-Match', etag)).status).toBe(304);
    await editor.post(`/api/reports/${report.id}/hide`).send({ reason: 'Not a fig' });
    expect((await ctx.agent().get(url)).status).toBe(404);
    // A cache that revalidates its copy learns it is gone.
    expect((await ctx.agent().get(url).set('If-None-Match', etag)).status).toBe(404);
    const own = await alice.get(url);
    expect(own.status).toBe(200);
    expect(own.headers['cache-control']).toBe('private, no-store');
    expect((await ctx.agent().get('/uploads/reports/..%2F..%2Ftest.db')).status).toBe(404);
  });

  it('refuses a seventh photo', async () => {
    const report = await postReport(alice);
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#ffffff' } }).png().toBuffer();
    let req = alice.post(`/api/reports/${report.id}/photos`);
    for (let i = 0; i < 6; i++) req = req.attach('photos', png, `p${i}.png`);
    expect((await req).status).toBe(201);
    const extra = await alice.post(`/api/reports/${report.id}/photos`).attach('photos', png, 'p7.png');
    expect(extra.status).toBe(400);
    expect(extra.body.error.code).toBe('too_many_photos');
  });
});

describe('CSV import and export', () => {
  const header = 'tree,variety,proposedVarietyName,lat,lon,form,origin,yearPlanted,season,crop,outcome,firstRipeDate,lastHarvestDate,springFrostDate,fallFrostDate,pinched,pinchedDate,notes';

  it('rejects the whole file with per-row, per-column errors and writes nothing', async () => {
    const grower = await ctx.signedIn('grower');
    const before = ctx.db.sqlite.prepare('SELECT (SELECT count(*) FROM reports) r, (SELECT count(*) FROM trees) t, (SELECT count(*) FROM varieties) v').get();
    const csv = [
      header,
      'Back fence,Lantern Amber,,42.61,-73.70,ground,cutting,2019,2023,main,ripened,2023-09-10,2023-10-01,2023-05-01,2023-10-12,yes,2023-06-15,',
      'Back fence,Lantern Amber,,42.61,-73.70,pot,cutting,2019,2024,main,ripened,2024-09-10,2024-10-01,,,no,,',
      'Shed,Nonesuch Purple,,42.61,abc,ground,,,2024,main,unripe,,,,,,,',
      'Shed,,Brand new name,42.61,-73.70,ground,,,2024,main,ripened,2024-03-01,,2024-04-20,,,,',
    ].join('\n');
    const res = await grower.post('/api/reports/import').attach('file', Buffer.from(csv), 'seasons.csv');
    expect(res.status).toBe(400);
    const fields = res.body.error.fields as Record<string, string[]>;
    expect(Object.keys(fields).sort()).toEqual(['rows.3.form', 'rows.4.lon', 'rows.4.variety', 'rows.5.firstRipeDate']);
    const after = ctx.db.sqlite.prepare('SELECT (SELECT count(*) FROM reports) r, (SELECT count(*) FROM trees) t, (SELECT count(*) FROM varieties) v').get();
    expect(after).toEqual(before);
  });

  it('imports a good file in one go, one tree per label', async () => {
    const grower = await ctx.signedIn('grower');
    const csv = [
      header,
      'Back fence,Lantern Amber,,42.61,-73.70,ground,cutting,2019,2023,main,ripened,2023-09-10,2023-10-01,2023-05-01,2023-10-12,yes,2023-06-15,"A good year, finally"',
      'Back fence,lantern amber,,42.61,-73.70,ground,cutting,2019,2024,main,unripe,,,,,no,,',
      'Shed,,Brand new name,42.62,-73.71,container,,,2024,breba,dropped,,,,,,,',
    ].join('\r\n');
    const res = await grower.post('/api/reports/import').attach('file', Buffer.from(`\uFEFF${csv}`), 'seasons.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.imported).toBe(3);
    const mine = await grower.get('/api/reports?mine=true&sort=season&dir=asc');
    expect(mine.body.total).toBe(3);
    const fence = mine.body.reports.filter((r: { treeLabel: string }) => r.treeLabel === 'Back fence');
    expect(new Set(fence.map((r: { treeId: number }) => r.treeId)).size).toBe(1);
  });

  it('offers a template whose columns the import accepts', async () => {
    const grower = await ctx.signedIn('grower');
    const template = await ctx.agent().get('/api/reports/import/template.csv');
    expect(template.status).toBe(200);
    const res = await grower.post('/api/reports/import').attach('file', Buffer.from(template.text), 'template.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });

  it('exports public rows with grid positions only, never exact coordinates, e-mail or drafts', async () => {
    const report = await postReport(bob, { lat: 41.123456, lon: -72.654321, season: 2022, springFrostDate: null, firstRipeDate: null, lastHarvestDate: null, fallFrostDate: null, pinched: false, pinchedDate: null, outcome: 'dropped' });
    const csv = await ctx.agent().get('/api/reports/export.csv?seasonFrom=2022&seasonTo=2022');
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text).toContain(`${report.id},`);
    expect(csv.text).toContain(String(snapToGrid(41.123456)));
    const geo = await ctx.agent().get('/api/reports/export.geojson?seasonFrom=2022&seasonTo=2022');
    const collection = JSON.parse(geo.text);
    const feature = collection.features.find((f: { id: number }) => f.id === report.id);
    // GeoJSON positions are [longitude, latitude] (RFC 7946, section 3.1.1).
    expect(feature.geometry.coordinates).toEqual([snapToGrid(-72.654321), snapToGrid(41.123456)]);
    for (const text of [csv.text, geo.text]) {
      expect(text).not.toContain('41.123456');
      expect(text).not.toContain('72.654321');
      expect(text).not.toContain('@example.com');
      expect(text).not.toMatch(/userId|email/i);
    }
    const filtered = await ctx.agent().get('/api/reports/export.csv?outcome=ripened&seasonFrom=2022&seasonTo=2022');
    expect(filtered.text).not.toContain(`\n${report.id},`);
    const bad = await ctx.agent().get('/api/reports/export.csv?crop=winter');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('crop');
  });
});

describe('demo photos', () => {
  it('gives the demo grower three drawn photos, cleaned like uploads, once', async () => {
    const demo = createTestContext();
    // the demo grower's photos need only the story, not the demo atlas's crowd
    await seedDatabase(demo.db, { seedDemo: true, demoAtlas: false, uploadsDir: demo.config.uploadsDir });
    await seedDatabase(demo.db, { seedDemo: true, demoAtlas: false, uploadsDir: demo.config.uploadsDir });
    const rows = demo.db.sqlite.prepare('SELECT p.file_name AS fileName, r.status FROM report_photos p JOIN reports r ON r.id = p.report_id').all() as { fileName: string; status: string }[];
    expect(rows).toHaveLength(3);
    const res = await demo.agent().get(`/uploads/reports/${rows[0]!.fileName}`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect((await sharp(res.body as Buffer).metadata()).format).toBe('webp');
  }, 60_000);
});
