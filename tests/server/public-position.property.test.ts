import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runNearbyDigest } from '../../server/email/digest';
import { upsertSubscription } from '../../server/email/digest.repo';
import type { MailMessage, Mailer } from '../../server/email/mailer';
import { writeStation } from '../../server/stations/stations.repo';
import { MIN_PUBLIC_RADIUS_KM, PUBLIC_GRID_STEP_DEG, toPublicPoint } from '../../shared/domain/public-grid';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';
import { listRoutes } from './reliability/helpers';

/*
 * The privacy rule of issue 15, as a property: for random atlases (fast-check), moving every
 * report's exact place anywhere else inside its public grid cell changes NO BYTE of any public
 * answer: every public GET route of the app (read from the Express router, as the access-control
 * test does, so a new public route is covered without editing this file), as a visitor and as
 * another signed-in grower, and the weekly nearby digest's membership and content.
 *
 * Routes that need parameters get them from PARAMETERS below; a public route that needs some and
 * is not there fails the test (add a row). A route is public when a visitor gets anything but 401
 * or 403 from it. The reports are written with SQL (the API's own writes are tested elsewhere);
 * the move is the UPDATE an edit makes (exact place and the unchanged grid cell, nothing else).
 */

/** The region of the random atlas: 6 x 6 public grid cells south-west of Albany, NY. */
const ORIGIN = { lat: 42.5, lon: -73.9 };
const CELLS = 6;
const STEP = PUBLIC_GRID_STEP_DEG;
const CENTRE = { lat: ORIGIN.lat + (CELLS / 2) * STEP, lon: ORIGIN.lon + (CELLS / 2) * STEP };
const RADII = [MIN_PUBLIC_RADIUS_KM, 9.5, 12, 17, 25];
/** Query points: the region's centre and points off the grid's lines, so circles cut cells. */
const POINTS = [CENTRE, { lat: 42.6213, lon: -73.8177 }, { lat: 42.7391, lon: -73.6842 }, { lat: 42.5532, lon: -73.7519 }];
const SEASONS = [2023, 2024, 2025];

let ctx: TestContext;
const varieties: number[] = [];
let proposedVariety = 0;
const growers: number[] = [];
let otherGrower: TestAgent;
const stations: number[] = [];

/** Where a generated report stands: its cell, and its spot in the cell (0..1 each way, kept off the cell's edges). */
const arbSpot = fc.tuple(fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.double({ min: 0.01, max: 0.99, noNaN: true }));

const arbReport = fc.record({
  cell: fc.tuple(fc.integer({ min: 0, max: CELLS - 1 }), fc.integer({ min: 0, max: CELLS - 1 })),
  spot: arbSpot,
  movedTo: arbSpot,
  grower: fc.integer({ min: 0, max: 2 }),
  tree: fc.integer({ min: 0, max: 2 }),
  variety: fc.integer({ min: 0, max: 3 }),
  form: fc.constantFrom('ground', 'container'),
  season: fc.constantFrom(...SEASONS),
  crop: fc.constantFrom('main', 'breba'),
  outcome: fc.constantFrom('ripened', 'ripened', 'unripe', 'no-fruit', 'dropped'),
  ripeDay: fc.integer({ min: 180, max: 290 }),
  frost: fc.option(fc.tuple(fc.integer({ min: 80, max: 140 }), fc.integer({ min: 120, max: 220 })), { nil: null }),
  status: fc.constantFrom('published', 'published', 'published', 'draft', 'hidden'),
});
type ArbReport = typeof arbReport extends fc.Arbitrary<infer T> ? T : never;

const arbAtlas = fc.record({ reports: fc.array(arbReport, { minLength: 1, maxLength: 14 }) });

const isoDay = (year: number, day: number) => new Date(Date.UTC(year, 0, day)).toISOString().slice(0, 10);
const exactPlace = (r: ArbReport, spot: [number, number]) => ({
  lat: ORIGIN.lat + (r.cell[0] + spot[0]) * STEP,
  lon: ORIGIN.lon + (r.cell[1] + spot[1]) * STEP,
});

interface World {
  reportIds: number[];
  cells: { lat: number; lon: number }[];
}

