import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type EvidenceReport, type TreeEvidence, groupTreeEvidence, varietyOverall } from '../../shared/domain/ripening-stats';
import { readTreeSnapshot } from '../../server/atlas/tree-snapshot';
import { createTestDb } from '../helpers/test-app';
import { toPublicPoint } from '../../shared/domain/public-grid';
import type { Db } from '../../server/db/client';

/*
 * tree_evidence is kept by SQLite triggers on reports (drizzle/0004_tree-evidence.sql). Whatever
 * growers and editors do to reports, it must hold exactly what grouping the published reports in
 * plain code gives (groupTreeEvidence), with days of year worked out here by JavaScript's Date.
 */

let db: Db;
let cleanup: () => void;
/** Public grid cell centres (shared/domain/public-grid.ts); each report lies somewhere inside one. */
const PLACES = [
  { lat: 42.675, lon: -73.775 },
  { lat: 42.725, lon: -73.825 },
  // Southern hemisphere: a season from spring frost in September to a first fig in February.
  { lat: -37.825, lon: 144.975 },
];

beforeAll(() => {
  const t = createTestDb();
  db = t.db;
  cleanup = () => {
    db.sqlite.close();
  };
  for (const name of ['Test Amber (fictional)', 'Test Violet (fictional)']) {
    db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES (?, 'common', 'accepted')").run(name);
  }
});
afterAll(() => cleanup());

/** Day of year (1-366) of an ISO date, by the calendar (not SQLite). */
function dayOfYear(iso: string): number {
  const d = new Date(`${iso}T00:00:00Z`);
  return Math.round((d.getTime() - Date.UTC(d.getUTCFullYear(), 0, 1)) / 86_400_000) + 1;
}

type ReportRow = {
  id: number;
  tree_id: number;
  user_id: number;
  variety_id: number | null;
  lat: number;
  lon: number;
  grid_lat: number;
  grid_lon: number;
  form: EvidenceReport['form'];
  crop: EvidenceReport['crop'];
  outcome: EvidenceReport['outcome'];
  season: number;
  status: string;
  first_ripe_date: string | null;
  spring_frost_date: string | null;
  fall_frost_date: string | null;
};

const placeIndex = (lat: number, lon: number) => PLACES.findIndex((p) => p.lat === lat && p.lon === lon);

/** What tree_evidence should hold, from the reports table, in a comparable form. */
function expected(): string[] {
  const reports = db.sqlite.prepare("SELECT * FROM reports WHERE status = 'published' AND variety_id IS NOT NULL").all() as ReportRow[];
  const asEvidence: EvidenceReport[] = reports.map((r) => ({
    reportId: r.id,
    treeId: r.tree_id,
    userId: r.user_id,
    varietyId: r.variety_id!,
    crop: r.crop,
    form: r.form,
    outcome: r.outcome,
    season: r.season,
    // groupTreeEvidence keys a place by its distance; here every place has its own number.
    distanceKm: placeIndex(r.grid_lat, r.grid_lon),
    firstRipeDoy: r.first_ripe_date ? dayOfYear(r.first_ripe_date) : null,
    springFrostDoy: r.spring_frost_date ? dayOfYear(r.spring_frost_date) : null,
  }));
  const frostSeasons = new Map<string, string[]>();
  for (const r of reports) {
    if (!r.spring_frost_date || !r.fall_frost_date) continue;
    const key = `${r.tree_id}|${r.user_id}|${r.variety_id}|${placeIndex(r.grid_lat, r.grid_lon)}|${r.form}`;
    const days = Math.round((Date.parse(r.fall_frost_date) - Date.parse(r.spring_frost_date)) / 86_400_000) - 1;
    frostSeasons.set(key, [...(frostSeasons.get(key) ?? []), `${r.season}:${days}`]);
  }
  return groupTreeEvidence(asEvidence)
    .map((t) => {
      const key = `${t.treeId}|${t.userId}|${t.varietyId}|${t.distanceKm}|${t.form}`;
      return [key, t.reports, t.ripened, t.brebaReports, t.brebaRipened, sorted(t.mainFirstRipeDoys), sorted(t.mainFrostToRipeDays), sortedText(frostSeasons.get(key) ?? [])].join(' ');
    })
    .sort();
}

function stored(): string[] {
  const rows = db.sqlite.prepare('SELECT * FROM tree_evidence').all() as Record<string, number | string | null>[];
  return rows
    .map((e) => {
      const key = `${e.tree_id}|${e.user_id}|${e.variety_id}|${placeIndex(e.grid_lat as number, e.grid_lon as number)}|${e.form}`;
      const list = (v: unknown) => (v === null ? [] : String(v).split(',').map(Number));
      return [key, e.reports, e.ripened, e.breba_reports, e.breba_ripened, sorted(list(e.first_ripe_doys)), sorted(list(e.frost_to_ripe_days)), sortedText(e.frost_seasons === null ? [] : String(e.frost_seasons).split(','))].join(' ');
    })
    .sort();
}

