import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { freezeSummary, freezeYears, thresholdFToC } from '../../shared/domain/frost';
import { MAX_LISTED_ERRORS, parseStationCsv } from '../../shared/domain/station-csv';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/${name}`, import.meta.url), 'utf8');
const parsed = new Map<string, ReturnType<typeof parseStationCsv>>();
const parseFixture = (name: string) => parsed.get(name) ?? parsed.set(name, parseStationCsv(fixture(name))).get(name)!;

// Each open data file is parsed once; that takes seconds on a busy machine.
describe('parseStationCsv on the open data files', { timeout: 60_000 }, () => {
  it('reads the Milwaukee year/month/day file in deg F with NA missing', () => {
    // NOAA NCEI GHCN-Daily USW00014839 (Milwaukee Mitchell International Airport), deg F, NA = missing (shared/CHECKS.md).
    const { days, errors, unit, format } = parseFixture('ghcnd-USW00014839-daily.csv');
    expect(errors).toEqual([]);
    expect({ unit, format }).toEqual({ unit: 'F', format: 'year-month-day' });
    // First row: 1938-04-01, TMAX 35.96 F, TMIN 30.02 F = 2.2 C and -1.1 C (C = (F - 32) x 5/9).
    expect(days[0]).toEqual({ date: '1938-04-01', tminC: -1.1, tmaxC: 2.2 });
    expect(days.at(-1)?.date).toBe('2026-08-19');
    // 1939-06-08 has TMAX NA: kept with a null maximum.
    expect(days.find((d) => d.date === '1939-06-08')).toEqual({ date: '1939-06-08', tminC: 16.1, tmaxC: null });
    expect(days.length).toBeGreaterThan(32_000);
  });

  it('reads the Albany GHCN file in deg C with -9999 missing, giving the same freeze dates as the raw file', () => {
    const { days, errors, unit, format } = parseFixture('ghcnd-USW00014735-daily.csv');
    expect(errors).toEqual([]);
    expect({ unit, format }).toEqual({ unit: 'C', format: 'ghcn' });
    expect(days[0]).toEqual({ date: '1938-06-01', tminC: 8.3, tmaxC: 26.7 });
    const years = freezeYears(days, thresholdFToC(32)).filter((y) => y.year >= 1991 && y.year <= 2017);
    // shared/CHECKS.md: from this file over 1991-2017 at <= 0 C the medians are day 119 and day 285.
    expect(freezeSummary(years, [50])[0]).toMatchObject({ lastSpringDoy: 119, firstFallDoy: 285, years: 27 });
  });

  it('gives Milwaukee freeze dates in the expected season', () => {
    const { days } = parseFixture('ghcnd-USW00014839-daily.csv');
    const years = freezeYears(days, 0).filter((y) => y.year >= 1991 && y.year <= 2020);
    const [, p50] = freezeSummary(years);
    // Southeastern Wisconsin's last spring freeze falls in late April to early May, the first fall freeze in
    // mid to late October (recalled from memory of NWS Milwaukee/Sullivan climate pages; loose bounds).
    expect(p50.lastSpringDoy!).toBeGreaterThanOrEqual(105);
    expect(p50.lastSpringDoy!).toBeLessThanOrEqual(135);
    expect(p50.firstFallDoy!).toBeGreaterThanOrEqual(280);
    expect(p50.firstFallDoy!).toBeLessThanOrEqual(310);
  });
});

describe('parseStationCsv on simple files and bad rows', () => {
  it('reads date,tmin,tmax with the unit from the options or the header', () => {
    const text = 'date,tmin,tmax\n2024-01-01,32,41\n2024-01-02,NA,40\n\n2024-01-03,23,\n';
    expect(parseStationCsv(text, { unit: 'F' })).toEqual({
      days: [
        { date: '2024-01-01', tminC: 0, tmaxC: 5 },
        { date: '2024-01-03', tminC: -5, tmaxC: null },
      ],
      errors: [],
      unit: 'F',
      format: 'simple',
    });
    expect(parseStationCsv('date,tmin_c\n2024-03-01,-2.5\n').days).toEqual([{ date: '2024-03-01', tminC: -2.5, tmaxC: null }]);
    expect(parseStationCsv('Date,"TMIN (°F)"\n2024-03-01,14\n').days[0].tminC).toBe(-10);
  });

  it('refuses a simple file with no unit, or a header unit that contradicts the chosen one', () => {
    expect(parseStationCsv('date,tmin\n2024-01-01,3\n').errors).toEqual([{ row: 1, column: 'tmin', message: expect.stringMatching(/°C or °F/) }]);
    expect(parseStationCsv('date,tmin_f\n2024-01-01,3\n', { unit: 'C' }).errors[0]).toMatchObject({ row: 1, column: 'tmin_f' });
  });

  it('names the row and column of a non-numeric value, an impossible date and a duplicate date', () => {
    const text = [
      'date,tmin,tmax',
      '2023-02-28,-1,5',
      '2023-02-29,-2,4', // 2023 is not a leap year
      '2023-03-01,cold,4',
      '2023-03-02,-3,warm',
      '2023-02-28,-1,5',
      '2023-03-03,-200,5',
      '2023-03-04,-4,6',
    ].join('\n');
    const { days, errors } = parseStationCsv(text, { unit: 'C' });
    expect(errors).toEqual([
      { row: 3, column: 'date', message: expect.stringMatching(/not a real date/) },
      { row: 4, column: 'tmin', message: expect.stringMatching(/not a number/) },
      { row: 5, column: 'tmax', message: expect.stringMatching(/not a number/) },
      { row: 6, column: 'date', message: expect.stringMatching(/appears twice \(first on row 2\)/) },
      { row: 7, column: 'tmin', message: expect.stringMatching(/outside the possible range/) },
    ]);
    expect(days.map((d) => d.date)).toEqual(['2023-02-28', '2023-03-04']);
  });

  it('names the GHCN date columns and caps the error list', () => {
    const ghcn = 'YYYY,MM,DD,TMAX,TMIN\n2021,13,01,5.0,1.0\n';
    expect(parseStationCsv(ghcn).errors).toEqual([{ row: 2, column: 'YYYY/MM/DD', message: expect.stringMatching(/2021-13-01/) }]);
    const many = `date,tmin\n${Array.from({ length: MAX_LISTED_ERRORS + 5 }, () => 'x,1').join('\n')}`;
    const { errors } = parseStationCsv(many, { unit: 'C' });
    expect(errors).toHaveLength(MAX_LISTED_ERRORS + 1);
    expect(errors.at(-1)?.message).toBe('5 more errors not listed.');
  });

  it('refuses a file without a minimum temperature or a date', () => {
    expect(parseStationCsv('date,tmax\n2024-01-01,3\n').errors[0]).toMatchObject({ row: 1, column: 'tmin' });
    expect(parseStationCsv('when,tmin\n2024-01-01,3\n', { unit: 'C' }).errors[0]).toMatchObject({ row: 1, column: 'date' });
    expect(parseStationCsv('').errors[0].message).toMatch(/empty/);
  });
});
