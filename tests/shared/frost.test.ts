import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  type DailyMin,
  dayOfYear,
  doyToMonthDay,
  freezeSummary,
  freezeYears,
  hemisphereOf,
  stationFreezeTables,
  thresholdFToC,
} from '../../shared/domain/frost';

/** Albany (GHCN-Daily USW00014735, deg C, -9999 missing), read directly so this test does not lean on the CSV importer. */
function albany(): DailyMin[] {
  const lines = readFileSync(new URL('../fixtures/ghcnd-USW00014735-daily.csv', import.meta.url), 'utf8').trim().split('\n');
  const days: DailyMin[] = [];
  for (const line of lines.slice(1)) {
    const [y, m, d, , tmin] = line.split(',').map((s) => s.trim());
    if (Number(tmin) === -9999) continue;
    days.push({ date: `${y}-${m}-${d}`, tminC: Number(tmin) });
  }
  return days;
}

/** A whole year (or years) of mild days, with chosen freezes. */
function series(from: string, to: string, cold: Record<string, number> = {}, warmC = 10): DailyMin[] {
  const out: DailyMin[] = [];
  for (let t = Date.parse(`${from}T00:00:00Z`); t <= Date.parse(`${to}T00:00:00Z`); t += 86_400_000) {
    const date = new Date(t).toISOString().slice(0, 10);
    out.push({ date, tminC: cold[date] ?? warmC });
  }
  return out;
}

const doy = (mmdd: string) => dayOfYear(`2001-${mmdd}`) as number; // a common year, as the normals tables read

describe('thresholdFToC', () => {
  it('converts the normals thresholds', () => {
    // 32, 28, 24 F = 0, -2.2, -4.4 C (shared/DOMAIN.md; F = C * 9/5 + 32).
    expect(thresholdFToC(32)).toBe(0);
    expect(thresholdFToC(28)).toBeCloseTo(-2.222, 3);
    expect(thresholdFToC(24)).toBeCloseTo(-4.444, 3);
  });
});

