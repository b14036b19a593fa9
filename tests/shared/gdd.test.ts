import { describe, expect, it } from 'vitest';
import { growingDegreeDays, yearlyHeat } from '../../shared/domain/gdd';

describe('growingDegreeDays', () => {
  it('uses the simple average method', () => {
    // Midwestern Regional Climate Center, GDD information page: mean 75 F, base 65 gives 10.
    expect(growingDegreeDays(85, 65, 65)).toBe(10);
    // Iowa State University, Agronomy 541 notes: 70/50 F at base 50 gives 10.
    expect(growingDegreeDays(70, 50)).toBe(10);
    expect(growingDegreeDays(40, 20)).toBe(0);
  });

  it('uses the modified 86/50 method', () => {
    // Midwestern Regional Climate Center, agriculture special topics: Tmax 92, Tmin 68 gives (86 + 68)/2 - 50 = 27.
    expect(growingDegreeDays(92, 68, 50, 'modified-86-50')).toBe(27);
    // The cap gives at most 36 a day, and a cold night is raised to 50 F (same source).
    expect(growingDegreeDays(100, 90, 50, 'modified-86-50')).toBe(36);
    expect(growingDegreeDays(70, 40, 50, 'modified-86-50')).toBe(10);
  });
});

describe('yearlyHeat', () => {
  const fToC = (f: number) => ((f - 32) * 5) / 9;
  const year = (y: number, tmaxF: number | null, tminF: number) => {
    const days = [];
    for (let d = new Date(Date.UTC(y, 0, 1)); d.getUTCFullYear() === y; d.setUTCDate(d.getUTCDate() + 1)) {
      days.push({ date: d.toISOString().slice(0, 10), tminC: fToC(tminF), tmaxC: tmaxF === null ? null : fToC(tmaxF) });
    }
    return days;
  };

  it('sums the daily mean method over a year, base 50 F', () => {
    // Iowa State University, Agronomy 541 notes: 70/50 F at base 50 gives 10 a day; 2023 has 365 days.
    expect(yearlyHeat(year(2023, 70, 50))).toEqual({ gdd50F: 3650, years: 1 });
    // Two years average: 10 a day in 2023, 0 a day in 2021 (40/20 F).
    expect(yearlyHeat([...year(2023, 70, 50), ...year(2021, 40, 20)])).toEqual({ gdd50F: 1825, years: 2 });
  });

  it('gives no heat without maxima, and leaves out a year with missing days', () => {
    expect(yearlyHeat(year(2023, null, 50))).toEqual({ gdd50F: null, years: 0 });
    expect(yearlyHeat(year(2023, 70, 50).slice(0, 300))).toEqual({ gdd50F: null, years: 0 });
  });
});
