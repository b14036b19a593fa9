import KDBush from 'kdbush';
import type { LatLon } from '../../shared/domain/geo';
import type { StationSeason } from '../../shared/domain/season-estimate';
import type { Db } from '../db/client';
import { stationsDataVersion } from '../db/data-version';
import { secondsSince, snapshotRebuildDuration } from '../ops/metrics';
import { idsInRadiusBoxes } from '../lib/kdbush-radius';
import { allStationSeasons } from './stations.repo';

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

/** Reads every station and its summaries in one read transaction (the version is exactly that of the rows). */
export function readStationSnapshot(db: Db): StationSnapshot {
  const read = db.sqlite.transaction(() => ({ version: stationsDataVersion(db), stations: allStationSeasons(db, SNAPSHOT_THRESHOLD_F) }));
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
