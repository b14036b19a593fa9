import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { freezeSummary, freezeYears, type FreezeComparison } from '../../shared/domain/frost';
import { parseStationCsv } from '../../shared/domain/station-csv';
import type { Db } from '../db/client';
import { computeFreezeTables } from '../stations/station-import';
import { findStationIdByCode, writeStation, type StationData, type StationDayRow, type StationMeta } from '../stations/stations.repo';
import { DEMO_TOWNS, type DemoTown } from './demo-scenario';
import { seededRandom } from './random';

/** Years of synthetic record for the invented stations (kept short so seeding stays quick). */
const SYNTHETIC_YEARS = { first: 2011, last: 2020 };

/**
 * Towns with no real climate data within 50 km (no NOAA daily record in the demo, no NOAA normals
 * station): only these keep an invented station. Every other demo town is covered by the shipped
 * normals (server/normals) or, for Albany and Milwaukee, a real daily record.
 */
export const TOWNS_WITHOUT_REAL_DATA = new Set(['Toronto, ON', 'London, UK']);

function isoDate(epochDay: number): string {
  return new Date(epochDay * 86_400_000).toISOString().slice(0, 10);
}

/**
 * Invented daily minima for a demo town: a yearly cosine that crosses 0 deg C `halfWidth` days either
 * side of mid-season, plus day-to-day weather (autocorrelated noise) and a yearly offset.
 * Deterministic for a given seed. Not climate data: it only makes the demo's frost layer agree with
 * the demo story's season lengths.
 */
function syntheticDays(town: DemoTown, halfWidth: number, seed: number): StationDayRow[] {
  const random = seededRandom(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const amplitude = 11;
  const mid = town.springFrostDoy + town.seasonDays / 2;
  const offset = -amplitude * Math.cos((2 * Math.PI * halfWidth) / 365);
  const days: StationDayRow[] = [];
  let weather = 0;
  for (let year = SYNTHETIC_YEARS.first; year <= SYNTHETIC_YEARS.last; year++) {
    const yearShift = gauss() * 1.2;
    const start = Math.round(Date.UTC(year, 0, 1) / 86_400_000);
    const length = year % 4 === 0 ? 366 : 365;
    for (let doy = 1; doy <= length; doy++) {
      weather = 0.7 * weather + gauss() * 2.2;
      const tminC = amplitude * Math.cos((2 * Math.PI * (doy - mid)) / 365) + offset + yearShift + weather;
      days.push({ date: isoDate(start + doy - 1), tminC: Math.round(tminC * 10) / 10, tmaxC: Math.round((tminC + 9 + gauss()) * 10) / 10 });
    }
  }
  return days;
}

/** Median 32 deg F season of a synthetic record, used to tune it to the story's season length. */
function median32(days: StationDayRow[]): number {
  return freezeSummary(freezeYears(days, 0), [50])[0]?.seasonDays ?? 0;
}

/** Synthetic days whose median 32 deg F season is within a few days of the town's story. */
export function calibratedSyntheticDays(town: DemoTown, seed: number): StationDayRow[] {
  // Day-to-day weather brings the freezes inward, so widen the warm half until the median fits.
  // One correction step: "roughly" is enough, and seeding stays quick.
  const halfWidth = town.seasonDays / 2 + 14;
  const days = syntheticDays(town, halfWidth, seed);
  const miss = town.seasonDays - median32(days);
  return Math.abs(miss) <= 4 ? days : syntheticDays(town, halfWidth + miss * 0.5, seed);
}

export const demoStationCode = (town: DemoTown) => `DEMO-${town.name.toUpperCase().replace(/[^A-Z]+/g, '-').replace(/-+$/, '')}`;

/** The invented stations: one a few km from each demo town that has no real station. */
export function syntheticStationMetas(): { town: DemoTown; meta: StationMeta }[] {
  return DEMO_TOWNS.filter((town) => TOWNS_WITHOUT_REAL_DATA.has(town.name)).map((town, i) => ({
    town,
    meta: {
      name: `${town.name} (demo, synthetic)`,
      code: demoStationCode(town),
      lat: Math.round((town.lat + 0.06 * (i % 2 === 0 ? 1 : -1)) * 1e4) / 1e4,
      lon: Math.round((town.lon + 0.08) * 1e4) / 1e4,
      elevationM: null,
    },
  }));
}

const DATA_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), 'data');

/** Load real records from this year on: the current normals period, and quick enough for startup. */
export const REAL_STATIONS_FROM = '1991-01-01';

/** Two real NOAA GHCN-Daily stations (public domain; see server/seed/data/README.md). */
export const REAL_DEMO_STATIONS: { file: string; meta: StationMeta }[] = [
  {
    file: 'ghcnd-USW00014735-daily.csv',
    meta: { name: 'Albany International Airport, NY', code: 'USW00014735', lat: 42.7431, lon: -73.8092, elevationM: 85.6 },
  },
  {
    file: 'ghcnd-USW00014839-daily.csv',
    // Coordinates and elevation recalled from memory (the file carries none): about 42.955 N,
    // 87.904 W, roughly 205 m.
    meta: { name: 'Milwaukee Mitchell International Airport, WI', code: 'USW00014839', lat: 42.955, lon: -87.904, elevationM: 205 },
  },
];

