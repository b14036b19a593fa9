import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stationSeasonsNear } from '../../server/atlas/atlas.repo';
import type { Db } from '../../server/db/client';
import { stationsDataVersion } from '../../server/db/data-version';
import { currentStationSnapshot } from '../../server/stations/station-snapshot';
import { deleteStation, saveStation, type StationData } from '../../server/stations/stations.repo';
import { boundingBox, distanceKm, inBoxes, type LatLon } from '../../shared/domain/geo';
import { estimateSeason, type StationSeason } from '../../shared/domain/season-estimate';
import { nearResponseSchema } from '../../shared/schemas/atlas';
import { createTestContext, createTestDb, type TestContext } from '../helpers/test-app';

/*
 * stationSeasonsNear answers from the in-memory station snapshot (server/stations/station-snapshot.ts).
 * Anywhere on the globe it must give exactly the stations in the radius's boxes with their 32 deg F
 * figures, so every station within the radius and the same estimate as from all stations, and see
 * every change to stations or their summaries on the next call. The reference is every station read
 * from the tables with a plain join (no spatial index, not the snapshot's own query), filtered here
 * by the boxes and by the exact great-circle distance. Stations and figures are invented.
 */

/** Every station with a 32 deg F summary, its rows folded into one station by probability. */
function everyStation(db: Db): StationSeason[] {
  const rows = db.sqlite
    .prepare(
      `SELECT s.id, s.name, s.lat, s.lon, s.code, s.first_date AS firstDate, s.last_date AS lastDate, s.gdd50_f AS gdd50F, s.extreme_min_c AS extremeMinC,
              m.probability, m.last_spring_doy AS lastSpringDoy, m.first_fall_doy AS firstFallDoy, m.season_days AS seasonDays
         FROM stations s JOIN station_summaries m ON m.station_id = s.id AND m.threshold_f = 32`,
    )
    .all() as {
    id: number;
    name: string;
    lat: number;
    lon: number;
    code: string | null;
    firstDate: string | null;
    lastDate: string | null;
    gdd50F: number | null;
    extremeMinC: number | null;
    probability: number;
    lastSpringDoy: number | null;
    firstFallDoy: number | null;
    seasonDays: number | null;
  }[];
  const byId = new Map<number, StationSeason>();
  for (const row of rows) {
    let s = byId.get(row.id);
    if (!s) {
      const period = row.firstDate && row.lastDate ? `${row.firstDate.slice(0, 4)}-${row.lastDate.slice(0, 4)}` : null;
      const source = 'daily' as const;
      s = { id: row.id, name: row.name, lat: row.lat, lon: row.lon, days10: null, days50: null, days90: null, lastSpringDoy50: null, firstFallDoy50: null, code: row.code, source, period, freezeNote: null, gdd50F: row.gdd50F, extremeMinC: row.extremeMinC };
      byId.set(row.id, s);
    }
    if (row.probability === 10) s.days10 = row.seasonDays;
    if (row.probability === 90) s.days90 = row.seasonDays;
    if (row.probability === 50) {
      s.days50 = row.seasonDays;
      s.lastSpringDoy50 = row.lastSpringDoy;
      s.firstFallDoy50 = row.firstFallDoy;
    }
  }
  return [...byId.values()];
}

const byId = (list: StationSeason[]) => [...list].sort((a, b) => a.id - b.id);
const within = (list: StationSeason[], point: LatLon, radiusKm: number) => byId(list.filter((s) => distanceKm(point, s) <= radiusKm));

