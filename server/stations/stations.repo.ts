import { and, asc, eq } from 'drizzle-orm';
import type { StationSeason } from '../../shared/domain/season-estimate';
import type { StationDetail, StationListItem } from '../../shared/schemas/stations';
import type { Db } from '../db/client';
import { stationDays, stationFreezeYears, stations, stationSummaries } from '../db/schema';
import { recordAudit } from '../audit/audit.repo';

export interface StationDayRow {
  date: string;
  tminC: number;
  tmaxC: number | null;
}

export interface StationMeta {
  name: string;
  code: string | null;
  lat: number;
  lon: number;
  elevationM: number | null;
}

export interface StationClimate {
  gdd50F: number | null;
  gddYears: number;
  extremeMinC: number | null;
  extremeMinWinters: number;
}

export interface StationData {
  days: StationDayRow[];
  freezeYears: StationDetail['freezeYears'];
  summaries: StationDetail['summaries'];
  /** Heat and winter cold from the record (absent in data cached before they were computed). */
  climate?: StationClimate;
}

const listColumns = {
  id: stations.id,
  code: stations.code,
  name: stations.name,
  lat: stations.lat,
  lon: stations.lon,
  elevationM: stations.elevationM,
  firstDate: stations.firstDate,
  lastDate: stations.lastDate,
  dayCount: stations.dayCount,
  days50: stationSummaries.seasonDays,
};

const summary32At50 = and(eq(stationSummaries.stationId, stations.id), eq(stationSummaries.thresholdF, 32), eq(stationSummaries.probability, 50));

export function listStations(db: Db): StationListItem[] {
  return db.select(listColumns).from(stations).leftJoin(stationSummaries, summary32At50).orderBy(asc(stations.name)).all();
}

export function findStation(db: Db, id: number): StationListItem | undefined {
  return db.select(listColumns).from(stations).leftJoin(stationSummaries, summary32At50).where(eq(stations.id, id)).get();
}

export function findStationIdByCode(db: Db, code: string): number | undefined {
  return db.select({ id: stations.id }).from(stations).where(eq(stations.code, code)).get()?.id;
}

export function findStationDetail(db: Db, id: number): StationDetail | undefined {
  const station = findStation(db, id);
  if (!station) return undefined;
  const freezeYears = db
    .select({
      thresholdF: stationFreezeYears.thresholdF,
      year: stationFreezeYears.year,
      lastSpringDoy: stationFreezeYears.lastSpringDoy,
      firstFallDoy: stationFreezeYears.firstFallDoy,
      seasonDays: stationFreezeYears.seasonDays,
      leftOutReason: stationFreezeYears.leftOutReason,
    })
    .from(stationFreezeYears)
    .where(eq(stationFreezeYears.stationId, id))
    .orderBy(asc(stationFreezeYears.year), asc(stationFreezeYears.thresholdF))
    .all();
  const summaries = db
    .select({
      thresholdF: stationSummaries.thresholdF,
      probability: stationSummaries.probability,
      lastSpringDoy: stationSummaries.lastSpringDoy,
      firstFallDoy: stationSummaries.firstFallDoy,
      seasonDays: stationSummaries.seasonDays,
      years: stationSummaries.years,
    })
    .from(stationSummaries)
    .where(eq(stationSummaries.stationId, id))
    .orderBy(asc(stationSummaries.thresholdF), asc(stationSummaries.probability))
    .all();
  return { station, freezeYears, summaries };
}

/**
 * Create or update a station (matched by code when it has one) and replace all of its days,
 * freeze years and summaries. Call it inside a transaction; `saveStation` does, with the audit.
 */