/** A real station's days from `REAL_STATIONS_FROM` on, read by the same parser as an editor's upload. */
export function readRealStationDays(file: string): StationDayRow[] {
  return readRealStation(file).days;
}

/** The days and how to compare them with the thresholds (GHCN-Daily files: at 0.1 °C; see frost.ts). */
function readRealStation(file: string): { days: StationDayRow[]; comparison: FreezeComparison } {
  // Both files start each row with the year: drop the older rows before parsing (quicker startup).
  const [header, ...lines] = fs.readFileSync(path.join(DATA_DIR, file), 'utf8').split(/\r?\n/);
  const fromYear = REAL_STATIONS_FROM.slice(0, 4);
  const text = [header, ...lines.filter((line) => line.slice(0, 4) >= fromYear)].join('\n');
  const parsed = parseStationCsv(text);
  if (parsed.errors.length > 0) throw new Error(`${file}: ${parsed.errors.length} bad rows, first: ${JSON.stringify(parsed.errors[0])}`);
  return { days: parsed.days.filter((d) => d.date >= REAL_STATIONS_FROM), comparison: parsed.format === 'ghcn' ? 'ghcn-tenths' : 'exact' };
}

/**
 * Demo climate stations: Albany and Milwaukee from NOAA records, and a synthetic one near each demo
 * town that no real data covers. Idempotent: a station whose code is already there is left alone;
 * the synthetic stations earlier versions made for towns that the normals now cover are removed.
 */
export function seedDemoStations(db: Db): void {
  const kept = new Set(syntheticStationMetas().map(({ meta }) => meta.code!));
  const retired = DEMO_TOWNS.map(demoStationCode).filter((code) => !kept.has(code));
  db.transaction(() => {
    const drop = db.sqlite.prepare('DELETE FROM stations WHERE code = ?');
    for (const code of retired) drop.run(code);
  });
  const missing = new Set(
    [...REAL_DEMO_STATIONS.map(({ meta }) => meta.code!), ...syntheticStationMetas().map(({ meta }) => meta.code!)].filter((code) => findStationIdByCode(db, code) === undefined),
  );
  if (missing.size === 0) return;
  const prepared = demoStationData().filter(({ meta }) => missing.has(meta.code!));
  db.transaction(() => {
    for (const { meta, data } of prepared) writeStation(db, meta, data);
  });
}

type PreparedStation = { meta: StationMeta; data: StationData };

function computeDemoStationData(): PreparedStation[] {
  const withFreezeTables = (meta: StationMeta, days: StationDayRow[], comparison: FreezeComparison = 'exact') => ({ meta, data: { days, ...computeFreezeTables(days, meta.lat, comparison) } });
  return [
    ...REAL_DEMO_STATIONS.map(({ file, meta }) => {
      const { days, comparison } = readRealStation(file);
      return withFreezeTables(meta, days, comparison);
    }),
    ...syntheticStationMetas().map(({ town, meta }) => withFreezeTables(meta, calibratedSyntheticDays(town, 1991 + DEMO_TOWNS.indexOf(town)))),
  ];
}

/** Everything the demo stations are computed from: when any of it changes, so does the cache key. */
const CACHE_INPUTS = [
  ...REAL_DEMO_STATIONS.map(({ file }) => path.join(DATA_DIR, file)),
  fileURLToPath(import.meta.url),
  fileURLToPath(new URL('./demo-scenario.ts', import.meta.url)),
  fileURLToPath(new URL('../stations/station-import.ts', import.meta.url)),
  fileURLToPath(new URL('../../shared/domain/frost.ts', import.meta.url)),
  fileURLToPath(new URL('../../shared/domain/station-csv.ts', import.meta.url)),
];

let inProcess: PreparedStation[] | undefined;

/**
 * The demo stations' data is the same every time, and computing it (parsing two NOAA files,
 * freeze dates for a dozen stations) takes a moment: keep it per process, and in a file in the
 * system's temporary folder keyed by a hash of its inputs, so many test workers and restarts
 * compute it once.
 */
function demoStationData(): PreparedStation[] {
  if (inProcess) return inProcess;
  const hash = crypto.createHash('sha1');
  for (const file of CACHE_INPUTS) {
    try {
      hash.update(fs.readFileSync(file));
    } catch {
      hash.update(`missing:${file}`); // a bundled build without sources: key on the data only
    }
  }
  const cacheFile = path.join(os.tmpdir(), `syconium-demo-stations-${hash.digest('hex').slice(0, 16)}.json`);
  try {
    inProcess = JSON.parse(fs.readFileSync(cacheFile, 'utf8')) as PreparedStation[];
    return inProcess;
  } catch {
    // not cached yet (or unreadable): compute below
  }
  inProcess = computeDemoStationData();
  try {
    const temp = `${cacheFile}.${process.pid}.tmp`;
    fs.writeFileSync(temp, JSON.stringify(inProcess));
    fs.renameSync(temp, cacheFile); // atomic: a concurrent reader sees all of it or nothing
  } catch {
    // a read-only temporary folder only costs the next start a recomputation
  }
  return inProcess;
}
