import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { asc, eq } from 'drizzle-orm';
import { NORMALS_1981_2010_FILES, parseNormalsFileSet, type NormalsFileKey, type NormalsStation } from '../../shared/domain/climate-normals';
import type { Db } from '../db/client';
import { normalsReleases } from '../db/schema';

/*
 * NOAA's climate normals as reference data: shipped in server/normals/data (see its README for the
 * source), loaded on every start of every install, demo or not, before anything else reads
 * stations. The same files are not loaded twice (their SHA-256 is kept with the release); a newer
 * release replaces an older one's rows, station by station, in one transaction.
 */

export type NormalsRelease = { name: string; periodStart: number; periodEnd: number; source: string; fingerprint: string | null };

export const SHIPPED_NORMALS_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), 'data', 'ncei-normals-1981-2010');

export const SHIPPED_NORMALS_RELEASE: Omit<NormalsRelease, 'fingerprint'> = {
  name: '1981-2010',
  periodStart: 1981,
  periodEnd: 2010,
  source: 'NOAA NCEI, 1981-2010 U.S. Climate Normals (Arguez et al., 2012), public domain',
};

export type NormalsLoadSummary = {
  release: string;
  /** New stations, stations whose older row this release replaced, and stations a newer release keeps. */
  added: string[];
  replaced: string[];
  refused: { code: string; reason: string }[];
};

function releaseRow(db: Db, name: string) {
  return db.select().from(normalsReleases).where(eq(normalsReleases.name, name)).get();
}

/**
 * Write a release's stations in the caller's transaction. `wholeRelease`: the set is the release
 * entire, so its stations not in the set are removed. A station held by a newer release (a later
 * period end) is refused, never overwritten by older figures.
 */
export function writeNormalsRelease(db: Db, release: NormalsRelease, stations: NormalsStation[], options: { wholeRelease: boolean }): NormalsLoadSummary {
  const { sqlite } = db;
  let row = releaseRow(db, release.name);
  if (row) {
    db.update(normalsReleases).set({ source: release.source, periodStart: release.periodStart, periodEnd: release.periodEnd, fingerprint: release.fingerprint, loadedAt: new Date().toISOString() }).where(eq(normalsReleases.id, row.id)).run();
  } else {
    row = db.insert(normalsReleases).values(release).returning().get();
  }
  const releaseId = row.id;
  const held = new Map(
    (sqlite.prepare('SELECT s.code, s.release_id, r.period_end FROM normals_stations s JOIN normals_releases r ON r.id = s.release_id').raw().all() as [string, number, number][]).map(([code, id, end]) => [code, { releaseId: id, periodEnd: end }]),
  );
  const summary: NormalsLoadSummary = { release: release.name, added: [], replaced: [], refused: [] };
  const upsert = sqlite.prepare(
    `INSERT INTO normals_stations (code, release_id, name, state, lat, lon, elevation_m, last_spring_doy50, last_spring_doy90, first_fall_doy50, first_fall_doy90, season_days50, season_days90, freeze_note, gdd50_f, flag)
     VALUES (@code, @releaseId, @name, @state, @lat, @lon, @elevationM, @lastSpringDoy50, @lastSpringDoy90, @firstFallDoy50, @firstFallDoy90, @seasonDays50, @seasonDays90, @freezeNote, @gdd50F, @flag)
     ON CONFLICT (code) DO UPDATE SET release_id = excluded.release_id, name = excluded.name, state = excluded.state, lat = excluded.lat, lon = excluded.lon,
       elevation_m = excluded.elevation_m, last_spring_doy50 = excluded.last_spring_doy50, last_spring_doy90 = excluded.last_spring_doy90,
       first_fall_doy50 = excluded.first_fall_doy50, first_fall_doy90 = excluded.first_fall_doy90, season_days50 = excluded.season_days50,
       season_days90 = excluded.season_days90, freeze_note = excluded.freeze_note, gdd50_f = excluded.gdd50_f, flag = excluded.flag`,
  );
  const inSet = new Set<string>();
  for (const station of stations) {
    inSet.add(station.code);
    const before = held.get(station.code);
    if (before && before.releaseId !== releaseId && before.periodEnd > release.periodEnd) {
      summary.refused.push({ code: station.code, reason: `a newer normals release (to ${before.periodEnd}) already gives this station` });
      continue;
    }
    upsert.run({ ...station, releaseId });
    (before ? summary.replaced : summary.added).push(station.code);
  }
  if (options.wholeRelease) {
    const drop = sqlite.prepare('DELETE FROM normals_stations WHERE code = ?');
    for (const [code, h] of held) if (h.releaseId === releaseId && !inSet.has(code)) drop.run(code);
  }
  // Every release's count: stations this one took over leave the older release.
  sqlite.prepare('UPDATE normals_releases SET station_count = (SELECT count(*) FROM normals_stations s WHERE s.release_id = normals_releases.id)').run();
  return summary;
}

