import Papa from 'papaparse';
import { epochDay } from './frost';

/**
 * Reading a station's daily temperatures from CSV. Three layouts are understood:
 *
 * 1. GHCN-Daily as NOAA NCEI exports it: `YYYY,MM,DD,TMAX,TMIN,...`, °C, `-9999` = missing
 *    (tests/fixtures/ghcnd-USW00014735-daily.csv).
 * 2. The year/month/day layout: `year,month,day,date,day_of_year,...,TMAX,TMIN`, °F, `NA` = missing
 *    (tests/fixtures/ghcnd-USW00014839-daily.csv). The `date` column is used when present.
 * 3. Simple: `date,tmin[,tmax]` with ISO dates (YYYY-MM-DD).
 *
 * Unit: a unit written in the column name (`tmin_c`, `TMIN (°F)`, `tmin_degf`) wins; otherwise
 * `options.unit`; otherwise the layout's own unit (°C for 1, °F for 2). A simple file with no unit
 * anywhere is refused with an error. A header unit that contradicts `options.unit` is an error.
 *
 * Missing values (empty, `NA`, `N/A`, `M`, `-9999`) are skipped, not errors: a day without a minimum
 * is left out, a day without a maximum gets `tmaxC: null`. A non-numeric value, an impossible date,
 * a temperature outside -90..60 °C or a repeated date is an error naming the row (1 = the header
 * line) and the column. Days come back in date order; values in °C rounded to 0.01.
 */

export type StationDay = { date: string; tminC: number; tmaxC: number | null };
export type StationCsvError = { row: number; column: string; message: string };
export type StationCsvResult = {
  days: StationDay[];
  errors: StationCsvError[];
  /** The unit the values were read in (null when it could not be decided). */
  unit: 'C' | 'F' | null;
  format: 'ghcn' | 'year-month-day' | 'simple' | null;
};

/** At most this many errors are listed; one last line says how many more there were. */
export const MAX_LISTED_ERRORS = 200;

const MISSING = new Set(['', 'na', 'n/a', 'm', 'nan', 'null']);
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

type Column = { index: number; name: string; unit: 'C' | 'F' | null };

/** Find a temperature column (tmin or tmax) and any unit written in its name. */
function findTempColumn(header: string[], kind: 'min' | 'max'): Column | null {
  const re = new RegExp(`^(t${kind}|${kind}|${kind}imum|${kind}temp|${kind}temperature)(deg)?([cf])?$`);
  for (let i = 0; i < header.length; i++) {
    const m = re.exec(header[i].toLowerCase().replace(/[^a-z]/g, ''));
    if (m) return { index: i, name: header[i], unit: m[3] ? (m[3].toUpperCase() as 'C' | 'F') : null };
  }
  return null;
}

function cToTidy(c: number): number {
  return Math.round(c * 100) / 100;
}

/** Parse station CSV text (see the module comment for layouts, units and errors). */
export function parseStationCsv(text: string, options: { unit?: 'C' | 'F' } = {}): StationCsvResult {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const rows = parsed.data;
  const errors: StationCsvError[] = [];
  const fail = (message: string, column = ''): StationCsvResult => ({ days: [], errors: [{ row: 1, column, message }], unit: null, format: null });
  if (rows.length === 0 || rows[0].every((c) => c.trim() === '')) return fail('The file is empty.');

  const header = rows[0].map((h) => h.trim());
  const lower = header.map((h) => h.toLowerCase());
  const at = (name: string) => lower.indexOf(name);
  const tmin = findTempColumn(header, 'min');
  const tmax = findTempColumn(header, 'max');
  if (!tmin) return fail('No minimum temperature column (for example TMIN or tmin).', 'tmin');

  let format: StationCsvResult['format'];
  let layoutUnit: 'C' | 'F' | null;
  if (header.includes('YYYY') && header.includes('MM') && header.includes('DD')) {
    format = 'ghcn';
    layoutUnit = 'C';
  } else if (at('year') >= 0 && at('month') >= 0 && at('day') >= 0) {
    format = 'year-month-day';
    layoutUnit = 'F';
  } else if (at('date') >= 0) {
    format = 'simple';
    layoutUnit = null;
  } else {
    return fail('No date columns: expected YYYY,MM,DD or year,month,day or date.', 'date');
  }

  const headerUnit = tmin.unit ?? tmax?.unit ?? null;
  if (headerUnit && options.unit && headerUnit !== options.unit) {
    return fail(`The column ${tmin.unit ? tmin.name : tmax!.name} says °${headerUnit} but °${options.unit} was chosen.`, tmin.name);
  }
  const unit = headerUnit ?? options.unit ?? layoutUnit;
  if (!unit) return { ...fail('Say whether the temperatures are in °C or °F (choose a unit, or name the column tmin_c or tmin_f).', tmin.name), format };
  const toC = unit === 'F' ? (v: number) => ((v - 32) * 5) / 9 : (v: number) => v;

  const dateIdx = at('date');
  const ymd =
    format === 'ghcn'
      ? [header.indexOf('YYYY'), header.indexOf('MM'), header.indexOf('DD')]
      : format === 'year-month-day'
        ? [at('year'), at('month'), at('day')]
        : null;
  const dateColumn = format === 'ghcn' ? 'YYYY/MM/DD' : dateIdx >= 0 ? header[dateIdx] : `${header[ymd![0]]}/${header[ymd![1]]}/${header[ymd![2]]}`;

  const seen = new Map<string, number>();
  const days: StationDay[] = [];
  let moreErrors = 0;
  const addError = (row: number, column: string, message: string) => {
    if (errors.length < MAX_LISTED_ERRORS) errors.push({ row, column, message });
    else moreErrors++;
  };

  for (let i = 1; i < rows.length; i++) {
    const cells = rows[i];
    const row = i + 1;
    if (cells.every((c) => c.trim() === '')) continue;
    const cell = (idx: number) => (cells[idx] ?? '').trim();

    let date: string;
    if (dateIdx >= 0) date = cell(dateIdx);
    else {
      const [y, m, d] = ymd!.map(cell);
      date = `${y.padStart(4, '0')}-${m.padStart(2, '0')}-${d.padStart(2, '0')}`;
    }
    if (epochDay(date) === null) {
      addError(row, dateColumn, `“${date}” is not a real date (use YYYY-MM-DD).`);
      continue;
    }

    const read = (col: Column): number | null | 'bad' => {
      const raw = cell(col.index);
      if (MISSING.has(raw.toLowerCase())) return null;
      if (!NUMBER.test(raw)) {
        addError(row, col.name, `“${raw}” is not a number.`);
        return 'bad';
      }
      const v = Number(raw);
      if (v === -9999) return null;
      const c = toC(v);
      if (c < -90 || c > 60) {
        addError(row, col.name, `${raw} °${unit} is outside the possible range (-90 to 60 °C).`);
        return 'bad';
      }
      return cToTidy(c);
    };
    const lo = read(tmin);
    const hi = tmax ? read(tmax) : null;
    if (lo === 'bad' || hi === 'bad') continue;

    const first = seen.get(date);
    if (first !== undefined) {
      addError(row, dateColumn, `${date} appears twice (first on row ${first}).`);
      continue;
    }
    seen.set(date, row);
    if (lo === null) continue; // a day without a minimum is simply missing
    days.push({ date, tminC: lo, tmaxC: hi });
  }
  if (moreErrors > 0) errors.push({ row: rows.length, column: '', message: `${moreErrors} more errors not listed.` });
  days.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  return { days, errors, unit, format };
}