describe('station snapshot against every station in the tables', () => {
  let db: Db;
  beforeAll(() => {
    db = createTestDb().db;
  });
  afterAll(() => db.sqlite.close());

  const lon = fc.double({ min: -180, max: 180, noNaN: true });
  const arbStation = fc.record({
    // Clustered near the antimeridian (on it too), both poles, a mid-latitude place, and anywhere.
    place: fc.oneof(
      fc.record({ lat: fc.double({ min: -18, max: -16, noNaN: true }), lon: fc.oneof(fc.double({ min: 178, max: 180, noNaN: true }), fc.double({ min: -180, max: -178, noNaN: true }), fc.constantFrom(180, -180)) }),
      fc.record({ lat: fc.oneof(fc.double({ min: 87, max: 90, noNaN: true }), fc.constant(90)), lon }),
      fc.record({ lat: fc.oneof(fc.double({ min: -90, max: -87, noNaN: true }), fc.constant(-90)), lon }),
      fc.record({ lat: fc.double({ min: 41, max: 43, noNaN: true }), lon: fc.double({ min: -75, max: -72, noNaN: true }) }),
      fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon }),
    ),
    // Any mix of summaries, some at other thresholds or probabilities, some figures missing.
    summaries: fc.uniqueArray(
      fc.record({
        thresholdF: fc.constantFrom(32, 28),
        probability: fc.constantFrom(10, 50, 90, 70),
        lastSpringDoy: fc.option(fc.integer({ min: 1, max: 366 })),
        firstFallDoy: fc.option(fc.integer({ min: 1, max: 366 })),
        seasonDays: fc.option(fc.integer({ min: 0, max: 366 })),
      }),
      { selector: (s) => `${s.thresholdF}:${s.probability}`, maxLength: 6 },
    ),
  });
  type Station = typeof arbStation extends fc.Arbitrary<infer T> ? T : never;
  const arbQuery = fc.record({
    point: fc.oneof(
      fc.constant({ lat: -17, lon: 179.9 }),
      fc.constant({ lat: -17, lon: -179.5 }),
      fc.constant({ lat: 89.5, lon: 10 }),
      fc.constant({ lat: -89.9, lon: -120 }),
      fc.constant({ lat: 42, lon: -73.5 }),
      fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon }),
    ),
    radiusKm: fc.constantFrom(1, 50, 150, 200, 500, 3000),
  });

  function store(stations: Station[]): void {
    const { sqlite } = db;
    sqlite.exec('DELETE FROM stations'); // summaries go by cascade
    const insertStation = sqlite.prepare('INSERT INTO stations (name, lat, lon) VALUES (?, ?, ?)');
    const insertSummary = sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, last_spring_doy, first_fall_doy, season_days, years) VALUES (?, ?, ?, ?, ?, ?, 30)');
    stations.forEach((s, i) => {
      const id = insertStation.run(`Station ${i}`, s.place.lat, s.place.lon).lastInsertRowid;
      for (const m of s.summaries) insertSummary.run(id, m.thresholdF, m.probability, m.lastSpringDoy, m.firstFallDoy, m.seasonDays);
    });
  }

  it('gives the stations in the boxes with their figures, every one within the radius, and the same estimate, anywhere on the globe', () => {
    let queriesWithStationsInRange = 0;
    fc.assert(
      fc.property(fc.array(arbStation, { maxLength: 50 }), fc.array(arbQuery, { minLength: 1, maxLength: 5 }), (stations, queries) => {
        store(stations);
        const all = everyStation(db);
        for (const { point, radiusKm } of queries) {
          const cached = stationSeasonsNear(db, point, radiusKm);
          const boxes = boundingBox(point, radiusKm);
          // Exactly the stations whose place lies in the boxes (the snapshot's index keeps 64-bit places), once each.
          expect(byId(cached)).toEqual(byId(all.filter((s) => inBoxes(s, boxes))));
          expect(new Set(cached.map((s) => s.id)).size).toBe(cached.length);
          // What matters to the answer: no station within the exact radius lost or added.
          const inRange = within(all, point, radiusKm);
          expect(within(cached, point, radiusKm)).toEqual(inRange);
          if (inRange.length) queriesWithStationsInRange++;
          const estimate = (list: StationSeason[]) => estimateSeason({ point, stations: list, reportFrostSeasons: [], radiusKm });
          expect(estimate(cached)).toEqual(estimate(all));
        }
      }),
      { numRuns: 150 },
    );
    // The comparison was not vacuous: many queries had stations within their radius.
    expect(queriesWithStationsInRange).toBeGreaterThan(50);
  });

  it('finds a station on the antimeridian once, from either side', () => {
    store([]);
    const id = Number(db.sqlite.prepare("INSERT INTO stations (name, lat, lon) VALUES ('Meridian', -17, 180)").run().lastInsertRowid);
    db.sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, season_days, years) VALUES (?, 32, 50, 300, 30)').run(id);
    for (const lon of [179.9, -179.9, 180, -180]) {
      const found = stationSeasonsNear(db, { lat: -17, lon }, 50);
      expect(found.map((s) => s.id)).toEqual([id]);
      expect(found).toEqual(within(everyStation(db), { lat: -17, lon }, 50));
    }
  });

  it('answers no stations with no stations', () => {
    store([]);
    expect(stationSeasonsNear(db, { lat: 0, lon: 0 }, 20_000)).toEqual([]);
  });

  it('keeps one snapshot while nothing changes, and hands out figures no caller can change', () => {
    store([{ place: { lat: 42, lon: -73 }, summaries: [{ thresholdF: 32, probability: 50, lastSpringDoy: 120, firstFallDoy: 280, seasonDays: 160 }] }]);
    const first = currentStationSnapshot(db);
    expect(currentStationSnapshot(db)).toBe(first);
    db.sqlite.prepare("INSERT INTO varieties (name, fig_type) VALUES ('Snapshot Test (fictional)', 'common')").run();
    expect(currentStationSnapshot(db)).toBe(first);
    const [station] = stationSeasonsNear(db, { lat: 42, lon: -73 }, 10);
    expect(() => {
      station!.days50 = 1;
    }).toThrow(TypeError);
  });

  it('does not keep a snapshot read inside a transaction that is then rolled back', () => {
    store([]);
    const point = { lat: 10, lon: 10 };
    expect(stationSeasonsNear(db, point, 50)).toEqual([]);
    const before = stationsDataVersion(db);
    const insert = () => db.sqlite.prepare("INSERT INTO stations (name, lat, lon) VALUES ('Rolled back', 10, 10)").run().lastInsertRowid;
    expect(() =>
      db.sqlite.transaction(() => {
        const id = insert();
        db.sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, season_days, years) VALUES (?, 32, 50, 200, 30)').run(id);
        expect(stationSeasonsNear(db, point, 50)).toHaveLength(1);
        throw new Error('roll back');
      })(),
    ).toThrow('roll back');
    expect(stationsDataVersion(db)).toBe(before);
    expect(stationSeasonsNear(db, point, 50)).toEqual([]);
    // A committed change that moves the counter as far as the rolled-back one did is seen as itself.
    const id = insert();
    db.sqlite.prepare('INSERT INTO station_summaries (station_id, threshold_f, probability, season_days, years) VALUES (?, 32, 50, 150, 30)').run(id);
    expect(stationSeasonsNear(db, point, 50).map((s) => s.days50)).toEqual([150]);
  });
});

