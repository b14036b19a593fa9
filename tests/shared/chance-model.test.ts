import { describe, expect, it } from 'vitest';
import {
  accuracyOf,
  chanceAt,
  fitChanceModel,
  leaveOneGrowerOut,
  MIN_TREES_FOR_VERDICT,
  placeSpread,
  seasonMargin,
  updateWithLocal,
  type ModelVariety,
  type TreeRecord,
} from '../../shared/domain/chance-model';
import { brierScore, brierSkillScore, logLoss, reliabilityBins } from '../../shared/domain/forecast-scores';
import { fitLogistic, sigmoid } from '../../shared/domain/logistic';

describe('fitLogistic', () => {
  it('gives the coefficients and standard errors of the hours-studied example', () => {
    // Source: Wikipedia, "Logistic regression", example "Probability of passing an exam versus hours
    // of study" (20 students; data as also reproduced in the RPubs note 167443 with R's glm):
    // intercept −4.0777 (SE 1.7610), hours 1.5046 (SE 0.6287). The four-decimal figures are R's glm
    // output as that article tabulates it (recalled from memory, consistent with its rounded −4.1 / 1.5).
    const hours = [0.5, 0.75, 1, 1.25, 1.5, 1.75, 1.75, 2, 2.25, 2.5, 2.75, 3, 3.25, 3.5, 4, 4.25, 4.5, 4.75, 5, 5.5];
    const pass = [0, 0, 0, 0, 0, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 1, 1, 1, 1, 1];
    const fit = fitLogistic(hours.map((x, i) => ({ x, successes: pass[i], trials: 1 })));
    expect(fit.converged).toBe(true);
    expect(fit.coef[0]).toBeCloseTo(-4.0777, 3);
    expect(fit.coef[1]).toBeCloseTo(1.5046, 3);
    expect(Math.sqrt(fit.cov[0][0])).toBeCloseTo(1.761, 2);
    expect(Math.sqrt(fit.cov[1][1])).toBeCloseTo(0.6287, 3);
    // Grouped data (two students at 1.75 h as one point of 2 trials) give the same fit.
    const grouped = fitLogistic([...hours.map((x, i) => ({ x, successes: pass[i], trials: 1 })).filter((_, i) => i !== 5 && i !== 6), { x: 1.75, successes: 1, trials: 2 }]);
    expect(grouped.coef[0]).toBeCloseTo(fit.coef[0], 8);
  });

  it('is pulled toward the prior mean, and stays finite on separable data', () => {
    // All successes: without a prior the intercept runs off; with N(0, 1) it stays near the prior.
    const points = [{ x: 0, successes: 3, trials: 3 }];
    const fit = fitLogistic(points, { mean: [0, 0], sd: [1, 1] });
    expect(fit.coef[0]).toBeGreaterThan(0);
    expect(fit.coef[0]).toBeLessThan(2);
    // The penalised optimum: gradient 3·(1 − p) − a = 0 (a by hand: a = 3(1 − σ(a))).
    expect(3 * (1 - sigmoid(fit.coef[0])) - fit.coef[0]).toBeCloseTo(0, 8);
  });
});

describe('trees that differ', () => {
  // 100 trees of one variety at the same margin, 3 seasons each: 80 always ripen, 20 never (a strong
  // tree effect: a shaded yard, a juvenile plant). Each tree's own outcomes are certain, yet for a
  // tree not seen yet the chance of a ripe crop is 0.8: a logistic fit to tree-seasons pooled over
  // trees estimates that population-averaged curve directly (the marginal, not the tree-specific,
  // curve: Zeger, Liang & Albert 1988, Biometrics 44:1049, recalled from memory). Attenuating its
  // logit again for the tree spread, as an earlier version did, gave 0.68 here.
  const v: ModelVariety = { id: 1, figType: 'common', ripeningClass: 'mid', typicalDaysToRipen: null };
  const records: TreeRecord[] = Array.from({ length: 100 }, (_, i) => ({
    treeId: i + 1, userId: i + 1, varietyId: 1, form: 'ground', lat: 40, lon: -100, localDays: 130, seasons: 3, edible: i < 80 ? 3 : 0, reports: 3, ripened: i < 80 ? 3 : 0,
  }));
  it('gives a tree not seen yet the share of all trees’ seasons that ripened', () => {
    const model = fitChanceModel(records, new Map([[1, v]]));
    const far = { point: { lat: 0, lon: 0 }, localDays: 130, form: 'ground' as const, waspEstablished: false, bandwidthKm: 50 };
    expect(chanceAt(model, v, [], far)!.probability).toBeCloseTo(0.8, 2);
  });
});

