import type { Crop, GrowingForm, Outcome } from './codes';
import type { Share } from '../schemas/atlas';

/**
 * Ripening statistics of one variety near a point: shares of trees that ripened, their 90 %
 * interval, a distance-weighted share shrunk toward the variety's overall rate, and medians.
 *
 * Unit of evidence: the TREE. A tree reported over several seasons (and for both crops) is one
 * tree; it contributes the fraction of its reports that ripened (3 seasons, 2 ripened = 0.667 of a
 * success). So `trees` = distinct treeIds, `ripened` = the sum of those fractions (not always a
 * whole number), `share` = ripened / trees.
 */

/** One report, as the server gathers it for the engine. */
export type EvidenceReport = {
  reportId: number;
  treeId: number;
  userId: number;
  varietyId: number;
  crop: Crop;
  form: GrowingForm;
  outcome: Outcome;
  season: number;
  /** Distance from the query point to the report's place, km. */
  distanceKm: number;
  firstRipeDoy: number | null;
  springFrostDoy: number | null;
};

/**
 * Inverse of the standard normal distribution function (Acklam's rational approximation, relative
 * error below 1.2e-9), for the z of a confidence level.
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError('p must lie strictly between 0 and 1');
  const a = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
  const b = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
  const c = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
  const d = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];
  const low = 0.02425;
  if (p < low) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  if (p > 1 - low) return -normalQuantile(1 - p);
  const q = p - 0.5;
  const r = q * q;
  return ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
}

/**
 * Wilson score interval for a proportion (E. B. Wilson, 1927; "method 3" of Newcombe, 1998), two-sided
 * at `confidence` (default 0.9). `successes` may be fractional (trees count fractions of seasons).
 * Null when n is 0.
 */
export function wilsonInterval(successes: number, n: number, confidence = 0.9): { low: number; high: number } | null {
  if (!(n > 0)) return null;
  const z = normalQuantile(1 - (1 - confidence) / 2);
  const p = Math.min(1, Math.max(0, successes / n));
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}

type TreeTally = { reports: number; ripened: number; distanceKm: number };

function tallyTrees(reports: EvidenceReport[]): Map<number, TreeTally> {
  const trees = new Map<number, TreeTally>();
  for (const r of reports) {
    const t = trees.get(r.treeId) ?? { reports: 0, ripened: 0, distanceKm: r.distanceKm };
    t.reports++;
    if (r.outcome === 'ripened') t.ripened++;
    t.distanceKm = Math.min(t.distanceKm, r.distanceKm);
    trees.set(r.treeId, t);
  }
  return trees;
}

/**
 * Trees, reports, ripened trees (fractional, see the module comment), the share and its 90 % Wilson
 * interval (n = trees).
 */
export function summarizeShare(reports: EvidenceReport[]): Share {
  const trees = tallyTrees(reports);
  let ripened = 0;
  for (const t of trees.values()) ripened += t.ripened / t.reports;
  const n = trees.size;
  return {
    trees: n,
    reports: reports.length,
    ripened,
    share: n > 0 ? ripened / n : null,
    interval90: wilsonInterval(ripened, n, 0.9),
  };
}

/** Default kernel bandwidth (km) and prior strength (in trees) of `adjustedShare`. */
export const ADJUSTED_SHARE_DEFAULTS = { bandwidthKm: 50, priorStrength: 3 } as const;

/** Plain words for the API's `method` field. */
export const ADJUSTED_SHARE_METHOD =
  'Each tree counts once, as the fraction of its reported seasons that ripened. Nearby trees weigh more: ' +
  'a Gaussian distance kernel (weight exp(-d²/2h²), h = 50 km). The weighted share is then pulled toward the ' +
  'rate of the variety everywhere, as if 3 more trees at that rate had been reported here (a beta-binomial, ' +
  'empirical-Bayes estimate), so a variety with few local trees is not ranked on luck.';

/**
 * Distance-weighted share of ripened trees, shrunk toward the variety's overall rate:
 *
 *   adjusted = (Σ wᵢ fᵢ + k · p₀) / (Σ wᵢ + k),   wᵢ = exp(-dᵢ² / (2h²))
 *
 * where fᵢ is tree i's ripened fraction, dᵢ its distance from the point (km), h = `bandwidthKm`,
 * p₀ = `overallShare` and k = `priorStrength`. With all weights 1 this is the posterior mean of a
 * Beta(k·p₀, k·(1-p₀)) prior updated by the local trees. With no overall rate it is the plain weighted
 * share; with neither, null.
 */
