// `npm run bench`: runs every scripts/bench/*.bench.ts in turn, each in its own process, and lets
// each print its own figures. Pass a name to run one: `npm run bench -- pins`.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const folder = import.meta.dirname;
const only = process.argv[2];
const benches = fs
  .readdirSync(folder)
  .filter((file) => file.endsWith('.bench.ts') && (!only || file.startsWith(only)))
  .sort();

if (benches.length === 0) console.log('No benchmarks found.');
let failed = 0;
for (const file of benches) {
  console.log(`\n=== ${file} ===`);
  const result = spawnSync('npx', ['tsx', path.join(folder, file)], { stdio: 'inherit' });
  if (result.status !== 0) failed++;
}
process.exitCode = failed ? 1 : 0;
