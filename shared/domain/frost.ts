/**
 * Freeze dates and the frost-free season from daily minimum temperatures.
 *
 * Method (after NOAA NCEI's U.S. Climate Normals freeze products, PRBLST / PRBFST / PRBGSL, and NCDC
 * Climatography of the U.S. No. 20, freeze/frost supplement):
 *
 * - A **freeze** at a threshold is a day whose minimum is at or below it, compared exactly as
 *   recorded (`comparison: 'exact'`, the default): a reading in °C or in decimal °F counts only at
 *   or below the threshold, to the 0.01 °C at which the atlas stores readings (station-csv.ts):
 *   28.0 °F is stored as -2.22 °C and meets 28 °F (-2.222 °C); 28.1 °F (-2.17) and -2.2 °C do not. GHCN-Daily stores U.S. stations' whole-°F readings as tenths of °C: 28 °F becomes
 *   -2.2 °C, a hair above -2.22 °C. For such data only (`comparison: 'ghcn-tenths'`, chosen when
 *   the file is in the GHCN-Daily layout) readings are compared at 0.1 °C, so the stored -2.2 still
 *   counts at 28 °F (the next whole degree, 29 °F, is stored as -1.7 and does not). This tolerance
 *   would be wrong for a decimal reading of -2.2 °C, so it is never applied to other data.
 * - **Season-year.** Northern hemisphere: the calendar year, split on 1 August; the last spring
 *   freeze is the last freeze from 1 January to 31 July, the first fall freeze the first freeze from
 *   1 August to 31 December (the NCEI/NCDC split, as we understand it; the split itself is recalled
 *   from memory). Southern hemisphere: the same split shifted by six months, so the season-year runs
 *   1 July to 30 June and the season spans the new year; spring is 1 July to 31 January, fall
 *   1 February to 30 June. `year` is the calendar year in which the season-year starts.
 * - **Day of year** (`lastSpringDoy`, `firstFallDoy`) is the calendar day of year of that date
 *   (1 January = 1; leap years run to 366). In the southern hemisphere the fall date lies in the
 *   next calendar year.
 * - **Season length** (`seasonDays`) counts the days strictly between the last spring freeze and the
 *   first fall freeze (the frost-free days). With no spring freeze it counts from the start of the
 *   season-year; with no fall freeze, to its end.
 * - **Freeze-free years.** As in the NCEI method, a season-year with one or no freezes counts as
 *   freeze-free. We represent it as `lastSpringDoy: null, firstFallDoy: null` and `seasonDays` = the
 *   length of the season-year (365 or 366). A null date alone means "no freeze in that half".
 * - **Missing days.** Only days that could change a date are counted: in spring the missing days
 *   after the last observed freeze (or all of spring when none was observed), in fall the missing
 *   days before the first observed freeze. A year with more than `maxMissingDays` (default 10) such
 *   days in either half is marked `complete: false` and left out of `freezeSummary`.
 */

/** One day's minimum temperature. */
export type DailyMin = { date: string /* YYYY-MM-DD */; tminC: number };

/** One season-year's freeze dates at one threshold. */
export type FreezeYear = {
  /** Calendar year in which the season-year starts (1 January north, 1 July south). */
  year: number;
  /** Day of year of the last spring freeze; null when none (or when the year is freeze-free). */
  lastSpringDoy: number | null;
  /** Day of year of the first fall freeze; null when none (or when the year is freeze-free). */
  firstFallDoy: number | null;
  /** Days strictly between the two freezes; the whole season-year when freeze-free. */
  seasonDays: number | null;
  /** False when too many days that could change a date are missing; such years are not summarized. */
  complete: boolean;
  /** Why an incomplete year is left out, in words ("14 days missing in spring after the last freeze"); null when complete. */
  leftOutReason?: string | null;
};

/**
 * 'exact': compare the reading with the threshold as recorded. 'ghcn-tenths': whole-°F readings
 * stored at 0.1 °C (GHCN-Daily), compared at that precision (see the module comment).
 */
export type FreezeComparison = 'exact' | 'ghcn-tenths';

export type Hemisphere = 'north' | 'south';

export type FreezeSummaryRow = {
  /** Probability in percent (10, 50, 90...). */
  probability: number;
  /** Day of year after which the last spring freeze falls in `probability` % of years (null: none). */
  lastSpringDoy: number | null;
  /** Day of year before which the first fall freeze falls in `probability` % of years (null: none). */
  firstFallDoy: number | null;
  /** Frost-free days not exceeded in `probability` % of years (10 % = a short year). */
  seasonDays: number | null;
  /** Number of complete season-years the row rests on. */
  years: number;
};

/** Default tolerance of missing days per half-year that could change a date. */
export const DEFAULT_MAX_MISSING_DAYS = 10;

const DAY_MS = 86_400_000;

/** Degrees Fahrenheit to Celsius (32 F = 0 C, 28 F = -2.22 C, 24 F = -4.44 C). */
export function thresholdFToC(f: number): number {
  return ((f - 32) * 5) / 9;
}