export function adjustedShare(
  local: EvidenceReport[],
  overallShare: number | null,
  options: { bandwidthKm?: number; priorStrength?: number } = {},
): number | null {
  const h = options.bandwidthKm ?? ADJUSTED_SHARE_DEFAULTS.bandwidthKm;
  const k = options.priorStrength ?? ADJUSTED_SHARE_DEFAULTS.priorStrength;
  let s = 0;
  let w = 0;
  for (const t of tallyTrees(local).values()) {
    const weight = Math.exp(-(t.distanceKm * t.distanceKm) / (2 * h * h));
    s += weight * (t.ripened / t.reports);
    w += weight;
  }
  if (overallShare === null) return w > 0 ? s / w : null;
  return (s + k * overallShare) / (w + k);
}

/** Median of the finite values (mean of the middle two when even); null when there are none. */
export function median(values: readonly (number | null | undefined)[]): number | null {
  const xs = values.filter((v): v is number => typeof v === 'number' && Number.isFinite(v)).sort((a, b) => a - b);
  if (xs.length === 0) return null;
  const mid = xs.length >> 1;
  return xs.length % 2 === 1 ? xs[mid] : (xs[mid - 1] + xs[mid]) / 2;
}

/** The median over trees of each tree's median value, so one tree's many seasons count once. */
function medianOverTrees(reports: EvidenceReport[], value: (r: EvidenceReport) => number | null): number | null {
  const perTree = new Map<number, number[]>();
  for (const r of reports) {
    const v = value(r);
    if (v === null || !Number.isFinite(v)) continue;
    const list = perTree.get(r.treeId) ?? [];
    list.push(v);
    perTree.set(r.treeId, list);
  }
  return median([...perTree.values()].map((list) => median(list)));
}

/** Median first-ripe day of year over trees (each tree's own median first). */
export function medianFirstRipeDoy(reports: EvidenceReport[]): number | null {
  return medianOverTrees(reports, (r) => r.firstRipeDoy);
}

/**
 * Days from the last spring frost to the first ripe fig of a report; across the new year (southern
 * hemisphere) a negative difference gains 365 days. Null when either date is missing.
 */
export function daysFrostToRipe(r: Pick<EvidenceReport, 'firstRipeDoy' | 'springFrostDoy'>): number | null {
  if (r.firstRipeDoy === null || r.springFrostDoy === null) return null;
  const d = r.firstRipeDoy - r.springFrostDoy;
  return d < 0 ? d + 365 : d;
}

/** Median days from the last spring frost to the first ripe fig, over trees. */
export function medianDaysFrostToRipe(reports: EvidenceReport[]): number | null {
  return medianOverTrees(reports, daysFrostToRipe);
}

/**
 * A tree's published reports of one variety at one place in one growing form, summed: the unit the
 * server stores (table tree_evidence, kept by triggers) and reads for a radius, so a query touches
 * about a third as many rows as there are reports. A tree usually has one such row; a tree moved
 * from a container into the ground, or re-placed, has one per form or place. `groupTreeEvidence`
 * is the same grouping in plain code; every figure below is defined on reports and computed on these.
 */
export type TreeEvidence = {
  treeId: number;
  userId: number;
  varietyId: number;
  form: GrowingForm;
  /** Distance from the query point to this row's place, km. */
  distanceKm: number;
  reports: number;
  ripened: number;
  brebaReports: number;
  brebaRipened: number;
  /** Main crop only, one entry per report that gave a first-ripe date. */
  mainFirstRipeDoys: number[];
  /** Main crop only, one entry per report with both a spring frost and a first-ripe date (daysFrostToRipe). */
  mainFrostToRipeDays: number[];
};

