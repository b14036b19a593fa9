// Bench of the chance model (shared/domain/chance-model.ts). First, always: the leave-one-grower-out
// cross-validation of the demo atlas (a fresh temporary database seeded as on first start), with the
// issue's targets: Brier skill against the variety's overall rate above 0, and every reliability bin
// with 30+ tree-seasons within ±0.05. Then, on the near bench's million-report database kept with
// NEAR_BENCH_DB=/some/file.db (run `npm run bench -- near` first): how long a fit takes, what the
// chance adds to a near request's work at 50 and 200 km (the same answer built with and without it,
// alternating, in one process), and with CHANCE_BENCH_CV=1 the same cross-validation there (minutes).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createDb, migrateDb } from '../../server/db/client';
import { seedDatabase } from '../../server/seed';
import type { ModelAccuracy } from '../../shared/schemas/accuracy';
import { readStationSnapshot } from '../../server/stations/station-snapshot';
import { computeChanceFit, chanceFitFrom, recordsOf } from '../../server/atlas/chance-fit';
import { readTreeSnapshot, treeSnapshotFrom, treesWithin } from '../../server/atlas/tree-snapshot';
import { cachedAcceptedVarieties } from '../../server/atlas/catalogue-cache';
import { chanceAt } from '../../shared/domain/chance-model';
import { computeModelAccuracy } from '../../server/accuracy/accuracy.compute';
import { stationSeasonsNear } from '../../server/atlas/atlas.repo';
import { reportFrostSeasons, type NearTree } from '../../server/atlas/tree-snapshot';
import { bandwidthForRadius, buildNearResponse, type VarietyEvidenceInput } from '../../shared/domain/evidence';
import { estimateSeason } from '../../shared/domain/season-estimate';

const CALIBRATION_TOLERANCE = 0.05;
const CALIBRATION_MIN_COUNT = 30;

/** The scores, the reliability table and the targets' verdicts. */
function printAccuracy(label: string, acc: ModelAccuracy, seconds: number): void {
  const s = acc.scores!;
  console.log(`${label}: leave-one-grower-out over ${acc.treeSeasons.toLocaleString()} tree-seasons (${acc.trees.toLocaleString()} trees, ${acc.growers.toLocaleString()} growers) in ${seconds.toFixed(1)} s`);
  console.log(`  Brier: chance ${s.chance.brier.toFixed(4)}, overall rate ${s.overallRate.brier.toFixed(4)}, old adjusted share ${s.adjustedShare.brier.toFixed(4)}; log loss ${s.chance.logLoss.toFixed(4)} / ${s.overallRate.logLoss.toFixed(4)} / ${s.adjustedShare.logLoss.toFixed(4)}`);
  console.log('  bin        tree-seasons  predicted  observed  difference');
  let worst = 0;
  for (const b of acc.bins) {
    if (b.meanPredicted === null || b.observed === null) continue;
    const gap = b.observed - b.meanPredicted;
    const counted = b.count >= CALIBRATION_MIN_COUNT;
    if (counted) worst = Math.max(worst, Math.abs(gap));
    console.log(`  ${b.from.toFixed(1)}–${b.to.toFixed(1)}  ${String(b.count).padStart(12)}  ${b.meanPredicted.toFixed(3).padStart(9)}  ${b.observed.toFixed(3).padStart(8)}  ${(gap >= 0 ? '+' : '') + gap.toFixed(3)}${counted ? '' : ' (under 30: not counted)'}`);
  }
  const skill = acc.brierSkillScore ?? NaN;
  console.log(`  ${skill > 0 ? 'met' : 'MISSED'}: Brier skill score against the overall rate ${skill.toFixed(4)} > 0`);
  console.log(`  ${worst <= CALIBRATION_TOLERANCE ? 'met' : 'MISSED'}: every bin with ${CALIBRATION_MIN_COUNT}+ tree-seasons within ±${CALIBRATION_TOLERANCE} (worst ${worst.toFixed(3)})`);
}