export function writeStation(db: Db, meta: StationMeta, data: StationData): { id: number; before: StationListItem | undefined } {
  const { sqlite } = db;
  const existingId = meta.code ? findStationIdByCode(db, meta.code) : undefined;
  const before = existingId ? findStation(db, existingId) : undefined;
  let firstDate: string | null = null;
  let lastDate: string | null = null;
  for (const { date } of data.days) {
    if (firstDate === null || date < firstDate) firstDate = date;
    if (lastDate === null || date > lastDate) lastDate = date;
  }
  const span = { firstDate, lastDate, dayCount: data.days.length, ...(data.climate ?? { gdd50F: null, gddYears: 0, extremeMinC: null, extremeMinWinters: 0 }) };
  let id: number;
  if (existingId) {
    id = existingId;
    db.update(stations)
      .set({ ...meta, ...span, updatedAt: new Date().toISOString() })
      .where(eq(stations.id, id))
      .run();
    db.delete(stationDays).where(eq(stationDays.stationId, id)).run();
    db.delete(stationFreezeYears).where(eq(stationFreezeYears.stationId, id)).run();
    db.delete(stationSummaries).where(eq(stationSummaries.stationId, id)).run();
  } else {
    id = db.insert(stations).values({ ...meta, ...span }).returning({ id: stations.id }).get().id;
  }
  // Tens of thousands of days: hand SQLite one JSON array and let it insert the rows itself,
  // rather than one call from JavaScript per row.
  sqlite
    .prepare("INSERT INTO station_days (station_id, date, tmin_c, tmax_c) SELECT ?, value ->> 0, value ->> 1, value ->> 2 FROM json_each(?)")
    .run(id, JSON.stringify(data.days.map((d) => [d.date, d.tminC, d.tmaxC])));
  const insertYear = sqlite.prepare('INSERT INTO station_freeze_years (station_id, threshold_f, year, last_spring_doy, first_fall_doy, season_days, left_out_reason) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const y of data.freezeYears) insertYear.run(id, y.thresholdF, y.year, y.lastSpringDoy, y.firstFallDoy, y.seasonDays, y.leftOutReason ?? null);
  const insertSummary = sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, last_spring_doy, first_fall_doy, season_days, years) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const s of data.summaries) insertSummary.run(id, s.thresholdF, s.probability, s.lastSpringDoy, s.firstFallDoy, s.seasonDays, s.years);
  return { id, before };
}

/**
 * An editor's upload: `writeStation` and its audit entry in one transaction, so a failure anywhere
 * leaves the station's earlier data as it was.
 */
export function saveStation(db: Db, meta: StationMeta, data: StationData, actorId: number | null): number {
  return db.transaction(() => {
    const { id, before } = writeStation(db, meta, data);
    recordAudit(db, {
      actorId,
      action: before ? 'station.replace' : 'station.create',
      entityType: 'station',
      entityId: id,
      before: before ?? null,
      after: findStation(db, id),
    });
    return id;
  });
}

/** Delete a station with its days and computed dates (cascade), recording who did it. */
export function deleteStation(db: Db, id: number, actorId: number | null): boolean {
  return db.transaction(() => {
    const before = findStation(db, id);
    if (!before) return false;
    db.delete(stations).where(eq(stations.id, id)).run();
    recordAudit(db, { actorId, action: 'station.delete', entityType: 'station', entityId: id, before, after: null });
    return true;
  });
}

type StationSeasonTuple = [number, string, number, number, number | null, number | null, number | null, number | null, number | null, string | null, string | null, string | null, number | null, number | null, number | null];

/** A daily station's figures with the complete years behind its 50 % summary (the snapshot prefers it over normals from MIN_DAILY_YEARS). */
export type DailyStationSeason = StationSeason & { years: number };

/**
 * Every station that has summaries at the threshold, with its season length at 10, 50 and 90 % and
 * its 50 % dates (null where it has no row for that probability), one row per station. The
 * in-memory station snapshot (station-snapshot.ts) is read from it, and every station look-up goes
 * through that snapshot; one row per station keeps that read short (~15 ms for 5,000 stations, a
 * third of the time one row per summary took).
 */
export function allStationSeasons(db: Db, thresholdF = 32): DailyStationSeason[] {
  const rows = db.sqlite
    .prepare(
      `SELECT s.id, s.name, s.lat, s.lon, m10.season_days, m50.season_days, m90.season_days, m50.last_spring_doy, m50.first_fall_doy,
              s.code, s.first_date, s.last_date, m50.years, s.gdd50_f, s.extreme_min_c
         FROM stations s
         LEFT JOIN station_summaries m10 ON m10.station_id = s.id AND m10.threshold_f = @thresholdF AND m10.probability = 10
         LEFT JOIN station_summaries m50 ON m50.station_id = s.id AND m50.threshold_f = @thresholdF AND m50.probability = 50
         LEFT JOIN station_summaries m90 ON m90.station_id = s.id AND m90.threshold_f = @thresholdF AND m90.probability = 90
        WHERE EXISTS (SELECT 1 FROM station_summaries m WHERE m.station_id = s.id AND m.threshold_f = @thresholdF)`,
    )
    .raw()
    .all({ thresholdF }) as StationSeasonTuple[];
  return rows.map(([id, name, lat, lon, days10, days50, days90, lastSpringDoy50, firstFallDoy50, code, firstDate, lastDate, years, gdd50F, extremeMinC]) => ({
    id,
    name,
    lat,
    lon,
    days10,
    days50,
    days90,
    lastSpringDoy50,
    firstFallDoy50,
    code,
    source: 'daily' as const,
    period: firstDate && lastDate ? `${firstDate.slice(0, 4)}-${lastDate.slice(0, 4)}` : null,
    freezeNote: null,
    gdd50F,
    extremeMinC,
    years: years ?? 0,
  }));
}
