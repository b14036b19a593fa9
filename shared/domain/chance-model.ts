import type { Chance } from '../schemas/chance';
import type { FigType, GrowingForm, RipeningClass } from './codes';
import { brierScore, brierSkillScore, logLoss, reliabilityBins } from './forecast-scores';
import { distanceKm, type LatLon } from './geo';
import { fitLogistic, sigmoid, type BinomialPoint, type CoefficientPrior, type LogisticFit } from './logistic';
import { pollinationChecks } from './pollination';
import { FORM_HEAD_START_DAYS, RIPENING_CLASS_NEED_DAYS } from './season-fit';

/*
 * The chance that a variety gives an edible crop in a typical season at a point, grown in a given
 * form (issue 16). Three parts:
 *
 * 1. A logistic model of "edible crop this season" on the SEASON MARGIN, in months (30 days):
 *      margin = typical frost-free days at the tree's grid cell + the form's head start − the days
 *               the variety needs (catalogue figure, else its ripening class)
 *      logit P(edible crop) = a_v + b_v · margin
 *    fitted on tree-seasons. Each variety's (a_v, b_v) is partially pooled toward its ripening class:
 *    the class's own fit is the mean of a Gaussian prior on the variety's coefficients (a penalised
 *    logistic regression, Newton/IRLS, logistic.ts), so a variety with a few trees follows its class
 *    and one with many follows its own reports.
 * 2. Local trees adjust it: a Beta-binomial update of the model's prediction p₀ with the trees of the
 *    variety near the point, each weighing a Gaussian kernel of its distance, exp(−d²/2h²). Each
 *    tree adds its observed edible-crop fraction minus what the model expected for it (its own form
 *    and cell), so a container tree nearby does not count as a ground tree. The prior's weight m
 *    is what the model's own uncertainty is worth in trees (the Beta whose variance matches it).
 * 3. Pollination enters as a rule per crop, counted once: a tree-season counts only the crops that
 *    can set fruit at the tree's place (a San Pedro's main crop without the wasp is not a zero, it is
 *    left out), and at the point, a variety none of whose crops can set there has no chance.
 *
 * Units of evidence: tree-seasons (a tree reported in one season, whatever its crops), and trees.
 */

export const MARGIN_SCALE_DAYS = 30;
/**
 * Margins are capped at ± this many days: past two months to spare a longer season adds nothing
 * (what still fails there fails for other reasons), and the logistic curve must not read certainty
 * into it. Chosen on the leave-one-grower-out scores of the demo (ADJUSTABLE ASSUMPTION).
 */
export const MARGIN_CAP_DAYS = 60;
/** Days a variety is assumed to need when neither the catalogue nor its class says (a mid fig). */
export const DEFAULT_NEED_DAYS = RIPENING_CLASS_NEED_DAYS.mid;
/**
 * Prior spread of a variety's coefficients around its class's (logit units; the slope per month
 * of margin). ADJUSTABLE ASSUMPTIONS, chosen so that leave-one-grower-out scores on the demo are
 * good without letting one tree decide: about 8 tree-seasons move the intercept halfway.
 */
export const VARIETY_PRIOR_SD: [number, number] = [0.7, 0.3];
/** Weak prior of a class's own fit: keeps it finite when its reports are all one outcome. */
export const CLASS_PRIOR: CoefficientPrior = { mean: [0, 0.5], sd: [3, 1] };
/** Fewest trees of a variety (local and elsewhere) for a verdict. */
export const MIN_TREES_FOR_VERDICT = 5;
/** The interval's coverage. */
export const INTERVAL = 0.8;
const Z_INTERVAL = 1.2815515655446004; // the standard normal's 90th percentile
/** Bounds of the local update's prior weight, in trees. */
export const PRIOR_TREES = { min: 5, max: 60 } as const;

export type ClassKey = RipeningClass | 'unknown';

/** What the model reads of a variety. */
export type ModelVariety = {
  id: number;
  figType: FigType;
  ripeningClass: RipeningClass | null;
  typicalDaysToRipen: number | null;
};

/**
 * One tree (in one form, at one grid cell) with its tree-seasons, as the fit reads them: only
 * crops that can set fruit at the tree's place count (see the module comment).
 */
