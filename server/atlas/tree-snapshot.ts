import type Database from 'better-sqlite3';
import KDBush from 'kdbush';
import { GROWING_FORMS, type GrowingForm } from '../../shared/domain/codes';
import { distanceKm, type LatLon } from '../../shared/domain/geo';
import { heatFromFrost } from '../../shared/domain/gdd';
import { heatNeedByVariety, overallByVariety, type OverallRow, type TreeEvidence, type VarietyOverall } from '../../shared/domain/ripening-stats';
import { estimateSeason } from '../../shared/domain/season-estimate';
import type { Db } from '../db/client';
import { currentStationSnapshot, stationSeasonsInBoxes, type StationSnapshot } from '../stations/station-snapshot';
import { atlasDataVersion } from '../db/data-version';
import { idsInRadiusBoxes } from '../lib/kdbush-radius';

/*
 * Every tree row of the atlas (table tree_evidence, kept by triggers on reports) held in memory as
 * typed-array columns with a k-d tree over their places (kdbush). A row's place is its public grid
 * cell's centre (drizzle/0012; shared/domain/public-grid.ts publicPosition): every answer built
 * from the snapshot is public, so no exact place is ever read into it. A radius query is then a box
 * query on the k-d tree plus the exact great-circle distance, and reads no database page: at
 * 200 km on a million reports it takes a fraction of a millisecond, where fetching the same rows
 * from SQLite took several. A snapshot holds the rows of one atlas data version, with each
 * variety's overall figures computed from the same rows; tree-snapshot-cache.ts decides when to
 * read a new one (and in which thread). About 70 bytes per tree row: 25 MB for a million reports.
 */

/** One of a grower's frost-free seasons, as reported with a tree (season = the year). */
export type FrostSeason = { season: number; days: number };

/** A tree row near a point (see TreeEvidence), with the frost-free seasons its reports gave. */
export type NearTree = TreeEvidence & { frostSeasons: FrostSeason[] };

/**
 * The rows, column by column (row i of each). The lists of row i are the slices
 * `values[start[i]] .. values[start[i + 1] - 1]` of their column.
 */
export interface TreeColumns {
  count: number;
  /** Row ids below 2^31, as SQLite gives them to a growing atlas (Int32: small integers in JavaScript too). */
  treeId: Int32Array;
  userId: Int32Array;
  varietyId: Int32Array;
  /** Index into GROWING_FORMS. */
  form: Uint8Array;
  /** The tree's public position (its grid cell's centre, publicPosition), never its exact place. */
  lat: Float64Array;
  lon: Float64Array;
  reports: Int32Array;
  ripened: Int32Array;
  brebaReports: Int32Array;
  brebaRipened: Int32Array;
  firstRipeStart: Uint32Array;
  firstRipeDoys: Int16Array;
  frostToRipeStart: Uint32Array;
  frostToRipeDays: Int16Array;
  frostSeasonStart: Uint32Array;
  frostSeasonYears: Int16Array;
  frostSeasonDays: Int16Array;
  /** The kdbush index over (lon, lat) of the rows, as its buffer (KDBush.from). */
  index: ArrayBuffer;
}

/** What a read hands over (from a worker thread, without a copy). */
export interface TreeSnapshotData {
  version: number;
  columns: TreeColumns;
  overall: [number, VarietyOverall][];
}

export interface TreeSnapshot {
  /** The atlas data version the rows were read at. */
  version: number;
  columns: TreeColumns;
  index: KDBush;
  /** Each variety's figures over all its trees (varietyOverall). */
  overall: Map<number, VarietyOverall>;
}

const FORM_CODE = new Map<string, number>(GROWING_FORMS.map((form, i) => [form, i]));

const ROWS_SQL = `
  SELECT tree_id, user_id, variety_id, form, grid_lat, grid_lon, reports, ripened, breba_reports, breba_ripened,
         first_ripe_doys, frost_to_ripe_days, frost_seasons
    FROM tree_evidence ORDER BY id`;

type RowTuple = [number, number, number, string, number, number, number, number, number, number, string | null, string | null, string | null];

