import { FREEZE_THRESHOLDS_F, PROBABILITY_LEVELS } from '../../shared/domain/codes';
import { freezeSummary, freezeYears, thresholdFToC, type Hemisphere } from '../../shared/domain/frost';
import { parseStationCsv, type StationCsvError } from '../../shared/domain/station-csv';
import type { StationDetail, StationUnit } from '../../shared/schemas/stations';
import { HttpError } from '../lib/http-error';
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
  return { days: parsed.days, ...computeFreezeTables(parsed.days, lat) };
}