export type TreeRecord = {
  treeId: number;
  userId: number;
  varietyId: number;
  form: GrowingForm;
  /** The report's public grid cell: never the exact place. */
  lat: number;
  lon: number;
  /** Typical (50 %) frost-free days at the cell; null when unknown. */
  localDays: number | null;
  /** Tree-seasons with a crop that can set here, and of those the seasons with an edible (ripe) crop. */
  seasons: number;
  edible: number;
  /** All reports and ripened reports (any crop): the old adjusted share's inputs, for comparison. */
  reports: number;
  ripened: number;
};

export function neededDays(v: ModelVariety): number {
  return v.typicalDaysToRipen ?? (v.ripeningClass ? RIPENING_CLASS_NEED_DAYS[v.ripeningClass] : DEFAULT_NEED_DAYS);
}

/** The season margin in months; null when the local season is unknown. */
export function seasonMargin(localDays: number | null, form: GrowingForm, v: ModelVariety, headStartDays?: number): number | null {
  if (localDays === null) return null;
  const days = localDays + (headStartDays ?? FORM_HEAD_START_DAYS[form]) - neededDays(v);
  return Math.max(-MARGIN_CAP_DAYS, Math.min(MARGIN_CAP_DAYS, days)) / MARGIN_SCALE_DAYS;
}

export type VarietyCoefficients = {
  coef: [number, number];
  cov: LogisticFit['cov'];
  /** Whole trees and tree-seasons behind the fit. */
  trees: number;
  seasons: number;
  /** Mean margin of its tree-seasons (where the local season is unknown the chance is read there). */
  meanMargin: number;
};

/**
 * The fitted curves. Fitted on tree-seasons pooled over trees, a curve is already the population-
 * averaged one: the chance for a tree not seen yet, its grower's luck and care included (a tree's own
 * departure from the curve widens nothing further; attenuating the logit for it as well, as an earlier
 * version did, read too little into every margin: the demo's calibration was off by up to 0.076).
 */
export type ChanceModel = {
  /**
   * How far a place's trees depart together from their variety's curve, as a share of the binomial
   * variance (see placeSpread): what the curve cannot know about a place (its microclimate, a climate
   * record that misjudges it). It sets how much nearby trees may move the curve's figure.
   */
  placeSpread: number;
  classes: Partial<Record<ClassKey, { coef: [number, number]; cov: LogisticFit['cov'] }>>;
  varieties: Map<number, VarietyCoefficients>;
};

const classOf = (v: ModelVariety): ClassKey => v.ripeningClass ?? 'unknown';

/** Grouped binomial points: tree-seasons with the same margin (to the day) are one point. */
class Bins {
  private map = new Map<number, BinomialPoint>();
  add(x: number, successes: number, trials: number, sign = 1) {
    const key = Math.round(x * MARGIN_SCALE_DAYS);
    let bin = this.map.get(key);
    if (!bin) this.map.set(key, (bin = { x: key / MARGIN_SCALE_DAYS, successes: 0, trials: 0 }));
    bin.successes += sign * successes;
    bin.trials += sign * trials;
  }
  points(): BinomialPoint[] {
    return [...this.map.values()].filter((p) => p.trials > 0);
  }
  clone(): Bins {
    const copy = new Bins();
    for (const [k, p] of this.map) copy.map.set(k, { ...p });
    return copy;
  }
}

