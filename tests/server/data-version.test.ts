import { eq } from 'drizzle-orm';
import fs from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { atlasDataVersion, stationsDataVersion } from '../../server/db/data-version';
import { reports, stations, stationSummaries, trees, users, varieties } from '../../server/db/schema';
import { createTestDb } from '../helpers/test-app';

const { db, file, dir } = createTestDb();
const other = createDb(file);
afterAll(() => {
  other.sqlite.close();
  db.sqlite.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** Runs a change and returns how far it moved the atlas data version. */
function moves(change: () => unknown): number {
  const before = atlasDataVersion(db);
  change();
  return atlasDataVersion(db) - before;
}

// Invented test rows.
const userId = db.insert(users).values({ email: 'dv@example.com', displayName: 'DV', passwordHash: 'x' }).returning().get().id;
const treeId = db.insert(trees).values({ userId, label: 'dv tree' }).returning().get().id;
const newReport = (u = userId, t = treeId) =>
  db.insert(reports).values({ userId: u, treeId: t, lat: 42.6, lon: -73.7, gridLat: 42.6, gridLon: -73.7, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened' }).returning().get().id;

describe('atlasDataVersion', () => {
  it('is a number that moves on every insert, update and delete of a report', () => {
    expect(typeof atlasDataVersion(db)).toBe('number');
    let id = 0;
    expect(moves(() => (id = newReport()))).toBeGreaterThan(0);
    expect(moves(() => db.update(reports).set({ outcome: 'dropped' }).where(eq(reports.id, id)).run())).toBeGreaterThan(0);
    expect(moves(() => db.update(reports).set({ status: 'hidden' }).where(eq(reports.id, id)).run())).toBeGreaterThan(0);
    expect(moves(() => db.delete(reports).where(eq(reports.id, id)).run())).toBeGreaterThan(0);
  });

  it('moves on every insert, update and delete of a variety', () => {
    let id = 0;
    expect(moves(() => (id = db.insert(varieties).values({ name: 'Data Version Test', figType: 'common', isFictional: true }).returning().get().id))).toBeGreaterThan(0);
    expect(moves(() => db.update(varieties).set({ figType: 'smyrna' }).where(eq(varieties.id, id)).run())).toBeGreaterThan(0);
    expect(moves(() => db.delete(varieties).where(eq(varieties.id, id)).run())).toBeGreaterThan(0);
  });

  it('moves when reports go with their grower (a cascading delete)', () => {
    const u = db.insert(users).values({ email: 'dv-cascade@example.com', displayName: 'Cascade', passwordHash: 'x' }).returning().get().id;
    const t = db.insert(trees).values({ userId: u, label: 'cascade tree' }).returning().get().id;
    const id = newReport(u, t);
    // reports.user_id is ON DELETE CASCADE: deleting the grower alone removes the report.
    expect(moves(() => db.delete(users).where(eq(users.id, u)).run())).toBeGreaterThan(0);
    expect(db.select().from(reports).where(eq(reports.id, id)).all()).toHaveLength(0);
  });

  it('stays put when nothing the atlas reads changes', () => {
    expect(moves(() => db.insert(trees).values({ userId, label: 'another tree' }).run())).toBe(0);
    expect(moves(() => db.update(users).set({ displayName: 'DV renamed' }).where(eq(users.id, userId)).run())).toBe(0);
    expect(atlasDataVersion(db)).toBe(atlasDataVersion(db));
  });

  it('sees a change committed by another connection to the same file', () => {
    const before = atlasDataVersion(db);
    other.sqlite.prepare("INSERT INTO varieties (name, fig_type, is_fictional) VALUES ('Other Connection Test', 'common', 1)").run();
    expect(atlasDataVersion(db)).not.toBe(before);
    expect(atlasDataVersion(other)).toBe(atlasDataVersion(db));
  });

  it('goes back with a rolled-back transaction, like the data', () => {
    const before = atlasDataVersion(db);
    expect(() =>
      db.sqlite.transaction(() => {
        newReport();
        throw new Error('roll back');
      })(),
    ).toThrow('roll back');
    expect(atlasDataVersion(db)).toBe(before);
  });
});

describe('stationsDataVersion', () => {
  /** Runs a change and returns how far it moved the stations data version. */
  const stationsMoves = (change: () => unknown): number => {
    const before = stationsDataVersion(db);
    change();
    return stationsDataVersion(db) - before;
  };
  // Invented station and figures.
  const newStation = () => db.insert(stations).values({ code: null, name: 'DV station', lat: 44.1, lon: -71.2 }).returning().get().id;
  const summary = (stationId: number, probability: number) => ({ stationId, thresholdF: 32, probability, lastSpringDoy: 130, firstFallDoy: 270, seasonDays: 140, years: 30 });

  it('moves on every insert, update and delete of a station', () => {
    expect(typeof stationsDataVersion(db)).toBe('number');
    let id = 0;
    expect(stationsMoves(() => (id = newStation()))).toBeGreaterThan(0);
    expect(stationsMoves(() => db.update(stations).set({ name: 'DV station renamed' }).where(eq(stations.id, id)).run())).toBeGreaterThan(0);
    expect(stationsMoves(() => db.update(stations).set({ lat: 44.2 }).where(eq(stations.id, id)).run())).toBeGreaterThan(0);
    expect(stationsMoves(() => db.delete(stations).where(eq(stations.id, id)).run())).toBeGreaterThan(0);
  });

  it('moves on every insert, update and delete of a station summary', () => {
    const id = newStation();
    expect(stationsMoves(() => db.insert(stationSummaries).values(summary(id, 50)).run())).toBeGreaterThan(0);
    expect(stationsMoves(() => db.update(stationSummaries).set({ seasonDays: 141 }).where(eq(stationSummaries.stationId, id)).run())).toBeGreaterThan(0);
    expect(stationsMoves(() => db.delete(stationSummaries).where(eq(stationSummaries.stationId, id)).run())).toBeGreaterThan(0);
    // Also when the summary's own trigger is the only one that fires (the station row untouched).
    db.insert(stationSummaries).values(summary(id, 90)).run();
    expect(stationsMoves(() => db.sqlite.prepare('UPDATE station_summaries SET years = 29 WHERE station_id = ?').run(id))).toBe(1);
  });

  it('is apart from the atlas version: each moves only with its own tables', () => {
    const atlasBefore = atlasDataVersion(db);
    expect(stationsMoves(() => newStation())).toBeGreaterThan(0);
    expect(atlasDataVersion(db)).toBe(atlasBefore);
    expect(stationsMoves(() => newReport())).toBe(0);
    expect(stationsMoves(() => db.insert(varieties).values({ name: 'Stations Version Test', figType: 'common', isFictional: true }).run())).toBe(0);
  });

  it('sees a station written by another connection', () => {
    const before = stationsDataVersion(db);
    other.sqlite.prepare("INSERT INTO stations (name, lat, lon) VALUES ('Other connection station', 10, 20)").run();
    expect(stationsDataVersion(db)).not.toBe(before);
    expect(stationsDataVersion(other)).toBe(stationsDataVersion(db));
  });
});