describe('places that depart from the curve', () => {
  const v = new Map([[1, { id: 1, figType: 'common' as const, ripeningClass: null, typicalDaysToRipen: null }]]);
  const flat = new Map([[1, { coef: [0, 0] as [number, number], meanMargin: 0 }]]); // e = 0.5 everywhere
  const tree = (treeId: number, lat: number, fraction: number): TreeRecord => ({ treeId, userId: treeId, varietyId: 1, form: 'ground', lat, lon: 0, localDays: null, seasons: 2, edible: 2 * fraction, reports: 2, ripened: 2 * fraction });

  it('is the one-way random-effects moment estimate, worked by hand', () => {
    // Cell A: fractions 1, 1, 0.5 (mean 5/6, s² = 1/12, gap to e = 1/3): 3·(1/9 − 1/36) = 0.25.
    // Cell B mirrors it: 0.25. Σ e(1 − e) over the six trees: 1.5. ρ = 0.5 / 1.5 = 1/3.
    const cells = [tree(1, 10, 1), tree(2, 10, 1), tree(3, 10, 0.5), tree(4, 20, 0), tree(5, 20, 0), tree(6, 20, 0.5)];
    expect(placeSpread(cells, v, flat)).toBeCloseTo(1 / 3, 12);
    // Cells whose trees scatter as much as their means do: no place effect.
    expect(placeSpread([tree(1, 10, 1), tree(2, 10, 0.5), tree(3, 20, 0), tree(4, 20, 0.5)], v, flat)).toBe(0);
  });

  it('lets nearby trees move the figure further where places depart from the curve', () => {
    // Three trees nearby, all ripened where the model expected half: the prior is worth
    // 1/(ρ + q·Var η) − 1 trees (a Beta of that variance), 60 at most, 5 at least.
    const local = { observed: 3, expected: 1.5, weight: 3 };
    expect(updateWithLocal(0.5, 0.01, local).probability).toBeCloseTo(0.5 + 1.5 / 63, 12);
    // ρ = 0.1: 1/(0.1 + 0.0025) − 1 = 8.756 trees.
    expect(updateWithLocal(0.5, 0.01, local, 0.1).probability).toBeCloseTo(0.5 + 1.5 / (1 / 0.1025 - 1 + 3), 12);
  });
});