/** Class fit, then each variety's fit with the class as its prior. */
function fitFromBins(classBins: Map<ClassKey, Bins>, varietyBins: Map<number, Bins>, varieties: Map<number, ModelVariety>, only?: Set<number>) {
  const classes: ChanceModel['classes'] = {};
  for (const [key, bins] of classBins) {
    const fit = fitLogistic(bins.points(), CLASS_PRIOR);
    classes[key] = { coef: fit.coef, cov: fit.cov };
  }
  const fits = new Map<number, { coef: [number, number]; cov: LogisticFit['cov'] }>();
  for (const [id, bins] of varietyBins) {
    if (only && !only.has(id)) continue;
    const v = varieties.get(id);
    if (!v) continue;
    const cls = classes[classOf(v)] ?? { coef: CLASS_PRIOR.mean, cov: [[CLASS_PRIOR.sd[0] ** 2, 0], [0, CLASS_PRIOR.sd[1] ** 2]] };
    const fit = fitLogistic(bins.points(), { mean: cls.coef, sd: VARIETY_PRIOR_SD }, cls.coef);
    // The class's own uncertainty adds to the variety's (they are independent pieces of the prior).
    fits.set(id, {
      coef: fit.coef,
      cov: [
        [fit.cov[0][0] + shrinkVar(fit.cov[0][0], cls.cov[0][0], VARIETY_PRIOR_SD[0]), fit.cov[0][1]],
        [fit.cov[1][0], fit.cov[1][1] + shrinkVar(fit.cov[1][1], cls.cov[1][1], VARIETY_PRIOR_SD[1])],
      ],
    });
  }
  return { classes, fits };
}

/** The part of the class's variance that reaches a variety: as much as its prior still weighs. */
function shrinkVar(varietyVar: number, classVar: number, priorSd: number): number {
  const priorWeight = Math.min(1, varietyVar / priorSd ** 2);
  return priorWeight * priorWeight * classVar;
}

/** Fits the model on the tree records (see the module comment). Pure; a few ms for the demo. */
export function fitChanceModel(records: readonly TreeRecord[], varieties: Map<number, ModelVariety>): ChanceModel {
  const classBins = new Map<ClassKey, Bins>();
  const varietyBins = new Map<number, Bins>();
  const tally = new Map<number, { trees: Set<number>; seasons: number; sumX: number; nX: number }>();
  for (const r of records) {
    const v = varieties.get(r.varietyId);
    if (!v || r.seasons === 0) continue;
    let t = tally.get(v.id);
    if (!t) tally.set(v.id, (t = { trees: new Set(), seasons: 0, sumX: 0, nX: 0 }));
    t.trees.add(r.treeId);
    t.seasons += r.seasons;
    const x = seasonMargin(r.localDays, r.form, v);
    if (x === null) continue;
    t.sumX += x * r.seasons;
    t.nX += r.seasons;
    binsFor(classBins, classOf(v)).add(x, r.edible, r.seasons);
    binsFor(varietyBins, v.id).add(x, r.edible, r.seasons);
  }
  for (const id of tally.keys()) if (!varietyBins.has(id)) varietyBins.set(id, new Bins());
  const { classes, fits } = fitFromBins(classBins, varietyBins, varieties);
  const out = new Map<number, VarietyCoefficients>();
  for (const [id, fit] of fits) {
    const t = tally.get(id)!;
    out.set(id, { ...fit, trees: t.trees.size, seasons: t.seasons, meanMargin: t.nX > 0 ? t.sumX / t.nX : 0 });
  }
  return { classes, varieties: out, placeSpread: placeSpread(records, varieties, out) };
}

/**
 * The intra-class correlation ρ of a variety's trees in one public grid cell around the fitted curve:
 * the one-way random-effects moment estimate (between-cell variance of the cells' mean edible-crop
 * fraction beyond what the trees' own scatter explains, over the binomial variance e(1 − e)):
 *   ρ = Σ n·[(ȳ − ē)² − s²/n] / Σ n·e(1 − e)   over cells with two or more trees of the variety,
 * with ȳ the trees' mean fraction, ē the curve's mean expectation for them and s² their sample
 * variance; clamped to [0, 1]. A Beta prior of variance ρ·e(1 − e) is worth 1/ρ − 1 trees.
 */
