import { FREEZE_THRESHOLDS_F, PROBABILITY_LEVELS } from '../../shared/domain/codes';
import { freezeSummary, freezeYears, thresholdFToC, type Hemisphere } from '../../shared/domain/frost';
import type { StationDetail } from '../../shared/schemas/stations';
import type { StationData, StationDayRow } from './stations.repo';

/** The hemisphere decides where a station's season-year starts (see shared/domain/frost.ts). */
export const hemisphereAt = (lat: number): Hemisphere => (lat < 0 ? 'south' : 'north');

/**
 * Per-year freeze dates at 32, 28 and 24 deg F and the 10/50/90 % summaries, shaped for storage.
 * Only complete years are kept, the same years the summaries rest on.
 */
export function computeFreezeTables(days: StationDayRow[], lat: number): Pick<StationData, 'freezeYears' | 'summaries'> {
  const hemisphere = hemisphereAt(lat);
  const years: StationDetail['freezeYears'] = [];
  const summaries: StationDetail['summaries'] = [];
  for (const thresholdF of FREEZE_THRESHOLDS_F) {
    const perYear = freezeYears(days, thresholdFToC(thresholdF), { hemisphere });
    for (const y of perYear) if (y.complete) years.push({ thresholdF, year: y.year, lastSpringDoy: y.lastSpringDoy, firstFallDoy: y.firstFallDoy, seasonDays: y.seasonDays });
    for (const s of freezeSummary(perYear, [...PROBABILITY_LEVELS])) summaries.push({ thresholdF, ...s });
  }
  return { freezeYears: years, summaries };
}