/** Reports grouped as the server groups them into tree_evidence rows (tree, variety, place ~ distance, form). */
export function groupTreeEvidence(reports: EvidenceReport[]): TreeEvidence[] {
  const rows = new Map<string, TreeEvidence>();
  for (const r of reports) {
    const key = `${r.treeId}|${r.userId}|${r.varietyId}|${r.distanceKm}|${r.form}`;
    let row = rows.get(key);
    if (!row) {
      row = { treeId: r.treeId, userId: r.userId, varietyId: r.varietyId, form: r.form, distanceKm: r.distanceKm, reports: 0, ripened: 0, brebaReports: 0, brebaRipened: 0, mainFirstRipeDoys: [], mainFrostToRipeDays: [] };
      rows.set(key, row);
    }
    const ok = r.outcome === 'ripened' ? 1 : 0;
    row.reports++;
    row.ripened += ok;
    if (r.crop === 'breba') {
      row.brebaReports++;
      row.brebaRipened += ok;
    } else {
      if (r.firstRipeDoy !== null) row.mainFirstRipeDoys.push(r.firstRipeDoy);
      const days = daysFrostToRipe(r);
      if (days !== null) row.mainFrostToRipeDays.push(days);
    }
  }
  return [...rows.values()];
}

/**
 * A variety's figures over ALL its trees (not only near the point): the overall share that the
 * local share is shrunk toward, and the days from spring frost to first ripe main-crop fig of trees
 * in the ground, which season fit compares with the local season. `treesBehindNeed` counts the trees
 * that gave a days figure. Equal to summarizeShare(reports).share and medianDaysFrostToRipe of the
 * main-crop, in-ground reports.
 */
export function varietyOverall(rows: TreeEvidence[]): VarietyOverall {
  return overallFigures(rows, () => 0).get(0) ?? overallFromParts(null, []);
}

/** The fields of a tree row that the overall figures read. */
export type OverallRow = Pick<TreeEvidence, 'treeId' | 'varietyId' | 'form' | 'reports' | 'ripened' | 'mainFrostToRipeDays'>;

/** Every variety's overall figures (as varietyOverall of its rows) from the rows of many varieties, in one pass. */
export function overallByVariety(rows: Iterable<OverallRow>): Map<number, VarietyOverall> {
  return overallFigures(rows, (row) => row.varietyId);
}

/** varietyOverall for each group of rows (`groupOf`), keyed by the group. */
function overallFigures(rows: Iterable<OverallRow>, groupOf: (row: OverallRow) => number): Map<number, VarietyOverall> {
  const groups = new Map<number, Map<number, { n: number; ripe: number; need: number[] | null }>>();
  for (const row of rows) {
    const group = groupOf(row);
    let trees = groups.get(group);
    if (!trees) groups.set(group, (trees = new Map()));
    let t = trees.get(row.treeId);
    if (!t) trees.set(row.treeId, (t = { n: 0, ripe: 0, need: null }));
    t.n += row.reports;
    t.ripe += row.ripened;
    if (row.form === 'ground' && row.mainFrostToRipeDays.length > 0) (t.need ??= []).push(...row.mainFrostToRipeDays);
  }
  const overall = new Map<number, VarietyOverall>();
  for (const [group, trees] of groups) {
    let ripened = 0;
    const need: number[][] = [];
    for (const t of trees.values()) {
      ripened += t.ripe / t.n;
      if (t.need) need.push(t.need);
    }
    overall.set(group, overallFromParts(ripened / trees.size, need));
  }
  return overall;
}

/** A variety's figures over all its trees (see varietyOverall). */
export type VarietyOverall = {
  share: number | null;
  neededDays: number | null;
  treesBehindNeed: number;
  /** Heat from spring frost to first ripe fig (GDD base 50 °F) over trees in the ground, and the trees behind it (heatNeedByVariety). */
  neededHeatF?: number | null;
  treesBehindHeatNeed?: number;
};

/**
 * Each variety's heat need from reports: per tree in the ground, the median of its main-crop heat
 * figures (heat from the last spring frost to the first ripe fig at the tree's place), then the
 * median over trees, each tree counting once (as neededDays).
 */
export function heatNeedByVariety(rows: Iterable<{ treeId: number; varietyId: number; heats: number[] }>): Map<number, { neededHeatF: number | null; treesBehindHeatNeed: number }> {
  const byVariety = new Map<number, Map<number, number[]>>();
  for (const row of rows) {
    if (row.heats.length === 0) continue;
    let trees = byVariety.get(row.varietyId);
    if (!trees) byVariety.set(row.varietyId, (trees = new Map()));
    const list = trees.get(row.treeId);
    if (list) list.push(...row.heats);
    else trees.set(row.treeId, [...row.heats]);
  }
  const out = new Map<number, { neededHeatF: number | null; treesBehindHeatNeed: number }>();
  for (const [varietyId, trees] of byVariety) {
    const perTree = [...trees.values()].map((list) => median(list) as number);
    const m = median(perTree);
    out.set(varietyId, { neededHeatF: m === null ? null : Math.round(m), treesBehindHeatNeed: perTree.length });
  }
  return out;
}