export function placeSpread(records: readonly TreeRecord[], varieties: Map<number, ModelVariety>, fits: Map<number, { coef: [number, number]; meanMargin: number }>): number {
  const cells = new Map<string, { n: number; sumY: number; sumY2: number; sumE: number; sumQ: number }>();
  for (const r of records) {
    const v = varieties.get(r.varietyId);
    const fit = v && fits.get(v.id);
    if (!v || !fit || r.seasons === 0) continue;
    const e = sigmoid(fit.coef[0] + fit.coef[1] * (seasonMargin(r.localDays, r.form, v) ?? fit.meanMargin));
    const y = r.edible / r.seasons;
    const key = `${r.varietyId}|${r.lat}|${r.lon}`;
    let cell = cells.get(key);
    if (!cell) cells.set(key, (cell = { n: 0, sumY: 0, sumY2: 0, sumE: 0, sumQ: 0 }));
    cell.n++;
    cell.sumY += y;
    cell.sumY2 += y * y;
    cell.sumE += e;
    cell.sumQ += e * (1 - e);
  }
  let num = 0;
  let den = 0;
  for (const c of cells.values()) {
    if (c.n < 2) continue;
    const mean = c.sumY / c.n;
    const s2 = Math.max(0, (c.sumY2 - c.n * mean * mean) / (c.n - 1));
    const gap = mean - c.sumE / c.n;
    num += c.n * (gap * gap - s2 / c.n);
    den += c.sumQ;
  }
  return den > 0 ? Math.min(1, Math.max(0, num / den)) : 0;
}

function binsFor<K>(map: Map<K, Bins>, key: K): Bins {
  let bins = map.get(key);
  if (!bins) map.set(key, (bins = new Bins()));
  return bins;
}

/** Kernel-weighted local evidence: Σw·observed, Σw·expected, Σw (in trees). */
export type LocalEvidence = { observed: number; expected: number; weight: number; trees: number };

/**
 * The local trees' evidence for one variety at a point (a tree's records side by side): each tree once, weighted exp(−d²/2h²) by
 * the distance from the point to its grid cell, its edible-crop fraction against the model's
 * expectation for its own form and cell.
 */
export function localEvidence(
  coef: [number, number],
  variety: ModelVariety,
  trees: readonly TreeRecord[],
  point: LatLon,
  bandwidthKm: number,
  fallbackMargin: number,
): LocalEvidence {
  let observed = 0;
  let expected = 0;
  let weight = 0;
  let count = 0;
  // A tree's records come side by side (recordsOf gives them so), so distinct trees are counted
  // without a set: thousands of trees per request at 200 km.
  let lastTree = NaN;
  const place = { lat: 0, lon: 0 };
  for (const t of trees) {
    if (t.seasons === 0) continue;
    place.lat = t.lat;
    place.lon = t.lon;
    const d = distanceKm(point, place);
    const w = Math.exp(-(d * d) / (2 * bandwidthKm * bandwidthKm));
    const x = seasonMargin(t.localDays, t.form, variety) ?? fallbackMargin;
    observed += (w * t.edible) / t.seasons;
    expected += w * sigmoid(coef[0] + coef[1] * x);
    weight += w;
    if (t.treeId !== lastTree) {
      lastTree = t.treeId;
      count++;
    }
  }
  return { observed, expected, weight, trees: count };
}

/** A fitted curve's logit at margin x and its variance from the coefficients' covariance (delta method). */
function logitAt(fit: { coef: [number, number]; cov: LogisticFit['cov'] }, x: number): { eta: number; etaVariance: number } {
  return { eta: fit.coef[0] + fit.coef[1] * x, etaVariance: fit.cov[0][0] + 2 * x * fit.cov[0][1] + x * x * fit.cov[1][1] };
}

/**
 * The Beta-binomial update: the model's p₀ as a Beta prior worth m trees (m from the variance of
 * p₀, bounded by PRIOR_TREES), moved by the local trees' observed-minus-expected; the 80 % interval
 * of the resulting Beta(p·K, (1 − p)·K), K = m + Σw, by its normal approximation on the logit scale.
 */
export function updateWithLocal(p0: number, etaVariance: number, local: Pick<LocalEvidence, 'observed' | 'expected' | 'weight'>, spread = 0): { probability: number; low: number; high: number } {
  const q = p0 * (1 - p0);
  const m = Math.min(PRIOR_TREES.max, Math.max(PRIOR_TREES.min, 1 / (spread + q * etaVariance) - 1));
  const p = Math.min(0.995, Math.max(0.005, p0 + (local.observed - local.expected) / (m + local.weight)));
  const k = m + local.weight;
  const half = Z_INTERVAL * Math.sqrt(1 / (p * (1 - p) * (k + 1)));
  const eta = Math.log(p / (1 - p));
  return { probability: p, low: sigmoid(eta - half), high: sigmoid(eta + half) };
}

