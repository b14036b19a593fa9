import type { Crop, GrowingForm, Outcome } from './codes';

/**
 * Rules that pick out reports worth a second look. They never hide anything by themselves: they
 * put a report in the editors' moderation queue with the reason in words. Thresholds are our own
 * judgement (common practice, no source), kept here so tests and screens share them.
 */
export const MODERATION_THRESHOLDS = {
  /** First ripe fig sooner than this share of the variety's typical days after the spring frost. */
  tooEarlyShare: 0.6,
  /** A ripened main crop in the ground whose frost-free season was shorter than this share of the typical days. */
  tooShortShare: 0.7,
  /** Neighbours: same variety and crop, within this distance, seasons within this many years. */
  neighbourKm: 60,
  neighbourSeasons: 1,
  /** At least this many other trees nearby before calling a report an outlier… */
  minNeighbourTrees: 5,
  /** …and at most this share of them ripened while the report says it did. */
  maxNeighbourRipenedShare: 0.1,
} as const;

export const SUSPICION_RULES = ['dates-out-of-order', 'too-early', 'season-too-short', 'neighbour-outlier'] as const;
export type SuspicionRule = (typeof SUSPICION_RULES)[number];

export interface Suspicion {
  rule: SuspicionRule;
  message: string;
}

/** The fields of a report the rules read. Dates are 'YYYY-MM-DD'. */
export interface ReportForRules {
  id: number;
  treeId: number;
  varietyId: number | null;
  lat: number;
  lon: number;
  season: number;
  crop: Crop;
  outcome: Outcome;
  form: GrowingForm;
  firstRipeDate: string | null;
  lastHarvestDate: string | null;
  springFrostDate: string | null;
  fallFrostDate: string | null;
  pinchedDate: string | null;
}

export interface VarietyForRules {
  id: number;
  name: string;
  typicalDaysToRipen: number | null;
}

const DAY_MS = 86_400_000;
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** Dates that contradict each other or the season they belong to. */
export function checkDateOrder(report: ReportForRules): Suspicion[] {
  const found: string[] = [];
  const dates: [string, string | null][] = [
    ['last spring frost', report.springFrostDate],
    ['pinching', report.pinchedDate],
    ['first ripe fig', report.firstRipeDate],
    ['last harvest', report.lastHarvestDate],
    ['first fall frost', report.fallFrostDate],
  ];
  for (const [label, date] of dates) {
    if (date && Number(date.slice(0, 4)) !== report.season) found.push(`the ${label} (${date}) is not in the ${report.season} season`);
  }
  const before = (a: number, b: number) => {
    const [la, da] = dates[a]!;
    const [lb, db] = dates[b]!;
    if (da && db && da > db) found.push(`the ${la} (${da}) comes after the ${lb} (${db})`);
  };
  before(0, 4); // spring frost before fall frost
  before(2, 3); // first ripe before last harvest
  if (report.crop === 'main') before(0, 2); // a main crop ripens after the spring frost
  return found.length ? [{ rule: 'dates-out-of-order', message: `Dates out of order: ${found.join('; ')}.` }] : [];
}

/** Ripening far earlier than the variety allows, or a main crop ripened in a season far too short. */
export function checkSeasonFit(report: ReportForRules, variety: VarietyForRules | undefined): Suspicion[] {
  const typical = variety?.typicalDaysToRipen;
  if (!typical || report.crop !== 'main' || report.outcome !== 'ripened') return [];
  // A greenhouse gives a head start the dates do not show.
  if (report.form === 'greenhouse') return [];
  const found: Suspicion[] = [];
  if (report.springFrostDate && report.firstRipeDate) {
    const days = daysBetween(report.springFrostDate, report.firstRipeDate);
    if (days >= 0 && days < typical * MODERATION_THRESHOLDS.tooEarlyShare) {
      found.push({ rule: 'too-early', message: `First ripe ${days} days after the spring frost; ${variety!.name} typically needs about ${typical}.` });
    }
  }
  if (report.form === 'ground' && report.springFrostDate && report.fallFrostDate) {
    const season = daysBetween(report.springFrostDate, report.fallFrostDate);
    if (season >= 0 && season < typical * MODERATION_THRESHOLDS.tooShortShare) {
      found.push({ rule: 'season-too-short', message: `Main crop ripened in the ground in a ${season}-day frost-free season; ${variety!.name} typically needs about ${typical} days.` });
    }
  }
  return found;
}

