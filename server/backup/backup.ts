import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/*
 * Online backups of the SQLite database plus the uploads folder, and their restore.
 * The database copy uses SQLite's online backup API (better-sqlite3 `db.backup()`): it reads a
 * consistent snapshot while the app keeps writing (WAL readers never block the writer).
 */

export const MANIFEST_FILE = 'manifest.json';
export const BACKUP_DB_FILE = 'syconium.db';
export const BACKUP_UPLOADS_DIR = 'uploads';

export interface BackupManifest {
  format: 'syconium-backup-1';
  createdAt: string;
  sourceDb: string;
  sourceUploads: string;
  dbFile: string;
  dbBytes: number;
  integrity: string;
  /** Rows per table (virtual-table shadow tables included). */
  tableCounts: Record<string, number>;
  /** sha256 of the canonical dump of the reports table (reportsDump). */
  reportsSha256: string;
  uploads: { files: number; bytes: number };
  /** Photo files named in report_photos that were not in the uploads folder when it was copied. */
  missingPhotoFiles: string[];
}

/** Every ordinary table (not SQLite's own), sorted by name. */
function tableNames(sqlite: Database.Database): string[] {
  return (sqlite.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name").pluck().all() as string[]).filter(
    // R*Tree virtual tables are counted through their shadow tables (…_node, …_rowid, …_parent).
    (name) => !/^CREATE VIRTUAL TABLE/i.test(String(sqlite.prepare('SELECT sql FROM sqlite_master WHERE name = ?').pluck().get(name) ?? '')),
  );
}

export function tableCounts(sqlite: Database.Database): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const name of tableNames(sqlite)) counts[name] = sqlite.prepare(`SELECT count(*) FROM "${name.replaceAll('"', '""')}"`).pluck().get() as number;
  return counts;
}

/**
 * sha256 over the reports table in a canonical form: rows by id, each row's values (in column
 * order) as a JSON array, one per line. Equal tables give equal sums on any machine.
 */
export function reportsChecksum(sqlite: Database.Database): string {
  const hash = createHash('sha256');
  const columns = (sqlite.prepare('SELECT name FROM pragma_table_info(?) ORDER BY cid').pluck().all('reports') as string[]).join(',');
  hash.update(`${columns}\n`);
  for (const row of sqlite.prepare('SELECT * FROM reports ORDER BY id').raw().iterate() as Iterable<unknown[]>) hash.update(`${JSON.stringify(row)}\n`);
  return hash.digest('hex');
}

export function integrityCheck(sqlite: Database.Database): string {
  return (sqlite.prepare('PRAGMA integrity_check').pluck().all() as string[]).join('; ');
}

/** Copy a folder tree file by file; returns how many files and bytes. A missing source copies nothing. */
function copyTree(from: string, to: string): { files: number; bytes: number } {
  let files = 0;
  let bytes = 0;
  if (!fs.existsSync(from)) return { files, bytes };
  fs.mkdirSync(to, { recursive: true });
  for (const entry of fs.readdirSync(from, { withFileTypes: true })) {
    const source = path.join(from, entry.name);
    const target = path.join(to, entry.name);
    if (entry.isDirectory()) {
      const sub = copyTree(source, target);
      files += sub.files;
      bytes += sub.bytes;
    } else if (entry.isFile()) {
      try {
        fs.copyFileSync(source, target);
      } catch (error) {
        // A photo deleted while we copy is simply not in this backup.
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') continue;
        throw error;
      }
      files++;
      bytes += fs.statSync(target).size;
    }
  }
  return { files, bytes };
}

export const backupTimestamp = (date = new Date()) => date.toISOString().replace(/[:.]/g, '-');

/**
 * Write `<outRoot>/<timestamp>/` with the database copy, the uploads and manifest.json.
 * Safe while the server runs: the source is opened read-only and copied with the backup API.
 */