/** A growable list of numbers, turned into a typed array at the end. */
class ListColumn {
  values: number[] = [];
  start: number[] = [0];
  /** Appends row's list: the numbers of "230,241" (SQLite's group_concat of integers). */
  addList(text: string | null) {
    if (text !== null) for (const part of text.split(',')) this.values.push(+part);
    this.start.push(this.values.length);
  }
}

/**
 * Reads every tree row and builds the columns, the index and the overall figures, in one read
 * transaction (the version is exactly that of the rows). Runs in a worker thread on a large atlas.
 */
export function readTreeSnapshot(sqlite: Database.Database): { data: TreeSnapshotData; transfer: ArrayBuffer[] } {
  const read = sqlite.transaction(() => ({
    version: atlasDataVersion({ sqlite }),
    rows: sqlite.prepare(ROWS_SQL).raw().all() as RowTuple[],
  }));
  const { version, rows } = read.deferred();
  const n = rows.length;
  const c: TreeColumns = {
    count: n,
    treeId: new Int32Array(n),
    userId: new Int32Array(n),
    varietyId: new Int32Array(n),
    form: new Uint8Array(n),
    lat: new Float64Array(n),
    lon: new Float64Array(n),
    reports: new Int32Array(n),
    ripened: new Int32Array(n),
    brebaReports: new Int32Array(n),
    brebaRipened: new Int32Array(n),
    firstRipeStart: new Uint32Array(0),
    firstRipeDoys: new Int16Array(0),
    frostToRipeStart: new Uint32Array(0),
    frostToRipeDays: new Int16Array(0),
    frostSeasonStart: new Uint32Array(0),
    frostSeasonYears: new Int16Array(0),
    frostSeasonDays: new Int16Array(0),
    index: new ArrayBuffer(0),
  };
  const firstRipe = new ListColumn();
  const frostToRipe = new ListColumn();
  const seasonYears: number[] = [];
  const seasonDays: number[] = [];
  const seasonStart: number[] = [0];
  const index = new KDBush(Math.max(1, n));
  for (let i = 0; i < n; i++) {
    const row = rows[i]!;
    c.treeId[i] = row[0];
    c.userId[i] = row[1];
    c.varietyId[i] = row[2];
    c.form[i] = FORM_CODE.get(row[3]) ?? 0;
    c.lat[i] = row[4];
    c.lon[i] = row[5];
    c.reports[i] = row[6];
    c.ripened[i] = row[7];
    c.brebaReports[i] = row[8];
    c.brebaRipened[i] = row[9];
    firstRipe.addList(row[10]);
    frostToRipe.addList(row[11]);
    // 'season:days' pairs; a days figure outside 1..366 is not a season and is left out.
    if (row[12] !== null) {
      for (const pair of row[12].split(',')) {
        const [season, days] = pair.split(':');
        const d = Number(days);
        if (!(d > 0 && d <= 366)) continue;
        seasonYears.push(Number(season));
        seasonDays.push(d);
      }
    }
    seasonStart.push(seasonYears.length);
    index.add(row[5], row[4]);
  }
  if (n === 0) index.add(0, 0); // kdbush needs one point; an empty snapshot never looks it up
  index.finish();
  c.firstRipeStart = Uint32Array.from(firstRipe.start);
  c.firstRipeDoys = Int16Array.from(firstRipe.values);
  c.frostToRipeStart = Uint32Array.from(frostToRipe.start);
  c.frostToRipeDays = Int16Array.from(frostToRipe.values);
  c.frostSeasonStart = Uint32Array.from(seasonStart);
  c.frostSeasonYears = Int16Array.from(seasonYears);
  c.frostSeasonDays = Int16Array.from(seasonDays);
  c.index = index.data as ArrayBuffer;
  const overall = overallByVariety(overallRows(c));
  for (const [varietyId, heat] of heatNeedByVariety(heatRows(c, stationsFor(sqlite)))) {
    const o = overall.get(varietyId);
    if (o) Object.assign(o, heat);
  }
  const data: TreeSnapshotData = { version, columns: c, overall: [...overall] };
  const transfer = Object.values(c).filter((v): v is ArrayBuffer | ArrayBufferView => typeof v === 'object').map((v) => (ArrayBuffer.isView(v) ? (v.buffer as ArrayBuffer) : v));
  return { data, transfer };
}

