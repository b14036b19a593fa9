import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { frostTreesWithin, readTreeSnapshot, reportFrostSeasons, treeSnapshotFrom, treesWithin, type NearTree } from '../../server/atlas/tree-snapshot';
import type { Db } from '../../server/db/client';
import { distanceKm } from '../../shared/domain/geo';
import { createTestDb } from '../helpers/test-app';

/*
 * The tree snapshot answers a radius query from memory (a k-d tree, then the exact distance). It
 * must return exactly the rows a plain filter of every stored row by great-circle distance returns,
 * with every figure and list intact, anywhere on the globe (the antimeridian and the poles too).
 * distanceKm itself is checked against @turf/turf and a published example in tests/shared/geo.test.ts.
 */

let db: Db;
beforeAll(() => {
  db = createTestDb().db;
});
afterAll(() => db.sqlite.close());

const arbRow = fc.record({
  treeId: fc.integer({ min: 1, max: 40 }),
  userId: fc.integer({ min: 1, max: 8 }),
  varietyId: fc.integer({ min: 1, max: 3 }),
  form: fc.constantFrom('ground', 'container', 'wall', 'greenhouse'),
  // Clustered near a few places (one on the antimeridian, one near the pole) and anywhere else.
  place: fc.oneof(
    fc.record({ lat: fc.double({ min: 41, max: 43, noNaN: true }), lon: fc.double({ min: -75, max: -72, noNaN: true }) }),
    fc.record({ lat: fc.double({ min: -18, max: -16, noNaN: true }), lon: fc.oneof(fc.double({ min: 178, max: 180, noNaN: true }), fc.double({ min: -180, max: -178, noNaN: true })) }),
    fc.record({ lat: fc.double({ min: 88, max: 90, noNaN: true }), lon: fc.double({ min: -180, max: 180, noNaN: true }) }),
    fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon: fc.double({ min: -180, max: 180, noNaN: true }) }),
  ),
  reports: fc.integer({ min: 1, max: 6 }),
  ripenedShare: fc.double({ min: 0, max: 1, noNaN: true }),
  brebaReports: fc.integer({ min: 0, max: 2 }),
  firstRipe: fc.array(fc.integer({ min: 1, max: 366 }), { maxLength: 3 }),
  frostToRipe: fc.array(fc.integer({ min: 0, max: 364 }), { maxLength: 3 }),
  frostSeasons: fc.array(fc.record({ season: fc.integer({ min: 2020, max: 2025 }), days: fc.integer({ min: -5, max: 400 }) }), { maxLength: 3 }),
});
const arbQuery = fc.record({
  point: fc.oneof(
    fc.constant({ lat: 42, lon: -73.5 }),
    fc.constant({ lat: -17, lon: 179.9 }),
    fc.constant({ lat: 89.5, lon: 10 }),
    fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon: fc.double({ min: -180, max: 180, noNaN: true }) }),
  ),
  radiusKm: fc.constantFrom(1, 50, 100, 200, 500, 3000),
});

type Row = typeof arbRow extends fc.Arbitrary<infer T> ? T : never;
const text = (xs: number[]) => (xs.length ? xs.join(',') : null);