describe("station snapshot after editors' changes", () => {
  let ctx: TestContext;
  beforeAll(() => {
    ctx = createTestContext();
  });
  afterAll(() => ctx.db.sqlite.close());

  const PLACE = { lat: 38.5, lon: -121.7 };
  const meta = { name: 'Snapshot Test Station', code: 'SNAP1', lat: 38.55, lon: -121.75, elevationM: 20 };
  /** Summaries at 32 deg F (and 28, which the snapshot does not hold); no days or freeze years needed here. */
  const data = (days50: number): StationData => ({
    days: [],
    freezeYears: [],
    summaries: [
      { thresholdF: 32, probability: 10, lastSpringDoy: 100, firstFallDoy: 300, seasonDays: days50 + 20, years: 30 },
      { thresholdF: 32, probability: 50, lastSpringDoy: 110, firstFallDoy: 290, seasonDays: days50, years: 30 },
      { thresholdF: 32, probability: 90, lastSpringDoy: 120, firstFallDoy: 280, seasonDays: days50 - 20, years: 30 },
      { thresholdF: 28, probability: 50, lastSpringDoy: 90, firstFallDoy: 310, seasonDays: days50 + 40, years: 30 },
    ],
  });
  const near = () => stationSeasonsNear(ctx.db, PLACE, 50);

  it('sees an upload, a replacement, a move and a deletion on the next call', () => {
    expect(near()).toEqual([]);
    let version = stationsDataVersion(ctx.db);
    const moved = () => {
      const now = stationsDataVersion(ctx.db);
      const did = now !== version;
      version = now;
      return did;
    };

    const id = saveStation(ctx.db, meta, data(200), null);
    expect(moved()).toBe(true);
    expect(near()).toEqual([
      { id, name: meta.name, lat: meta.lat, lon: meta.lon, days10: 220, days50: 200, days90: 180, lastSpringDoy50: 110, firstFallDoy50: 290, code: 'SNAP1', source: 'daily', period: null, freezeNote: null, gdd50F: null, extremeMinC: null },
    ]);

    // Uploaded again under the same code: the station is replaced in place.
    expect(saveStation(ctx.db, { ...meta, name: 'Renamed' }, data(180), null)).toBe(id);
    expect(moved()).toBe(true);
    expect(near()).toEqual([expect.objectContaining({ id, name: 'Renamed', days10: 200, days50: 180, days90: 160 })]);

    // Moved out of range.
    saveStation(ctx.db, { ...meta, lat: 45 }, data(180), null);
    expect(moved()).toBe(true);
    expect(near()).toEqual([]);
    expect(stationSeasonsNear(ctx.db, { lat: 45, lon: meta.lon }, 10).map((s) => s.id)).toEqual([id]);

    expect(deleteStation(ctx.db, id, null)).toBe(true);
    expect(moved()).toBe(true);
    expect(stationSeasonsNear(ctx.db, { lat: 45, lon: meta.lon }, 10)).toEqual([]);
  });

  it('shows in GET /api/atlas/near as soon as it is saved, and is gone once deleted', async () => {
    const stationsAt = async () => {
      const res = await ctx.agent().get(`/api/atlas/near?lat=${PLACE.lat}&lon=${PLACE.lon}&radiusKm=50`);
      expect(res.status).toBe(200);
      return nearResponseSchema.parse(res.body).season.stations.map((s) => ({ id: s.id, days50: s.days50 }));
    };
    expect(await stationsAt()).toEqual([]);
    const id = saveStation(ctx.db, meta, data(210), null);
    expect(await stationsAt()).toEqual([{ id, days50: 210 }]);
    ctx.db.sqlite.prepare('UPDATE station_summaries SET season_days = 205 WHERE station_id = ? AND threshold_f = 32 AND probability = 50').run(id);
    expect(await stationsAt()).toEqual([{ id, days50: 205 }]);
    deleteStation(ctx.db, id, null);
    expect(await stationsAt()).toEqual([]);
  });
});
