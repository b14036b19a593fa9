// Bench of GET /api/atlas/near: 1,000,000 synthetic reports clustered around a few thousand grower
// places and 5,000 stations in a temporary database, plus the shipped NOAA normals (7,501 stations; their
// load time and how much of the contiguous US they cover are printed first); at 50 km and 200 km it prints the endpoint's
// median and p95 latency over HTTP, the same aggregation as one raw indexed SQL query (the floor),
// and a brute-force scan of every row. `NEAR_BENCH_REPORTS=100000 npm run bench -- near` for a quick run.
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createApp } from '../../server/app';
import { createDb, migrateDb, type Db } from '../../server/db/client';
import { readConfig } from '../../server/lib/config';
import { seededRandom } from '../../server/seed/random';
import { boundingBox } from '../../shared/domain/geo';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { CROPS, GROWING_FORMS, OUTCOMES } from '../../shared/domain/codes';
import { FORM_HEAD_START_DAYS } from '../../shared/domain/season-fit';
import { bulkLoad } from '../bulk-load';
import { loadShippedNormals } from '../../server/normals/normals.repo';
import { CELL_SEASON_RADIUS_KM } from '../../server/atlas/chance-data';
import { readStationSnapshot, stationSeasonsInBoxes } from '../../server/stations/station-snapshot';
import { estimateSeason } from '../../shared/domain/season-estimate';
import { COVERAGE_RADIUS_KM, normalsCoverage } from './normals-coverage';

const REPORTS = Number(process.env.NEAR_BENCH_REPORTS ?? 1_000_000);
const CLUSTERS = 3_000;
const GROWERS = Math.max(CLUSTERS, Math.round(REPORTS / 60));
const STATIONS = 5_000;
const VARIETIES = 60;
const SEASONS = [2021, 2022, 2023, 2024, 2025];
const HTTP_QUERIES = 200;
const SQL_QUERIES = 200;
const SCAN_QUERIES = 5;
const RADII = [50, 200] as const;
const TARGET_MEDIAN_MS: Record<(typeof RADII)[number], number> = { 50: 10, 200: 50 };

/** The bench stations' typical frost-free days at a latitude (before each station's own noise). */
const benchSeasonDays = (lat: number) => 330 - (lat - 29) * 7;
/** Bench variety v's days to ripen (v from 0). */
const benchNeedDays = (v: number) => 120 + (v % 9) * 10;

/** Regions where the synthetic growers live: North America's fig belt and the cool north, and Europe. */
const REGIONS = [
  { minLat: 29, maxLat: 48, minLon: -123, maxLon: -70, weight: 0.6 },
  { minLat: 36, maxLat: 56, minLon: -9, maxLon: 28, weight: 0.4 },
];

const random = seededRandom(7_2026);
const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());

function randomPlace(): { lat: number; lon: number } {
  const region = random() < REGIONS[0]!.weight ? REGIONS[0]! : REGIONS[1]!;
  return { lat: region.minLat + random() * (region.maxLat - region.minLat), lon: region.minLon + random() * (region.maxLon - region.minLon) };
}

/**
 * Fills an empty, migrated database with the benchmark's atlas (the season surface bench builds the
 * same). The climate comes first: the bench's stations and the shipped NOAA normals, as on every
 * install. Each grower's seasons then follow the typical season that climate gives at the grower's
 * public grid cell (the estimator the atlas itself uses), so the synthetic gardens and the atlas's
 * climate agree, as real gardens and real normals do.
 */
