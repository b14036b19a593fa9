import type { SeasonEstimate } from '../schemas/atlas';
import type { FreezeNote } from './climate-normals';
import { distanceKm, type LatLon } from './geo';
import { hardinessZone } from './hardiness';

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
 *
 * Stations are of two kinds (`source`): computed from a station's own daily record, or NOAA's
 * climate normals (server/normals). A normals station gives the short year (its 90 % growing-season
 * length, reached in 9 years of 10) and the typical year (50 %); it has no long-year figure. A
 * normals station that never freezes (-6666) counts as a 365-day season; one where a freeze can
 * come in any month (-4444) has no season and no dates, and the answer says so in words.
 *
 * Heat (`gdd50F`, growing degree days base 50 °F in a typical year) and the hardiness basis (the
 * average annual extreme minimum) are weighted the same way over the stations that have them:
 * heat from daily maxima and minima where a station has them, else from the normals' figure.
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
  /** The station's own id (a GHCN id for NOAA stations). */
  code?: string | null;
  /** Where the figures come from: the station's daily record, or NOAA's climate normals. */
  source?: 'daily' | 'normals';
  /** The years the figures cover, e.g. "1981-2010" (normals) or "1991-2025" (a daily record). */
  period?: string | null;
  /** Normals' special values: never freezes (-6666) or a freeze in any month (-4444). */
  freezeNote?: FreezeNote;
  /** Growing degree days base 50 °F in a typical year (°F-days). */
  gdd50F?: number | null;
  /** Average annual extreme minimum, °C (daily records only). */
  extremeMinC?: number | null;
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
  /** Results are rounded to 1 / `scale` (whole days by default). */
  constructor(private readonly scale = 1) {}
  add(value: number | null, weight: number): void {
    if (value === null || !Number.isFinite(value)) return;
    this.sum += value * weight;
    this.weight += weight;
  }
  get totalWeight(): number {
    return this.weight;
  }
  result(): number | null {
    return this.weight > 0 ? Math.round((this.sum / this.weight) * this.scale) / this.scale : null;
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
  const heat = new WeightedMean();
  const extremeMin = new WeightedMean(10);
  let heatStations = 0;
  let coldStations = 0;
  for (const { s, w } of near) {
    days10.add(s.days10, w);
    days50.add(s.days50, w);
    days90.add(s.days90, w);
    lastSpring.add(s.lastSpringDoy50, w);
    firstFall.add(s.firstFallDoy50, w);
    if (s.gdd50F != null) heatStations++;
    heat.add(s.gdd50F ?? null, w);
    if (s.extremeMinC != null) coldStations++;
    extremeMin.add(s.extremeMinC ?? null, w);
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
    freezeNote: freezeNoteOf(near.map((x) => x.s)),
    gdd50F: heat.result(),
    heatStationCount: heatStations,
    extremeMinF: extremeMinF(extremeMin.result()),
    hardinessZone: null,
    coldStationCount: coldStations,
    sources: sourcesOf(near.map((x) => x.s)),
    method: '',
    stations: near.map(({ s, d, w }) => ({
      id: s.id,
      name: s.name,
      code: s.code ?? null,
      source: s.source ?? 'daily',
      period: s.period ?? null,
      freezeNote: s.freezeNote ?? null,
      distanceKm: round1(d),
      days50: s.days50,
      gdd50F: s.gdd50F ?? null,
      weight: s.days50 === null || days50.totalWeight === 0 ? 0 : Math.round((w / days50.totalWeight) * 1000) / 1000,
    })),
  };
  estimate.hardinessZone = estimate.extremeMinF === null ? null : hardinessZone(estimate.extremeMinF).zone;
  estimate.method = describe(estimate, input.radiusKm);
  return estimate;
}

const extremeMinF = (c: number | null) => (c === null ? null : Math.round(((c * 9) / 5 + 32) * 10) / 10);

/**
 * "never" when every station in range with a season is frost-free all year, "any-month" when every
 * station in range has no frost-free season: then the answer gives no date, and says why.
 */
function freezeNoteOf(stations: StationSeason[]): FreezeNote {
  if (stations.length === 0) return null;
  if (stations.every((s) => s.freezeNote === 'any-month')) return 'any-month';
  const withSeason = stations.filter((s) => s.days50 !== null);
  if (withSeason.length > 0 && withSeason.every((s) => s.freezeNote === 'never')) return 'never';
  return null;
}

/** Which kinds of station the figures use, with their periods: "NOAA normals 1981-2010 (3), daily records 1991-2025 (1)". */
function sourcesOf(stations: StationSeason[]): SeasonEstimate['sources'] {
  const groups = new Map<string, { source: 'daily' | 'normals'; period: string | null; stations: number }>();
  for (const s of stations) {
    const source = s.source ?? 'daily';
    const key = `${source}|${s.period ?? ''}`;
    const g = groups.get(key) ?? { source, period: s.period ?? null, stations: 0 };
    g.stations++;
    groups.set(key, g);
  }
  return [...groups.values()].sort((a, b) => (a.source === b.source ? (a.period ?? '').localeCompare(b.period ?? '') : a.source === 'daily' ? -1 : 1));
}

/** The sources in words, for the method line. */
export function sourcesWords(sources: SeasonEstimate['sources']): string {
  return sources
    .map((g) =>
      g.source === 'normals'
        ? `NOAA climate normals ${g.period ?? ''} (${g.stations} station${g.stations === 1 ? '' : 's'})`
        : `daily records${g.period ? ` ${g.period}` : ''} (${g.stations} station${g.stations === 1 ? '' : 's'})`,
    )
    .join(', ');
}

function describe(e: SeasonEstimate, radiusKm: number): string {
  const at = `at ${e.thresholdF} °F`;
  if (e.stationCount === 0 && e.reportFrostCount === 0) {
    return `No weather station and no frost dates from growers within ${radiusKm} km, so no season length is given here.`;
  }
  if (e.freezeNote === 'any-month') {
    return `No frost-free season defined: at the ${e.stationCount === 1 ? 'station' : `${e.stationCount} stations`} within ${radiusKm} km a freeze ${at} can come in any month (${sourcesWords(e.sources)}).`;
  }
  if (e.days50 === null) {
    return `${e.stationCount} station(s) within ${radiusKm} km, but none gives a season length ${at} (too few complete years, or only heat figures).`;
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
  const from = e.stationCount > 0 ? ` Stations: ${sourcesWords(e.sources)}.` : '';
  const never = e.freezeNote === 'never' ? ' Frost-free all year: the stations record no freeze, so no frost date is given.' : '';
  return `Frost-free days ${at} from ${parts.join(' and ')}.${from}${never}${onlyReports}`;
}