export type ChanceContext = {
  point: LatLon;
  /** Typical frost-free days at the point; null when unknown. */
  localDays: number | null;
  form: GrowingForm;
  headStartDays?: number;
  waspEstablished: boolean;
  bandwidthKm: number;
};

/** Why the chance is what it is, for the ranking's one-line reason. */
export type ChanceBasis = {
  rule: 'no-crop' | 'breba-only' | null;
  modelProbability: number;
  localTrees: number;
};

/**
 * The chance for one variety at a point from a fitted model and the variety's tree records near it;
 * null when the model has no fit for the variety (it had no reports when fitted).
 */
export function chanceAt(model: ChanceModel, variety: ModelVariety, nearby: readonly TreeRecord[], ctx: ChanceContext): (Chance & { basis: ChanceBasis }) | null {
  const checks = pollinationChecks(variety.figType, ctx.waspEstablished);
  const mainSets = checks.main.fruitExpected !== 'no';
  const brebaSets = checks.breba.fruitExpected !== 'no';
  const fit = model.varieties.get(variety.id);
  if (!mainSets && !brebaSets) {
    // A rule, not evidence: no crop of this type sets fruit here (its reports elsewhere do not matter).
    const localTrees = new Set(nearby.map((t) => t.treeId)).size;
    const trees = Math.max(fit?.trees ?? 0, localTrees);
    return { probability: 0, low: 0, high: 0, enoughEvidence: true, trees, basis: { rule: 'no-crop', modelProbability: 0, localTrees } };
  }
  if (!fit) return null;
  const local = localEvidence(fit.coef, variety, nearby, ctx.point, ctx.bandwidthKm, fit.meanMargin);
  const trees = Math.max(fit.trees, local.trees);
  const x = seasonMargin(ctx.localDays, ctx.form, variety, ctx.headStartDays) ?? fit.meanMargin;
  const { eta, etaVariance } = logitAt(fit, x);
  const p0 = sigmoid(eta);
  const { probability, low, high } = updateWithLocal(p0, etaVariance, local, model.placeSpread);
  return {
    probability,
    low,
    high,
    enoughEvidence: fit.trees >= MIN_TREES_FOR_VERDICT,
    trees,
    basis: { rule: mainSets ? null : 'breba-only', modelProbability: p0, localTrees: local.trees },
  };
}

/** Plain words for the API's `method` field. */
export function chanceMethod(bandwidthKm: number): string {
  return (
    'Chance of an edible crop in a typical season here, grown this way: a logistic model of each variety on the season ' +
    'margin (the typical frost-free days plus the head start of the growing form, minus the days the variety needs), ' +
    'learned from all its tree-seasons and pulled toward its ripening class when they are few; then adjusted by the ' +
    `variety's trees nearby (distance kernel, h = ${Math.round(bandwidthKm)} km) against what the model expected for ` +
    'them. Only crops that can set fruit without the fig wasp (where it is absent) count, each once. The range is ' +
    `an ${Math.round(INTERVAL * 100)} % interval. A variety with fewer than ${MIN_TREES_FOR_VERDICT} trees has too little evidence for a verdict and is ` +
    'ranked after the others.'
  );
}

// ---- Leave-one-grower-out cross-validation -------------------------------------------------------

/** One grower's tree-seasons predicted by a model fitted without that grower, three ways. */
export type HeldOutPrediction = { chance: number; overallRate: number; adjustedShare: number; edible: number; seasons: number };

/** Search radius and kernel of the cross-validation's local evidence: the near answer's defaults. */
export const VALIDATION_RADIUS_KM = 100;

/**
 * For every grower: refit the classes and the varieties the grower reported without their trees,
 * then predict each of the grower's trees at its own cell and form ((a) the chance, with the local
 * trees of other growers within VALIDATION_RADIUS_KM; (b) the variety's overall rate of edible-crop
 * seasons without the grower; (c) the old adjusted share, as the near answer computed it, without
 * the grower). Only the grower's varieties and their classes are refitted: the other varieties
 * do not enter these predictions. Returns one entry per held-out tree (its seasons and edible ones).
 */