/** Days since 1970-01-01 of an ISO date, or null when the text is not a real calendar date. */
export function epochDay(date: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return Math.round(ms / DAY_MS);
}

function epochDayOf(y: number, month: number, day: number): number {
  return Math.round(Date.UTC(y, month - 1, day) / DAY_MS);
}

/** Calendar day of year (1..366) of an epoch day. */
function doyOfEpochDay(e: number): number {
  const d = new Date(e * DAY_MS);
  return e - epochDayOf(d.getUTCFullYear(), 1, 1) + 1;
}

/** Calendar day of year of an ISO date (1 January = 1), or null when the date is not real. */
export function dayOfYear(date: string): number | null {
  const e = epochDay(date);
  return e === null ? null : doyOfEpochDay(e);
}

/** The "MM-DD" of a day of year, read in a common (non-leap) year unless `year` is given. */
export function doyToMonthDay(doy: number, year = 2001): string {
  const d = new Date(Date.UTC(year, 0, 1) + (Math.round(doy) - 1) * DAY_MS);
  return `${String(d.getUTCMonth() + 1).padStart(2, '0')}-${String(d.getUTCDate()).padStart(2, '0')}`;
}

/** Season-year bounds as epoch days: [start, split) is spring, [split, end] is fall. */
function seasonBounds(year: number, hemisphere: Hemisphere) {
  if (hemisphere === 'north') {
    return { start: epochDayOf(year, 1, 1), split: epochDayOf(year, 8, 1), end: epochDayOf(year, 12, 31) };
  }
  return { start: epochDayOf(year, 7, 1), split: epochDayOf(year + 1, 2, 1), end: epochDayOf(year + 1, 6, 30) };
}

/**
 * Per season-year freeze dates at one threshold (see the module comment for the method).
 * Days may come in any order; a repeated date keeps its lowest minimum; non-finite values count as
 * missing. Season-years with no observed day at all are left out.
 */
export function freezeYears(
  days: DailyMin[],
  thresholdC: number,
  options: { hemisphere?: Hemisphere; maxMissingDays?: number; comparison?: FreezeComparison } = {},
): FreezeYear[] {
  const hemisphere = options.hemisphere ?? 'north';
  const maxMissing = options.maxMissingDays ?? DEFAULT_MAX_MISSING_DAYS;
  const limitTenths = Math.round(thresholdC * 10);
  const limitHundredths = Math.round(thresholdC * 100);
  const isFreeze = options.comparison === 'ghcn-tenths' ? (t: number) => Math.round(t * 10) <= limitTenths : (t: number) => Math.round(t * 100) <= limitHundredths;

  const byDay = new Map<number, number>();
  let first = Infinity;
  let last = -Infinity;
  for (const day of days) {
    if (!Number.isFinite(day.tminC)) continue;
    const e = epochDay(day.date);
    if (e === null) continue;
    const prev = byDay.get(e);
    byDay.set(e, prev === undefined ? day.tminC : Math.min(prev, day.tminC));
    if (e < first) first = e;
    if (e > last) last = e;
  }
  if (byDay.size === 0) return [];

  const firstYear = new Date(first * DAY_MS).getUTCFullYear() - (hemisphere === 'south' ? 1 : 0);
  const lastYear = new Date(last * DAY_MS).getUTCFullYear();
  const result: FreezeYear[] = [];

  for (let year = firstYear; year <= lastYear; year++) {
    const { start, split, end } = seasonBounds(year, hemisphere);
    const length = end - start + 1;
    let observed = 0;
    let freezes = 0;
    let lastSpring: number | null = null;
    let firstFall: number | null = null;
    for (let e = start; e <= end; e++) {
      const t = byDay.get(e);
      if (t === undefined) continue;
      observed++;
      if (isFreeze(t)) {
        freezes++;
        if (e < split) lastSpring = e;
        else if (firstFall === null) firstFall = e;
      }
    }
    if (observed === 0) continue;

    let springMissing = 0;
    for (let e = (lastSpring ?? start - 1) + 1; e < split; e++) if (!byDay.has(e)) springMissing++;
    let fallMissing = 0;
    for (let e = split; e < (firstFall ?? end + 1); e++) if (!byDay.has(e)) fallMissing++;
    const complete = springMissing <= maxMissing && fallMissing <= maxMissing;
    const reasons: string[] = [];
    const half = lastSpring === null ? 'in spring' : 'in spring after the last freeze';
    if (springMissing > maxMissing) reasons.push(`${springMissing} days missing ${half}`);
    if (fallMissing > maxMissing) reasons.push(`${fallMissing} days missing ${firstFall === null ? 'in fall' : 'in fall before the first freeze'}`);
    const leftOutReason = complete ? null : `${reasons.join(' and ')} (more than ${maxMissing} could move a date)`;

    if (freezes <= 1) {
      result.push({ year, lastSpringDoy: null, firstFallDoy: null, seasonDays: length, complete, ...(leftOutReason ? { leftOutReason } : {}) });
      continue;
    }
    const from = lastSpring ?? start - 1;
    const to = firstFall ?? end + 1;
    result.push({
      year,
      lastSpringDoy: lastSpring === null ? null : doyOfEpochDay(lastSpring),
      firstFallDoy: firstFall === null ? null : doyOfEpochDay(firstFall),
      seasonDays: to - from - 1,
      complete,
      ...(leftOutReason ? { leftOutReason } : {}),
    });
  }
  return result;
}