describe('freezeYears and freezeSummary on Albany, NY (GHCN-Daily USW00014735), 1991-2017', { timeout: 60_000 }, () => {
  const days = albany();
  const inNormalsPeriod = (years: ReturnType<typeof freezeYears>) => years.filter((y) => y.year >= 1991 && y.year <= 2017);

  it('finds the 32 F median dates within 5 days of the NCEI 1991-2020 normals', () => {
    const years = inNormalsPeriod(freezeYears(days, thresholdFToC(32)));
    expect(years).toHaveLength(27);
    expect(years.every((y) => y.complete)).toBe(true);
    const [p10, p50, p90] = freezeSummary(years);
    expect(p50.years).toBe(27);
    // Computed from this file at <= 0 C: median last spring day 119, first fall day 285 (shared/CHECKS.md).
    expect(p50.lastSpringDoy).toBe(119);
    expect(p50.firstFallDoy).toBe(285);
    // NOAA NCEI U.S. Climate Normals 1991-2020, Albany USW00014735 (unverified copy, shared/CHECKS.md):
    // 50 % last spring 32 F 04/27, first fall 32 F 10/15.
    expect(Math.abs((p50.lastSpringDoy as number) - doy('04-27'))).toBeLessThanOrEqual(5);
    expect(Math.abs((p50.firstFallDoy as number) - doy('10-15'))).toBeLessThanOrEqual(5);
    // Direction of the probabilities (NCDC Climatography of the U.S. No. 20, freeze/frost supplement):
    // a 90 % spring date is early (9 years in 10 freeze later), 10 % late; fall 10 % early, 90 % late.
    // Normals: spring 05/11 > 04/27 > 04/16; fall 10/03 < 10/15 < 11/01.
    expect(p10.lastSpringDoy!).toBeGreaterThan(p50.lastSpringDoy!);
    expect(p50.lastSpringDoy!).toBeGreaterThan(p90.lastSpringDoy!);
    expect(p10.firstFallDoy!).toBeLessThan(p50.firstFallDoy!);
    expect(p50.firstFallDoy!).toBeLessThan(p90.firstFallDoy!);
    expect(p10.seasonDays!).toBeLessThan(p50.seasonDays!);
    expect(p50.seasonDays!).toBeLessThan(p90.seasonDays!);
    // Season length at 50 %: NCEI 169 days; our empirical statistic is its own median, compared loosely.
    expect(Math.abs(p50.seasonDays! - 169)).toBeLessThanOrEqual(10);
  });

  it('puts the 90 % spring date where 9 years in 10 freeze on or after it', () => {
    // Definition: NCDC Climatography of the U.S. No. 20, freeze/frost supplement (shared/CHECKS.md).
    const years = inNormalsPeriod(freezeYears(days, thresholdFToC(32)));
    const [p10, , p90] = freezeSummary(years);
    const share = (pred: (d: number) => boolean) => years.filter((y) => pred(y.lastSpringDoy!)).length / years.length;
    expect(share((d) => d >= p90.lastSpringDoy!)).toBeGreaterThanOrEqual(0.85);
    expect(share((d) => d > p10.lastSpringDoy!)).toBeLessThanOrEqual(0.15);
  });

  it('finds the 28 F median dates within 5 days of the NCEI normals', () => {
    // GHCN-Daily stores these whole-°F readings at 0.1 °C: compared at that precision.
    const years = inNormalsPeriod(freezeYears(days, thresholdFToC(28), { comparison: 'ghcn-tenths' }));
    const [p10, p50, p90] = freezeSummary(years);
    // NOAA NCEI U.S. Climate Normals 1991-2020, Albany (unverified copy, shared/CHECKS.md):
    // 28 F last spring 04/28, 04/16, 04/03 at 10/50/90 %; first fall 10/11, 10/28, 11/10.
    expect(Math.abs(p50.lastSpringDoy! - doy('04-16'))).toBeLessThanOrEqual(5);
    expect(Math.abs(p50.firstFallDoy! - doy('10-28'))).toBeLessThanOrEqual(5);
    expect(p10.lastSpringDoy!).toBeGreaterThan(p90.lastSpringDoy!);
    expect(p10.firstFallDoy!).toBeLessThan(p90.firstFallDoy!);
  });

  it('marks the partial first and last years of the record incomplete', () => {
    const years = freezeYears(days, 0);
    // The record runs 1938-06-01 to 2018-04-25: 1938's spring and 2018's fall are mostly missing.
    expect(years[0]).toMatchObject({ year: 1938, complete: false });
    expect(years.at(-1)).toMatchObject({ year: 2018, complete: false });
  });
});

