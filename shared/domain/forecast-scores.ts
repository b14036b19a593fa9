/**
 * Scores of probability forecasts against what happened (0/1 outcomes), for the accuracy page:
 *
 * - Brier score (G. W. Brier, "Verification of forecasts expressed in terms of probability",
 *   Monthly Weather Review 78(1), 1950), two-outcome form: mean of (p − y)². 0 is perfect.
 * - Log loss: mean of −[y ln p + (1 − y) ln(1 − p)], p clipped to [1e-15, 1 − 1e-15] as
 *   scikit-learn's log_loss does, so a confident miss costs much but stays finite.
 * - Brier skill score against a reference forecast: 1 − BS / BS_ref (above 0: better than it).
 * - Reliability diagram: forecasts in 10 equal-width bins of p (the last bin includes 1); per bin
 *   the mean forecast, the observed frequency and the count (Wilks, "Statistical Methods in the
 *   Atmospheric Sciences", ch. on forecast verification; scikit-learn's calibration_curve with
 *   strategy 'uniform' bins the same way).
 */

export function brierScore(p: readonly number[], y: readonly number[]): number {
  if (p.length !== y.length || p.length === 0) throw new RangeError('brierScore needs as many outcomes as forecasts, at least one');
  let s = 0;
  for (let i = 0; i < p.length; i++) s += (p[i] - y[i]) ** 2;
  return s / p.length;
}

const EPS = 1e-15;

export function logLoss(p: readonly number[], y: readonly number[]): number {
  if (p.length !== y.length || p.length === 0) throw new RangeError('logLoss needs as many outcomes as forecasts, at least one');
  let s = 0;
  for (let i = 0; i < p.length; i++) {
    const q = Math.min(1 - EPS, Math.max(EPS, p[i]));
    s -= y[i] === 1 ? Math.log(q) : Math.log(1 - q);
  }
  return s / p.length;
}

export function brierSkillScore(brier: number, referenceBrier: number): number | null {
  return referenceBrier > 0 ? 1 - brier / referenceBrier : null;
}

export type ReliabilityBin = {
  /** Bin edges: [from, to) (the last bin includes 1). */
  from: number;
  to: number;
  count: number;
  /** Mean forecast in the bin; null when empty. */
  meanPredicted: number | null;
  /** Share of outcomes that happened in the bin; null when empty. */
  observed: number | null;
};

export function reliabilityBins(p: readonly number[], y: readonly number[], bins = 10): ReliabilityBin[] {
  const count = new Array<number>(bins).fill(0);
  const sumP = new Array<number>(bins).fill(0);
  const sumY = new Array<number>(bins).fill(0);
  for (let i = 0; i < p.length; i++) {
    const b = Math.min(bins - 1, Math.max(0, Math.floor(p[i] * bins)));
    count[b]++;
    sumP[b] += p[i];
    sumY[b] += y[i];
  }
  return count.map((n, b) => ({
    from: b / bins,
    to: (b + 1) / bins,
    count: n,
    meanPredicted: n > 0 ? sumP[b] / n : null,
    observed: n > 0 ? sumY[b] / n : null,
  }));
}