export function leaveOneGrowerOut(records: readonly TreeRecord[], varieties: Map<number, ModelVariety>, bandwidthKm = VALIDATION_RADIUS_KM / 2): HeldOutPrediction[] {
  const usable = records.filter((r) => r.seasons > 0 && varieties.has(r.varietyId));
  const classBins = new Map<ClassKey, Bins>();
  const varietyBins = new Map<number, Bins>();
  const byVariety = new Map<number, TreeRecord[]>();
  const byGrower = new Map<number, TreeRecord[]>();
  const rate = new Map<number, { s: number; n: number; sumF: number; trees: number; sumX: number; nX: number }>();
  const classRate = new Map<ClassKey, { s: number; n: number }>();
  let allS = 0;
  let allN = 0;
  for (const r of usable) {
    const v = varieties.get(r.varietyId)!;
    const x = seasonMargin(r.localDays, r.form, v);
    if (x !== null) {
      binsFor(classBins, classOf(v)).add(x, r.edible, r.seasons);
      binsFor(varietyBins, v.id).add(x, r.edible, r.seasons);
    }
    listFor(byVariety, v.id).push(r);
    listFor(byGrower, r.userId).push(r);
    tallyVarietyRate(rate, v.id, r, x);
    const c = classRate.get(classOf(v)) ?? { s: 0, n: 0 };
    c.s += r.edible;
    c.n += r.seasons;
    classRate.set(classOf(v), c);
    allS += r.edible;
    allN += r.seasons;
  }
  // Each variety's records sorted by latitude, for a window search by radius.
  for (const list of byVariety.values()) list.sort((a, b) => a.lat - b.lat);
  const latWindow = VALIDATION_RADIUS_KM / 110.5;
  // How far places depart from the curve: one scalar of the whole atlas, estimated once on all of it
  // (like the prior spreads, a setting of the model rather than a fact about any one grower).
  const spread = fitChanceModel(usable, varieties).placeSpread;

  const out: HeldOutPrediction[] = [];
  for (const [grower, own] of byGrower) {
    const touchedClasses = new Map<ClassKey, Bins>();
    const touchedVarieties = new Map<number, Bins>();
    const ownRate = new Map<number, { s: number; n: number; sumF: number; trees: number; sumX: number; nX: number }>();
    let ownS = 0;
    let ownN = 0;
    const ownClass = new Map<ClassKey, { s: number; n: number }>();
    for (const r of own) {
      const v = varieties.get(r.varietyId)!;
      const key = classOf(v);
      if (!touchedClasses.has(key)) touchedClasses.set(key, (classBins.get(key) ?? new Bins()).clone());
      if (!touchedVarieties.has(v.id)) touchedVarieties.set(v.id, (varietyBins.get(v.id) ?? new Bins()).clone());
      const x = seasonMargin(r.localDays, r.form, v);
      if (x !== null) {
        touchedClasses.get(key)!.add(x, r.edible, r.seasons, -1);
        touchedVarieties.get(v.id)!.add(x, r.edible, r.seasons, -1);
      }
      tallyVarietyRate(ownRate, v.id, r, x);
      const c = ownClass.get(key) ?? { s: 0, n: 0 };
      c.s += r.edible;
      c.n += r.seasons;
      ownClass.set(key, c);
      ownS += r.edible;
      ownN += r.seasons;
    }
    // Classes not touched keep their bins (they do not enter the fit of the touched varieties).
    const { fits } = fitFromBins(touchedClasses, touchedVarieties, varieties);
    const globalRate = allN - ownN > 0 ? (allS - ownS) / (allN - ownN) : 0.5;
    for (const r of own) {
      const v = varieties.get(r.varietyId)!;
      const all = rate.get(v.id)!;
      const mine = ownRate.get(v.id)!;
      const restN = all.n - mine.n;
      const cAll = classRate.get(classOf(v))!;
      const cMine = ownClass.get(classOf(v))!;
      const overallRate = restN > 0 ? (all.s - mine.s) / restN : cAll.n - cMine.n > 0 ? (cAll.s - cMine.s) / (cAll.n - cMine.n) : globalRate;
      const restTrees = all.trees - mine.trees;
      const overallShare = restTrees > 0 ? (all.sumF - mine.sumF) / restTrees : null;
      const neighbours = othersNear(byVariety.get(v.id)!, r, grower, latWindow);
      const point = { lat: r.lat, lon: r.lon };
      // (c) the old adjusted share: kernel-weighted tree fractions shrunk toward the overall share (3 trees).
      let ws = 0;
      let w = 0;
      for (const t of neighbours) {
        const d = distanceKm(point, t);
        const k = Math.exp(-(d * d) / (2 * bandwidthKm * bandwidthKm));
        ws += k * (t.reports > 0 ? t.ripened / t.reports : 0);
        w += k;
      }
      const adjusted = overallShare === null ? (w > 0 ? ws / w : globalRate) : (ws + 3 * overallShare) / (w + 3);
      // (a) the chance.
      const fit = fits.get(v.id)!;
      const meanMargin = all.nX - mine.nX > 0 ? (all.sumX - mine.sumX) / (all.nX - mine.nX) : 0;
      const x = seasonMargin(r.localDays, r.form, v) ?? meanMargin;
      const { eta, etaVariance } = logitAt(fit, x);
      const local = localEvidence(fit.coef, v, neighbours, point, bandwidthKm, meanMargin);
      const { probability } = updateWithLocal(sigmoid(eta), etaVariance, local, spread);
      out.push({ chance: probability, overallRate, adjustedShare: adjusted, edible: r.edible, seasons: r.seasons });
    }
  }
  return out;
}

