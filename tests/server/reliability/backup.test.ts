import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createBackup, integrityCheck, reportsChecksum, restoreBackup, tableCounts, verifyBackup } from '../../../server/backup/backup';
import { insertSyntheticData } from '../../../scripts/synthetic-data';
import { createTestContext } from '../../helpers/test-app';
import { addVariety, validReportBody } from './helpers';

const ctx = createTestContext();
afterAll(() => ctx.db.sqlite.close());

describe('online backup and restore', () => {
  it('copies a consistent snapshot while the app keeps writing, and restores it elsewhere', async () => {
    const varietyId = addVariety(ctx.db);
    const grower = await ctx.signedIn('grower');
    insertSyntheticData(ctx.db.sqlite, { reports: 20_000, growers: 200, passwordHash: 'x', seed: 7 });
    // A stored photo and its row, to show uploads travel with the database.
    const photoDir = path.join(ctx.config.uploadsDir, 'reports');
    fs.mkdirSync(photoDir, { recursive: true });
    const stem = 'a'.repeat(32);
    fs.writeFileSync(path.join(photoDir, `${stem}.webp`), 'main image bytes');
    fs.writeFileSync(path.join(photoDir, `${stem}-thumb.webp`), 'thumb bytes');
    ctx.db.sqlite
      .prepare("INSERT INTO report_photos (report_id, file_name, thumb_name, mime, width, height, bytes) VALUES (1, ?, ?, 'image/webp', 10, 10, 16)")
      .run(`${stem}.webp`, `${stem}-thumb.webp`);
    const before = ctx.db.sqlite.prepare('SELECT count(*) FROM reports').pluck().get() as number;

    // Writes through the API keep landing while the backup runs (same process: they interleave
    // with the backup's steps on the event loop, so the source changes under the copy).
    let writing = true;
    let written = 0;
    const writer = (async () => {
      while (writing) {
        const res = await grower.post('/api/reports').send(validReportBody(varietyId, { notes: `during backup ${written}` }));
        expect(res.status, JSON.stringify(res.body)).toBe(201);
        written++;
      }
    })();
    await new Promise((r) => setTimeout(r, 50));
    const outRoot = path.join(ctx.dir, 'backups');
    const { dir, manifest } = await createBackup({ dbFile: dbFileOf(ctx), uploadsDir: ctx.config.uploadsDir, outRoot });
    const writtenAtEnd = written;
    // Let a few more writes land after the snapshot, then stop.
    await expect.poll(() => written, { timeout: 20_000 }).toBeGreaterThan(writtenAtEnd + 2);
    writing = false;
    await writer;
    expect(written).toBeGreaterThan(0);

    // The snapshot lies between the rows before and after the writes, and is internally whole.
    expect(manifest.integrity).toBe('ok');
    expect(manifest.tableCounts.reports).toBeGreaterThanOrEqual(before);
    expect(manifest.tableCounts.reports).toBeLessThanOrEqual(before + writtenAtEnd + 1);
    expect(manifest.tableCounts.reports_rtree_rowid).toBe(manifest.tableCounts.reports);
    expect(manifest.uploads.files).toBe(2);
    expect(manifest.missingPhotoFiles).toEqual([]);
    expect(fs.existsSync(path.join(dir, 'syconium.db-wal'))).toBe(false);
    expect(verifyBackup(dir).reportsSha256).toBe(manifest.reportsSha256);

    // Restore into a new place and compare with the manifest.
    const target = path.join(ctx.dir, 'restored', 'syconium.db');
    const uploads = path.join(ctx.dir, 'restored', 'uploads');
    restoreBackup(dir, { dbFile: target, uploadsDir: uploads });
    const restored = new Database(target, { readonly: true });
    try {
      expect(integrityCheck(restored)).toBe('ok');
      expect(tableCounts(restored)).toEqual(manifest.tableCounts);
      expect(reportsChecksum(restored)).toBe(manifest.reportsSha256);
    } finally {
      restored.close();
    }
    expect(fs.readFileSync(path.join(uploads, 'reports', `${stem}.webp`), 'utf8')).toBe('main image bytes');

    // The live database moved on; its checksum now differs from the snapshot's.
    expect(reportsChecksum(ctx.db.sqlite)).not.toBe(manifest.reportsSha256);
  }, 60_000);

  it('refuses a backup whose reports were altered after it was made', async () => {
    const { dir } = await createBackup({ dbFile: dbFileOf(ctx), uploadsDir: ctx.config.uploadsDir, outRoot: path.join(ctx.dir, 'backups-2') });
    const copy = new Database(path.join(dir, 'syconium.db'));
    copy.prepare("UPDATE reports SET notes = 'tampered' WHERE id = 1").run();
    copy.close();
    const target = path.join(ctx.dir, 'restored-2', 'syconium.db');
    expect(() => restoreBackup(dir, { dbFile: target, uploadsDir: path.join(ctx.dir, 'restored-2', 'uploads') })).toThrow(/checksum/);
    expect(fs.existsSync(target)).toBe(false);
  });

  it('npm run backup and npm run restore work from the command line, keeping the previous copy aside', () => {
    const env = { ...process.env, SYCONIUM_DB: dbFileOf(ctx), SYCONIUM_UPLOADS: ctx.config.uploadsDir };
    const out = path.join(ctx.dir, 'cli-backups');
    const backup = spawnSync('npx', ['tsx', 'scripts/backup.ts', '--out', out], { env, encoding: 'utf8' });
    expect(backup.status, backup.stderr).toBe(0);
    expect(backup.stdout).toMatch(/integrity ok/);
    const [folder] = fs.readdirSync(out);
    const target = path.join(ctx.dir, 'cli-restore', 'syconium.db');
    fs.mkdirSync(path.dirname(target), { recursive: true });
    fs.writeFileSync(target, 'an older database');
    const restore = spawnSync('npx', ['tsx', 'scripts/restore.ts', path.join(out, folder!), '--db', target, '--uploads', path.join(ctx.dir, 'cli-restore', 'uploads')], { env, encoding: 'utf8' });
    expect(restore.status, restore.stderr).toBe(0);
    expect(restore.stdout).toMatch(/checksum [0-9a-f]{64} verified/);
    const aside = fs.readdirSync(path.dirname(target)).find((f) => f.startsWith('syconium.db.before-restore-'));
    expect(fs.readFileSync(path.join(path.dirname(target), aside!), 'utf8')).toBe('an older database');
  }, 60_000);
});

/** The test database file (createTestContext keeps it beside its temp folder). */
function dbFileOf(c: typeof ctx): string {
  return c.db.sqlite.name;
}