describe('freezeYears on hand-made series', () => {
  it('counts days of year and season days in a leap year', () => {
    // 2024 is a leap year: 1 March is day 61, 31 October day 305 (Gregorian calendar; common practice, no source).
    const years = freezeYears(series('2024-01-01', '2024-12-31', { '2024-02-10': -3, '2024-03-01': -1, '2024-10-31': -2, '2024-12-31': -5 }), 0);
    expect(years).toEqual([{ year: 2024, lastSpringDoy: 61, firstFallDoy: 305, seasonDays: 305 - 61 - 1, complete: true }]);
  });

  it('compares at the 0.1 C precision of GHCN-Daily only for such data: -2.2 C counts as 28 F', () => {
    const marks = { '2023-04-01': -2.2, '2023-04-20': -2.2, '2023-10-20': -2.1, '2023-11-02': -2.2, '2023-11-20': -2.5 };
    const years = freezeYears(series('2023-01-01', '2023-12-31', marks), thresholdFToC(28), { comparison: 'ghcn-tenths' });
    expect(years[0]).toMatchObject({ lastSpringDoy: dayOfYear('2023-04-20'), firstFallDoy: dayOfYear('2023-11-02') });
    // The same readings taken as recorded (decimal °C): -2.2 C is 28.04 F, above 28 F, so only -2.5 C freezes.
    // 28 F = -2.222 C (F = C * 9/5 + 32; shared/DOMAIN.md).
    const exact = freezeYears(series('2023-01-01', '2023-12-31', marks), thresholdFToC(28));
    expect(exact[0]).toMatchObject({ lastSpringDoy: null, firstFallDoy: null, seasonDays: 365 });
  });

  it('compares a reading made in F exactly with 28 F: 28.0 F counts, 28.1 F does not', () => {
    const fToStoredC = (f: number) => Math.round((((f - 32) * 5) / 9) * 100) / 100; // as station-csv.ts stores a °F reading
    const marks = { '2023-04-01': fToStoredC(28), '2023-04-20': fToStoredC(28.1), '2023-10-20': fToStoredC(28.1), '2023-11-02': fToStoredC(28) };
    const years = freezeYears(series('2023-01-01', '2023-12-31', marks), thresholdFToC(28));
    expect(years[0]).toMatchObject({ lastSpringDoy: dayOfYear('2023-04-01'), firstFallDoy: dayOfYear('2023-11-02') });
  });

  it('says why a year is left out', () => {
    const days = series('2023-01-01', '2023-12-31', { '2023-03-01': -3, '2023-11-01': -3 }).filter((d) => d.date < '2023-05-01' || d.date > '2023-05-20');
    const [year] = freezeYears(days, 0);
    expect(year).toMatchObject({ complete: false, leftOutReason: '20 days missing in spring after the last freeze (more than 10 could move a date)' });
  });

  it('represents a year with one or no freezes as freeze-free (NCEI method, shared/CHECKS.md)', () => {
    const none = freezeYears(series('2023-01-01', '2023-12-31'), 0);
    expect(none).toEqual([{ year: 2023, lastSpringDoy: null, firstFallDoy: null, seasonDays: 365, complete: true }]);
    const one = freezeYears(series('2023-01-01', '2023-12-31', { '2023-03-03': -1 }), 0);
    expect(one).toEqual([{ year: 2023, lastSpringDoy: null, firstFallDoy: null, seasonDays: 365, complete: true }]);
  });

  it('counts from the start of the year when only the fall froze', () => {
    const years = freezeYears(series('2023-01-01', '2023-12-31', { '2023-11-01': -1, '2023-11-02': -1 }), 0);
    expect(years[0]).toMatchObject({ lastSpringDoy: null, firstFallDoy: 305, seasonDays: 304 });
  });

  it('marks a year incomplete when days that could move a date are missing', () => {
    const cold = { '2022-03-20': -2, '2022-10-25': -2, '2023-03-20': -2, '2023-10-25': -2 };
    const all = series('2022-01-01', '2023-12-31', cold);
    // 2022: 20 days missing in May, after the last spring freeze: the date might have been later.
    // 2023: 40 days missing in January, before the last spring freeze: they cannot change it.
    const gappy = all.filter(
      (d) => !(d.date >= '2022-05-01' && d.date <= '2022-05-20') && !(d.date >= '2023-01-01' && d.date <= '2023-02-09'),
    );
    const years = freezeYears(gappy, 0);
    expect(years.map((y) => [y.year, y.complete])).toEqual([
      [2022, false],
      [2023, true],
    ]);
    // Incomplete years are left out of the summary.
    expect(freezeSummary(years, [50])[0]).toMatchObject({ years: 1, lastSpringDoy: dayOfYear('2023-03-20') });
  });

  it('runs the southern season-year from July to June, across the new year', () => {
    // Southern hemisphere: spring freezes in September, fall freezes in April of the next calendar year.
    const cold = { '2020-07-15': -4, '2020-09-10': -1, '2021-04-20': -1, '2021-06-01': -3 };
    const years = freezeYears(series('2020-07-01', '2021-06-30', cold), 0, { hemisphere: 'south' });
    // 2020 is a leap year: 10 September is day 254; 20 April 2021 is day 110; 221 days lie strictly between.
    expect(years).toEqual([{ year: 2020, lastSpringDoy: 254, firstFallDoy: 110, seasonDays: 221, complete: true }]);
    // Read as northern calendar years, 2021 lacks July after its June freeze and is incomplete.
    expect(freezeYears(series('2020-07-01', '2021-06-30', cold), 0).find((y) => y.year === 2021)?.complete).toBe(false);
  });
});