function listFor<K, V>(map: Map<K, V[]>, key: K): V[] {
  let list = map.get(key);
  if (!list) map.set(key, (list = []));
  return list;
}

/** Other growers' records in a latitude-sorted list within VALIDATION_RADIUS_KM of r's cell. */
function othersNear(sorted: TreeRecord[], r: TreeRecord, grower: number, latWindow: number): TreeRecord[] {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid].lat < r.lat - latWindow) lo = mid + 1;
    else hi = mid;
  }
  const found: TreeRecord[] = [];
  for (let i = lo; i < sorted.length && sorted[i].lat <= r.lat + latWindow; i++) {
    const t = sorted[i];
    if (t.userId !== grower && distanceKm(r, t) <= VALIDATION_RADIUS_KM) found.push(t);
  }
  return found;
}

/** The three forecasts' scores over every held-out tree-season (see the accuracy page). */
export function accuracyOf(predictions: readonly HeldOutPrediction[]) {
  const y: number[] = [];
  const chance: number[] = [];
  const rate: number[] = [];
  const share: number[] = [];
  for (const p of predictions) {
    for (let i = 0; i < p.seasons; i++) {
      y.push(i < p.edible ? 1 : 0);
      chance.push(p.chance);
      rate.push(p.overallRate);
      share.push(p.adjustedShare);
    }
  }
  if (y.length === 0) return null;
  const scores = (p: number[]) => ({ brier: brierScore(p, y), logLoss: logLoss(p, y) });
  const result = { chance: scores(chance), overallRate: scores(rate), adjustedShare: scores(share) };
  return {
    treeSeasons: y.length,
    trees: predictions.length,
    scores: result,
    brierSkillScore: brierSkillScore(result.chance.brier, result.overallRate.brier),
    bins: reliabilityBins(chance, y),
  };
}

/** Adds one tree record to its variety's running rate (edible seasons, mean share, mean margin). */
function tallyVarietyRate(
  rates: Map<number, { s: number; n: number; sumF: number; trees: number; sumX: number; nX: number }>,
  varietyId: number,
  r: { edible: number; seasons: number; reports: number; ripened: number },
  x: number | null,
): void {
  const t = rates.get(varietyId) ?? { s: 0, n: 0, sumF: 0, trees: 0, sumX: 0, nX: 0 };
  t.s += r.edible;
  t.n += r.seasons;
  t.sumF += r.reports > 0 ? r.ripened / r.reports : 0;
  t.trees++;
  if (x !== null) {
    t.sumX += x * r.seasons;
    t.nX += r.seasons;
  }
  rates.set(varietyId, t);
}
