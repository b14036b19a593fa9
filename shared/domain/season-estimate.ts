import type { SeasonEstimate } from '../schemas/atlas';
import { distanceKm, type LatLon } from './geo';

/**
 * Frost-free season at a point from nearby stations and growers' reported frost seasons.
 *
 * Inverse-distance weighting with power 2 (Shepard's method): each station within `radiusKm` weighs
 * 1 / d², with d floored at MIN_DISTANCE_KM so a station on the point does not take all the weight.
 * Each value (days10/50/90, the 50 % dates) is the weighted mean over the stations that have it.
 * Growers' own frost seasons (one season each, days between their reported spring and fall frosts)
 * join only the 50 % length, each at REPORT_WEIGHT_FACTOR × 1 / d², because one year at one garden
 * says less than a station's 30-year statistic. The 10 % and 90 % lengths and the dates come from
 * stations only. With nothing in range every value is null and `method` says so: no guess is made.
 */

export const IDW_POWER = 2;
export const MIN_DISTANCE_KM = 1;
/** A grower's one-season frost report weighs a quarter of a station at the same distance. */
export const REPORT_WEIGHT_FACTOR = 0.25;

export type StationSeason = {
  id: number;
  name: string;
  lat: number;
  lon: number;
  days10: number | null;
  days50: number | null;
  days90: number | null;
  lastSpringDoy50: number | null;
  firstFallDoy50: number | null;
};

export type SeasonEstimateInput = {
  point: LatLon;
  stations: StationSeason[];
  reportFrostSeasons: { distanceKm: number; seasonDays: number }[];
  radiusKm: number;
  thresholdF?: number;
};

const idw = (d: number) => 1 / Math.max(d, MIN_DISTANCE_KM) ** IDW_POWER;
const round1 = (x: number) => Math.round(x * 10) / 10;

function weightedMean(pairs: { value: number | null; weight: number }[]): number | null {
  let s = 0;
  let w = 0;
  for (const p of pairs) {
    if (p.value === null || !Number.isFinite(p.value)) continue;
    s += p.value * p.weight;
    w += p.weight;
  }
  return w > 0 ? Math.round(s / w) : null;
}

/** The season estimate in the wire shape (see the module comment for the method). */
export function estimateSeason(input: SeasonEstimateInput): SeasonEstimate {
  const thresholdF = input.thresholdF ?? 32;
  const near = input.stations
    .map((s) => ({ s, d: distanceKm(input.point, s) }))
    .filter((x) => x.d <= input.radiusKm)
    .sort((a, b) => a.d - b.d || a.s.id - b.s.id)
    .map((x) => ({ ...x, w: idw(x.d) }));
  const reports = input.reportFrostSeasons
    .filter((r) => r.distanceKm <= input.radiusKm && Number.isFinite(r.seasonDays))
    .map((r) => ({ ...r, w: REPORT_WEIGHT_FACTOR * idw(r.distanceKm) }));

  const stationPairs = (pick: (s: StationSeason) => number | null) => near.map((x) => ({ value: pick(x.s), weight: x.w }));
  const days50Pairs = [...stationPairs((s) => s.days50), ...reports.map((r) => ({ value: r.seasonDays, weight: r.w }))];
  const days50Weight = days50Pairs.reduce((sum, p) => sum + (p.value === null ? 0 : p.weight), 0);

  const estimate: SeasonEstimate = {
    thresholdF,
    days10: weightedMean(stationPairs((s) => s.days10)),
    days50: weightedMean(days50Pairs),
    days90: weightedMean(stationPairs((s) => s.days90)),
    lastSpringDoy50: weightedMean(stationPairs((s) => s.lastSpringDoy50)),
    firstFallDoy50: weightedMean(stationPairs((s) => s.firstFallDoy50)),
    stationCount: near.length,
    reportFrostCount: reports.length,
    nearestStationKm: near.length ? round1(near[0].d) : null,
    method: '',
    stations: near.map((x) => ({
      id: x.s.id,
      name: x.s.name,
      distanceKm: round1(x.d),
      days50: x.s.days50,
      weight: x.s.days50 === null || days50Weight === 0 ? 0 : Math.round((x.w / days50Weight) * 1000) / 1000,
    })),
  };
  estimate.method = describe(estimate, input.radiusKm);
  return estimate;
}

function describe(e: SeasonEstimate, radiusKm: number): string {
  const at = `at ${e.thresholdF} °F`;
  if (e.stationCount === 0 && e.reportFrostCount === 0) {
    return `No weather station and no frost dates from growers within ${radiusKm} km, so no season length is given here.`;
  }
  if (e.days50 === null) {
    return `${e.stationCount} station(s) within ${radiusKm} km, but none has enough complete years for a season length ${at}.`;
  }
  const parts: string[] = [];
  if (e.stationCount > 0) {
    parts.push(
      `${e.stationCount} weather station${e.stationCount === 1 ? '' : 's'} within ${radiusKm} km (nearest ${e.nearestStationKm} km), weighted by 1/distance²`,
    );
  }
  if (e.reportFrostCount > 0) {
    parts.push(
      `${e.reportFrostCount} grower-reported frost season${e.reportFrostCount === 1 ? '' : 's'}, each weighing a quarter of a station at the same distance`,
    );
  }
  const onlyReports = e.stationCount === 0 ? ' Without a station, only the typical length can be given.' : '';
  return `Frost-free days ${at} from ${parts.join(' and ')}.${onlyReports}`;
}
