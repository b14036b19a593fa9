// Bulk loading of synthetic reports and stations (the load script, the near bench, tests).
//
// Every report insert fires its triggers: R*Tree row, publication time, data version, and the
// rebuild of its tree's tree_evidence rows (a GROUP BY over the tree's reports). For 200,000 rows
// that is most of the time. bulkLoad drops the triggers on `reports` and `stations`, runs the
// inserts, does what the triggers would have done once for all the new rows, and puts the triggers
// back exactly as the migrations wrote them: all in ONE transaction, so a failure leaves the
// database as it was, triggers included. tests/server/bulk-load.test.ts compares the result with
// a trigger-built database.
import type Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';

/**
 * The triggers bulkLoad replaces, by what it does instead. A trigger not listed here (a new
 * migration) makes bulkLoad refuse to run rather than silently skip what that trigger does.
 */
const REPLAYED_TRIGGERS = new Set([
  // drizzle/0001: the R*Tree row of each report (filled below for the new rows; the stations'
  // R*Tree and its triggers were dropped by drizzle/0011)
  'reports_rtree_insert', 'reports_rtree_update', 'reports_rtree_delete',
  // drizzle/0003: publication time of a row inserted as non-draft without one
  'reports_published_at_insert',
  // drizzle/0012 (replacing 0008 and 0004): the tree's rows in tree_evidence, on its public grid cell (refilled below)
  'reports_tree_evidence_insert', 'reports_tree_evidence_update', 'reports_tree_evidence_update_old_tree', 'reports_tree_evidence_delete',
  // drizzle/0005: the atlas data version (moved once below)
  'reports_atlas_version_insert', 'reports_atlas_version_update', 'reports_atlas_version_delete',
  // drizzle/0010: the stations data version (moved once below; the triggers on station_summaries stay)
  'stations_stations_version_insert', 'stations_stations_version_update', 'stations_stations_version_delete',
]);

/** The statement drizzle/0012 ends with: fill tree_evidence from its source view in one pass. */
function treeEvidenceFill(): string {
  const folder = path.resolve(import.meta.dirname, '../drizzle');
  const file = fs.readdirSync(folder).find((name) => name.endsWith('_tree-evidence-public-cell.sql'));
  if (!file) throw new Error('bulkLoad: the tree-evidence migration (drizzle/*_tree-evidence-public-cell.sql) is missing');
  return fs.readFileSync(path.join(folder, file), 'utf8').split('--> statement-breakpoint').at(-1)!;
}

/**
 * Run `insert` with the triggers of `reports` and `stations` off, then bring the derived tables
 * (reports_rtree, published_at, data_versions, tree_evidence) to what the triggers would have
 * made. `insert` may only INSERT new reports and stations (other tables, such as users and trees,
 * freely); it must not update or delete existing ones.
 * tree_evidence is rebuilt whole (its ids, which only order rows by place, are renumbered).
 */
export function bulkLoad<T>(sqlite: Database.Database, insert: () => T): T {
  const triggers = sqlite
    .prepare("SELECT name, sql FROM sqlite_master WHERE type = 'trigger' AND tbl_name IN ('reports', 'stations') ORDER BY rowid")
    .all() as { name: string; sql: string }[];
  const unknown = triggers.filter((t) => !REPLAYED_TRIGGERS.has(t.name)).map((t) => t.name);
  if (unknown.length) throw new Error(`bulkLoad does not know what these triggers do, so it cannot replay them: ${unknown.join(', ')} (scripts/bulk-load.ts)`);
  const fill = treeEvidenceFill();
  const maxId = (table: string) => sqlite.prepare(`SELECT ifnull(max(id), 0) FROM ${table}`).pluck().get() as number;

  return sqlite.transaction(() => {
    const lastReport = maxId('reports');
    for (const t of triggers) sqlite.exec(`DROP TRIGGER ${t.name}`);
    const result = insert();
    // reports_rtree_insert
    sqlite.prepare('INSERT INTO reports_rtree SELECT id, lat, lat, lon, lon FROM reports WHERE id > ?').run(lastReport);
    // reports_published_at_insert
    sqlite.prepare("UPDATE reports SET published_at = created_at WHERE id > ? AND status <> 'draft' AND published_at IS NULL").run(lastReport);
    // reports_atlas_version_*: the version only has to move (caches compare it for equality).
    sqlite.exec("UPDATE data_versions SET version = version + 1 WHERE name = 'atlas'");
    // stations_stations_version_*: likewise.
    sqlite.exec("UPDATE data_versions SET version = version + 1 WHERE name = 'stations'");
    // reports_tree_evidence_*: every tree's rows from the source view at once (tree_evidence has
    // had no triggers of its own since its R*Tree was dropped, drizzle/0009).
    sqlite.exec('DELETE FROM tree_evidence');
    sqlite.exec(fill);
    for (const t of triggers) sqlite.exec(t.sql);
    return result;
  })();
}
