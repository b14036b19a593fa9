import type Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bulkLoad } from '../../scripts/bulk-load';
import { insertSyntheticRows } from '../../scripts/synthetic-data';
import type { Db } from '../../server/db/client';
import { createTestDb } from '../helpers/test-app';

/*
 * scripts/bulk-load.ts loads reports with their triggers off and fills the derived tables once.
 * The same rows loaded with every trigger firing per row must give the same database: reports,
 * their R*Tree, stations, tree_evidence, and the triggers themselves.
 */

const opened: Db[] = [];
afterAll(() => opened.forEach((db) => db.sqlite.close()));

/** A migrated database with a few rows already there (written through the triggers), the same in every call. */
function databaseWithDemo(): Db {
  const { db } = createTestDb();
  opened.push(db);
  const { sqlite } = db;
  for (const name of ['Bulk Amber (fictional)', 'Bulk Violet (fictional)', 'Bulk Slate (fictional)']) {
    sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES (?, 'common', 'accepted')").run(name);
  }
  const userId = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role) VALUES ('demo@bulk.test', 'Demo', 'x', 'grower')").run().lastInsertRowid);
  const treeId = Number(sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'Demo tree')").run(userId).lastInsertRowid);
  const insert = sqlite.prepare('INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, first_ripe_date, status) VALUES (?, ?, 1, 42.65, -73.75, 42.65, -73.75, ?, ?, ?, ?, ?, ?)');
  insert.run(userId, treeId, 'ground', 2023, 'main', 'ripened', '2023-08-20', 'published');
  insert.run(userId, treeId, 'ground', 2024, 'breba', 'ripened', '2024-06-30', 'published');
  insert.run(userId, treeId, 'container', 2024, 'main', 'no-fruit', null, 'draft');
  return db;
}

/** What is loaded: synthetic growers and reports, plus rows the generator does not make (frost dates, drafts, hidden, stations). */
function loadRows(sqlite: Database.Database): void {
  insertSyntheticRows(sqlite, { reports: 3_000, growers: 120, passwordHash: 'x', seed: 7, lastSeason: 2025, emailOf: (i) => `bulk-${i}@bulk.test` });
  const treeId = sqlite.prepare('SELECT max(id) FROM trees').pluck().get() as number;
  const userId = sqlite.prepare('SELECT user_id FROM trees WHERE id = ?').pluck().get(treeId) as number;
  const insert = sqlite.prepare(
    'INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, first_ripe_date, spring_frost_date, fall_frost_date, status) VALUES (?, ?, 2, -37.81, 144.96, -37.8, 144.95, ?, ?, ?, ?, ?, ?, ?, ?)',
  );
  insert.run(userId, treeId, 'ground', 2024, 'main', 'ripened', '2025-02-10', '2024-09-20', '2025-05-01', 'published');
  insert.run(userId, treeId, 'ground', 2025, 'main', 'ripened', '2026-02-02', '2025-09-12', '2026-04-28', 'published');
  insert.run(userId, treeId, 'ground', 2025, 'main', 'ripened', '2026-02-02', '2025-09-12', null, 'hidden');
  insert.run(userId, treeId, 'greenhouse', 2025, 'main', 'no-fruit', null, null, null, 'draft');
  const station = sqlite.prepare('INSERT INTO stations (code, name, lat, lon) VALUES (?, ?, ?, ?)');
  for (let s = 0; s < 25; s++) station.run(`BULK${s}`, `Bulk station ${s}`, 30 + s * 0.7, -100 + s * 1.3);
}

/** Comma-separated lists in tree_evidence are multisets (medians are taken from them): compare them sorted. */
const sortedList = (value: string | null) => (value === null ? null : value.split(',').sort().join(','));

function contents(sqlite: Database.Database) {
  const all = (sql: string) => sqlite.prepare(sql).all();
  return {
    // Timestamps are the clock's; published_at must follow created_at as the trigger makes it.
    reports: all(`SELECT id, user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, origin, season, crop, outcome, first_ripe_date, spring_frost_date, fall_frost_date, status,
                         published_at IS created_at AS published_when_created, published_at IS NULL AS unpublished FROM reports ORDER BY id`),
    reportsRtree: all('SELECT * FROM reports_rtree ORDER BY id'),
    // Timestamps are the clock's.
    stations: all('SELECT id, code, name, lat, lon, elevation_m, first_date, last_date, day_count FROM stations ORDER BY id'),
    // An evidence row's id is its place cell (high bits) and a counter within the cell that
    // depends on the order rows were written: compare the cell, not the counter.
    treeEvidence: (
      all(`SELECT id >> 30 AS cell, tree_id, user_id, variety_id, grid_lat, grid_lon, form, reports, ripened, breba_reports, breba_ripened, first_ripe_doys, frost_to_ripe_days, frost_seasons
             FROM tree_evidence ORDER BY tree_id, variety_id, form, grid_lat, grid_lon`) as Record<string, string | number | null>[]
    ).map((row) => ({ ...row, first_ripe_doys: sortedList(row.first_ripe_doys as string | null), frost_to_ripe_days: sortedList(row.frost_to_ripe_days as string | null), frost_seasons: sortedList(row.frost_seasons as string | null) })),
    triggers: all("SELECT name, tbl_name, sql FROM sqlite_master WHERE type = 'trigger' ORDER BY name"),
  };
}

