import type Database from 'better-sqlite3';
import { booleanPointInPolygon, point } from '@turf/turf';
import type { GrowingForm } from '../../shared/domain/codes';
import { GROWING_FORMS } from '../../shared/domain/codes';
import type { ModelVariety, TreeRecord } from '../../shared/domain/chance-model';
import { pollinationChecks } from '../../shared/domain/pollination';
import { estimateSeason } from '../../shared/domain/season-estimate';
import type { WaspAreaGeometry } from '../../shared/schemas/wasp-areas';
import { type StationSnapshot, stationSeasonsInBoxes } from '../stations/station-snapshot';

/*
 * The chance model's inputs read from SQLite (in a worker thread on a large atlas): every published
 * report of an accepted variety, at its PUBLIC GRID CELL (grid_lat/grid_lon, never the exact place),
 * grouped into tree records (tree, variety, form, cell) with their tree-seasons. The typical season
 * at each cell is the same estimator the near answer uses (estimateSeason over the station snapshot,
 * with the frost-free seasons growers reported at that cell);
 * the wasp at each cell, the active wasp areas.
 */

/** Radius of the stations that give a cell's typical season (the near answer's default radius). */
export const CELL_SEASON_RADIUS_KM = 100;

type ReportTuple = [treeId: number, userId: number, varietyId: number, form: string, lat: number, lon: number, season: number, crop: 'breba' | 'main', outcome: string, isDemo: number];

const REPORTS_SQL = `
  SELECT r.tree_id, r.user_id, r.variety_id, r.form, r.grid_lat, r.grid_lon, r.season, r.crop, r.outcome, u.is_demo
    FROM reports r
    JOIN varieties v ON v.id = r.variety_id AND v.status = 'accepted'
    JOIN users u ON u.id = r.user_id
   WHERE r.status = 'published'
   ORDER BY r.tree_id`;

/** Growers' own frost-free seasons per cell, one per grower and season (as the near answer counts them). */
const CELL_FROST_SQL = `
  SELECT r.grid_lat, r.grid_lon, r.user_id, r.season, max(CAST(julianday(r.fall_frost_date) - julianday(r.spring_frost_date) AS INTEGER))
    FROM reports r
    JOIN varieties v ON v.id = r.variety_id AND v.status = 'accepted'
   WHERE r.status = 'published' AND r.spring_frost_date IS NOT NULL AND r.fall_frost_date IS NOT NULL
   GROUP BY r.grid_lat, r.grid_lon, r.user_id, r.season`;

export function readModelVarieties(sqlite: Database.Database): Map<number, ModelVariety> {
  const rows = sqlite
    .prepare("SELECT id, fig_type AS figType, ripening_class AS ripeningClass, typical_days_to_ripen AS typicalDaysToRipen FROM varieties WHERE status = 'accepted'")
    .all() as ModelVariety[];
  return new Map(rows.map((v) => [v.id, v]));
}

function waspLookup(sqlite: Database.Database): (lat: number, lon: number) => boolean {
  const areas = (sqlite.prepare("SELECT geometry, min_lat, max_lat, min_lon, max_lon FROM wasp_areas WHERE status = 'active'").raw().all() as [string, number, number, number, number][]).map(
    ([geometry, minLat, maxLat, minLon, maxLon]) => ({ geometry: JSON.parse(geometry) as WaspAreaGeometry, minLat, maxLat, minLon, maxLon }),
  );
  return (lat, lon) => {
    const here = point([lon, lat]);
    return areas.some((a) => lat >= a.minLat && lat <= a.maxLat && lon >= a.minLon && lon <= a.maxLon && booleanPointInPolygon(here, a.geometry));
  };
}

export type ModelInputs = { records: TreeRecord[]; varieties: Map<number, ModelVariety>; demoSeasons: number; seasons: number };

/** Reads the tree records (see the module comment) in one read transaction. */
export function readModelInputs(sqlite: Database.Database, stations: StationSnapshot): ModelInputs {
  return sqlite.transaction(() => readInTransaction(sqlite, stations)).deferred();
}