/** Replace the atlas's reports with the generated ones; returns their ids and cells. */
function writeAtlas(reports: ArbReport[]): World {
  const { sqlite } = ctx.db;
  sqlite.exec('DELETE FROM reports; DELETE FROM trees;');
  const trees = new Map<string, number>();
  const insert = sqlite.prepare(
    `INSERT INTO reports (user_id, tree_id, variety_id, proposed_variety_name, lat, lon, grid_lat, grid_lon, form, season, crop, outcome,
                          first_ripe_date, spring_frost_date, fall_frost_date, status, published_at)
     VALUES (@userId, @treeId, @varietyId, @proposed, @lat, @lon, @gridLat, @gridLon, @form, @season, @crop, @outcome,
             @firstRipe, @spring, @fall, @status, @publishedAt)`,
  );
  const publishedAt = new Date(Date.now() - 86_400_000).toISOString();
  const reportIds: number[] = [];
  const cells = new Map<string, { lat: number; lon: number }>();
  for (const r of reports) {
    const userId = growers[r.grower]!;
    const key = `${r.grower}:${r.tree}`;
    let treeId = trees.get(key);
    if (treeId === undefined) trees.set(key, (treeId = Number(sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'Garden tree')").run(userId).lastInsertRowid)));
    const place = exactPlace(r, r.spot);
    const grid = toPublicPoint(place.lat, place.lon);
    cells.set(`${grid.lat},${grid.lon}`, grid);
    const varietyId = r.variety === 3 ? proposedVariety : varieties[r.variety]!;
    reportIds.push(
      Number(
        insert.run({
          userId,
          treeId,
          varietyId,
          proposed: r.variety === 3 ? 'Cellside Plum (fictional, proposed)' : null,
          ...place,
          gridLat: grid.lat,
          gridLon: grid.lon,
          form: r.form,
          season: r.season,
          crop: r.crop,
          outcome: r.outcome,
          firstRipe: r.outcome === 'ripened' ? isoDay(r.season, r.ripeDay) : null,
          spring: r.frost ? isoDay(r.season, r.frost[0]) : null,
          fall: r.frost ? isoDay(r.season, r.frost[0] + r.frost[1]) : null,
          status: r.status,
          publishedAt: r.status === 'draft' ? null : publishedAt,
        }).lastInsertRowid,
      ),
    );
  }
  return { reportIds, cells: [...cells.values()] };
}

/** The move: each report to another spot of its own cell, as an edit of the exact place writes it. */
function moveWithinCells(reports: ArbReport[], ids: number[]): void {
  const update = ctx.db.sqlite.prepare('UPDATE reports SET lat = ?, lon = ?, grid_lat = ?, grid_lon = ? WHERE id = ?');
  reports.forEach((r, i) => {
    const before = toPublicPoint(exactPlace(r, r.spot).lat, exactPlace(r, r.spot).lon);
    const place = exactPlace(r, r.movedTo);
    const grid = toPublicPoint(place.lat, place.lon);
    expect(grid).toEqual(before); // the generator keeps the move inside the cell
    update.run(place.lat, place.lon, grid.lat, grid.lon, ids[i]);
  });
}

type Paths = (w: World) => string[];
const each = <T,>(xs: readonly T[], f: (x: T) => string[]): string[] => xs.flatMap(f);
const atPoints = (query: (p: { lat: number; lon: number }, radiusKm: number) => string): string[] => each(POINTS, (p) => RADII.map((r) => query(p, r)));

/**
 * Parameters for the public routes that need them (path parameters, or a query without which they
 * answer 400). Every list is what a visitor's script might ask; `[]` with a reason where nothing
 * in a random atlas exists to ask for.
 */
const PARAMETERS: Record<string, { paths: Paths; note?: string }> = {
  'GET /api/atlas/near': { paths: () => [...atPoints((p, r) => `/api/atlas/near?lat=${p.lat}&lon=${p.lon}&radiusKm=${r}`), `/api/atlas/near?lat=${CENTRE.lat}&lon=${CENTRE.lon}&radiusKm=12&form=container`] },
  'GET /api/varieties/:id/fit': { paths: () => each([...varieties, proposedVariety], (id) => [`/api/varieties/${id}/fit?lat=${CENTRE.lat}&lon=${CENTRE.lon}&radiusKm=9.5`, `/api/varieties/${id}/fit?lat=${POINTS[1]!.lat}&lon=${POINTS[1]!.lon}&radiusKm=${MIN_PUBLIC_RADIUS_KM}&form=container`]) },
  'GET /api/varieties/:id': { paths: () => [...varieties, proposedVariety].map((id) => `/api/varieties/${id}`) },
  'GET /api/guidance/ripe-dates': {
    paths: () =>
      each([...varieties, proposedVariety], (id) => [
        ...each(POINTS.slice(0, 2), (p) => RADII.slice(0, 2).map((r) => `/api/guidance/ripe-dates?varietyId=${id}&lat=${p.lat}&lon=${p.lon}&radiusKm=${r}`)),
        `/api/guidance/ripe-dates?varietyId=${id}&lat=${CENTRE.lat}&lon=${CENTRE.lon}&radiusKm=12&crop=breba`,
      ]),
  },
  'GET /api/guidance/season-success': { paths: () => ['/api/guidance/season-success', '/api/guidance/season-success?crop=breba', '/api/guidance/season-success?form=container&binDays=10'] },
  'GET /api/guidance/short-season': { paths: () => [120, 150, 180, 220].map((d) => `/api/guidance/short-season?seasonDays=${d}`) },
  'GET /api/atlas/pins': { paths: () => [4, 8, 10, 12, 14].map((zoom) => `/api/atlas/pins?bbox=-74.2,42.2,-73.3,43.1&zoom=${zoom}`) },
  'GET /api/atlas/pins/cell': { paths: (w) => w.cells.map((c) => `/api/atlas/pins/cell?lat=${c.lat}&lon=${c.lon}`) },
  'GET /api/reports': { paths: () => ['/api/reports', '/api/reports?pageSize=3&page=2', '/api/reports?sort=variety&dir=asc', '/api/reports?outcome=ripened'] },
  'GET /api/reports/:id': { paths: (w) => w.reportIds.map((id) => `/api/reports/${id}`) },
  'GET /api/reports/export.csv': { paths: () => ['/api/reports/export.csv', '/api/reports/export.csv?crop=main'] },
  'GET /api/reports/export.geojson': { paths: () => ['/api/reports/export.geojson', '/api/reports/export.geojson?form=container'] },
  'GET /api/stations/:id': { paths: () => stations.map((id) => `/api/stations/${id}`) },
  'GET /api/stations/normals/:code': { paths: () => ['/api/stations/normals/USW00014735'], note: 'reference climate: no report enters it' },
  'GET /api/places': { paths: () => ['/api/places?q=Albany'] },
  'GET /api/atlas/season-at': { paths: () => POINTS.map((p) => `/api/atlas/season-at?lat=${p.lat}&lon=${p.lon}`) },
  'GET /api/atlas/season-grid/:z/:x/:y': { paths: () => ['/api/atlas/season-grid/8/75/94', '/api/atlas/season-grid/9/151/188'] },
  'GET /api/places/nearest': { paths: () => POINTS.map((p) => `/api/places/nearest?lat=${p.lat}&lon=${p.lon}`) },
  'GET /api/varieties/:id/page': { paths: () => [...varieties, proposedVariety].map((id) => `/api/varieties/${id}/page`) },
  'GET /api/support/checkout/:sessionId': { paths: () => [], note: 'a checkout holds an amount and a state, no place' },
  'GET /tiles/*': { paths: () => ['/tiles/base/6/18/23.pbf'] },
  'GET /uploads/reports/:name': { paths: () => [], note: 'the random reports have no photos; a photo file holds no place (EXIF is stripped on upload)' },
};

/** GET routes that are not public in production and so are left out, with the reason. */
const NOT_PUBLIC: Record<string, string> = {
  'GET /api/dev/mail': 'the development mailbox: loopback only, not mounted in production (the digest it would show is compared below)',
  'GET /api/dev/mail/:id': 'the development mailbox, as above',
  'GET /metrics': 'operations: answers only loopback or a token holder; request counts and timings per route pattern, no place (tests/server/ops.test.ts)',
};

const ROUTES_CHECKED = new Set<string>();
/**
 * The pins' and the season surface's cache keys: the atlas (and stations) data version, counters every
 * report edit moves (drizzle/0005).
 * It tells that something changed, never where, so it is the one part of an answer left out.
 */
const DATA_VERSION = /"dataVersion":"\d+"|"version":"\d+\.\d+"/g;

/** Every public GET answer, keyed by path, as status and body bytes. */
async function publicAnswers(agent: TestAgent, world: World): Promise<Map<string, string>> {
  const answers = new Map<string, string>();
  for (const route of listRoutes(ctx.app)) {
    if (!route.startsWith('GET ') || NOT_PUBLIC[route]) continue;
    const row = PARAMETERS[route];
    let paths: string[];
    if (row) paths = row.paths(world);
    else if (/[:*]/.test(route)) {
      // Unknown route with parameters: fine only if it is not public.
      const probe = await agent.get(route.slice(4).replace(/:\w+/g, '1').replace('*', 'x'));
      expect(probe.status === 401 || probe.status === 403, `${route} answers ${probe.status} to ${agent === otherGrower ? 'another grower' : 'a visitor'}: add it to PARAMETERS`).toBe(true);
      continue;
    } else paths = [route.slice(4)];
    for (const path of paths) {
      const res = await agent.get(path);
      if (res.status === 401 || res.status === 403) continue;
      expect(res.status, `${path} answers ${res.status}: give ${route} its parameters in PARAMETERS (${res.text.slice(0, 200)})`).not.toBe(400);
      ROUTES_CHECKED.add(route);
      const body = Buffer.isBuffer(res.body) ? res.body.toString('base64') : res.text;
      answers.set(path, `${res.status} ${res.headers['content-type'] ?? ''} ${body.replace(DATA_VERSION, '"dataVersion":"(any)"')}`);
    }
  }
  return answers;
}

/** The nearby digests as they would be sent now to every subscriber (every subscription due). */
async function digestSent(now: Date): Promise<string> {
  const outbox: MailMessage[] = [];
  // The message is what is compared; its transport (SMTP to the local server) is tested in email-*.test.ts.
  const mailer: Mailer = { enabled: true, send: async (m) => void outbox.push(m), close: () => {} };
  ctx.db.sqlite.exec('UPDATE digest_subscriptions SET last_sent_at = NULL');
  await runNearbyDigest({ db: ctx.db, mailer, appUrl: 'http://atlas.test' }, now);
  return JSON.stringify(outbox);
}

beforeAll(async () => {
  ctx = createTestContext();
  const { sqlite } = ctx.db;
  for (const [name, days] of [['Cellside Amber (fictional)', 150], ['Cellside Violet (fictional)', 190], ['Cellside Green (fictional)', null]] as const) {
    varieties.push(Number(sqlite.prepare("INSERT INTO varieties (name, fig_type, status, ripening_class, typical_days_to_ripen, bears_breba) VALUES (?, 'common', 'accepted', 'mid', ?, 1)").run(name, days).lastInsertRowid));
  }
  proposedVariety = Number(sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Cellside Plum (fictional, proposed)', 'unknown', 'proposed')").run().lastInsertRowid);
  for (let g = 0; g < 3; g++) growers.push(Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash, email_verified_at) VALUES (?, ?, 'x', '2025-01-01')").run(`cell-grower-${g}@example.com`, `Cell grower ${g}`).lastInsertRowid));
  otherGrower = await ctx.signedIn('grower');
  // Digest subscribers of their own (a settings page shows when its digest was last sent), one
  // with a home at each query point and each radius, so many circles cut the random cells.
  for (const [i, home] of POINTS.entries()) {
    for (const radiusKm of RADII) {
      const id = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash, email_verified_at) VALUES (?, 'Cell subscriber', 'x', '2025-01-01')").run(`cell-subscriber-${i}-${radiusKm}@example.com`).lastInsertRowid);
      sqlite.prepare("INSERT INTO saved_places (user_id, name, lat, lon, is_home) VALUES (?, 'Home', ?, ?, 1)").run(id, home.lat, home.lon);
      upsertSubscription(ctx.db, id, { active: true, radiusKm });
    }
  }
  // Two stations in the region, so the season estimate has stations and growers' frost seasons to weigh.
  for (const [code, lat, lon, days50] of [['CELL1', 42.61, -73.8, 160], ['CELL2', 42.75, -73.66, 175]] as const) {
    ctx.db.transaction(() =>
      stations.push(
        writeStation(ctx.db, { name: `Cell station ${code}`, code, lat, lon, elevationM: null }, {
          days: [],
          freezeYears: [],
          summaries: [10, 50, 90].map((probability) => ({ thresholdF: 32, probability, lastSpringDoy: 120, firstFallDoy: 120 + days50, seasonDays: days50 + (50 - probability) / 2, years: 30 })),
        }).id,
      ),
    );
  }
});
afterAll(() => ctx.db.sqlite.close());

describe('public answers depend on the grid cell only', () => {
  it('moving every exact place inside its cell changes no byte of any public answer or digest', { timeout: 420_000 }, async () => {
    let run = 0;
    await fc.assert(
      fc.asyncProperty(arbAtlas, async (atlas) => {
        const agent = run++ % 2 === 0 ? ctx.agent() : otherGrower;
        const world = writeAtlas(atlas.reports);
        const now = new Date(Date.now() + 60_000);
        const before = await publicAnswers(agent, world);
        const digestBefore = await digestSent(now);

        moveWithinCells(atlas.reports, world.reportIds);
        const after = await publicAnswers(agent, world);
        expect([...after.keys()]).toEqual([...before.keys()]);
        for (const [path, answer] of before) expect(after.get(path), path).toBe(answer);
        expect(await digestSent(now)).toBe(digestBefore);
      }),
      // On a busy machine the runs (and a failure's shrinking) stop after 5 minutes; a failure found by then still fails the test.
      { numRuns: 16, interruptAfterTimeLimit: 300_000 },
    );
    // The property looked at every public route with something to ask (a route answering only 401/403 is not public).
    for (const [route, row] of Object.entries(PARAMETERS)) if (row.paths({ reportIds: [1], cells: [CENTRE] }).length) expect(ROUTES_CHECKED, route).toContain(route);
  });

  it('knows every GET route: a public route with parameters missing from PARAMETERS would fail above', () => {
    const gets = listRoutes(ctx.app).filter((r) => r.startsWith('GET '));
    for (const route of Object.keys(PARAMETERS)) expect(gets, `${route} is in PARAMETERS but not served`).toContain(route);
  });
});