const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b).join(',');
const sortedText = (xs: string[]) => [...xs].sort().join(',');

const arbReport = fc.record({
  tree: fc.integer({ min: 0, max: 3 }),
  variety: fc.constantFrom(1, 2, null),
  place: fc.integer({ min: 0, max: PLACES.length - 1 }),
  /** Where in its cell the tree stands: tree_evidence must not depend on it. */
  inCell: fc.tuple(fc.double({ min: -0.0249, max: 0.0249, noNaN: true }), fc.double({ min: -0.0249, max: 0.0249, noNaN: true })),
  form: fc.constantFrom('ground' as const, 'container' as const),
  crop: fc.constantFrom('breba' as const, 'main' as const),
  outcome: fc.constantFrom('no-fruit' as const, 'dropped' as const, 'unripe' as const, 'ripened' as const),
  season: fc.integer({ min: 2022, max: 2025 }),
  status: fc.constantFrom('published', 'published', 'draft', 'hidden'),
  ripeDay: fc.option(fc.integer({ min: 0, max: 364 }), { nil: null }),
  springDay: fc.option(fc.integer({ min: 0, max: 364 }), { nil: null }),
  fallAfter: fc.option(fc.integer({ min: 30, max: 300 }), { nil: null }),
});

const arbOp = fc.oneof(
  fc.record({ kind: fc.constant('insert' as const), report: arbReport }),
  fc.record({ kind: fc.constant('update' as const), pick: fc.nat(), report: arbReport }),
  fc.record({ kind: fc.constant('delete' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('delete-grower' as const), pick: fc.nat() }),
);

const isoDay = (season: number, offset: number) => new Date(Date.UTC(season, 0, 1 + offset)).toISOString().slice(0, 10);

type ArbReport = typeof arbReport extends fc.Arbitrary<infer T> ? T : never;

function columns(r: ArbReport, trees: { id: number; userId: number }[]) {
  const tree = trees[r.tree % trees.length]!;
  const place = PLACES[r.place]!;
  const exact = { lat: place.lat + r.inCell[0], lon: place.lon + r.inCell[1] };
  const grid = toPublicPoint(exact.lat, exact.lon);
  const spring = r.springDay === null ? null : isoDay(r.season, r.springDay);
  return {
    tree_id: tree.id,
    user_id: tree.userId,
    variety_id: r.variety,
    proposed_variety_name: r.variety === null ? 'Proposed (fictional)' : null,
    lat: exact.lat,
    lon: exact.lon,
    grid_lat: grid.lat,
    grid_lon: grid.lon,
    form: r.form,
    crop: r.crop,
    outcome: r.outcome,
    season: r.season,
    status: r.status,
    first_ripe_date: r.ripeDay === null ? null : isoDay(r.season, r.ripeDay),
    spring_frost_date: spring,
    fall_frost_date: spring && r.fallAfter !== null ? isoDay(r.season, (r.springDay ?? 0) + r.fallAfter) : null,
  };
}

describe('tree_evidence (kept by triggers) and the overall figures read from it', { timeout: 120_000 }, () => {
  it('always equals the grouping of the published reports, whatever is inserted, edited, hidden, moved or deleted', () => {
    fc.assert(
      fc.property(fc.array(arbOp, { minLength: 1, maxLength: 30 }), (ops) => {
        const { sqlite } = db;
        sqlite.exec('DELETE FROM reports; DELETE FROM trees; DELETE FROM users;');
        const trees: { id: number; userId: number }[] = [];
        for (let u = 0; u < 2; u++) {
          const userId = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES (?, 'Grower', 'x')").run(`g${u}-${Math.random()}@example.com`).lastInsertRowid);
          for (let t = 0; t < 2; t++) trees.push({ id: Number(sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'tree')").run(userId).lastInsertRowid), userId });
        }
        for (const op of ops) {
          const ids = sqlite.prepare('SELECT id FROM reports ORDER BY id').pluck().all() as number[];
          if ((op.kind === 'insert' || op.kind === 'update') && trees.length === 0) continue;
          if (op.kind === 'insert') {
            const c = columns(op.report, trees);
            const names = Object.keys(c);
            sqlite.prepare(`INSERT INTO reports (${names.join(', ')}) VALUES (${names.map((n) => `@${n}`).join(', ')})`).run(c);
          } else if (op.kind === 'update' && ids.length > 0) {
            const c = columns(op.report, trees);
            const names = Object.keys(c);
            sqlite.prepare(`UPDATE reports SET ${names.map((n) => `${n} = @${n}`).join(', ')} WHERE id = @id`).run({ ...c, id: ids[op.pick % ids.length] });
          } else if (op.kind === 'delete' && ids.length > 0) {
            sqlite.prepare('DELETE FROM reports WHERE id = ?').run(ids[op.pick % ids.length]);
          } else if (op.kind === 'delete-grower') {
            // Deleting an account deletes its reports by ON DELETE CASCADE: the triggers must see it.
            if (trees.length === 0) continue;
            const userId = trees[op.pick % trees.length]!.userId;
            sqlite.prepare('DELETE FROM users WHERE id = ?').run(userId);
            trees.splice(0, trees.length, ...trees.filter((t) => t.userId !== userId));
          }
        }
        expect(stored()).toEqual(expected());
        // Each variety's overall figures, computed by the tree snapshot, equal varietyOverall over its rows.
        const rows = (sqlite.prepare('SELECT * FROM tree_evidence').all() as Record<string, never>[]).map(
          (e): TreeEvidence => ({
            treeId: e.tree_id,
            userId: e.user_id,
            varietyId: e.variety_id,
            form: e.form,
            distanceKm: 0,
            reports: e.reports,
            ripened: e.ripened,
            brebaReports: e.breba_reports,
            brebaRipened: e.breba_ripened,
            mainFirstRipeDoys: [],
            mainFrostToRipeDays: e.frost_to_ripe_days === null ? [] : String(e.frost_to_ripe_days).split(',').map(Number),
          }),
        );
        const fromSnapshot = new Map(readTreeSnapshot(sqlite).data.overall);
        for (const varietyId of [1, 2]) {
          const own = rows.filter((r) => r.varietyId === varietyId);
          const expected = varietyOverall(own);
          const got = fromSnapshot.get(varietyId) ?? { share: null, neededDays: null, treesBehindNeed: 0 };
          expect(got.treesBehindNeed).toBe(expected.treesBehindNeed);
          expect(got.neededDays).toBe(expected.neededDays);
          if (expected.share === null) expect(got.share).toBeNull();
          else expect(got.share).toBeCloseTo(expected.share, 12);
        }
        // Ids follow the public place: the high part is the row's 0.1-degree cell (drizzle/0012_tree-evidence-public-cell.sql).
        for (const e of sqlite.prepare('SELECT id, grid_lat AS lat, grid_lon AS lon FROM tree_evidence').all() as { id: number; lat: number; lon: number }[]) {
          const cell = Math.floor((e.lat + 90) * 10) * 3601 + Math.floor((e.lon + 180) * 10);
          expect(Math.floor(e.id / 2 ** 30)).toBe(cell);
          expect(Number.isSafeInteger(e.id)).toBe(true);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('holds each tree on its public grid cell: moving a report inside its cell changes no row, not even its id', () => {
    const { sqlite } = db;
    sqlite.exec('DELETE FROM reports; DELETE FROM trees; DELETE FROM users;');
    const userId = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES ('cell@example.com', 'Grower', 'x')").run().lastInsertRowid);
    const treeIds = [0, 1].map(() => Number(sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'tree')").run(userId).lastInsertRowid));
    const insert = sqlite.prepare(
      "INSERT INTO reports (tree_id, user_id, variety_id, lat, lon, grid_lat, grid_lon, form, crop, outcome, season, status) VALUES (?, ?, 1, ?, ?, 42.675, -73.775, 'ground', 'main', 'ripened', ?, 'published')",
    );
    // Two seasons of one tree at two exact spots of one cell: one row, on the cell's centre.
    insert.run(treeIds[0], userId, 42.6512, -73.7561, 2024);
    insert.run(treeIds[0], userId, 42.6988, -73.7993, 2025);
    insert.run(treeIds[1], userId, 42.66, -73.78, 2025);
    const rows = () => sqlite.prepare('SELECT * FROM tree_evidence ORDER BY id').all();
    const before = rows();
    expect(before).toHaveLength(2);
    expect(before).toEqual(expect.arrayContaining([expect.objectContaining({ tree_id: treeIds[0], grid_lat: 42.675, grid_lon: -73.775, reports: 2 })]));
    expect(Object.keys(before[0] as object)).not.toContain('lat');
    // An edit that rewrites every column the triggers watch, with a new exact place in the same cell.
    sqlite
      .prepare("UPDATE reports SET lat = 42.6801, lon = -73.7502, grid_lat = 42.675, grid_lon = -73.775, form = 'ground', crop = 'main', outcome = 'ripened', status = 'published' WHERE tree_id = ?")
      .run(treeIds[1]);
    expect(rows()).toEqual(before);
  });
});
