import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import supertest from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { integrityCheck } from '../../../server/backup/backup';
import { createDb, migrateDb, type Db } from '../../../server/db/client';
import * as schema from '../../../server/db/schema';
import { createTestContext, TEST_PASSWORD, testConfig } from '../../helpers/test-app';
import { addVariety, dataFingerprint, validReportBody } from './helpers';

/** Sign in over plain supertest and return the session cookie, to replay it against another app. */
async function sessionCookie(app: Parameters<typeof supertest>[0], email: string): Promise<string> {
  const res = await supertest(app).post('/api/auth/sign-in').set('X-Syconium-Request', '1').send({ email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return String(res.headers['set-cookie']?.[0]).split(';')[0]!;
}

const cleanups: (() => void)[] = [];
afterAll(() => {
  for (const cleanup of cleanups.reverse()) cleanup();
});

describe('a read-only database file', () => {
  it('keeps answering reads, refuses writes with a clear 503, and changes nothing', async () => {
    const ctx = createTestContext();
    cleanups.push(() => ctx.db.sqlite.close());
    const varietyId = addVariety(ctx.db);
    const email = `readonly-${Date.now()}@example.com`;
    const grower = await ctx.signedIn('grower', email);
    const created = await grower.post('/api/reports').send(validReportBody(varietyId));
    expect(created.status).toBe(201);
    const cookie = await sessionCookie(ctx.app, email);
    const file = ctx.db.sqlite.name;
    const before = dataFingerprint(ctx.db.sqlite);

    // The server restarted on a file it may only read (as after a restore with wrong ownership).
    const sqlite = new Database(file, { readonly: true, fileMustExist: true });
    cleanups.push(() => sqlite.close());
    const readonlyDb = Object.assign(drizzle({ client: sqlite, schema, casing: 'snake_case' }), { sqlite }) as Db;
    const app = createApp({ db: readonlyDb, config: ctx.config });
    const as = (req: supertest.Test) => req.set('Cookie', cookie).set('X-Syconium-Request', '1');

    expect((await supertest(app).get(`/api/reports/${created.body.report.id}`)).status).toBe(200);
    const writes = [
      as(supertest(app).post('/api/reports')).send(validReportBody(varietyId, { notes: 'never stored' })),
      as(supertest(app).patch(`/api/reports/${created.body.report.id}`)).send({ notes: 'never changed' }),
      as(supertest(app).delete(`/api/reports/${created.body.report.id}`)),
      supertest(app).post('/api/auth/sign-up').set('X-Syconium-Request', '1').send({ email: `ro-${Date.now()}@example.com`, acceptDataLicence: true, password: TEST_PASSWORD, displayName: 'Read only' }),
    ];
    for (const write of writes) {
      const res = await write;
      expect(res.status, JSON.stringify(res.body)).toBe(503);
      expect(res.body.error.code).toBe('storage_unavailable');
      expect(res.body.error.message).toMatch(/nothing was saved/i);
    }
    // A signed-in read still answers although the session's expiry cannot be refreshed.
    const me = await as(supertest(app).get('/api/auth/me'));
    expect(me.status).toBeLessThan(500);
    expect(dataFingerprint(ctx.db.sqlite)).toBe(before);
    expect(integrityCheck(ctx.db.sqlite)).toBe('ok');
  }, 60_000);
});

/** A tiny tmpfs when the tests run as root (a real "no space left on device"), else undefined. */
function tinyDisk(): string | undefined {
  if (process.getuid?.() !== 0 || process.platform !== 'linux' || process.env.RELIABILITY_NO_TMPFS) return undefined;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-full-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=3m', 'tmpfs', dir], { stdio: 'ignore' });
    return dir;
  } catch {
    fs.rmSync(dir, { recursive: true, force: true });
    return undefined;
  }
}

/** Fill a file system to the last byte; returns the filler's path. */
function fillDisk(dir: string): string {
  const filler = path.join(dir, 'filler.bin');
  const fd = fs.openSync(filler, 'w');
  const chunk = Buffer.alloc(64 * 1024, 1);
  try {
    for (;;) fs.writeSync(fd, chunk);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOSPC') throw error;
    // The last partial chunk: fill byte by byte down to nothing.
    try {
      for (;;) fs.writeSync(fd, chunk, 0, 1);
    } catch {
      // full
    }
  } finally {
    fs.closeSync(fd);
  }
  return filler;
}

describe('a full disk', () => {
  it('answers writes with a clear 503, half-writes nothing, and recovers once there is room', async () => {
    const mount = tinyDisk();
    const dir = mount ?? fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-full-'));
    const db = createDb(path.join(dir, 'full.db'));
    migrateDb(db);
    cleanups.push(() => {
      db.sqlite.close();
      if (mount) execFileSync('umount', [mount]);
      fs.rmSync(dir, { recursive: true, force: true });
    });
    const config = testConfig({ uploadsDir: path.join(dir, 'uploads') });
    const app = createApp({ db, config });
    const varietyId = addVariety(db);
    const email = `full-${Date.now()}@example.com`;
    const { hashPassword } = await import('../../../server/auth/password');
    db.sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role, email_verified_at) VALUES (?, 'Full disk', ?, 'grower', '2026-01-01T00:00:00Z')").run(email, await hashPassword(TEST_PASSWORD));
    const cookie = await sessionCookie(app, email);
    const post = (notes: string) => supertest(app).post('/api/reports').set('Cookie', cookie).set('X-Syconium-Request', '1').send(validReportBody(varietyId, { notes: notes.padEnd(1900, '.') }));
    expect((await post('before the disk filled')).status).toBe(201);

    let filler: string | undefined;
    if (mount) {
      // Empty the WAL first, so the next write needs new space on the disk.
      db.sqlite.pragma('wal_checkpoint(TRUNCATE)');
      filler = fillDisk(mount);
    } else {
      // Not root: the database may not grow past its present size (SQLite answers SQLITE_FULL).
      db.sqlite.pragma(`max_page_count = ${db.sqlite.pragma('page_count', { simple: true })}`);
    }

    let refused: supertest.Response | undefined;
    for (let i = 0; i < 200 && !refused; i++) {
      const res = await post(`while full ${i}`);
      if (res.status !== 201) refused = res;
    }
    expect(refused?.status, JSON.stringify(refused?.body)).toBe(503);
    expect(refused!.body.error.code).toBe('storage_unavailable');
    // Every stored report has its audit entry: no transaction was half-written.
    const reports = db.sqlite.prepare('SELECT count(*) FROM reports').pluck().get() as number;
    const audits = db.sqlite.prepare("SELECT count(*) FROM audit_log WHERE action = 'report.create'").pluck().get() as number;
    expect(audits).toBe(reports);
    expect(db.sqlite.prepare('SELECT count(*) FROM reports_rtree').pluck().get()).toBe(reports);
    // Reads still work.
    expect((await supertest(app).get('/api/reports/1')).status).toBe(200);

    if (filler) fs.rmSync(filler);
    else db.sqlite.pragma('max_page_count = 1073741823');
    expect((await post('after room was made')).status).toBe(201);
    expect(integrityCheck(db.sqlite)).toBe('ok');
    console.log(`full disk simulated with ${mount ? 'a 3 MB tmpfs filled to the last byte' : 'PRAGMA max_page_count'}; refused after ${reports} stored reports`);
  }, 60_000);
});
