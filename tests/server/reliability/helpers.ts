import type Database from 'better-sqlite3';
import type { Express } from 'express';
import { createHash } from 'node:crypto';
import { reportsChecksum, tableCounts } from '../../../server/backup/backup';
import type { Db } from '../../../server/db/client';

/** An accepted catalogue variety to hang reports on (invented name). */
export function addVariety(db: Db, name = `Reliability test fig ${Math.random().toString(36).slice(2, 8)}`): number {
  return Number(db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status, sources) VALUES (?, 'common', 'accepted', 'Invented for a reliability test')").run(name).lastInsertRowid);
}

/** A report body the API accepts (POST /api/reports). */
export function validReportBody(varietyId: number, overrides: Record<string, unknown> = {}): Record<string, unknown> {
  return { varietyId, newTreeLabel: 'Reliability tree', lat: 42.65123, lon: -73.75456, form: 'ground', season: 2024, crop: 'main', outcome: 'no-fruit', ...overrides };
}

/** Tables whose rows change on every request (sessions, sign-in counters), left out of "unchanged". */
const VOLATILE = new Set(['sessions', 'rate_limit_hits']);

/**
 * What must not change when a request is refused: row counts of every table but the volatile ones,
 * and checksums of the contents of every such table.
 */
export function dataFingerprint(sqlite: Database.Database): string {
  const counts = Object.fromEntries(Object.entries(tableCounts(sqlite)).filter(([t]) => !VOLATILE.has(t)));
  const hash = createHash('sha256').update(JSON.stringify(counts)).update(reportsChecksum(sqlite));
  for (const table of Object.keys(counts)) {
    for (const row of sqlite.prepare(`SELECT * FROM "${table}"`).raw().iterate() as Iterable<unknown[]>) hash.update(JSON.stringify(row));
  }
  return hash.digest('hex');
}

/** Every route the Express app serves, as "METHOD /path" (from the routers mounted in server/app.ts). */
export function listRoutes(app: Express): string[] {
  const out = new Set<string>();
  const walk = (stack: any[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const raw = layer.route.path;
        const path = `${prefix}${raw instanceof RegExp ? '/*' : raw}`.replace(/(.)\/$/, '$1');
        for (const method of Object.keys(layer.route.methods)) out.add(`${method.toUpperCase()} ${path}`);
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, prefix + (typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : ''));
      }
    }
  };
  walk((app as unknown as { router: { stack: unknown[] } }).router.stack, '');
  return [...out].sort();
}