/**
 * Empirical quantile of sorted values by linear interpolation between order statistics
 * (Hyndman & Fan type 7, the default of R and NumPy). Infinite values stand for "no freeze"; a
 * result that depends on one becomes null.
 */
function quantile(sorted: number[], q: number): number | null {
  if (sorted.length === 0) return null;
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  const w = h - lo;
  const a = sorted[lo];
  const b = sorted[hi];
  if (w === 0 || a === b) return Number.isFinite(a) ? a : null;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return null;
  return a + w * (b - a);
}

function roundOrNull(v: number | null): number | null {
  return v === null ? null : Math.round(v);
}

/**
 * Dates and lengths across complete season-years at each probability (percent, default 10/50/90),
 * in the directions of the NCEI normals:
 *
 * - `lastSpringDoy` at p: the date after which the last spring freeze falls in p % of years. A 90 %
 *   date of 1 March means 9 years in 10 have a freeze after 1 March, so the 90 % date is early and
 *   the 10 % date late. It is the (100 - p) % empirical quantile of the spring dates.
 * - `firstFallDoy` at p: the date before which the first fall freeze falls in p % of years; the
 *   10 % date is early, the 90 % date late. It is the p % quantile of the fall dates.
 * - `seasonDays` at p: the length not exceeded in p % of years (10 % = a short year); the p %
 *   quantile of the yearly lengths, its own statistic (not the difference of the two dates).
 *
 * Years with no spring freeze sort as earliest and years with no fall freeze as latest; a quantile
 * that lands on them is null ("no freeze in that share of years"). Quantiles are empirical (type 7,
 * linear interpolation) and rounded to whole days; NCEI fits a distribution instead, so results
 * differ from published normals by a few days. Incomplete years are left out. Pass the same
 * `hemisphere` as to freezeYears: in the south a January spring freeze sorts after December ones.
 */
export function freezeSummary(
  years: FreezeYear[],
  probabilities: number[] = [10, 50, 90],
  options: { hemisphere?: Hemisphere } = {},
): FreezeSummaryRow[] {
  const used = years.filter((y) => y.complete);
  // Southern spring runs 1 July to 31 January: a January date (day <= 31) is the latest, so it is
  // ordered after December by adding a year, and wrapped back after the quantile.
  const south = options.hemisphere === 'south';
  const unwrap = (doy: number) => (south && doy <= 31 ? doy + 365 : doy);
  const wrap = (doy: number | null) => (doy !== null && doy > 365 ? doy - 365 : doy);
  const spring = used.map((y) => (y.lastSpringDoy === null ? -Infinity : unwrap(y.lastSpringDoy))).sort((a, b) => a - b);
  const fall = used.map((y) => y.firstFallDoy ?? Infinity).sort((a, b) => a - b);
  const season = used.filter((y) => y.seasonDays !== null).map((y) => y.seasonDays as number).sort((a, b) => a - b);
  return probabilities.map((probability) => {
    if (!(probability > 0 && probability < 100)) throw new RangeError('probabilities are percents between 0 and 100');
    const p = probability / 100;
    return {
      probability,
      lastSpringDoy: wrap(roundOrNull(quantile(spring, 1 - p))),
      firstFallDoy: roundOrNull(quantile(fall, p)),
      seasonDays: roundOrNull(quantile(season, p)),
      years: used.length,
    };
  });
}

/** The hemisphere of a latitude (the equator counts as north). */
export function hemisphereOf(lat: number): Hemisphere {
  return lat < 0 ? 'south' : 'north';
}

/**
 * Everything a station upload stores, at each normals threshold (32, 28, 24 °F by default): the
 * per-year freeze dates (with `complete`) and the 10/50/90 % summaries over complete years, flat
 * rows ready for station_freeze_years and station_summaries.
 */
export function stationFreezeTables(
  days: DailyMin[],
  options: { hemisphere?: Hemisphere; thresholdsF?: readonly number[]; probabilities?: number[]; maxMissingDays?: number; comparison?: FreezeComparison } = {},
): {
  years: (FreezeYear & { thresholdF: number })[];
  summaries: (FreezeSummaryRow & { thresholdF: number })[];
} {
  const years: (FreezeYear & { thresholdF: number })[] = [];
  const summaries: (FreezeSummaryRow & { thresholdF: number })[] = [];
  for (const thresholdF of options.thresholdsF ?? [32, 28, 24]) {
    const ys = freezeYears(days, thresholdFToC(thresholdF), options);
    for (const y of ys) years.push({ thresholdF, ...y });
    for (const s of freezeSummary(ys, options.probabilities, options)) summaries.push({ thresholdF, ...s });
  }
  return { years, summaries };
}
