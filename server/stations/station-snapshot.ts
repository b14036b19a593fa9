import KDBush from 'kdbush';
import type { LatLon } from '../../shared/domain/geo';
import type { StationSeason } from '../../shared/domain/season-estimate';
import type { Db } from '../db/client';
import { stationsDataVersion } from '../db/data-version';
import { secondsSince, snapshotRebuildDuration } from '../ops/metrics';
import { idsInRadiusBoxes } from '../lib/kdbush-radius';
import { allNormalsStations, type NormalsSnapshotRow } from '../normals/normals.repo';
import { allStationSeasons, type DailyStationSeason } from './stations.repo';

/*
 * Every station with its 32 deg F season figures (StationSeason), held in memory with a k-d tree
 * over their places (kdbush), so a station look-up reads no database page: at 200 km on the near
 * bench's database (5,000 stations) it took ~0.37 ms through the R*Tree and ~0.02 ms here. A
 * snapshot belongs to one stations data version (drizzle/0010_stations-data-version.sql) and is
 * re-read in the request as soon as the version moves, so it is always current. That read takes
 * ~15 ms for 5,000 stations, too little for a worker thread, and editors change stations rarely.
 */

/** The stations' summaries at this threshold are what the snapshot holds. */
export const SNAPSHOT_THRESHOLD_F = 32;

export interface StationSnapshot {
  /** The stations data version the rows were read at. */
  version: number;
  /** Frozen: handed out as they are. */
  stations: readonly StationSeason[];
  /** Over (lon, lat) of `stations`, by position; null when there are none (kdbush needs one point). */
  index: KDBush | null;
}

/**
 * Complete years from which a station's own daily record is preferred to its NOAA normals: two
 * thirds of the normals' 30-year period (a judgement, no source: fewer years give quantiles that
 * move by a week from one decade to the next).
 */
export const MIN_DAILY_YEARS = 20;

/**
 * A normals row as a station season: its 90 % length is the short year, its 50 % the typical one.
 * Where a freeze can come in any month (-4444) no frost-free season is defined: the answer says so
 * in words and takes no length from the station, although NCEI publishes one.
 */
export function normalsSeason(n: NormalsSnapshotRow): StationSeason {
  const wholeYear = n.freezeNote === 'never' ? 365 : null;
  const anyMonth = n.freezeNote === 'any-month';
  return {
    // Normals stations have no row in `stations`: a negative id keeps them apart from those.
    id: -n.rowid,
    name: n.state ? `${titleCase(n.name)}, ${n.state}` : titleCase(n.name),
    lat: n.lat,
    lon: n.lon,
    days10: anyMonth ? null : n.seasonDays90,
    days50: anyMonth ? null : n.seasonDays50,
    days90: wholeYear,
    lastSpringDoy50: n.lastSpringDoy50,
    firstFallDoy50: n.firstFallDoy50,
    code: n.code,
    source: 'normals',
    period: `${n.periodStart}-${n.periodEnd}`,
    freezeNote: n.freezeNote,
    gdd50F: n.gdd50F,
    extremeMinC: null,
  };
}

const titleCase = (name: string) => name.toLowerCase().replace(/\b([a-z])/g, (c) => c.toUpperCase()).replace(/\bAp\b/, 'Airport');

/**
 * Daily stations and normals stations in one list. Where a station has both (the same code), its
 * daily record is used when it has MIN_DAILY_YEARS complete years, with the normals' heat if the
 * record has no maxima; otherwise its normals.
 */
export function mergeStationSources(daily: DailyStationSeason[], normals: NormalsSnapshotRow[]): StationSeason[] {
  const dailyByCode = new Map(daily.filter((d) => d.code).map((d) => [d.code!, d]));
  const dropped = new Set<DailyStationSeason>();
  const out: StationSeason[] = [];
  for (const n of normals) {
    const d = dailyByCode.get(n.code);
    if (d && d.years >= MIN_DAILY_YEARS) {
      if (d.gdd50F == null && n.gdd50F != null) d.gdd50F = n.gdd50F;
      continue;
    }
    if (d) dropped.add(d);
    out.push(normalsSeason(n));
  }
  for (const d of daily) {
    if (dropped.has(d)) continue;
    const { years: _years, ...season } = d;
    out.push(season);
  }
  return out;
}

/** Reads every station and its summaries in one read transaction (the version is exactly that of the rows). */
export function readStationSnapshot(db: Db): StationSnapshot {
  const read = db.sqlite.transaction(() => ({
    version: stationsDataVersion(db),
    stations: mergeStationSources(allStationSeasons(db, SNAPSHOT_THRESHOLD_F), allNormalsStations(db)),
  }));
  const { version, stations } = read.deferred();
  for (const s of stations) Object.freeze(s);
  let index: KDBush | null = null;
  if (stations.length) {
    index = new KDBush(stations.length);
    for (const s of stations) index.add(s.lon, s.lat);
    index.finish();
  }
  return { version, stations, index };
}

const snapshots = new WeakMap<Db, StationSnapshot>();

/** The snapshot of the current stations data version: one primary-key read when nothing changed. */
export function currentStationSnapshot(db: Db): StationSnapshot {
  const version = stationsDataVersion(db);
  const kept = snapshots.get(db);
  if (kept?.version === version) return kept;
  const start = performance.now();
  const snapshot = readStationSnapshot(db);
  snapshotRebuildDuration.observe({ cache: 'stations', thread: 'request' }, secondsSince(start));
  // Read inside an open transaction, it may hold rows that are rolled back, with the counter, to
  // a version a later change reaches again: use it for this call only.
  if (!db.sqlite.inTransaction) snapshots.set(db, snapshot);
  return snapshot;
}

/**
 * Stations whose place lies in the boxes of the radius around the point (boundingBox: split at the
 * antimeridian, whole longitude circles at the poles), each once; estimateSeason applies the exact
 * distance. In no particular order.
 */
export function stationSeasonsInBoxes(snapshot: StationSnapshot, point: LatLon, radiusKm: number): StationSeason[] {
  const { stations, index } = snapshot;
  return index ? idsInRadiusBoxes(index, point, radiusKm).map((i) => stations[i]!) : [];
}