/** The fixed-width files of a release, read from a folder. */
export function readNormalsFolder(dir: string): Partial<Record<NormalsFileKey, string>> {
  const files: Partial<Record<NormalsFileKey, string>> = {};
  for (const [key, name] of Object.entries(NORMALS_1981_2010_FILES)) {
    const file = path.join(dir, name);
    if (fs.existsSync(file)) files[key as NormalsFileKey] = fs.readFileSync(file, 'latin1');
  }
  return files;
}

export function fingerprintOf(files: Partial<Record<NormalsFileKey, string>>): string {
  const hash = crypto.createHash('sha256');
  for (const key of Object.keys(NORMALS_1981_2010_FILES).sort()) hash.update(`${key}\n${files[key as NormalsFileKey] ?? ''}\n`);
  return hash.digest('hex');
}

/**
 * Load the shipped normals unless these very files are already loaded: idempotent, and quick on
 * every start after the first (one hash of ~2 MB and one row read). Returns null when nothing was
 * written.
 */
export function loadShippedNormals(db: Db, dir = SHIPPED_NORMALS_DIR): (NormalsLoadSummary & { ms: number }) | null {
  const started = performance.now();
  const files = readNormalsFolder(dir);
  const fingerprint = fingerprintOf(files);
  if (releaseRow(db, SHIPPED_NORMALS_RELEASE.name)?.fingerprint === fingerprint) return null;
  const parsed = parseNormalsFileSet(files);
  // Shipped data must be whole: a station missing from the inventory is a packaging fault.
  if (parsed.errors.length) throw new Error(`The shipped climate normals in ${dir} are incomplete: ${parsed.errors.slice(0, 3).join(' ')}`);
  const summary = db.transaction(() => writeNormalsRelease(db, { ...SHIPPED_NORMALS_RELEASE, fingerprint }, parsed.stations, { wholeRelease: true }));
  return { ...summary, ms: performance.now() - started };
}

/** The releases held, for the editors' Stations screen and the README's "which data" answer. */
export function listNormalsReleases(db: Db) {
  return db.select().from(normalsReleases).orderBy(asc(normalsReleases.periodEnd)).all();
}

export type NormalsSnapshotRow = NormalsStation & { rowid: number; release: string; periodStart: number; periodEnd: number };

/** Every normals station with its release's period, for the station snapshot. */
export function allNormalsStations(db: Db, code?: string): NormalsSnapshotRow[] {
  return db.sqlite
    .prepare(
      `SELECT s.rowid AS rowid, s.code, s.name, s.state, s.lat, s.lon, s.elevation_m AS elevationM, s.last_spring_doy50 AS lastSpringDoy50, s.last_spring_doy90 AS lastSpringDoy90,
              s.first_fall_doy50 AS firstFallDoy50, s.first_fall_doy90 AS firstFallDoy90, s.season_days50 AS seasonDays50, s.season_days90 AS seasonDays90,
              s.freeze_note AS freezeNote, s.gdd50_f AS gdd50F, s.flag, r.name AS release, r.period_start AS periodStart, r.period_end AS periodEnd
         FROM normals_stations s JOIN normals_releases r ON r.id = s.release_id
        ${code === undefined ? '' : 'WHERE s.code = @code'}`,
    )
    .all(code === undefined ? {} : { code }) as NormalsSnapshotRow[];
}

export function findNormalsStation(db: Db, code: string): NormalsSnapshotRow | undefined {
  return allNormalsStations(db, code)[0];
}