/** The snapshot from what a read handed over (the index wraps its buffer; nothing is copied). */
export function treeSnapshotFrom(data: TreeSnapshotData): TreeSnapshot {
  return { version: data.version, columns: data.columns, index: KDBush.from(data.columns.index), overall: new Map(data.overall) };
}

const wrappers = new WeakMap<Database.Database, Db>();

/** The station snapshot over this connection, kept while the stations do not change (one per connection). */
function stationsFor(sqlite: Database.Database): StationSnapshot {
  let db = wrappers.get(sqlite);
  if (!db) wrappers.set(sqlite, (db = { sqlite } as Db));
  return currentStationSnapshot(db);
}

/**
 * How far to look for stations when turning a tree's days into heat: half the near answer's default
 * radius, near enough for the garden's summer, and about a quarter of the cost of 100 km with the normals loaded.
 */
const HEAT_STATION_KM = 50;

/**
 * Each tree row in the ground with its main-crop heat figures: days from spring frost to first ripe
 * fig turned into heat at the row's place (heatFromFrost) with the typical season and heat the
 * stations give there, one estimate per place. Rows where no station gives heat are left out. The
 * stations are read with the tree rows, so the heat need follows the atlas data version (a station
 * change shows in it with the next report).
 */
function* heatRows(c: TreeColumns, stations: StationSnapshot): Generator<{ treeId: number; varietyId: number; heats: number[] }> {
  const places = new Map<string, { heat: number; days: number } | null>();
  const groundCode = FORM_CODE.get('ground');
  for (let i = 0; i < c.count; i++) {
    if (c.form[i] !== groundCode || c.frostToRipeStart[i + 1] === c.frostToRipeStart[i]) continue;
    const point = { lat: c.lat[i]!, lon: c.lon[i]! };
    const key = `${point.lat.toFixed(2)},${point.lon.toFixed(2)}`;
    let place = places.get(key);
    if (place === undefined) {
      const season = estimateSeason({ point, stations: stationSeasonsInBoxes(stations, point, HEAT_STATION_KM), reportFrostSeasons: [], radiusKm: HEAT_STATION_KM });
      place = season.gdd50F !== null && season.days50 !== null ? { heat: season.gdd50F, days: season.days50 } : null;
      places.set(key, place);
    }
    if (!place) continue;
    const heats = slice(c.frostToRipeDays, c.frostToRipeStart, i).map((d) => Math.round(heatFromFrost(place.heat, place.days, d)));
    yield { treeId: c.treeId[i]!, varietyId: c.varietyId[i]!, heats };
  }
}

/** The columns as the rows the overall figures read, one at a time. */
function* overallRows(c: TreeColumns): Generator<OverallRow> {
  for (let i = 0; i < c.count; i++) {
    yield {
      treeId: c.treeId[i]!,
      varietyId: c.varietyId[i]!,
      form: GROWING_FORMS[c.form[i]!] as GrowingForm,
      reports: c.reports[i]!,
      ripened: c.ripened[i]!,
      mainFrostToRipeDays: slice(c.frostToRipeDays, c.frostToRipeStart, i),
    };
  }
}

const NO_NUMBERS: number[] = [];
const NO_SEASONS: FrostSeason[] = [];

function slice(values: Int16Array, start: Uint32Array, i: number): number[] {
  const from = start[i]!;
  const to = start[i + 1]!;
  if (to === from) return NO_NUMBERS;
  const list = new Array<number>(to - from);
  for (let k = from; k < to; k++) list[k - from] = values[k]!;
  return list;
}

function treeAt(c: TreeColumns, i: number, distance: number): NearTree {
  let frostSeasons = NO_SEASONS;
  const from = c.frostSeasonStart[i]!;
  const to = c.frostSeasonStart[i + 1]!;
  if (to > from) {
    frostSeasons = [];
    for (let k = from; k < to; k++) frostSeasons.push({ season: c.frostSeasonYears[k]!, days: c.frostSeasonDays[k]! });
  }
  return {
    treeId: c.treeId[i]!,
    userId: c.userId[i]!,
    varietyId: c.varietyId[i]!,
    form: GROWING_FORMS[c.form[i]!] as GrowingForm,
    distanceKm: distance,
    reports: c.reports[i]!,
    ripened: c.ripened[i]!,
    brebaReports: c.brebaReports[i]!,
    brebaRipened: c.brebaRipened[i]!,
    mainFirstRipeDoys: slice(c.firstRipeDoys, c.firstRipeStart, i),
    mainFrostToRipeDays: slice(c.frostToRipeDays, c.frostToRipeStart, i),
    frostSeasons,
  };
}

