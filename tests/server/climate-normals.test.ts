import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadShippedNormals, writeNormalsRelease } from '../../server/normals/normals.repo';
import { REAL_DEMO_STATIONS, readRealStationDays } from '../../server/seed/demo-stations';
import { computeFreezeTables } from '../../server/stations/station-import';
import { saveStation } from '../../server/stations/stations.repo';
import { parseNormalsFileSet, parseNormalsValue, parseNormalsDate } from '../../shared/domain/climate-normals';
import { dayOfYear } from '../../shared/domain/frost';
import { nearResponseSchema } from '../../shared/schemas/atlas';
import { normalsStationSchema } from '../../shared/schemas/stations';
import { createTestContext, type TestContext } from '../helpers/test-app';

/*
 * NOAA NCEI 1981-2010 U.S. Climate Normals (Arguez et al., 2012; the shipped copy in
 * server/normals/data, whose README gives these check values): Albany International Airport, NY,
 * USW00014735: last spring freeze 32 F at 50 % 04/28, first fall freeze 10/10, growing season 50 %
 * 163 days (90 %: 144), growing degree days base 50 F 2649. Read through the app's own loader and API.
 */
const ALBANY = { lat: 42.7431, lon: -73.8092 };
const doy = (mmdd: string) => dayOfYear(`2001-${mmdd}`)!;

describe('NOAA normals shipped with the app', () => {
  let ctx: TestContext;
  let firstLoadMs = 0;
  beforeAll(() => {
    ctx = createTestContext();
    const loaded = loadShippedNormals(ctx.db)!;
    firstLoadMs = loaded.ms;
  }, 60_000);
  afterAll(() => ctx.db.sqlite.close());

  it('loads every normals station in seconds, once', () => {
    // 5,808 stations with freeze figures and 7,501 with growing degree days (the data's README), 7,501 in all.
    expect(ctx.db.sqlite.prepare('SELECT count(*) FROM normals_stations').pluck().get()).toBe(7501);
    expect(ctx.db.sqlite.prepare('SELECT count(*) FROM normals_stations WHERE season_days50 IS NOT NULL').pluck().get()).toBe(5808);
    expect(firstLoadMs).toBeLessThan(5000);
    const version = ctx.db.sqlite.prepare("SELECT version FROM data_versions WHERE name = 'stations'").pluck().get();
    expect(loadShippedNormals(ctx.db)).toBeNull(); // the same files: nothing written
    expect(ctx.db.sqlite.prepare("SELECT version FROM data_versions WHERE name = 'stations'").pluck().get()).toBe(version);
  });

  it("gives Albany's published values through the API", async () => {
    const station = normalsStationSchema.parse((await ctx.agent().get('/api/stations/normals/USW00014735').expect(200)).body);
    expect(station).toMatchObject({ lastSpringDoy50: doy('04-28'), firstFallDoy50: doy('10-10'), seasonDays50: 163, seasonDays90: 144, gdd50F: 2649, release: '1981-2010', freezeNote: null });
    expect(station).toMatchObject({ lastSpringDoy90: doy('04-16'), firstFallDoy90: doy('10-23') });

    // The near answer at the airport, with only that station in range.
    const near = nearResponseSchema.parse((await ctx.agent().get(`/api/atlas/near?lat=${ALBANY.lat}&lon=${ALBANY.lon}&radiusKm=8`).expect(200)).body);
    expect(near.season).toMatchObject({ days50: 163, days10: 144, days90: null, lastSpringDoy50: doy('04-28'), firstFallDoy50: doy('10-10'), gdd50F: 2649, stationCount: 1 });
    expect(near.season.sources).toEqual([{ source: 'normals', period: '1981-2010', stations: 1 }]);
    expect(near.season.stations[0]).toMatchObject({ code: 'USW00014735', source: 'normals', period: '1981-2010' });
    expect(near.season.method).toContain('NOAA climate normals 1981-2010');
  });

  it('says "frost-free all year" where the normals record no freeze (-6666), never a date', async () => {
    // Pago Pago WSO AP, American Samoa, AQW00061705: -6666 in every freeze-date file, season 365 (the data).
    const station = normalsStationSchema.parse((await ctx.agent().get('/api/stations/normals/AQW00061705').expect(200)).body);
    expect(station).toMatchObject({ freezeNote: 'never', lastSpringDoy50: null, firstFallDoy50: null, seasonDays50: 365 });
    expect(station.freezeWords).toContain('frost-free all year');
    const near = nearResponseSchema.parse((await ctx.agent().get('/api/atlas/near?lat=-14.3306&lon=-170.7136&radiusKm=8').expect(200)).body);
    expect(near.season).toMatchObject({ freezeNote: 'never', lastSpringDoy50: null, firstFallDoy50: null, days50: 365 });
    expect(near.season.method).toContain('Frost-free all year');
  });

  it('says "no frost-free season defined" where a freeze can come in any month (-4444), never a date', async () => {
    // Bellemont WFO, AZ, USC00020678, 2180 m: -4444 in the freeze-date files (the data; NCEI still lists 74 days).
    const station = normalsStationSchema.parse((await ctx.agent().get('/api/stations/normals/USC00020678').expect(200)).body);
    expect(station).toMatchObject({ freezeNote: 'any-month', lastSpringDoy50: null, firstFallDoy50: null, lastSpringDoy90: null, firstFallDoy90: null });
    expect(station.freezeWords).toContain('no frost-free season defined');
    const near = nearResponseSchema.parse((await ctx.agent().get('/api/atlas/near?lat=35.23&lon=-111.8214&radiusKm=8').expect(200)).body);
    expect(near.season).toMatchObject({ freezeNote: 'any-month', days50: null, lastSpringDoy50: null, firstFallDoy50: null });
    expect(near.season.method).toContain('No frost-free season defined');
  });

  it("prefers Albany's own daily record, and it agrees with the normals within the days the periods explain", async () => {
    const normals = nearResponseSchema.parse((await ctx.agent().get(`/api/atlas/near?lat=${ALBANY.lat}&lon=${ALBANY.lon}&radiusKm=8`)).body).season;
    const { file, meta } = REAL_DEMO_STATIONS[0]!;
    const days = readRealStationDays(file);
    saveStation(ctx.db, meta, { days, ...computeFreezeTables(days, meta.lat, 'ghcn-tenths') }, null);
    const daily = nearResponseSchema.parse((await ctx.agent().get(`/api/atlas/near?lat=${ALBANY.lat}&lon=${ALBANY.lon}&radiusKm=8`)).body).season;
    // One station, the same code: the daily record (1991 on, 20+ complete years) is used, not both.
    expect(daily.stationCount).toBe(1);
    expect(daily.stations[0]).toMatchObject({ code: 'USW00014735', source: 'daily' });
    expect(daily.sources[0]!.source).toBe('daily');
    // Measured: daily record 1991-2018 161 days, 04/29, 10/12, 2766 GDD; normals 1981-2010 163 days,
    // 04/28, 10/10, 2649 GDD. The periods overlap by 20 years, the daily figures are empirical
    // quantiles while NCEI fits a distribution (shared/CHECKS.md: "within a few days, not equal"),
    // and the later decade is warmer: within 5 days, and heat within 10 %.
    expect(Math.abs(daily.days50! - normals.days50!)).toBeLessThanOrEqual(5);
    expect(Math.abs(daily.lastSpringDoy50! - normals.lastSpringDoy50!)).toBeLessThanOrEqual(5);
    expect(Math.abs(daily.firstFallDoy50! - normals.firstFallDoy50!)).toBeLessThanOrEqual(5);
    expect(Math.abs(daily.gdd50F! / normals.gdd50F! - 1)).toBeLessThan(0.1);
  });
});

