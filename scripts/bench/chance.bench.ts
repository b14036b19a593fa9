// Bench of the chance model (shared/domain/chance-model.ts) on the near bench's million-report
// database, kept with NEAR_BENCH_DB=/some/file.db (run `npm run bench -- near` first): how long a fit
// takes, the chance's own share of a near request at 50 and 200 km (the records of the local trees
// found and the chance evaluated for every variety), and with CHANCE_BENCH_CV=1 the leave-one-grower-
// out cross-validation the model-accuracy job runs (minutes). Skipped without NEAR_BENCH_DB.
import fs from 'node:fs';
import { performance } from 'node:perf_hooks';
import { createDb } from '../../server/db/client';
import { readStationSnapshot } from '../../server/stations/station-snapshot';
import { computeChanceFit, chanceFitFrom, recordsOf } from '../../server/atlas/chance-fit';
import { readTreeSnapshot, treeSnapshotFrom, treesWithin } from '../../server/atlas/tree-snapshot';
import { acceptedVarieties } from '../../server/atlas/atlas.repo';
import { chanceAt } from '../../shared/domain/chance-model';
import { computeModelAccuracy } from '../../server/accuracy/accuracy.compute';

const file = process.env.NEAR_BENCH_DB;
if (!file || !fs.existsSync(file)) {
  console.log('Skipped: set NEAR_BENCH_DB to the database `npm run bench -- near` kept.');
  process.exit(0);
}
const db = createDb(file);
let t = performance.now();
const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
console.log(`Tree snapshot: ${((performance.now() - t) / 1000).toFixed(1)} s`);
t = performance.now();
const fit = chanceFitFrom(computeChanceFit(db.sqlite, readStationSnapshot(db), 1).data);
console.log(`Fit: ${((performance.now() - t) / 1000).toFixed(1)} s for ${fit.columns.count.toLocaleString()} tree records of ${fit.model.varieties.size} varieties; tree-to-tree variance ${fit.model.treeVariance.toFixed(3)}; classes ${JSON.stringify(Object.fromEntries(Object.entries(fit.model.classes).map(([k, c]) => [k, c!.coef.map((x) => +x.toFixed(3))])))}`);
const catalogue = acceptedVarieties(db);
const centres = db.sqlite.prepare('SELECT grid_lat AS lat, grid_lon AS lon FROM reports WHERE id % 5000 = 0').all() as { lat: number; lon: number }[];
for (const radius of [50, 200]) {
  const times: number[] = [];
  const whole: number[] = [];
  for (let k = 0; k < 300; k++) {
    const point = centres[k % centres.length];
    const t0 = performance.now();
    const trees = treesWithin(snapshot, point, radius);
    const byVariety = new Map<number, number[]>();
    for (const tr of trees) {
      let l = byVariety.get(tr.varietyId);
      if (!l) byVariety.set(tr.varietyId, (l = []));
      l.push(tr.treeId);
    }
    const t1 = performance.now();
    for (const [id, ids] of byVariety) {
      const v = catalogue.get(id);
      if (!v) continue;
      chanceAt(fit.model, v, recordsOf(fit, new Set(ids), v), { point, localDays: 200, form: 'ground', waspEstablished: false, bandwidthKm: radius / 2 });
    }
    const t2 = performance.now();
    if (k >= 20) {
      times.push(t2 - t1);
      whole.push(t2 - t0);
    }
  }
  times.sort((a, b) => a - b);
  whole.sort((a, b) => a - b);
  console.log(`${radius} km: the chance's part median ${times[times.length >> 1].toFixed(3)} ms, p95 ${times[Math.floor(times.length * 0.95)].toFixed(3)} ms (rows + chance ${whole[whole.length >> 1].toFixed(3)} ms)`);
}
if (process.env.CHANCE_BENCH_CV === '1') {
  t = performance.now();
  const acc = computeModelAccuracy(db.sqlite, readStationSnapshot(db), new Date().toISOString());
  console.log(`Leave-one-grower-out: ${((performance.now() - t) / 1000).toFixed(1)} s`, JSON.stringify({ ...acc, method: undefined }));
}
const [load1] = (await import('node:os')).loadavg();
console.log(`Machine load average ${load1!.toFixed(1)} at the end of the run.`);