describe('forecast scores', () => {
  it('match scikit-learn’s documented examples', () => {
    // scikit-learn, sklearn.metrics.brier_score_loss docstring example:
    // y_true = [0, 1, 1, 0], y_prob = [0.1, 0.9, 0.8, 0.3] → 0.0375 (the Brier 1950 score, two-outcome form).
    expect(brierScore([0.1, 0.9, 0.8, 0.3], [0, 1, 1, 0])).toBeCloseTo(0.0375, 12);
    // scikit-learn, sklearn.metrics.log_loss docstring example:
    // log_loss(["spam", "ham", "ham", "spam"], [[.1, .9], [.9, .1], [.8, .2], [.35, .65]]) → 0.21616...
    // (columns ham, spam; "spam" is the positive outcome here).
    expect(logLoss([0.9, 0.1, 0.2, 0.65], [1, 0, 0, 1])).toBeCloseTo(0.21616, 5);
    // A certain miss is clipped at 1e-15 as scikit-learn does: −ln(1e-15) = 34.539.
    expect(logLoss([0], [1])).toBeCloseTo(34.5388, 3);
    expect(brierSkillScore(0.15, 0.2)).toBeCloseTo(0.25, 12);
    expect(brierSkillScore(0.1, 0)).toBeNull();
  });

  it('bins forecasts in ten equal-width bins, 1 in the last, with counts', () => {
    // As scikit-learn's calibration_curve(strategy='uniform', n_bins=10) bins them.
    const bins = reliabilityBins([0.05, 0.15, 0.15, 0.95, 1, 0.1], [0, 1, 0, 1, 1, 0]);
    expect(bins).toHaveLength(10);
    expect(bins[0]).toMatchObject({ from: 0, to: 0.1, count: 1, meanPredicted: 0.05, observed: 0 });
    expect(bins[1]).toMatchObject({ count: 3, observed: 1 / 3 });
    expect(bins[1].meanPredicted).toBeCloseTo(0.4 / 3, 12);
    expect(bins[9]).toMatchObject({ count: 2, meanPredicted: 0.975, observed: 1 });
    expect(bins[5]).toMatchObject({ count: 0, meanPredicted: null, observed: null });
  });
});

const common = (id: number, ripeningClass: ModelVariety['ripeningClass'] = 'mid'): ModelVariety => ({ id, figType: 'common', ripeningClass, typicalDaysToRipen: null });

/** Trees of a variety at a place: `edibleOf(i)` edible seasons of `seasons`. */
function trees(start: number, variety: number, user: (i: number) => number, n: number, place: { lat: number; lon: number; days: number }, seasons: number, edibleOf: (i: number) => number): TreeRecord[] {
  return Array.from({ length: n }, (_, i) => ({
    treeId: start + i,
    userId: user(i),
    varietyId: variety,
    form: 'ground',
    lat: place.lat,
    lon: place.lon,
    localDays: place.days,
    seasons,
    edible: edibleOf(i),
    reports: seasons,
    ripened: edibleOf(i),
  }));
}

const WARM = { lat: 36, lon: -119, days: 240 };
const COOL = { lat: 45, lon: -122, days: 120 };