/**
 * The overall figures from their parts, as the server gathers them in SQL: the share (mean over trees
 * of each tree's ripened fraction) and, per tree in the ground, its main-crop days from spring frost
 * to first ripe fig (each tree's median counts once).
 */
export function overallFromParts(share: number | null, needDaysPerTree: number[][]): VarietyOverall {
  return { share, neededDays: median(needDaysPerTree.map(smallMedian)), treesBehindNeed: needDaysPerTree.length };
}

const FORM_INDEX: Record<GrowingForm, number> = { ground: 0, container: 1, wall: 2, greenhouse: 3 };

function shareOf(trees: number, reports: number, ripened: number): Share {
  return { trees, reports, ripened, share: trees > 0 ? ripened / trees : null, interval90: wilsonInterval(ripened, trees, 0.9) };
}

function medianOfSorted(xs: Float64Array): number | null {
  if (xs.length === 0) return null;
  const mid = xs.length >> 1;
  return xs.length % 2 === 1 ? xs[mid] : (xs[mid - 1] + xs[mid]) / 2;
}

/** Room for one tree's values while smallMedian sorts them (one tree has a few seasons). */
const treeScratch = new Float64Array(32);

/**
 * The median of one tree's values, as `median` gives it, without allocating: an insertion sort
 * into a reused buffer (thousands of trees per request, each with a handful of seasons).
 */
function smallMedian(list: number[]): number {
  const n = list.length;
  if (n === 1) return list[0];
  if (n > treeScratch.length || !list.every(Number.isFinite)) return median(list) as number;
  for (let i = 0; i < n; i++) {
    const x = list[i];
    let j = i - 1;
    while (j >= 0 && treeScratch[j] > x) {
      treeScratch[j + 1] = treeScratch[j];
      j--;
    }
    treeScratch[j + 1] = x;
  }
  const mid = n >> 1;
  return n % 2 === 1 ? treeScratch[mid] : (treeScratch[mid - 1] + treeScratch[mid]) / 2;
}

/**
 * Everything the near answer needs about one variety's local trees, in one pass over their rows:
 * the same figures as summarizeShare (all, by crop, by form), adjustedShare, and the main-crop
 * medians of the reports behind them, fast enough for thousands of trees per request.
 */
