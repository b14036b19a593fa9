/**
 * Growing degree days (GDD), the heat a plant accumulates above a base temperature.
 *
 * Daily mean method (the "simple average" method): GDD = max(0, (Tmax + Tmin) / 2 - base), in the
 * unit of the temperatures. The atlas uses base 50 °F (10 °C) and counts in °F-days, the unit of
 * NOAA's normals (ann-grdd-base50): 1 °C-day = 1.8 °F-days.
 * - 'simple': max(0, (Tmax + Tmin) / 2 - base).
 * - 'modified-86-50': Tmax capped at 86 °F and both temperatures raised to at least 50 °F before
 *   averaging (the corn/"86/50" convention), so a day gives 0 to 36 at base 50.
 */
export type GddMethod = 'simple' | 'modified-86-50';

export const GDD_BASE_F = 50;

export function growingDegreeDays(tmaxF: number, tminF: number, baseF = GDD_BASE_F, method: GddMethod = 'simple'): number {
  let hi = tmaxF;
  let lo = tminF;
  if (method === 'modified-86-50') {
    hi = Math.max(50, Math.min(86, hi));
    lo = Math.max(50, Math.min(86, lo));
  }
  return Math.max(0, (hi + lo) / 2 - baseF);
}

const cToF = (c: number) => (c * 9) / 5 + 32;

/** A year counts for heat when at most this many of its days lack a maximum or a minimum. */
export const GDD_MAX_MISSING_DAYS = 10;

/**
 * A station's typical yearly heat from its daily record: the mean over calendar years (July to June
 * in the south) of the summed daily GDD base 50 °F, simple method, counting only years with at most
 * GDD_MAX_MISSING_DAYS days without both a maximum and a minimum. Null (0 years) for a record
 * without maxima: such a station still gives frost dates, but no heat.
 */
export function yearlyHeat(days: { date: string; tminC: number; tmaxC: number | null }[], options: { hemisphere?: 'north' | 'south' } = {}): { gdd50F: number | null; years: number } {
  const south = options.hemisphere === 'south';
  const years = new Map<number, { sum: number; count: number }>();
  for (const d of days) {
    if (d.tmaxC === null || !Number.isFinite(d.tmaxC) || !Number.isFinite(d.tminC)) continue;
    const y = Number(d.date.slice(0, 4));
    const year = south && Number(d.date.slice(5, 7)) < 7 ? y - 1 : y;
    const entry = years.get(year) ?? { sum: 0, count: 0 };
    entry.sum += growingDegreeDays(cToF(d.tmaxC), cToF(d.tminC));
    entry.count++;
    years.set(year, entry);
  }
  let total = 0;
  let n = 0;
  for (const [year, { sum, count }] of years) {
    const leapYear = south ? year + 1 : year;
    const length = (leapYear % 4 === 0 && leapYear % 100 !== 0) || leapYear % 400 === 0 ? 366 : 365;
    if (length - count > GDD_MAX_MISSING_DAYS) continue;
    total += sum;
    n++;
  }
  return { gdd50F: n > 0 ? Math.round(total / n) : null, years: n };
}

/**
 * Heat gathered from the last spring frost to `daysAfterFrost` days later, at a place whose typical
 * year gives `seasonHeatF` growing degree days over a frost-free season of `seasonDays` days.
 * Assumed shape (a MODEL, no source): the season's heat comes as a half sine over the frost-free
 * days, little just after the spring frost and before the fall one, most in midsummer, so the
 * share gathered after t of L days is (1 - cos(pi t / L)) / 2. Used to turn a report's days from
 * spring frost to first ripe fig into heat where no daily temperatures of the garden exist.
 */
export function heatFromFrost(seasonHeatF: number, seasonDays: number, daysAfterFrost: number): number {
  if (!(seasonDays > 0) || !(daysAfterFrost > 0)) return 0;
  const share = (1 - Math.cos(Math.PI * Math.min(1, daysAfterFrost / seasonDays))) / 2;
  return seasonHeatF * share;
}
