import { FREEZE_THRESHOLDS_F, PROBABILITY_LEVELS } from '../../shared/domain/codes';
import { freezeSummary, freezeYears, thresholdFToC, type FreezeComparison, type Hemisphere } from '../../shared/domain/frost';
import { yearlyHeat } from '../../shared/domain/gdd';
import { averageExtremeMinC } from '../../shared/domain/hardiness';
import { parseStationCsv, type StationCsvError } from '../../shared/domain/station-csv';
import type { StationDetail, StationUnit } from '../../shared/schemas/stations';
import { HttpError } from '../lib/http-error';
import type { StationData, StationDayRow } from './stations.repo';

/** The hemisphere decides where a station's season-year starts (see shared/domain/frost.ts). */
export const hemisphereAt = (lat: number): Hemisphere => (lat < 0 ? 'south' : 'north');

/**
 * Per-year freeze dates at 32, 28 and 24 deg F and the 10/50/90 % summaries, shaped for storage,
 * with the station's heat and winter cold. Years left out for missing days are kept with the reason
 * (the summaries rest on the complete years only). `comparison`: 'ghcn-tenths' for GHCN-Daily files
 * (whole-°F readings stored at 0.1 °C), else readings are compared exactly (shared/domain/frost.ts).
 */
export function computeFreezeTables(days: StationDayRow[], lat: number, comparison: FreezeComparison = 'exact'): Omit<StationData, 'days'> {
  const hemisphere = hemisphereAt(lat);
  const years: StationDetail['freezeYears'] = [];
  const summaries: StationDetail['summaries'] = [];
  for (const thresholdF of FREEZE_THRESHOLDS_F) {
    const perYear = freezeYears(days, thresholdFToC(thresholdF), { hemisphere, comparison });
    for (const y of perYear) {
      years.push({ thresholdF, year: y.year, lastSpringDoy: y.lastSpringDoy, firstFallDoy: y.firstFallDoy, seasonDays: y.seasonDays, leftOutReason: y.complete ? null : (y.leftOutReason ?? 'too many missing days') });
    }
    for (const s of freezeSummary(perYear, [...PROBABILITY_LEVELS], { hemisphere })) summaries.push({ thresholdF, ...s });
  }
  const heat = yearlyHeat(days, { hemisphere });
  const cold = averageExtremeMinC(days, { hemisphere });
  return {
    freezeYears: years,
    summaries,
    climate: { gdd50F: heat.gdd50F, gddYears: heat.years, extremeMinC: cold.averageC === null ? null : Math.round(cold.averageC * 100) / 100, extremeMinWinters: cold.winters },
  };
}

/** One readable line per problem: "Row 12, column TMIN: “abc” is not a number." */
export function describeCsvError(error: StationCsvError): string {
  return error.column ? `Row ${error.row}, column ${error.column}: ${error.message}` : `Row ${error.row}: ${error.message}`;
}

/**
 * Read an uploaded station file and compute its freeze tables. Any bad row rejects the whole file:
 * a 400 whose `fields.file` lists each row and column, before anything is written.
 */
export function computeStationData(text: string, unit: StationUnit | undefined, lat: number): StationData {
  const parsed = parseStationCsv(text, { unit });
  if (parsed.errors.length > 0) {
    const count = parsed.errors.length;
    throw new HttpError(400, 'invalid_csv', `The file was not loaded: ${count === 1 ? 'one row has a problem' : `${count} rows have problems`}. Nothing was changed.`, {
      file: parsed.errors.map(describeCsvError),
    });
  }
  if (parsed.days.length === 0) {
    throw new HttpError(400, 'invalid_csv', 'The file has no day with a minimum temperature. Nothing was changed.', { file: ['The file has no day with a minimum temperature.'] });
  }
  return { days: parsed.days, ...computeFreezeTables(parsed.days, lat, parsed.format === 'ghcn' ? 'ghcn-tenths' : 'exact') };
}