describe('normals file layouts', () => {
  it('reads values, flags and the special values', () => {
    expect(parseNormalsValue('       04/28S')).toEqual({ kind: 'value', value: 118, flag: 'S' });
    expect(parseNormalsValue('         163S')).toEqual({ kind: 'value', value: 163, flag: 'S' });
    expect(parseNormalsValue('       -6666 ')).toEqual({ kind: 'never' });
    expect(parseNormalsValue('       -4444R')).toEqual({ kind: 'any-month' });
    expect(parseNormalsValue('       -9999')).toEqual({ kind: 'missing' });
    // The 1991-2020 CSVs write dates as MMDD (NCEI by-station normals readme, recalled from memory).
    expect(parseNormalsDate('0427')).toEqual({ kind: 'value', value: doy('04-27'), flag: null });
  });

  it('refuses a file set with a file missing, naming it', () => {
    const result = parseNormalsFileSet({ inventory: '' });
    expect(result.stations).toEqual([]);
    expect(result.errors).toContain('ann-grdd-base50.txt: the file is missing from the set.');
  });
});

describe('a newer normals release', () => {
  it('replaces the older one station by station, and the older one never overwrites it', () => {
    const ctx = createTestContext();
    loadShippedNormals(ctx.db);
    const albany = { code: 'USW00014735', name: 'ALBANY AP', state: 'NY', ...ALBANY, elevationM: 85.6, lastSpringDoy50: doy('04-27'), lastSpringDoy90: doy('04-16'), firstFallDoy50: doy('10-15'), firstFallDoy90: doy('11-01'), seasonDays50: 169, seasonDays90: null, freezeNote: null, gdd50F: 2886.3, flag: null };
    // NOAA NCEI 1991-2020 normals, Albany (unverified copy, shared/CHECKS.md): 04/27, 10/15, 169 days, 2886.3 GDD.
    const summary = ctx.db.transaction(() => writeNormalsRelease(ctx.db, { name: '1991-2020', periodStart: 1991, periodEnd: 2020, source: 'test', fingerprint: null }, [albany], { wholeRelease: false }));
    expect(summary).toMatchObject({ added: [], replaced: ['USW00014735'], refused: [] });
    // The shipped 1981-2010 files again (as after an upgrade that changed them): Albany keeps 1991-2020.
    ctx.db.sqlite.prepare("UPDATE normals_releases SET fingerprint = 'old' WHERE name = '1981-2010'").run();
    const again = loadShippedNormals(ctx.db)!;
    expect(again.refused).toEqual([{ code: 'USW00014735', reason: expect.stringContaining('newer normals release') }]);
    expect(ctx.db.sqlite.prepare("SELECT season_days50 FROM normals_stations WHERE code = 'USW00014735'").pluck().get()).toBe(169);
    ctx.db.sqlite.close();
  }, 60_000);
});
