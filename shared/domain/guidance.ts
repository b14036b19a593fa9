/**
 * Pure helpers behind the guidance charts and the short-season filter: day-of-year arithmetic,
 * a weekly histogram of first-ripe dates, ripening success binned by frost-free season length,
 * and the varieties that ripened in seasons as short as a given one. No I/O.
 */

const DAY_MS = 86_400_000;

/** Day of year (1 = 1 January) of an ISO date 'YYYY-MM-DD'; null when it is not a valid date. */
export function dayOfYear(iso: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso);
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = Date.UTC(y, mo - 1, d);
  const date = new Date(t);
  if (date.getUTCMonth() !== mo - 1 || date.getUTCDate() !== d) return null;
  return Math.round((t - Date.UTC(y, 0, 1)) / DAY_MS) + 1;
}

/**
 * Frost-free days between a grower's reported last spring frost and first fall frost of the same
 * season. A fall date before the spring date is taken to fall in the next calendar year (southern
 * hemisphere seasons span the new year). Null when either is missing or the span is implausible.
 */
export function seasonDaysFromFrostDates(spring: string | null, fall: string | null): number | null {
  if (!spring || !fall || dayOfYear(spring) === null || dayOfYear(fall) === null) return null;
  let days = (Date.parse(`${fall}T00:00:00Z`) - Date.parse(`${spring}T00:00:00Z`)) / DAY_MS;
  if (days <= 0) days += 365;
  return days > 0 && days < 366 ? Math.round(days) : null;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** A readable date ("29 Jul") for a day of year, in a common (non-leap) year. */
export function doyLabel(doy: number): string {
  const date = new Date(Date.UTC(2025, 0, 1) + (Math.round(doy) - 1) * DAY_MS);
  return `${date.getUTCDate()} ${MONTHS[date.getUTCMonth()]}`;
}

export interface WeekBin {
  /** Week of the year counted from 1 January: week 0 = days 1-7. */
  week: number;
  startDoy: number;
  label: string;
  count: number;
}

/** First-ripe dates counted by week of the year, every week from the first to the last filled. */
export function weeklyHistogram(doys: number[]): WeekBin[] {
  if (doys.length === 0) return [];
  const weeks = doys.map((d) => Math.floor((d - 1) / 7));
  const first = Math.min(...weeks);
  const last = Math.max(...weeks);
  const bins: WeekBin[] = [];
  for (let week = first; week <= last; week++) bins.push({ week, startDoy: week * 7 + 1, label: doyLabel(week * 7 + 1), count: 0 });
  for (const w of weeks) bins[w - first]!.count++;
  return bins;
}

/** The median of a list of numbers; null for an empty list. */
export function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/** z for a two-sided 90 % interval. */
export const Z90 = 1.6448536269514722;

/**
 * Wilson score interval for a share of `successes` out of `n` (successes may be fractional when a
 * tree's several reports count as one tree). Null for n = 0.
 */
export function wilsonInterval(successes: number, n: number, z = Z90): { low: number; high: number } | null {
  if (n <= 0) return null;
  const p = successes / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}

/** One report with its season length: the input of the season charts and the short-season filter. */
export interface SeasonReport {
  treeId: number;
  userId: number;
  varietyId: number;
  ripened: boolean;
  seasonDays: number;
}

/**
 * Group reports into trees: a tree's several reports count as one tree whose "ripened" is the share
 * of its reports that ripened (so one keen grower's tree cannot outvote ten others).
 */
function treeShares(rows: SeasonReport[]): { trees: number; ripened: number; reports: number } {
  const byTree = new Map<number, { n: number; ok: number }>();
  for (const r of rows) {
    const t = byTree.get(r.treeId) ?? { n: 0, ok: 0 };
    t.n++;
    if (r.ripened) t.ok++;
    byTree.set(r.treeId, t);
  }
  let ripened = 0;
  for (const t of byTree.values()) ripened += t.ok / t.n;
  return { trees: byTree.size, ripened, reports: rows.length };
}

export interface SeasonBin {
  fromDays: number;
  toDays: number;
  reports: number;
  trees: number;
  ripened: number;
  share: number | null;
  interval90: { low: number; high: number } | null;
}

/** Ripening success by frost-free season length, in bins `width` days wide (empty bins between kept). */
export function successBySeason(rows: SeasonReport[], width = 20): SeasonBin[] {
  if (rows.length === 0) return [];
  const index = (d: number) => Math.floor(d / width);
  const first = Math.min(...rows.map((r) => index(r.seasonDays)));
  const last = Math.max(...rows.map((r) => index(r.seasonDays)));
  const groups: SeasonReport[][] = Array.from({ length: last - first + 1 }, () => []);
  for (const r of rows) groups[index(r.seasonDays) - first]!.push(r);
  return groups.map((group, i) => {
    const { trees, ripened, reports } = treeShares(group);
    return {
      fromDays: (first + i) * width,
      toDays: (first + i + 1) * width - 1,
      reports,
      trees,
      ripened: Math.round(ripened * 100) / 100,
      share: trees ? ripened / trees : null,
      interval90: wilsonInterval(ripened, trees),
    };
  });
}

export interface ShortSeasonVariety {
  varietyId: number;
  /** Trees of this variety reported in seasons no longer than the limit, and how many ripened. */
  trees: number;
  ripened: number;
  growers: number;
  reports: number;
  share: number | null;
  /** The shortest season in which it ripened. */
  shortestRipeSeasonDays: number | null;
}

/**
 * Varieties that ripened in places with a season as short as `seasonDays` (plus `toleranceDays`):
 * among reports whose season was that short, every variety with at least one ripened report, most
 * ripened trees first, then the higher share.
 */
export function shortSeasonVarieties(rows: SeasonReport[], seasonDays: number, toleranceDays = 10): ShortSeasonVariety[] {
  const limit = seasonDays + toleranceDays;
  const byVariety = new Map<number, SeasonReport[]>();
  for (const r of rows) {
    if (r.seasonDays > limit) continue;
    const list = byVariety.get(r.varietyId) ?? [];
    list.push(r);
    byVariety.set(r.varietyId, list);
  }
  const result: ShortSeasonVariety[] = [];
  for (const [varietyId, list] of byVariety) {
    const ripe = list.filter((r) => r.ripened);
    if (ripe.length === 0) continue;
    const { trees, ripened, reports } = treeShares(list);
    result.push({
      varietyId,
      trees,
      ripened: Math.round(ripened * 100) / 100,
      growers: new Set(list.map((r) => r.userId)).size,
      reports,
      share: trees ? ripened / trees : null,
      shortestRipeSeasonDays: Math.min(...ripe.map((r) => r.seasonDays)),
    });
  }
  return result.sort((a, b) => b.ripened - a.ripened || (b.share ?? 0) - (a.share ?? 0) || a.varietyId - b.varietyId);
}
