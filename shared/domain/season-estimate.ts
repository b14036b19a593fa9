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

/** A weighted mean that skips missing values; null when nothing had a value. */
class WeightedMean {
  private sum = 0;
  private weight = 0;
  add(value: number | null, weight: number): void {
    if (value === null || !Number.isFinite(value)) return;
    this.sum += value * weight;
    this.weight += weight;
  }
  get totalWeight(): number {
    return this.weight;
  }
  result(): number | null {
    return this.weight > 0 ? Math.round(this.sum / this.weight) : null;
  }
}

/** The season estimate in the wire shape (see the module comment for the method). */
export function estimateSeason(input: SeasonEstimateInput): SeasonEstimate {
  const thresholdF = input.thresholdF ?? 32;
  const near = input.stations
    .map((s) => ({ s, d: distanceKm(input.point, s) }))
    .filter((x) => x.d <= input.radiusKm)
    .sort((a, b) => a.d - b.d || a.s.id - b.s.id)
    .map((x) => ({ ...x, w: idw(x.d) }));
  // Sums in loops, not arrays of pairs: hundreds of grower seasons at a wide radius.
  const days10 = new WeightedMean();
  const days50 = new WeightedMean();
  const days90 = new WeightedMean();
  const lastSpring = new WeightedMean();
  const firstFall = new WeightedMean();
  for (const { s, w } of near) {
    days10.add(s.days10, w);
    days50.add(s.days50, w);
    days90.add(s.days90, w);
    lastSpring.add(s.lastSpringDoy50, w);
    firstFall.add(s.firstFallDoy50, w);
  }
  let reportFrostCount = 0;
  for (const r of input.reportFrostSeasons) {
    if (r.distanceKm > input.radiusKm || !Number.isFinite(r.seasonDays)) continue;
    reportFrostCount++;
    days50.add(r.seasonDays, REPORT_WEIGHT_FACTOR * idw(r.distanceKm));
  }

  const estimate: SeasonEstimate = {
    thresholdF,
    days10: days10.result(),
    days50: days50.result(),
    days90: days90.result(),
    lastSpringDoy50: lastSpring.result(),
    firstFallDoy50: firstFall.result(),
    stationCount: near.length,
    reportFrostCount,
    nearestStationKm: near.length ? round1(near[0].d) : null,
    method: '',
    stations: near.map(({ s, d, w }) => ({
      id: s.id,
      name: s.name,
      distanceKm: round1(d),
      days50: s.days50,
      weight: s.days50 === null || days50.totalWeight === 0 ? 0 : Math.round((w / days50.totalWeight) * 1000) / 1000,
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
