/**
 * Growing degree days of one day, in °F.
 * - 'simple': max(0, (Tmax + Tmin) / 2 - base).
 * - 'modified-86-50': Tmax capped at 86 °F and both temperatures raised to at least 50 °F before
 *   averaging (the corn/"86/50" convention), so a day gives 0 to 36 at base 50.
 */
export type GddMethod = 'simple' | 'modified-86-50';

export function growingDegreeDays(tmaxF: number, tminF: number, baseF = 50, method: GddMethod = 'simple'): number {
  let hi = tmaxF;
  let lo = tminF;
  if (method === 'modified-86-50') {
    hi = Math.max(50, Math.min(86, hi));
    lo = Math.max(50, Math.min(86, lo));
  }
  return Math.max(0, (hi + lo) / 2 - baseF);
}