{
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-chance-bench-'));
  try {
    const demo = createDb(path.join(dir, 'demo.db'));
    migrateDb(demo);
    await seedDatabase(demo, { seedDemo: true, adminEmail: undefined, adminPassword: undefined });
    const t0 = performance.now();
    const acc = computeModelAccuracy(demo.sqlite, readStationSnapshot(demo), new Date().toISOString());
    printAccuracy('Demo atlas', acc, (performance.now() - t0) / 1000);
    demo.sqlite.close();
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

const file = process.env.NEAR_BENCH_DB;
if (!file || !fs.existsSync(file)) {
  console.log('The million-report part skipped: set NEAR_BENCH_DB to the database `npm run bench -- near` kept.');
  process.exit(0);
}
const db = createDb(file);
let t = performance.now();
const snapshot = treeSnapshotFrom(readTreeSnapshot(db.sqlite).data);
console.log(`Tree snapshot: ${((performance.now() - t) / 1000).toFixed(1)} s`);
t = performance.now();
const fit = chanceFitFrom(computeChanceFit(db.sqlite, readStationSnapshot(db), 1).data);
console.log(`Fit: ${((performance.now() - t) / 1000).toFixed(1)} s for ${fit.columns.count.toLocaleString()} tree records of ${fit.model.varieties.size} varieties; classes ${JSON.stringify(Object.fromEntries(Object.entries(fit.model.classes).map(([k, c]) => [k, c!.coef.map((x) => +x.toFixed(3))])))}`);
const catalogue = cachedAcceptedVarieties(db);
const centres = db.sqlite.prepare('SELECT grid_lat AS lat, grid_lon AS lon FROM reports WHERE id % 5000 = 0').all() as { lat: number; lon: number }[];
const NO_OVERALL = { share: null, neededDays: null, treesBehindNeed: 0 };
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;
/** The near answer's work in the request, as the router does it, with or without the chance. */
function nearAnswer(point: { lat: number; lon: number }, radius: number, withChance: boolean) {
  const trees = treesWithin(snapshot, point, radius);
  const season = estimateSeason({ point, stations: stationSeasonsNear(db, point, radius), reportFrostSeasons: reportFrostSeasons(trees), radiusKm: radius });
  const byVariety = new Map<number, NearTree[]>();
  for (const tr of trees) {
    let l = byVariety.get(tr.varietyId);
    if (!l) byVariety.set(tr.varietyId, (l = []));
    l.push(tr);
  }
  const ctx = { point, localDays: season.days50, form: 'ground' as const, waspEstablished: false, bandwidthKm: bandwidthForRadius(radius) };
  const varieties: VarietyEvidenceInput[] = [];
  for (const [id, localTrees] of byVariety) {
    const variety = catalogue.get(id);
    if (!variety) continue;
    const chance = withChance ? chanceAt(fit.model, variety, recordsOf(fit, new Set(localTrees.map((x) => x.treeId)), variety), ctx) : null;
    varieties.push({ variety, localTrees, overall: snapshot.overall.get(id) ?? NO_OVERALL, chance });
  }
  return JSON.stringify(buildNearResponse({ point, radiusKm: radius, form: 'ground', season, wasp: { established: false, areas: [] }, varieties }));
}
for (const radius of [50, 200]) {
  const without: number[] = [];
  const withIt: number[] = [];
  // Alternating, so both see the same machine load.
  for (let k = 0; k < 320; k++) {
    const point = centres[k % centres.length]!;
    const t0 = performance.now();
    nearAnswer(point, radius, k % 2 === 0);
    const ms = performance.now() - t0;
    if (k >= 20) (k % 2 === 0 ? withIt : without).push(ms);
  }
  console.log(`${radius} km: the near answer's work (rows, season, shares, JSON) median ${median(without).toFixed(2)} ms without the chance, ${median(withIt).toFixed(2)} ms with it`);
}
if (process.env.CHANCE_BENCH_CV === '1') {
  t = performance.now();
  const acc = computeModelAccuracy(db.sqlite, readStationSnapshot(db), new Date().toISOString());
  printAccuracy('Million-report bench atlas', acc, (performance.now() - t) / 1000);
}
const [load1] = os.loadavg();
console.log(`Machine load average ${load1!.toFixed(1)} at the end of the run.`);