export async function createBackup(options: { dbFile: string; uploadsDir: string; outRoot: string; now?: Date }): Promise<{ dir: string; manifest: BackupManifest }> {
  const dir = path.resolve(options.outRoot, backupTimestamp(options.now));
  if (fs.existsSync(dir)) throw new Error(`${dir} exists already`);
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const target = path.join(dir, BACKUP_DB_FILE);

  const source = new Database(options.dbFile, { readonly: true, fileMustExist: true });
  try {
    source.pragma('busy_timeout = 5000');
    // After the first step, copy the rest in one step: a busy writer cannot keep restarting it.
    await source.backup(target, { progress: () => 1_000_000_000 });
  } finally {
    source.close();
  }

  const copy = new Database(target);
  let manifest: BackupManifest;
  try {
    // A self-contained single file: no -wal beside it.
    copy.pragma('journal_mode = DELETE');
    const uploads = copyTree(path.resolve(options.uploadsDir), path.join(dir, BACKUP_UPLOADS_DIR));
    const photoFiles = tableNames(copy).includes('report_photos')
      ? (copy.prepare('SELECT file_name FROM report_photos UNION SELECT thumb_name FROM report_photos').pluck().all() as string[])
      : [];
    const missingPhotoFiles = photoFiles.filter((name) => !fs.existsSync(path.join(dir, BACKUP_UPLOADS_DIR, 'reports', name)));
    manifest = {
      format: 'syconium-backup-1',
      createdAt: (options.now ?? new Date()).toISOString(),
      sourceDb: path.resolve(options.dbFile),
      sourceUploads: path.resolve(options.uploadsDir),
      dbFile: BACKUP_DB_FILE,
      dbBytes: 0,
      integrity: integrityCheck(copy),
      tableCounts: tableCounts(copy),
      reportsSha256: reportsChecksum(copy),
      uploads,
      missingPhotoFiles,
    };
  } finally {
    copy.close();
  }
  manifest.dbBytes = fs.statSync(target).size;
  fs.writeFileSync(path.join(dir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  return { dir, manifest };
}

export function readManifest(backupDir: string): BackupManifest {
  const file = path.join(backupDir, MANIFEST_FILE);
  if (!fs.existsSync(file)) throw new Error(`${backupDir} has no ${MANIFEST_FILE}: not a Syconium backup folder`);
  const manifest = JSON.parse(fs.readFileSync(file, 'utf8')) as BackupManifest;
  if (manifest.format !== 'syconium-backup-1') throw new Error(`Unknown backup format ${String(manifest.format)}`);
  return manifest;
}

/** Check a backup folder against its manifest: integrity, row counts, reports checksum. */
export function verifyBackup(backupDir: string): BackupManifest {
  const manifest = readManifest(backupDir);
  const copy = new Database(path.join(backupDir, manifest.dbFile), { readonly: true, fileMustExist: true });
  try {
    const integrity = integrityCheck(copy);
    if (integrity !== 'ok') throw new Error(`The backup database fails its integrity check: ${integrity}`);
    const counts = tableCounts(copy);
    for (const [table, n] of Object.entries(manifest.tableCounts)) {
      if (counts[table] !== n) throw new Error(`Table ${table} has ${counts[table]} rows; the manifest says ${n}`);
    }
    if (reportsChecksum(copy) !== manifest.reportsSha256) throw new Error('The reports checksum does not match the manifest');
  } finally {
    copy.close();
  }
  return manifest;
}

/** Move a file or folder aside as `<name>.before-restore-<timestamp>`; returns the new path, if anything moved. */
function moveAside(file: string, stamp: string): string | undefined {
  if (!fs.existsSync(file)) return undefined;
  const aside = `${file}.before-restore-${stamp}`;
  fs.renameSync(file, aside);
  return aside;
}

/**
 * Restore a verified backup to `dbFile` and `uploadsDir`. The server must be stopped first.
 * Whatever was there is moved aside (never deleted), including a stale -wal/-shm pair.
 */
export function restoreBackup(backupDir: string, options: { dbFile: string; uploadsDir: string }): { manifest: BackupManifest; movedAside: string[] } {
  const manifest = verifyBackup(backupDir);
  const stamp = backupTimestamp();
  const dbFile = path.resolve(options.dbFile);
  const uploadsDir = path.resolve(options.uploadsDir);
  fs.mkdirSync(path.dirname(dbFile), { recursive: true });
  const movedAside = [dbFile, `${dbFile}-wal`, `${dbFile}-shm`, uploadsDir].map((f) => moveAside(f, stamp)).filter((f): f is string => !!f);

  // Copy to a temporary name first, so a half-copied file never sits under the real name.
  const partial = `${dbFile}.restoring`;
  fs.copyFileSync(path.join(backupDir, manifest.dbFile), partial);
  fs.renameSync(partial, dbFile);
  copyTree(path.join(backupDir, BACKUP_UPLOADS_DIR), uploadsDir);
  fs.mkdirSync(uploadsDir, { recursive: true });

  const restored = new Database(dbFile);
  try {
    restored.pragma('journal_mode = WAL');
    if (reportsChecksum(restored) !== manifest.reportsSha256) throw new Error('The restored reports do not match the backup checksum');
  } finally {
    restored.close();
  }
  return { manifest, movedAside };
}
