/**
 * USDA plant hardiness zones from the average annual extreme minimum temperature (USDA ARS / PRISM
 * Climate Group, 2023 Plant Hardiness Zone Map, based on 1991-2020). Zones 1-13 are 10 °F wide and
 * split into half-zones a/b 5 °F wide: zone n "a" starts at 10n - 70 °F, "b" at 10n - 65 °F.
 * A band includes its lower bound and excludes its upper one (5 °F is 7b, 10 °F is 8a).
 */

export type HardinessZone = { zone: string; lowF: number; highF: number };

/**
 * The half-zone of an average annual extreme minimum in °F. Below -60 °F gives zone "below 1a"
 * (lowF -Infinity); 70 °F and above gives "above 13b" (highF Infinity): the map has no zone there.
 */
export function hardinessZone(extremeMinF: number): HardinessZone {
  if (!Number.isFinite(extremeMinF)) throw new RangeError('extremeMinF must be a finite number');
  if (extremeMinF < -60) return { zone: 'below 1a', lowF: Number.NEGATIVE_INFINITY, highF: -60 };
  if (extremeMinF >= 70) return { zone: 'above 13b', lowF: 70, highF: Number.POSITIVE_INFINITY };
  const step = Math.floor((extremeMinF + 60) / 5); // 0 = 1a, 1 = 1b, ... 25 = 13b
  const lowF = -60 + step * 5;
  return { zone: `${Math.floor(step / 2) + 1}${step % 2 === 0 ? 'a' : 'b'}`, lowF, highF: lowF + 5 };
}

/** The same from an extreme minimum in °C. */
export function hardinessZoneFromC(extremeMinC: number): HardinessZone {
  return hardinessZone((extremeMinC * 9) / 5 + 32);
}

/**
 * The average of each winter's lowest minimum (°C), the quantity the hardiness map is drawn from.
 * Winters are counted whole: July to June in the north, January to December in the south, and
 * `year` is the calendar year in which the winter starts. A winter with more than `maxMissingDays`
 * (default 15) missing days is left out. `fromYear`/`toYear` bound the winters used (inclusive).
 */
export function averageExtremeMinC(
  days: { date: string; tminC: number }[],
  options: { hemisphere?: 'north' | 'south'; fromYear?: number; toYear?: number; maxMissingDays?: number } = {},
): { averageC: number | null; winters: number } {
  const south = options.hemisphere === 'south';
  const maxMissing = options.maxMissingDays ?? 15;
  const winters = new Map<number, { min: number; count: number; leap: boolean }>();
  for (const d of days) {
    if (!Number.isFinite(d.tminC)) continue;
    const y = Number(d.date.slice(0, 4));
    const m = Number(d.date.slice(5, 7));
    const year = south || m >= 7 ? y : y - 1;
    const w = winters.get(year) ?? { min: Infinity, count: 0, leap: false };
    w.min = Math.min(w.min, d.tminC);
    w.count++;
    if (d.date.endsWith('-02-29')) w.leap = true;
    winters.set(year, w);
  }
  let sum = 0;
  let n = 0;
  for (const [year, w] of winters) {
    if (options.fromYear !== undefined && year < options.fromYear) continue;
    if (options.toYear !== undefined && year > options.toYear) continue;
    const febYear = south ? year : year + 1;
    const length = (febYear % 4 === 0 && febYear % 100 !== 0) || febYear % 400 === 0 ? 366 : 365;
    if (length - w.count > maxMissing) continue;
    sum += w.min;
    n++;
  }
  return { averageC: n > 0 ? sum / n : null, winters: n };
}