function readInTransaction(sqlite: Database.Database, stations: StationSnapshot): ModelInputs {
  const varieties = readModelVarieties(sqlite);
  const wasp = waspLookup(sqlite);
  const cellFrost = new Map<string, number[]>();
  for (const [lat, lon, , , days] of sqlite.prepare(CELL_FROST_SQL).raw().iterate() as Iterable<[number, number, number, number, number | null]>) {
    if (days === null || !(days > 0 && days <= 366)) continue;
    const key = `${lat},${lon}`;
    let seasons = cellFrost.get(key);
    if (!seasons) cellFrost.set(key, (seasons = []));
    seasons.push(days);
  }
  const cells = new Map<string, { days: number | null; wasp: boolean }>();
  const cellAt = (lat: number, lon: number) => {
    const key = `${lat},${lon}`;
    let cell = cells.get(key);
    if (!cell) {
      const here = { lat, lon };
      const reportFrostSeasons = (cellFrost.get(key) ?? []).map((seasonDays) => ({ distanceKm: 0, seasonDays }));
      const season = estimateSeason({ point: here, stations: stationSeasonsInBoxes(stations, here, CELL_SEASON_RADIUS_KM), reportFrostSeasons, radiusKm: CELL_SEASON_RADIUS_KM });
      cells.set(key, (cell = { days: season.days50, wasp: wasp(lat, lon) }));
    }
    return cell;
  };
  const records: TreeRecord[] = [];
  let demoSeasons = 0;
  let seasons = 0;
  let current: TreeRecord | null = null;
  let lastSeason = NaN;
  let seasonEligible = false;
  let seasonEdible = false;
  let currentDemo = false;
  const closeSeason = () => {
    if (current && seasonEligible) {
      current.seasons++;
      if (seasonEdible) current.edible++;
      seasons++;
      if (currentDemo) demoSeasons++;
    }
    seasonEligible = false;
    seasonEdible = false;
  };
  let cell = { days: null as number | null, wasp: false };
  const consume = ([treeId, userId, varietyId, form, lat, lon, season, crop, outcome, isDemo]: ReportTuple) => {
    const variety = varieties.get(varietyId)!;
    if (!current || current.treeId !== treeId || current.varietyId !== varietyId || current.form !== form || current.lat !== lat || current.lon !== lon) {
      closeSeason();
      cell = cellAt(lat, lon);
      current = { treeId, userId, varietyId, form: (GROWING_FORMS.includes(form as GrowingForm) ? form : 'ground') as GrowingForm, lat, lon, localDays: cell.days, seasons: 0, edible: 0, reports: 0, ripened: 0 };
      records.push(current);
      lastSeason = NaN;
      currentDemo = isDemo === 1;
    } else if (season !== lastSeason) closeSeason();
    lastSeason = season;
    current.reports++;
    if (outcome === 'ripened') current.ripened++;
    // Pollination as a rule, per crop: a crop that cannot set fruit at this cell is not evidence.
    if (pollinationChecks(variety.figType, cell.wasp)[crop].fruitExpected !== 'no') {
      seasonEligible = true;
      if (outcome === 'ripened') seasonEdible = true;
    }
  };
  // Streamed in tree order (the tree index: no sort of a million rows), each tree's few reports
  // ordered here by variety, form, cell and season; so a million reports never sit in memory at once.
  let tree: ReportTuple[] = [];
  const flushTree = () => {
    tree.sort((a, b) => a[2] - b[2] || (a[3] < b[3] ? -1 : a[3] > b[3] ? 1 : 0) || a[4] - b[4] || a[5] - b[5] || a[6] - b[6]);
    for (const row of tree) consume(row);
    tree = [];
  };
  for (const row of sqlite.prepare(REPORTS_SQL).raw().iterate() as Iterable<ReportTuple>) {
    if (tree.length > 0 && tree[0][0] !== row[0]) flushTree();
    tree.push(row);
  }
  flushTree();
  closeSeason();
  return { records, varieties, demoSeasons, seasons };
}