export function tallyEvidence(
  rows: TreeEvidence[],
  overallShare: number | null,
  options: { bandwidthKm?: number; priorStrength?: number } = {},
): {
  growers: number;
  all: Share;
  byCrop: { breba: Share; main: Share };
  byForm: { ground: Share; container: Share; wall: Share; greenhouse: Share };
  adjustedShare: number | null;
  medianFirstRipeDoy: number | null;
  medianDaysFrostToRipe: number | null;
} {
  const h = options.bandwidthKm ?? ADJUSTED_SHARE_DEFAULTS.bandwidthKm;
  const k = options.priorStrength ?? ADJUSTED_SHARE_DEFAULTS.priorStrength;
  const users = new Set<number>();
  const cropReports = [0, 0];
  const cropTrees = [0, 0];
  const cropRipened = [0, 0];
  const formReports = [0, 0, 0, 0];
  const formTrees = [0, 0, 0, 0];
  const formRipened = [0, 0, 0, 0];
  // One tree's reports per form, and ripened per form (a tree in several forms has several rows).
  const treeFormN = [0, 0, 0, 0];
  const treeFormRipe = [0, 0, 0, 0];
  const firstRipe: number[] = [];
  const frostToRipe: number[] = [];
  let reports = 0;
  let trees = 0;
  let ripened = 0;
  let ws = 0;
  let w = 0;
  // A tree's rows side by side (a tree usually has one row), so each tree is summed in local
  // variables without a map or an object per tree: thousands of rows per request.
  const ordered = rowsByTree(rows);
  for (let i = 0; i < ordered.length; ) {
    const treeId = ordered[i].treeId;
    let end = i + 1;
    while (end < ordered.length && ordered[end].treeId === treeId) end++;
    let n = 0;
    let ripe = 0;
    let d = Infinity;
    let brebaN = 0;
    let brebaRipe = 0;
    treeFormN.fill(0);
    treeFormRipe.fill(0);
    for (let j = i; j < end; j++) {
      const row = ordered[j];
      users.add(row.userId);
      const f = FORM_INDEX[row.form];
      n += row.reports;
      ripe += row.ripened;
      if (row.distanceKm < d) d = row.distanceKm;
      brebaN += row.brebaReports;
      brebaRipe += row.brebaRipened;
      treeFormN[f] += row.reports;
      treeFormRipe[f] += row.ripened;
      formReports[f] += row.reports;
    }
    const mainN = n - brebaN;
    const mainRipe = ripe - brebaRipe;
    reports += n;
    cropReports[0] += brebaN;
    cropReports[1] += mainN;
    trees++;
    const frac = ripe / n;
    ripened += frac;
    const weight = Math.exp(-(d * d) / (2 * h * h));
    ws += weight * frac;
    w += weight;
    if (brebaN > 0) {
      cropTrees[0]++;
      cropRipened[0] += brebaRipe / brebaN;
    }
    if (mainN > 0) {
      cropTrees[1]++;
      cropRipened[1] += mainRipe / mainN;
    }
    for (let f = 0; f < 4; f++) {
      if (treeFormN[f] > 0) {
        formTrees[f]++;
        formRipened[f] += treeFormRipe[f] / treeFormN[f];
      }
    }
    const treeFirstRipe = treeList(ordered, i, end, 'mainFirstRipeDoys');
    if (treeFirstRipe) firstRipe.push(smallMedian(treeFirstRipe));
    const treeFrostToRipe = treeList(ordered, i, end, 'mainFrostToRipeDays');
    if (treeFrostToRipe) frostToRipe.push(smallMedian(treeFrostToRipe));
    i = end;
  }
  const adjusted = overallShare === null ? (w > 0 ? ws / w : null) : (ws + k * overallShare) / (w + k);
  const byForm = (f: number) => shareOf(formTrees[f], formReports[f], formRipened[f]);
  return {
    growers: users.size,
    all: shareOf(trees, reports, ripened),
    byCrop: { breba: shareOf(cropTrees[0], cropReports[0], cropRipened[0]), main: shareOf(cropTrees[1], cropReports[1], cropRipened[1]) },
    byForm: { ground: byForm(0), container: byForm(1), wall: byForm(2), greenhouse: byForm(3) },
    adjustedShare: adjusted,
    medianFirstRipeDoy: medianOfSorted(Float64Array.from(firstRipe).sort()),
    medianDaysFrostToRipe: medianOfSorted(Float64Array.from(frostToRipe).sort()),
  };
}

/**
 * The rows with each tree's rows side by side: as given when no tree has two rows (the usual case:
 * a tree has a second row only if its place, form or variety changed), else sorted by tree.
 */
function rowsByTree(rows: TreeEvidence[]): TreeEvidence[] {
  const trees = new Set<number>();
  for (const row of rows) {
    if (trees.has(row.treeId)) return [...rows].sort((a, b) => a.treeId - b.treeId);
    trees.add(row.treeId);
  }
  return rows;
}

/** One tree's values of a list over its rows `from`..`to` - 1 (the row's own list when it has one row); null when empty. */
function treeList(rows: TreeEvidence[], from: number, to: number, key: 'mainFirstRipeDoys' | 'mainFrostToRipeDays'): number[] | null {
  if (to - from === 1) return rows[from][key].length > 0 ? rows[from][key] : null;
  const values: number[] = [];
  for (let j = from; j < to; j++) values.push(...rows[j][key]);
  return values.length > 0 ? values : null;
}

/** The adjusted-share method in plain words for a kernel scale `bandwidthKm`. */
export function adjustedShareMethod(bandwidthKm: number = ADJUSTED_SHARE_DEFAULTS.bandwidthKm): string {
  return ADJUSTED_SHARE_METHOD.replace('h = 50 km', `h = ${Math.round(bandwidthKm)} km`);
}
