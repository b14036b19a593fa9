// `npm run backup [-- --out <folder>]`: a consistent online copy of the database (SQLite's backup
// API) and the uploads folder into backups/<timestamp>/ with manifest.json. Safe while the server runs.
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createBackup } from '../server/backup/backup';
import { readConfig } from '../server/lib/config';

const config = readConfig();
const { values } = parseArgs({ options: { out: { type: 'string', default: 'backups' }, db: { type: 'string' }, uploads: { type: 'string' } } });
const started = Date.now();
const { dir, manifest } = await createBackup({ dbFile: values.db ?? config.dbFile, uploadsDir: values.uploads ?? config.uploadsDir, outRoot: values.out! });
console.log(`Backup written to ${path.relative(process.cwd(), dir) || dir} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
console.log(`  database ${(manifest.dbBytes / 1024 / 1024).toFixed(1)} MB, integrity ${manifest.integrity}, ${manifest.tableCounts.reports ?? 0} reports, ${manifest.tableCounts.users ?? 0} accounts`);
console.log(`  uploads ${manifest.uploads.files} files (${(manifest.uploads.bytes / 1024 / 1024).toFixed(1)} MB)`);
console.log(`  reports sha256 ${manifest.reportsSha256}`);
if (manifest.missingPhotoFiles.length) console.warn(`  note: ${manifest.missingPhotoFiles.length} photo file(s) were deleted while copying and are not in this backup`);
if (manifest.integrity !== 'ok') process.exitCode = 1;