function store(rows: Row[]): void {
  const { sqlite } = db;
  sqlite.exec('DELETE FROM tree_evidence');
  const insert = sqlite.prepare(
    `INSERT INTO tree_evidence (tree_id, user_id, variety_id, grid_lat, grid_lon, form, reports, ripened, breba_reports, breba_ripened, first_ripe_doys, frost_to_ripe_days, frost_seasons)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  for (const r of rows) {
    const brebaReports = Math.min(r.brebaReports, r.reports);
    const ripened = Math.round(r.ripenedShare * r.reports);
    const seasons = r.frostSeasons.map((s) => `${s.season}:${s.days}`).join(',') || null;
    insert.run(r.treeId, r.userId, r.varietyId, r.place.lat, r.place.lon, r.form, r.reports, ripened, brebaReports, Math.min(ripened, brebaReports), text(r.firstRipe), text(r.frostToRipe), seasons);
  }
}

/** What treesWithin must return: every stored row within the radius, by a plain filter. */
function expectedNear(rows: Row[], point: { lat: number; lon: number }, radiusKm: number): NearTree[] {
  return rows
    .map((r) => ({ r, d: distanceKm(point, r.place) }))
    .filter(({ d }) => d <= radiusKm)
    .map(({ r, d }) => {
      const brebaReports = Math.min(r.brebaReports, r.reports);
      const ripened = Math.round(r.ripenedShare * r.reports);
      return {
        treeId: r.treeId,
        userId: r.userId,
        varietyId: r.varietyId,
        form: r.form,
        distanceKm: d,
        reports: r.reports,
        ripened,
        brebaReports,
        brebaRipened: Math.min(ripened, brebaReports),
        mainFirstRipeDoys: r.firstRipe,
        mainFrostToRipeDays: r.frostToRipe,
        // A days figure outside 1..366 is not a season.
        frostSeasons: r.frostSeasons.filter((s) => s.days > 0 && s.days <= 366),
      };
    });
}

const byContent = (a: NearTree, b: NearTree) => JSON.stringify(a).localeCompare(JSON.stringify(b));

describe('tree snapshot', () => {
  it('returns exactly the rows within the radius, with every figure, anywhere on the globe', () => {
    fc.assert(
      fc.property(fc.array(arbRow, { maxLength: 60 }), fc.array(arbQuery, { minLength: 1, maxLength: 4 }), (rows, queries) => {
        store(rows);
        const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
        expect(snapshot.columns.count).toBe(rows.length);
        for (const { point, radiusKm } of queries) {
          const got = treesWithin(snapshot, point, radiusKm).sort(byContent);
          expect(got).toEqual(expectedNear(rows, point, radiusKm).sort(byContent));
        }
      }),
      { numRuns: 80 },
    );
  });

  it('finds, for the season surface, exactly the grower frost seasons that the full radius query gives', () => {
    fc.assert(
      fc.property(fc.array(arbRow, { maxLength: 60 }), fc.array(arbQuery, { minLength: 1, maxLength: 4 }), (rows, queries) => {
        store(rows);
        const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
        const sorted = (xs: { distanceKm: number; seasonDays: number }[]) => [...xs].sort((a, b) => a.distanceKm - b.distanceKm || a.seasonDays - b.seasonDays);
        for (const { point, radiusKm } of queries) {
          expect(sorted(reportFrostSeasons(frostTreesWithin(snapshot, point, radiusKm)))).toEqual(sorted(reportFrostSeasons(treesWithin(snapshot, point, radiusKm))));
        }
      }),
      { numRuns: 60 },
    );
  });

  it('answers an empty atlas with no rows', () => {
    store([]);
    const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
    expect(treesWithin(snapshot, { lat: 0, lon: 0 }, 20_000)).toEqual([]);
    expect(snapshot.overall.size).toBe(0);
  });

  it("counts a grower's frost season once, at the grower's nearest tree, whatever the order of the rows", () => {
    const tree = (userId: number, distanceKm: number, frostSeasons: { season: number; days: number }[]): NearTree => ({
      treeId: userId * 10 + distanceKm,
      userId,
      varietyId: 1,
      form: 'ground',
      distanceKm,
      reports: 1,
      ripened: 1,
      brebaReports: 0,
      brebaRipened: 0,
      mainFirstRipeDoys: [],
      mainFrostToRipeDays: [],
      frostSeasons,
    });
    const trees = [
      tree(1, 30, [{ season: 2024, days: 180 }]),
      tree(1, 10, [{ season: 2024, days: 181 }, { season: 2023, days: 170 }]),
      tree(2, 20, [{ season: 2024, days: 200 }]),
    ];
    const sorted = (xs: { distanceKm: number; seasonDays: number }[]) => [...xs].sort((a, b) => a.distanceKm - b.distanceKm || a.seasonDays - b.seasonDays);
    const expected = [
      { distanceKm: 10, seasonDays: 181 },
      { distanceKm: 10, seasonDays: 170 },
      { distanceKm: 20, seasonDays: 200 },
    ];
    fc.assert(
      fc.property(fc.shuffledSubarray(trees, { minLength: 3, maxLength: 3 }), (shuffled) => {
        expect(sorted(reportFrostSeasons(shuffled))).toEqual(sorted(expected));
      }),
    );
  });
});
