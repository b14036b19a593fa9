// Bench of GET /api/atlas/pins: 200,000 synthetic published reports clustered around a few thousand
// grower places in a temporary database; the app runs in this process on a random port and each
// viewport is asked many times over HTTP. Prints the cold index build, then median and p95 latency
// per viewport. Target: median under 30 ms. Then times an index rebuild after a write, in the request
// thread and in the worker thread (what a large atlas uses), and how long a request waits meanwhile.
// `PINS_BENCH_REPORTS=50000 npm run bench -- pins` for a quick run.
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createApp } from '../../server/app';
import { createPinCache } from '../../server/atlas-pins/pin-cache';
import { bulkLoad } from '../bulk-load';
import { createDb, migrateDb, type Db } from '../../server/db/client';
import { readConfig } from '../../server/lib/config';
import { seededRandom } from '../../server/seed/random';
import { CROPS, GROWING_FORMS, OUTCOMES } from '../../shared/domain/codes';
import { toPublicPoint } from '../../shared/domain/public-grid';

const REPORTS = Number(process.env.PINS_BENCH_REPORTS ?? 200_000);
const PLACES = 3_000;
const VARIETIES = 40;
const QUERIES = 80;
const TARGET_MEDIAN_MS = 30;

const random = seededRandom(20261202);
const REGIONS = [
  { minLat: 29, maxLat: 48, minLon: -123, maxLon: -70, weight: 0.65 },
  { minLat: 36, maxLat: 56, minLon: -9, maxLon: 28, weight: 0.35 },
];

/** Invented benchmark data: places in two regions, reports scattered within ~30 km of them. */
function fill(db: Db): void {
  const { sqlite } = db;
  sqlite.pragma('synchronous = OFF');
  const places = Array.from({ length: PLACES }, () => {
    const r = random() < REGIONS[0]!.weight ? REGIONS[0]! : REGIONS[1]!;
    return { lat: r.minLat + random() * (r.maxLat - r.minLat), lon: r.minLon + random() * (r.maxLon - r.minLon) };
  });
  // With the report triggers off and what they do replayed once at the end (scripts/bulk-load.ts).
  bulkLoad(sqlite, () => {
    const userId = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.com', 'Bench', 'x')").run().lastInsertRowid);
    const insertVariety = sqlite.prepare("INSERT INTO varieties (name, fig_type, is_fictional) VALUES (?, ?, 1)");
    const varietyIds = Array.from({ length: VARIETIES }, (_, v) => Number(insertVariety.run(`Bench variety ${v}`, v % 9 === 0 ? 'smyrna' : 'common').lastInsertRowid));
    const insertTree = sqlite.prepare('INSERT INTO trees (user_id, label) VALUES (?, ?)');
    const insertReport = sqlite.prepare(
      'INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, status) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
    );
    let treeId = 0;
    for (let i = 0; i < REPORTS; i++) {
      if (i % 4 === 0) treeId = Number(insertTree.run(userId, `tree ${i}`).lastInsertRowid);
      const place = places[Math.floor(random() * PLACES)]!;
      const lat = place.lat + (random() - 0.5) * 0.5;
      const lon = place.lon + (random() - 0.5) * 0.7;
      const grid = toPublicPoint(lat, lon);
      insertReport.run(
        userId,
        treeId,
        varietyIds[Math.floor(random() * VARIETIES)]!,
        lat,
        lon,
        grid.lat,
        grid.lon,
        GROWING_FORMS[Math.floor(random() * GROWING_FORMS.length)]!,
        2020 + Math.floor(random() * 6),
        CROPS[Math.floor(random() * CROPS.length)]!,
        OUTCOMES[Math.floor(random() * OUTCOMES.length)]!,
        random() < 0.97 ? 'published' : 'hidden',
      );
    }
  });
  sqlite.pragma('synchronous = NORMAL');
}