describe('freezeSummary', () => {
  it('reads each probability in the NCEI direction', () => {
    const years = Array.from({ length: 11 }, (_, i) => ({
      year: 2000 + i,
      lastSpringDoy: 100 + i,
      firstFallDoy: 280 + i,
      seasonDays: 170 + i,
      complete: true,
    }));
    expect(freezeSummary(years)).toEqual([
      { probability: 10, lastSpringDoy: 109, firstFallDoy: 281, seasonDays: 171, years: 11 },
      { probability: 50, lastSpringDoy: 105, firstFallDoy: 285, seasonDays: 175, years: 11 },
      { probability: 90, lastSpringDoy: 101, firstFallDoy: 289, seasonDays: 179, years: 11 },
    ]);
  });

  it('gives null dates where freeze-free years dominate, and no row values without years', () => {
    const freeFree = { lastSpringDoy: null, firstFallDoy: null, seasonDays: 365, complete: true };
    const years = [
      { year: 2001, ...freeFree },
      { year: 2002, ...freeFree },
      { year: 2003, ...freeFree },
      { year: 2004, lastSpringDoy: 40, firstFallDoy: 340, seasonDays: 299, complete: true },
    ];
    expect(freezeSummary(years, [50])[0]).toMatchObject({ lastSpringDoy: null, firstFallDoy: null, seasonDays: 365 });
    // One freeze-free year in ten: the median is a date; the 90 % spring date (9 years in 10 freeze later) is not.
    const mostlyFreezing = [
      { year: 2000, ...freeFree },
      ...Array.from({ length: 9 }, (_, i) => ({ year: 2001 + i, lastSpringDoy: 100 + i, firstFallDoy: 280 + i, seasonDays: 179, complete: true })),
    ];
    const [p10, p50, p90] = freezeSummary(mostlyFreezing);
    expect(p50.lastSpringDoy).toBe(104);
    expect(p10.lastSpringDoy).toBe(107);
    expect(p90.lastSpringDoy).toBeNull();
    expect(freezeSummary([], [50])).toEqual([{ probability: 50, lastSpringDoy: null, firstFallDoy: null, seasonDays: null, years: 0 }]);
  });

  it('orders a southern January spring freeze after the December ones', () => {
    // Southern season-year: spring runs July to January, so a freeze on 10 January (day 10) is the latest.
    const years = [350, 355, 360, 10, 5].map((d, i) => ({ year: 2000 + i, lastSpringDoy: d, firstFallDoy: 120, seasonDays: 120, complete: true }));
    const [p10, p50, p90] = freezeSummary(years, [10, 50, 90], { hemisphere: 'south' });
    expect(p50.lastSpringDoy).toBe(360);
    expect(p10.lastSpringDoy).toBe(8); // between 5 and 10 January, wrapped back from day 373
    expect(p90.lastSpringDoy).toBe(352);
    // Read as northern, days 5 and 10 would be the earliest instead.
    expect(freezeSummary(years, [50])[0].lastSpringDoy).toBe(350);
  });

  it('shows a day of year as month and day', () => {
    expect(doyToMonthDay(117)).toBe('04-27');
    expect(doyToMonthDay(61, 2024)).toBe('03-01');
  });
});

describe('stationFreezeTables', () => {
  it('gives years and summaries at 32, 28 and 24 F, and finds the hemisphere', () => {
    const days = series('2022-01-01', '2023-12-31', { '2022-03-01': -5, '2022-11-01': -5, '2023-03-02': -3, '2023-11-02': -1 });
    const { years, summaries } = stationFreezeTables(days);
    expect(years.map((y) => [y.thresholdF, y.year, y.lastSpringDoy])).toEqual([
      [32, 2022, 60],
      [32, 2023, 61],
      [28, 2022, 60],
      [28, 2023, null], // only -3 C on 2 March reaches 28 F (-2.2 C): one freeze, freeze-free (NCEI rule)
      [24, 2022, 60],
      [24, 2023, null],
    ]);
    expect(summaries).toHaveLength(9);
    expect(summaries[0]).toMatchObject({ thresholdF: 32, probability: 10, years: 2 });
    expect(hemisphereOf(-33.9)).toBe('south');
    expect(hemisphereOf(42.7)).toBe('north');
  });
});