/**
 * Tree rows whose public position (grid cell centre) lies within `radiusKm` of the point (exact
 * great-circle distance to the cell centre), from published reports.
 */
export function treesWithin(snapshot: TreeSnapshot, point: LatLon, radiusKm: number): NearTree[] {
  const c = snapshot.columns;
  if (c.count === 0) return [];
  const result: NearTree[] = [];
  const place = { lat: 0, lon: 0 };
  for (const i of idsInRadiusBoxes(snapshot.index, point, radiusKm)) {
    place.lat = c.lat[i]!;
    place.lon = c.lon[i]!;
    const distance = distanceKm(point, place);
    if (distance <= radiusKm) result.push(treeAt(c, i, distance));
  }
  return result;
}

/** What reportFrostSeasons reads of a tree row: its grower, its distance and its frost seasons. */
export type FrostTree = Pick<NearTree, 'userId' | 'distanceKm' | 'frostSeasons'>;

/** The rows that carry a frost season, with their seasons ready and a k-d tree of their own. */
interface FrostRows {
  rows: Int32Array;
  seasons: FrostSeason[][];
  index: KDBush;
}
const frostRowsBySnapshot = new WeakMap<TreeSnapshot, FrostRows>();

function frostRowsOf(snapshot: TreeSnapshot): FrostRows | null {
  const kept = frostRowsBySnapshot.get(snapshot);
  if (kept) return kept;
  const c = snapshot.columns;
  const rows: number[] = [];
  for (let i = 0; i < c.count; i++) if (c.frostSeasonStart[i + 1]! > c.frostSeasonStart[i]!) rows.push(i);
  if (rows.length === 0) return null;
  const index = new KDBush(rows.length);
  const seasons = rows.map((i) => {
    index.add(c.lon[i]!, c.lat[i]!);
    return treeAt(c, i, 0).frostSeasons;
  });
  index.finish();
  const built = { rows: Int32Array.from(rows), seasons, index };
  frostRowsBySnapshot.set(snapshot, built);
  return built;
}

/**
 * The tree rows within `radiusKm` that carry a grower's frost season: exactly the rows of
 * treesWithin that reportFrostSeasons reads, found through a k-d tree of those rows alone (built
 * once per snapshot), since the season surface asks this for hundreds of points per tile.
 */
export function frostTreesWithin(snapshot: TreeSnapshot, point: LatLon, radiusKm: number): FrostTree[] {
  const frost = frostRowsOf(snapshot);
  if (!frost) return [];
  const c = snapshot.columns;
  const result: FrostTree[] = [];
  const place = { lat: 0, lon: 0 };
  for (const k of idsInRadiusBoxes(frost.index, point, radiusKm)) {
    const i = frost.rows[k]!;
    place.lat = c.lat[i]!;
    place.lon = c.lon[i]!;
    const distance = distanceKm(point, place);
    if (distance <= radiusKm) result.push({ userId: c.userId[i]!, distanceKm: distance, frostSeasons: frost.seasons[k]! });
  }
  return result;
}

/**
 * Growers' own frost-free seasons near the point: one per grower and season (a garden's frost does
 * not count again for each of its trees and crops), at the grower's nearest tree that reported it,
 * so the answer does not depend on the order of the rows.
 */
export function reportFrostSeasons(trees: FrostTree[]): { distanceKm: number; seasonDays: number }[] {
  const byGrowerSeason = new Map<number, { distanceKm: number; seasonDays: number }>();
  for (const t of trees) {
    for (const { season, days } of t.frostSeasons) {
      const key = t.userId * 100_000 + season;
      const seen = byGrowerSeason.get(key);
      if (!seen) byGrowerSeason.set(key, { distanceKm: t.distanceKm, seasonDays: days });
      else if (t.distanceKm < seen.distanceKm || (t.distanceKm === seen.distanceKm && days < seen.seasonDays)) {
        seen.distanceKm = t.distanceKm;
        seen.seasonDays = days;
      }
    }
  }
  return [...byGrowerSeason.values()];
}