const VIEWPORTS = [
  { name: 'world, zoom 2', query: 'bbox=-180,-85,180,85&zoom=2' },
  { name: 'north-east USA, zoom 5', query: 'bbox=-85,36,-66,48&zoom=5' },
  { name: 'Albany region, zoom 9', query: 'bbox=-74.6,42.2,-73.0,43.1&zoom=9' },
  { name: 'one town, zoom 12', query: 'bbox=-73.9,42.6,-73.6,42.75&zoom=12' },
  { name: 'Europe, zoom 4, breba + ripened', query: 'bbox=-12,34,30,60&zoom=4&crop=breba&outcome=ripened' },
];

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-pins-bench-'));
const db = createDb(path.join(dir, 'bench.db'));
try {
  migrateDb(db);
  let t = performance.now();
  fill(db);
  console.log(`filled ${REPORTS.toLocaleString('en-US')} reports around ${PLACES} places in ${((performance.now() - t) / 1000).toFixed(1)} s`);

  const app = createApp({ db, config: { ...readConfig({ NODE_ENV: 'test' }), seedDemo: false, tilesDir: dir } });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/atlas/pins?`;

  let failed = false;
  try {
    // The floor: the same HTTP round trip to a route that does nothing, on this (shared) machine.
    const floor: number[] = [];
    for (let i = 0; i < QUERIES; i++) {
      const start = performance.now();
      await (await fetch(base.replace('/atlas/pins?', '/health'))).arrayBuffer();
      floor.push(performance.now() - start);
    }
    floor.sort((a, b) => a - b);
    console.log(`${'floor: GET /api/health'.padEnd(34)}                              | median ${percentile(floor, 50).toFixed(1).padStart(5)} ms | p95 ${percentile(floor, 95).toFixed(1).padStart(5)} ms`);

    for (const viewport of VIEWPORTS) {
      t = performance.now();
      const first = await fetch(base + viewport.query);
      const body = (await first.json()) as { features: unknown[]; totalReports: number };
      const cold = performance.now() - t;
      const times: number[] = [];
      for (let i = 0; i < QUERIES; i++) {
        const start = performance.now();
        const res = await fetch(base + viewport.query);
        await res.arrayBuffer();
        times.push(performance.now() - start);
      }
      times.sort((a, b) => a - b);
      const median = percentile(times, 50);
      failed ||= median >= TARGET_MEDIAN_MS;
      console.log(
        `${viewport.name.padEnd(34)} ${String(body.features.length).padStart(4)} pins of ${body.totalReports.toLocaleString('en-US')} reports | first ${cold.toFixed(0).padStart(4)} ms | median ${median.toFixed(1).padStart(5)} ms | p95 ${percentile(times, 95).toFixed(1).padStart(5)} ms`,
      );
    }
  } finally {
    server.close();
  }
  console.log(`target: median under ${TARGET_MEDIAN_MS} ms per viewport -> ${failed ? 'MISSED' : 'met'}`);

  // Rebuilds of the unfiltered index after a write.
  const addReport = () =>
    db.sqlite
      .prepare("INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome) SELECT user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome FROM reports WHERE id = 1")
      .run();
  const describe = (b: ReturnType<ReturnType<typeof createPinCache>['lastBuild']>) =>
    `${b!.cells.toLocaleString('en-US')} cells, counting ${b!.queryMs.toFixed(0)} ms + clustering ${b!.clusterMs.toFixed(0)} ms in the ${b!.where === 'worker' ? 'worker' : 'request'} thread`;
  const inThread = createPinCache(db, { worker: false });
  await inThread.get({});
  addReport();
  t = performance.now();
  await inThread.get({});
  console.log(`rebuild in the request thread: ${(performance.now() - t).toFixed(0)} ms blocking; ${describe(inThread.lastBuild())}`);
  const offThread = createPinCache(db, { worker: true, maxStaleMs: 0 });
  await offThread.get({});
  addReport();
  t = performance.now();
  await offThread.get({});
  const staleAnswer = performance.now() - t;
  const waits: number[] = [];
  const rebuilt = offThread.settled();
  let done = false;
  void rebuilt.then(() => (done = true));
  // Meanwhile the event loop stays free: time a zero-delay timer round trip until the rebuild lands.
  while (!done) {
    const start = performance.now();
    await new Promise((resolve) => setTimeout(resolve, 0));
    waits.push(performance.now() - start);
  }
  console.log(
    `rebuild in the worker thread: stale answer in ${staleAnswer.toFixed(1)} ms, fresh index after ${(performance.now() - t).toFixed(0)} ms; event loop delay meanwhile max ${Math.max(...waits).toFixed(0)} ms; ${describe(offThread.lastBuild())}`,
  );
  await offThread.close();
} finally {
  db.sqlite.close();
  fs.rmSync(dir, { recursive: true, force: true });
}
