import { describe, expect, it } from 'vitest';
import { estimateSeason, type StationSeason } from '../../shared/domain/season-estimate';
import { seasonEstimateSchema } from '../../shared/schemas/atlas';

const point = { lat: 40, lon: -80 };
function station(id: number, lat: number, days50: number | null, extra: Partial<StationSeason> = {}): StationSeason {
  return { id, name: `Station ${id}`, lat, lon: -80, days10: null, days50, days90: null, lastSpringDoy50: null, firstFallDoy50: null, ...extra };
}

describe('estimateSeason', () => {
  it('weights stations by inverse distance squared', () => {
    // Shepard (1968), "A two-dimensional interpolation function for irregularly-spaced data": weights 1/d^p, here p = 2.
    // Along a meridian, 0.1 and 0.2 degrees are 11.12 and 22.24 km: weights 4 : 1, so (4 x 150 + 1 x 180) / 5 = 156.
    const e = estimateSeason({
      point,
      stations: [station(1, 40.1, 150, { days10: 140, days90: 160 }), station(2, 39.8, 180, { days10: 170, days90: 190 })],
      reportFrostSeasons: [],
      radiusKm: 100,
    });
    expect(e).toMatchObject({ days50: 156, days10: 146, days90: 166, stationCount: 2, reportFrostCount: 0, nearestStationKm: 11.1, thresholdF: 32 });
    expect(e.stations.map((s) => s.weight)).toEqual([0.8, 0.2]);
    expect(seasonEstimateSchema.parse(e)).toEqual(e);
    expect(e.method).toMatch(/2 weather stations within 100 km/);
  });

  it('blends growers’ frost seasons into the 50 % length at a quarter weight', () => {
    // One station and one report at the same distance: weights 1 and 0.25, so (150 + 0.25 x 200) / 1.25 = 160.
    const e = estimateSeason({ point, stations: [station(1, 40.1, 150)], reportFrostSeasons: [{ distanceKm: 11.1194, seasonDays: 200 }], radiusKm: 100 });
    expect(e.days50).toBe(160);
    expect(e.reportFrostCount).toBe(1);
    expect(e.days10).toBeNull(); // a single season gives no probabilities
  });

  it('leaves out what is beyond the radius and refuses to guess with nothing in range', () => {
    const e = estimateSeason({
      point,
      stations: [station(1, 42, 150)],
      reportFrostSeasons: [{ distanceKm: 120, seasonDays: 190 }],
      radiusKm: 100,
    });
    expect(e).toMatchObject({ days10: null, days50: null, days90: null, lastSpringDoy50: null, firstFallDoy50: null, stationCount: 0, reportFrostCount: 0, nearestStationKm: null, stations: [] });
    expect(e.method).toMatch(/no season length is given/);
  });

  it('keeps a station on the point from taking all the weight (1 km floor)', () => {
    const e = estimateSeason({ point, stations: [station(1, 40, 100), station(2, 40 + 1 / 111.195, 200)], reportFrostSeasons: [], radiusKm: 50 });
    expect(e.days50).toBe(150);
  });
});

describe('estimateSeason: heat and hardiness', () => {
  const base = { lat: 40, lon: -100, days10: 150, days50: 170, days90: 190, lastSpringDoy50: 110, firstFallDoy50: 280 };
  it('weights heat like the season, and gives the USDA half-zone of the average extreme minimum', () => {
    const e = estimateSeason({
      point: { lat: 40, lon: -100 },
      stations: [
        { ...base, id: 1, name: 'a', source: 'daily', gdd50F: 3000, extremeMinC: -15 },
        { ...base, id: 2, name: 'b', lat: 40 + 10 / 111.195, source: 'normals', period: '1981-2010', gdd50F: 2000, extremeMinC: null },
      ],
      reportFrostSeasons: [],
      radiusKm: 50,
    });
    // Station a at ~0 km weighs 1 / 1 (distance floored at 1 km), b at 10 km weighs 1 / 100.
    expect(e.gdd50F).toBe(Math.round((3000 + 2000 / 100) / (1 + 1 / 100)));
    // -15 C = 5 F: USDA 2023 Plant Hardiness Zone Map, 7b = 5 to 10 F (shared/CHECKS.md).
    expect(e).toMatchObject({ extremeMinF: 5, hardinessZone: '7b', coldStationCount: 1, heatStationCount: 2 });
    expect(e.sources).toEqual([
      { source: 'daily', period: null, stations: 1 },
      { source: 'normals', period: '1981-2010', stations: 1 },
    ]);
  });
});