describe('the chance model', () => {
  // Variety 1 (mid, 130 days): ripens in a long season, fails in a short one. Variety 2: one lucky tree.
  const varieties = new Map([common(1), common(2), common(3)].map((v) => [v.id, v]));
  const records = [
    ...trees(1, 1, (i) => 100 + i, 20, WARM, 3, (i) => (i % 10 === 0 ? 2 : 3)),
    ...trees(100, 1, (i) => 200 + i, 20, COOL, 3, (i) => (i % 4 === 0 ? 1 : 0)),
    ...trees(200, 3, (i) => 300 + i, 20, WARM, 3, (i) => (i % 2 === 0 ? 2 : 1)),
    ...trees(300, 2, () => 400, 1, COOL, 3, () => 3),
  ];
  const model = fitChanceModel(records, varieties);
  const ctx = (place: typeof WARM) => ({ point: place, localDays: place.days, form: 'ground' as const, waspEstablished: false, bandwidthKm: 50 });

  it('learns the season margin: a long season gives a high chance, a short one a low chance', () => {
    const warm = chanceAt(model, varieties.get(1)!, [], ctx(WARM))!;
    const cool = chanceAt(model, varieties.get(1)!, [], ctx(COOL))!;
    expect(warm.probability).toBeGreaterThan(0.85);
    expect(cool.probability).toBeLessThan(0.25);
    expect(warm.low).toBeLessThan(warm.probability);
    expect(warm.high).toBeGreaterThan(warm.probability);
    expect(warm).toMatchObject({ enoughEvidence: true, trees: 40 });
  });

  it('pools a one-tree variety toward its class: no verdict, and far from its lucky 100 %', () => {
    const lucky = chanceAt(model, varieties.get(2)!, records.filter((r) => r.varietyId === 2), ctx(COOL))!;
    expect(lucky.enoughEvidence).toBe(false);
    expect(lucky.trees).toBe(1);
    expect(1 < MIN_TREES_FOR_VERDICT).toBe(true);
    expect(lucky.probability).toBeLessThan(0.75);
  });

  it('lets nearby trees move the chance by what they did beyond the model’s expectation', () => {
    const v = varieties.get(3)!;
    const none = chanceAt(model, v, [], ctx(WARM))!;
    const good = chanceAt(model, v, trees(900, 3, () => 999, 4, WARM, 3, () => 3), ctx(WARM))!;
    const far = chanceAt(model, v, trees(900, 3, () => 999, 4, { ...WARM, lat: WARM.lat + 3 }, 3, () => 3), ctx(WARM))!;
    expect(good.probability).toBeGreaterThan(none.probability + 0.05);
    // 330 km away at h = 50 km: the kernel weight is ~e^−22, nothing moves.
    expect(far.probability).toBeCloseTo(none.probability, 6);
  });

  it('applies pollination as a rule: no crop without the wasp is no chance; a San Pedro counts its breba only', () => {
    const smyrna: ModelVariety = { id: 1, figType: 'smyrna', ripeningClass: 'mid', typicalDaysToRipen: null };
    expect(chanceAt(model, smyrna, [], ctx(WARM))).toMatchObject({ probability: 0, low: 0, high: 0, basis: { rule: 'no-crop' } });
    expect(chanceAt(model, smyrna, [], { ...ctx(WARM), waspEstablished: true })!.probability).toBeGreaterThan(0.5);
    const sanPedro: ModelVariety = { ...smyrna, figType: 'san-pedro' };
    expect(chanceAt(model, sanPedro, [], ctx(WARM))!.basis.rule).toBe('breba-only');
  });

  it('computes the margin from the form’s head start and the variety’s need', () => {
    // 150 days + 21 (container) − 130 (mid class) = 41 days = 1.3667 months.
    expect(seasonMargin(150, 'container', common(1))).toBeCloseTo(41 / 30, 12);
    expect(seasonMargin(null, 'ground', common(1))).toBeNull();
    expect(seasonMargin(150, 'ground', { ...common(1), typicalDaysToRipen: 100 })).toBeCloseTo(50 / 30, 12);
  });

  it('beats the variety’s overall rate in leave-one-grower-out cross-validation where the season decides', () => {
    const predictions = leaveOneGrowerOut(records, varieties);
    // Every held-out tree once, with all its seasons.
    expect(predictions).toHaveLength(records.length);
    const summary = accuracyOf(predictions)!;
    expect(summary.treeSeasons).toBe(records.reduce((s, r) => s + r.seasons, 0));
    expect(summary.brierSkillScore!).toBeGreaterThan(0.2);
    expect(summary.bins.reduce((s, b) => s + b.count, 0)).toBe(summary.treeSeasons);
  });

  it('does not see the held-out grower: their own trees never predict themselves', () => {
    // One grower alone with variety 2: without them the variety has no trees, so (b) falls back to
    // the class rate and the chance to the class curve, whatever their lucky tree did.
    const predictions = leaveOneGrowerOut(records, varieties);
    const lucky = predictions.find((_, i) => records[i].varietyId === 2)!;
    const flipped = leaveOneGrowerOut(
      records.map((r) => (r.varietyId === 2 ? { ...r, edible: 0, ripened: 0 } : r)),
      varieties,
    ).find((_, i) => records[i].varietyId === 2)!;
    expect(flipped.chance).toBeCloseTo(lucky.chance, 12);
    expect(flipped.overallRate).toBeCloseTo(lucky.overallRate, 12);
  });
});