export function build(db: Db): { centres: { lat: number; lon: number }[] } {
  const { sqlite } = db;
  const centres = Array.from({ length: CLUSTERS }, randomPlace);
  sqlite.pragma('synchronous = OFF');
  sqlite.transaction(() => {
    const insertStation = sqlite.prepare('INSERT INTO stations (code, name, lat, lon, elevation_m, day_count) VALUES (?, ?, ?, ?, ?, 0)');
    const insertSummary = sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, last_spring_doy, first_fall_doy, season_days, years) VALUES (?, ?, ?, ?, ?, ?, 30)');
    for (let s = 0; s < STATIONS; s++) {
      const place = randomPlace();
      const id = Number(insertStation.run(`BENCH${s}`, `Bench station ${s}`, place.lat, place.lon, 100).lastInsertRowid);
      const days50 = Math.round(benchSeasonDays(place.lat) + gauss() * 10);
      for (const thresholdF of [32, 28, 24]) {
        const extra = (32 - thresholdF) * 3;
        const spring50 = Math.round((365 - days50) / 2) - extra;
        insertSummary.run(id, thresholdF, 10, spring50 + 12, 365 - spring50 + extra - 12, days50 + extra * 2 - 22);
        insertSummary.run(id, thresholdF, 50, spring50, 365 - spring50 + extra, days50 + extra * 2);
        insertSummary.run(id, thresholdF, 90, spring50 - 12, 365 - spring50 + extra + 12, days50 + extra * 2 + 22);
      }
    }
  })();
  loadShippedNormals(db);
  const climate = readStationSnapshot(db);
  /** The typical frost-free days at a grid cell, as the atlas estimates them from its stations. */
  const typicalDays = (cell: { lat: number; lon: number }) =>
    estimateSeason({ point: cell, stations: stationSeasonsInBoxes(climate, cell, CELL_SEASON_RADIUS_KM), reportFrostSeasons: [], radiusKm: CELL_SEASON_RADIUS_KM }).days50 ?? benchSeasonDays(cell.lat);

  // Bulk load without the per-row triggers (R*Trees, tree_evidence): scripts/bulk-load.ts fills
  // what they would have in one pass afterwards and puts them back as the migrations wrote them.
  bulkLoad(sqlite, () => {
    const insertVariety = sqlite.prepare("INSERT INTO varieties (name, fig_type, bears_breba, ripening_class, typical_days_to_ripen, status, is_fictional) VALUES (?, ?, ?, ?, ?, ?, 1)");
    for (let v = 0; v < VARIETIES; v++) {
      const figType = v % 11 === 0 ? 'smyrna' : v % 7 === 0 ? 'san-pedro' : 'common';
      const status = v % 20 === 19 ? 'rejected' : 'accepted';
      insertVariety.run(`Bench variety ${v + 1}`, figType, v % 3 === 0 ? 1 : 0, (['early', 'mid', 'late'] as const)[v % 3], benchNeedDays(v), status);
    }
    const insertUser = sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role) VALUES (?, ?, 'x', 'grower')");
    const growerPlaces: { lat: number; lon: number; cluster: number; grid: { lat: number; lon: number }; days: number }[] = [];
    for (let g = 0; g < GROWERS; g++) {
      insertUser.run(`bench-${g}@bench.test`, `Bench grower ${g}`);
      const cluster = g % CLUSTERS;
      const c = centres[cluster]!;
      // Growers sit within a few tens of km of their cluster's centre (a town and its suburbs).
      const place = { lat: c.lat + gauss() * 0.12, lon: c.lon + gauss() * 0.16 };
      const grid = toPublicPoint(place.lat, place.lon);
      growerPlaces.push({ ...place, cluster, grid, days: typicalDays(grid) });
    }
    const insertTree = sqlite.prepare('INSERT INTO trees (user_id, label) VALUES (?, ?)');
    const insertReport = sqlite.prepare(
      `INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, first_ripe_date, spring_frost_date, fall_frost_date, status)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    );
    let written = 0;
    let treeId = 0;
    while (written < REPORTS) {
      const grower = Math.floor(random() * GROWERS);
      const place = growerPlaces[grower]!;
      treeId = Number(insertTree.run(grower + 1, 'tree').lastInsertRowid);
      // A cluster favours a handful of varieties, as real neighbourhoods share cuttings.
      const varietyId = 1 + ((place.cluster * 7 + Math.floor(random() * 12)) % VARIETIES);
      const form = GROWING_FORMS[Math.floor(random() * 4)]!;
      const seasons = 1 + Math.floor(random() * SEASONS.length);
      for (let s = 0; s < seasons && written < REPORTS; s++) {
        const season = SEASONS[SEASONS.length - 1 - s]!;
        const crop = random() < 0.2 ? CROPS[0] : CROPS[1];
        // Whether a season ripens follows the season, as in a garden: this year's frost-free days at
        // the cell (the typical ones, give or take a year's luck), the form's head start and the
        // variety's need set the odds (a logistic over ±20 days of margin, at most 85 %); the rest
        // is a garden's luck (no fruit, dropped, unripe).
        const seasonDays = Math.round(place.days + gauss() * 12);
        const margin = seasonDays + FORM_HEAD_START_DAYS[form] - benchNeedDays(varietyId - 1);
        const outcome = OUTCOMES[random() < 0.85 / (1 + Math.exp(-margin / 20)) ? 3 : Math.floor(random() * 3)]!;
        const spring = 80 + Math.floor(random() * 50);
        const ripe = outcome === 'ripened' ? isoDate(season, spring + Math.min(seasonDays - 5, 90 + Math.floor(random() * 80))) : null;
        const status = random() < 0.03 ? 'hidden' : 'published';
        insertReport.run(grower + 1, treeId, varietyId, place.lat, place.lon, place.grid.lat, place.grid.lon, form, season, crop, outcome, ripe, random() < 0.5 ? isoDate(season, spring) : null, random() < 0.5 ? isoDate(season, spring + seasonDays) : null, status);
        written++;
      }
    }
  });
  sqlite.exec('ANALYZE');
  sqlite.pragma('synchronous = NORMAL');
  return { centres };
}

function isoDate(year: number, dayOfYear: number): string {
  const date = new Date(Date.UTC(year, 0, 1));
  date.setUTCDate(dayOfYear);
  return date.toISOString().slice(0, 10);
}

/** Haversine in SQL (SQLite's built-in math functions), for the floor and the scan. */
const SQL_DISTANCE = `2 * 6371.0088 * asin(min(1, sqrt(pow(sin(radians(r.lat - :lat) / 2), 2) + cos(radians(:lat)) * cos(radians(r.lat)) * pow(sin(radians(r.lon - :lon) / 2), 2))))`;

/** Per-variety reports, trees and ripened trees within the radius: what the endpoint aggregates. */
const AGGREGATE = `SELECT r.variety_id, count(*) AS reports, count(DISTINCT r.tree_id) AS trees,
  count(DISTINCT CASE WHEN r.outcome = 'ripened' THEN r.tree_id END) AS ripened, count(DISTINCT r.user_id) AS growers`;

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

function stats(times: number[]): { median: number; p95: number } {
  const sorted = [...times].sort((a, b) => a - b);
  return { median: percentile(sorted, 50), p95: percentile(sorted, 95) };
}

async function main() {
  // NEAR_BENCH_DB=/some/file.db keeps the built database for profiling (and reuses it next time).
  const keep = process.env.NEAR_BENCH_DB;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-near-bench-'));
  const reuse = !!keep && fs.existsSync(keep);
  const db = createDb(keep ?? path.join(dir, 'bench.db'));
  try {
    let t0 = performance.now();
    let centres: { lat: number; lon: number }[];
    // A new database is built on the schema; one kept by an older version gets the newer migrations.
    migrateDb(db);
    if (reuse) {
      centres = (db.sqlite.prepare('SELECT lat, lon FROM reports WHERE id % 300 = 0 LIMIT 3000').all() as { lat: number; lon: number }[]);
      console.log(`Reusing ${keep}`);
    } else {
      ({ centres } = build(db));
      console.log(`Built ${REPORTS.toLocaleString()} reports (${GROWERS.toLocaleString()} growers around ${CLUSTERS.toLocaleString()} places) and ${STATIONS.toLocaleString()} stations in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    }

    // The shipped NOAA normals (7,501 stations) join the bench's stations, as on every install.
    const normals = normalsCoverage();
    console.log(
      `Reference climate: the shipped NOAA 1981-2010 normals (${normals.stations.toLocaleString()} stations) load into a fresh database in ${(normals.loadMs / 1000).toFixed(2)} s (target < 5 s), ` +
        `${normals.secondLoadMs.toFixed(0)} ms on a later start (already loaded); ${(normals.share * 100).toFixed(1)} % of ${normals.points.toLocaleString()} random points in the contiguous US get a season with its source (a station within ${COVERAGE_RADIUS_KM} km); ` +
        `the season estimate over them takes ${normals.estimateMs[50].toFixed(3)} ms at 50 km and ${normals.estimateMs[200].toFixed(3)} ms at 200 km (median, in process).`,
    );
    loadShippedNormals(db); // a database kept by an older version of this bench may lack them (build() loads them first)

    const app = createApp({ db, config: { ...readConfig({ NODE_ENV: 'test' }), seedDemo: false } });
    const server = app.listen(0, '127.0.0.1');
    // The first call waits for the tree snapshot (every tree row, read in a worker thread); keep the
    // connection open past it.
    server.keepAliveTimeout = 120_000;
    await new Promise((resolve) => server.once('listening', resolve));
    const port = (server.address() as AddressInfo).port;
    t0 = performance.now();
    await fetchNear(port, centres[0]!, 50);
    const rss = process.memoryUsage();
    console.log(`First call (reads the tree snapshot in a worker thread): ${((performance.now() - t0) / 1000).toFixed(1)} s; process resident memory afterwards: ${Math.round(rss.rss / 1e6)} MB (the database file is memory-mapped)`);
    // The chance model is fitted in another worker meanwhile; the answers carry it once it is ready.
    t0 = performance.now();
    while (performance.now() - t0 < 600_000 && !(await fetchNear(port, centres[0]!, 200)).varieties.some((v) => v.chance)) await new Promise((resolve) => setTimeout(resolve, 500));
    console.log(`Chance model ready ${((performance.now() - t0) / 1000).toFixed(1)} s later (fitted in a worker thread)`);

    const floorStatement = db.sqlite.prepare(
      `${AGGREGATE} FROM reports_rtree t JOIN reports r ON r.id = t.id JOIN varieties v ON v.id = r.variety_id
       WHERE t.min_lat <= :maxLat AND t.max_lat >= :minLat AND t.min_lon <= :maxLon AND t.max_lon >= :minLon
         AND r.status = 'published' AND v.status = 'accepted' AND ${SQL_DISTANCE} <= :radius
       GROUP BY r.variety_id`,
    );
    const scanStatement = db.sqlite.prepare(
      `${AGGREGATE} FROM reports r NOT INDEXED JOIN varieties v ON v.id = r.variety_id
       WHERE r.status = 'published' AND v.status = 'accepted' AND ${SQL_DISTANCE} <= :radius GROUP BY r.variety_id`,
    );

    const rows: string[][] = [];
    const verdicts: string[] = [];
    for (const radius of RADII) {
      const points = Array.from({ length: HTTP_QUERIES }, () => {
        const c = centres[Math.floor(random() * centres.length)]!;
        return { lat: +(c.lat + gauss() * 0.1).toFixed(4), lon: +(c.lon + gauss() * 0.1).toFixed(4) };
      });
      // Warm up: the first calls fill caches (statement plans, the JIT).
      for (const p of points.slice(0, 10)) await fetchNear(port, p, radius);

      const httpTimes: number[] = [];
      let trees = 0;
      for (const p of points) {
        t0 = performance.now();
        const body = await fetchNear(port, p, radius);
        httpTimes.push(performance.now() - t0);
        trees += body.totals.trees;
      }
      const floorTimes: number[] = [];
      let floorReports = 0;
      for (const p of points.slice(0, SQL_QUERIES)) {
        t0 = performance.now();
        const [box] = boundingBox(p, radius);
        const result = floorStatement.all({ ...box!, lat: p.lat, lon: p.lon, radius }) as { reports: number }[];
        floorTimes.push(performance.now() - t0);
        floorReports += result.reduce((n, r) => n + r.reports, 0);
      }
      const scanTimes: number[] = [];
      for (const p of points.slice(0, SCAN_QUERIES)) {
        t0 = performance.now();
        scanStatement.all({ lat: p.lat, lon: p.lon, radius });
        scanTimes.push(performance.now() - t0);
      }
      const http = stats(httpTimes);
      const floor = stats(floorTimes);
      const scan = stats(scanTimes);
      rows.push([
        `${radius} km`,
        Math.round(floorReports / SQL_QUERIES).toLocaleString(),
        Math.round(trees / HTTP_QUERIES).toLocaleString(),
        http.median.toFixed(2),
        http.p95.toFixed(2),
        floor.median.toFixed(2),
        floor.p95.toFixed(2),
        scan.median.toFixed(0),
        (http.median / floor.median).toFixed(2),
        (scan.median / http.median).toFixed(0),
      ]);
      const ok = (flag: boolean) => (flag ? 'met' : 'MISSED');
      verdicts.push(
        `${radius} km: median ${http.median.toFixed(2)} ms < ${TARGET_MEDIAN_MS[radius]} ms ${ok(http.median < TARGET_MEDIAN_MS[radius])}; ` +
          `within 3x the raw query (${(http.median / floor.median).toFixed(2)}x) ${ok(http.median <= 3 * floor.median)}; ` +
          `>= 50x faster than the scan (${(scan.median / http.median).toFixed(0)}x) ${ok(scan.median >= 50 * http.median)}`,
      );
    }
    server.close();
    printTable(
      ['radius', 'reports in radius', 'trees in radius', 'HTTP median ms', 'HTTP p95 ms', 'raw SQL median ms', 'raw SQL p95 ms', 'scan median ms', 'HTTP / raw', 'scan / HTTP'],
      rows,
    );
    console.log(`\nHTTP: ${HTTP_QUERIES} sequential GET /api/atlas/near per radius (after 10 warm-up calls); raw SQL: ${SQL_QUERIES} runs of one R*Tree + exact-distance GROUP BY query over the reports (the floor the targets use); scan: ${SCAN_QUERIES} runs of the same query over every row.`);
    for (const line of verdicts) console.log(`Targets, ${line}`);
    // Latency figures mean little on a busy machine: say how busy it was.
    const [load1] = os.loadavg();
    console.log(`Machine: ${os.cpus().length} CPUs, load average ${load1!.toFixed(1)} at the end of the run.`);
  } finally {
    db.sqlite.close();
    if (keep) console.log(`Kept the database at ${keep}`);
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

async function fetchNear(port: number, p: { lat: number; lon: number }, radius: number): Promise<{ totals: { trees: number }; varieties: { chance: unknown }[] }> {
  const response = await fetch(`http://127.0.0.1:${port}/api/atlas/near?lat=${p.lat}&lon=${p.lon}&radiusKm=${radius}`);
  if (!response.ok) throw new Error(`near answered ${response.status}: ${await response.text()}`);
  return (await response.json()) as { totals: { trees: number }; varieties: { chance: unknown }[] };
}

function printTable(header: string[], rows: string[][]): void {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padStart(widths[i]!)).join(' | ')} |`;
  console.log();
  console.log(line(header));
  console.log(`|${widths.map((w) => '-'.repeat(w + 2)).join('|')}|`);
  for (const row of rows) console.log(line(row));
}

// Run as a benchmark, not when another bench imports `build`.
if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) await main();
