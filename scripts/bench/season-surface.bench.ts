// Bench of the map's season surface, GET /api/atlas/season-grid/:z/:x/:y, on the near bench's
// atlas (1,000,000 synthetic reports, 5,000 stations; scripts/bench/near.bench.ts builds it): each
// tile's first request computes its (SURFACE_CELLS + 1)² nodes through the season estimate; a
// repeated request is read from the per-version tile cache. Target: each tile request < 50 ms median.
// NEAR_BENCH_DB=/some/file.db reuses (or keeps) the database; NEAR_BENCH_REPORTS sizes a new one.
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createApp } from '../../server/app';
import { createDb, migrateDb } from '../../server/db/client';
import { readConfig } from '../../server/lib/config';
import { seededRandom } from '../../server/seed/random';
import { SURFACE_CELLS } from '../../shared/domain/season-surface';
import { lonLatToTile } from '../tiles/tile-math';
import { build } from './near.bench';

const TILES = 200;
const ZOOMS = [5, 6, 7, 8, 9];
const TARGET_MEDIAN_MS = 50;
const random = seededRandom(17_2026);

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

async function main() {
  const keep = process.env.NEAR_BENCH_DB;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-surface-bench-'));
  const reuse = !!keep && fs.existsSync(keep);
  const db = createDb(keep ?? path.join(dir, 'bench.db'));
  try {
    migrateDb(db);
    let t0 = performance.now();
    if (reuse) console.log(`Reusing ${keep}`);
    else {
      build(db);
      console.log(`Built the near bench's atlas in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    }
    const reports = db.sqlite.prepare('SELECT count(*) FROM reports').pluck().get() as number;
    const app = createApp({ db, config: { ...readConfig({ NODE_ENV: 'test' }), seedDemo: false } });
    const server = app.listen(0, '127.0.0.1');
    server.keepAliveTimeout = 120_000;
    await new Promise((resolve) => server.once('listening', resolve));
    const port = (server.address() as AddressInfo).port;
    const fetchTile = async (z: number, x: number, y: number) => {
      const response = await fetch(`http://127.0.0.1:${port}/api/atlas/season-grid/${z}/${x}/${y}`);
      if (!response.ok) throw new Error(`season-grid answered ${response.status}: ${await response.text()}`);
      return (await response.json()) as { days50: (number | null)[] };
    };
    t0 = performance.now();
    await fetchTile(2, 0, 1); // the first call waits for the tree snapshot
    console.log(`First call (reads the tree snapshot): ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    // Places where growers live (the near bench's regions): what a grower pans over.
    const places = db.sqlite.prepare("SELECT lat, lon FROM reports WHERE id % 997 = 0 AND status = 'published' LIMIT 2000").all() as { lat: number; lon: number }[];
    const seen = new Set<string>();
    const tiles: { z: number; x: number; y: number }[] = [];
    while (tiles.length < TILES) {
      const p = places[Math.floor(random() * places.length)]!;
      const z = ZOOMS[Math.floor(random() * ZOOMS.length)]!;
      const { x, y } = lonLatToTile(p.lon, p.lat, z);
      if (seen.has(`${z}/${x}/${y}`)) continue;
      seen.add(`${z}/${x}/${y}`);
      tiles.push({ z, x, y });
    }
    const cold: number[] = [];
    const warm: number[] = [];
    let valued = 0;
    for (const { z, x, y } of tiles) {
      t0 = performance.now();
      const body = await fetchTile(z, x, y);
      cold.push(performance.now() - t0);
      valued += body.days50.filter((d) => d !== null).length;
    }
    for (const { z, x, y } of tiles) {
      t0 = performance.now();
      await fetchTile(z, x, y);
      warm.push(performance.now() - t0);
    }
    server.close();
    cold.sort((a, b) => a - b);
    warm.sort((a, b) => a - b);
    const nodes = (SURFACE_CELLS + 1) ** 2;
    console.log(`\n${reports.toLocaleString()} reports; ${TILES} distinct tiles at zooms ${ZOOMS.join(', ')} around growers' places, ${nodes} nodes each (${Math.round((valued / (TILES * nodes)) * 100)} % with a value).`);
    console.log(`| request | median ms | p95 ms | max ms |\n|---|---|---|---|`);
    console.log(`| first (computed) | ${percentile(cold, 50).toFixed(1)} | ${percentile(cold, 95).toFixed(1)} | ${cold[cold.length - 1]!.toFixed(1)} |`);
    console.log(`| again (cached) | ${percentile(warm, 50).toFixed(2)} | ${percentile(warm, 95).toFixed(2)} | ${warm[warm.length - 1]!.toFixed(2)} |`);
    const met = percentile(cold, 50) < TARGET_MEDIAN_MS;
    console.log(`Target: a computed tile < ${TARGET_MEDIAN_MS} ms median: ${met ? 'met' : 'MISSED'} (${(percentile(cold, 50) / nodes).toFixed(3)} ms a node).`);
    console.log(`Machine: ${os.cpus().length} CPUs, load average ${os.loadavg()[0]!.toFixed(1)} at the end of the run.`);
  } finally {
    db.sqlite.close();
    if (keep) console.log(`Kept the database at ${keep}`);
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

await main();
