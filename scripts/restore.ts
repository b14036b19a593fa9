// `npm run restore -- <backup-dir> [--db <file>] [--uploads <folder>]`: STOP THE SERVER FIRST.
// Verifies the backup against its manifest, moves the current database and uploads aside
// (<name>.before-restore-<timestamp>) and puts the backup in their place.
import { parseArgs } from 'node:util';
import { restoreBackup } from '../server/backup/backup';
import { readConfig } from '../server/lib/config';

const config = readConfig();
const { values, positionals } = parseArgs({ allowPositionals: true, options: { db: { type: 'string' }, uploads: { type: 'string' } } });
const backupDir = positionals[0];
if (!backupDir) {
  console.error('Usage: npm run restore -- <backup-dir> [--db <file>] [--uploads <folder>]   (stop the server first)');
  process.exit(2);
}
const dbFile = values.db ?? config.dbFile;
const uploadsDir = values.uploads ?? config.uploadsDir;
const { manifest, movedAside } = restoreBackup(backupDir, { dbFile, uploadsDir });
console.log(`Restored the backup of ${manifest.createdAt} to ${dbFile} and ${uploadsDir}`);
console.log(`  ${manifest.tableCounts.reports ?? 0} reports, checksum ${manifest.reportsSha256} verified`);
for (const file of movedAside) console.log(`  kept the previous copy as ${file}`);