const atlasVersion = (sqlite: Database.Database) => sqlite.prepare("SELECT version FROM data_versions WHERE name = 'atlas'").pluck().get() as number;
const stationsVersion = (sqlite: Database.Database) => sqlite.prepare("SELECT version FROM data_versions WHERE name = 'stations'").pluck().get() as number;

describe('bulkLoad', { timeout: 120_000 }, () => {
  let byTriggers: ReturnType<typeof contents>;
  let bulk: Db;

  beforeAll(() => {
    const reference = databaseWithDemo();
    reference.sqlite.transaction(() => loadRows(reference.sqlite))();
    byTriggers = contents(reference.sqlite);
    bulk = databaseWithDemo();
  });

  it('gives the same reports, R*Tree, stations, tree_evidence and triggers as loading row by row', () => {
    const versionBefore = atlasVersion(bulk.sqlite);
    const stationsVersionBefore = stationsVersion(bulk.sqlite);
    const triggersBefore = contents(bulk.sqlite).triggers;
    bulkLoad(bulk.sqlite, () => loadRows(bulk.sqlite));
    const loaded = contents(bulk.sqlite);

    expect(byTriggers.reports.length).toBe(3 + 3_000 + 4);
    expect(byTriggers.treeEvidence.length).toBeGreaterThan(100);
    expect(byTriggers.stations).toHaveLength(25);
    expect(loaded.reports).toEqual(byTriggers.reports);
    expect(loaded.reportsRtree).toEqual(byTriggers.reportsRtree);
    expect(loaded.stations).toEqual(byTriggers.stations);
    expect(loaded.treeEvidence).toEqual(byTriggers.treeEvidence);
    expect(loaded.triggers).toEqual(triggersBefore);
    expect(loaded.triggers).toEqual(byTriggers.triggers);
    expect(atlasVersion(bulk.sqlite)).toBeGreaterThan(versionBefore);
    expect(stationsVersion(bulk.sqlite)).toBeGreaterThan(stationsVersionBefore);
    expect(bulk.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
  });

  it('leaves the triggers working: a report written afterwards updates its tree as usual', () => {
    const tree = bulk.sqlite.prepare('SELECT tree_id, user_id, variety_id, lat, lon, form FROM reports WHERE status = ? ORDER BY id DESC LIMIT 1').get('published') as Record<string, number | string>;
    const before = bulk.sqlite.prepare('SELECT sum(reports) FROM tree_evidence WHERE tree_id = ?').pluck().get(tree.tree_id) as number;
    bulk.sqlite
      .prepare("INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, status) VALUES (?, ?, ?, ?, ?, 0, 0, ?, 2026, 'main', 'ripened', 'published')")
      .run(tree.user_id, tree.tree_id, tree.variety_id, tree.lat, tree.lon, tree.form);
    expect(bulk.sqlite.prepare('SELECT sum(reports) FROM tree_evidence WHERE tree_id = ?').pluck().get(tree.tree_id)).toBe(before + 1);
    expect(bulk.sqlite.prepare('SELECT count(*) FROM reports WHERE id NOT IN (SELECT id FROM reports_rtree)').pluck().get()).toBe(0);
  });

  it('leaves the database as it was, triggers included, when the load fails', () => {
    const db = databaseWithDemo();
    const before = contents(db.sqlite);
    expect(() =>
      bulkLoad(db.sqlite, () => {
        loadRows(db.sqlite);
        throw new Error('disk trouble half-way');
      }),
    ).toThrow('disk trouble half-way');
    expect(contents(db.sqlite)).toEqual(before);
  });

  it('refuses to run when a trigger it does not know would be skipped', () => {
    const db = databaseWithDemo();
    db.sqlite.exec("CREATE TRIGGER reports_new_rule AFTER INSERT ON reports BEGIN UPDATE data_versions SET version = version WHERE name = 'atlas'; END");
    const before = contents(db.sqlite);
    expect(() => bulkLoad(db.sqlite, () => loadRows(db.sqlite))).toThrow(/reports_new_rule/);
    expect(contents(db.sqlite)).toEqual(before);
  });
});
