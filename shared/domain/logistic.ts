/**
 * Small statistics for the chance model (chance-model.ts): a two-coefficient logistic regression
 * fitted by Newton's method (= iteratively reweighted least squares) with an optional Gaussian
 * prior on each coefficient (a penalised fit: the prior pulls a variety toward its ripening class),
 * and the quantiles of a Beta distribution for the chance's interval.
 */

export const sigmoid = (eta: number): number => (eta >= 0 ? 1 / (1 + Math.exp(-eta)) : Math.exp(eta) / (1 + Math.exp(eta)));
export const logit = (p: number): number => Math.log(p / (1 - p));

/** Grouped binomial data: `successes` of `trials` at covariate `x` (trials may be any positive weight). */
export type BinomialPoint = { x: number; successes: number; trials: number };

/** A Gaussian prior per coefficient (intercept, slope); sd Infinity = no penalty on it. */
export type CoefficientPrior = { mean: [number, number]; sd: [number, number] };

export type LogisticFit = {
  /** [intercept, slope]: logit p = a + b·x. */
  coef: [number, number];
  /** Covariance of the coefficients at the optimum (inverse of the penalised information matrix). */
  cov: [[number, number], [number, number]];
  iterations: number;
  converged: boolean;
};

const FLAT: CoefficientPrior = { mean: [0, 0], sd: [Infinity, Infinity] };

/**
 * Maximises Σ [yᵢ log pᵢ + (nᵢ − yᵢ) log(1 − pᵢ)] − Σⱼ (βⱼ − μⱼ)² / 2σⱼ² over β = (a, b), pᵢ = σ(a + b xᵢ),
 * by Newton steps (each step is the weighted least-squares solve of IRLS), halving a step that
 * lowers the objective. Without a prior this is the ordinary maximum-likelihood fit (as R's glm with
 * family = binomial gives it); with separable data and no prior the slope grows until the iteration
 * limit, so the model always passes a prior.
 */
export function fitLogistic(points: readonly BinomialPoint[], prior: CoefficientPrior = FLAT, start?: [number, number]): LogisticFit {
  const pa = prior.sd[0] === Infinity ? 0 : 1 / prior.sd[0] ** 2;
  const pb = prior.sd[1] === Infinity ? 0 : 1 / prior.sd[1] ** 2;
  const objective = (a: number, b: number) => {
    let ll = 0;
    for (const { x, successes, trials } of points) {
      const eta = a + b * x;
      // log σ(η) = −log(1 + e^−η), written to stay finite for large |η|.
      const logP = -softplus(-eta);
      const logQ = -softplus(eta);
      ll += successes * logP + (trials - successes) * logQ;
    }
    return ll - (pa * (a - prior.mean[0]) ** 2) / 2 - (pb * (b - prior.mean[1]) ** 2) / 2;
  };
  let a = start?.[0] ?? prior.mean[0];
  let b = start?.[1] ?? prior.mean[1];
  let current = objective(a, b);
  let iterations = 0;
  let converged = false;
  let h00 = pa;
  let h01 = 0;
  let h11 = pb;
  for (; iterations < 50; iterations++) {
    let g0 = -pa * (a - prior.mean[0]);
    let g1 = -pb * (b - prior.mean[1]);
    h00 = pa;
    h01 = 0;
    h11 = pb;
    for (const { x, successes, trials } of points) {
      const p = sigmoid(a + b * x);
      const r = successes - trials * p;
      const w = trials * p * (1 - p);
      g0 += r;
      g1 += r * x;
      h00 += w;
      h01 += w * x;
      h11 += w * x * x;
    }
    const det = h00 * h11 - h01 * h01;
    if (!(det > 1e-300)) break;
    let d0 = (h11 * g0 - h01 * g1) / det;
    let d1 = (h00 * g1 - h01 * g0) / det;
    let next = objective(a + d0, b + d1);
    for (let halvings = 0; next < current - 1e-12 && halvings < 30; halvings++) {
      d0 /= 2;
      d1 /= 2;
      next = objective(a + d0, b + d1);
    }
    a += d0;
    b += d1;
    current = next;
    if (Math.abs(d0) + Math.abs(d1) < 1e-10) {
      converged = true;
      iterations++;
      break;
    }
  }
  // The information matrix at the final coefficients.
  h00 = pa;
  h01 = 0;
  h11 = pb;
  for (const { x, trials } of points) {
    const p = sigmoid(a + b * x);
    const w = trials * p * (1 - p);
    h00 += w;
    h01 += w * x;
    h11 += w * x * x;
  }
  const det = h00 * h11 - h01 * h01;
  const cov: LogisticFit['cov'] = det > 0 ? [[h11 / det, -h01 / det], [-h01 / det, h00 / det]] : [[Infinity, 0], [0, Infinity]];
  return { coef: [a, b], cov, iterations, converged };
}

function softplus(t: number): number {
  return t > 0 ? t + Math.log1p(Math.exp(-t)) : Math.log1p(Math.exp(t));
}