/** Great-circle distance in km (haversine, mean Earth radius 6371 km). */
export function distanceKm(aLat: number, aLon: number, bLat: number, bLon: number): number {
  const rad = Math.PI / 180;
  const dLat = (bLat - aLat) * rad;
  const dLon = (bLon - aLon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(aLat * rad) * Math.cos(bLat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/**
 * A report that ripened where nearly all nearby trees of the same variety and crop did not.
 * `neighbours` may include the report itself and other reports of its own tree; both are ignored.
 * Each neighbouring tree counts once (ripened if any of its nearby-season reports ripened).
 */
export function checkNeighbourOutlier(report: ReportForRules, neighbours: ReportForRules[]): Suspicion[] {
  if (report.outcome !== 'ripened' || report.varietyId === null || report.form === 'greenhouse') return [];
  const t = MODERATION_THRESHOLDS;
  const trees = new Map<number, boolean>();
  for (const other of neighbours) {
    if (other.treeId === report.treeId || other.varietyId !== report.varietyId || other.crop !== report.crop) continue;
    if (other.form === 'greenhouse' || Math.abs(other.season - report.season) > t.neighbourSeasons) continue;
    if (other.outcome === 'no-fruit') continue; // a tree that bore nothing says nothing about ripening
    // a degree of latitude is at least 110.5 km: skip the far ones before the trigonometry
    if (Math.abs(other.lat - report.lat) * 110.5 > t.neighbourKm || distanceKm(report.lat, report.lon, other.lat, other.lon) > t.neighbourKm) continue;
    trees.set(other.treeId, (trees.get(other.treeId) ?? false) || other.outcome === 'ripened');
  }
  if (trees.size < t.minNeighbourTrees) return [];
  const ripened = [...trees.values()].filter(Boolean).length;
  if (ripened / trees.size > t.maxNeighbourRipenedShare) return [];
  return [{ rule: 'neighbour-outlier', message: `Ripened, while ${trees.size - ripened} of ${trees.size} nearby ${report.crop === 'breba' ? 'breba' : 'main'} crops of this variety within ${t.neighbourKm} km did not.` }];
}

/**
 * Run every rule over a set of reports. Neighbours are found through a 1-degree grid, so the work
 * grows with the reports near each one rather than with the square of all reports.
 */
export function findSuspiciousReports(reports: ReportForRules[], varieties: VarietyForRules[]): Map<number, Suspicion[]> {
  const byId = new Map(varieties.map((v) => [v.id, v]));
  // cells hold one variety's reports of one crop, so a dense region is scanned only for that pair
  const cells = new Map<string, ReportForRules[]>();
  const cellKey = (r: Pick<ReportForRules, 'varietyId' | 'crop'>, lat: number, lon: number) => `${r.varietyId}:${r.crop}:${lat}:${lon}`;
  for (const r of reports) {
    if (r.varietyId === null) continue;
    const key = cellKey(r, Math.floor(r.lat), Math.floor(r.lon));
    const list = cells.get(key);
    if (list) list.push(r);
    else cells.set(key, [r]);
  }
  // every report of a cell shares the same neighbourhood: gather it once per cell
  const neighbourhoods = new Map<string, ReportForRules[]>();
  const neighbourhood = (report: ReportForRules): ReportForRules[] => {
    const lat0 = Math.floor(report.lat);
    const lon0 = Math.floor(report.lon);
    const own = cellKey(report, lat0, lon0);
    let near = neighbourhoods.get(own);
    if (!near) {
      near = [];
      // 60 km is under one degree of latitude; longitude degrees shrink towards the poles, so look 2 wide
      for (let dLat = -1; dLat <= 1; dLat++) {
        for (let dLon = -2; dLon <= 2; dLon++) {
          const cell = cells.get(cellKey(report, lat0 + dLat, lon0 + dLon));
          if (cell) for (const r of cell) near.push(r);
        }
      }
      neighbourhoods.set(own, near);
    }
    return near;
  };
  const result = new Map<number, Suspicion[]>();
  for (const report of reports) {
    const found = [...checkDateOrder(report), ...checkSeasonFit(report, report.varietyId === null ? undefined : byId.get(report.varietyId))];
    if (report.outcome === 'ripened' && report.varietyId !== null) found.push(...checkNeighbourOutlier(report, neighbourhood(report)));
    if (found.length) result.set(report.id, found);
  }
  return result;
}
