import Papa from 'papaparse';
import { decimalNumber } from '../schemas/text-number';
import { restoreNeutralisedText, toSpreadsheetCsv, type CsvColumnKind } from './spreadsheet-csv';
import { CATALOGUE_CSV_COLUMNS, varietyInputSchema, type Variety, type VarietyInput } from '../schemas/varieties';

/** One problem of an import, in words an editor can act on. Row numbers count the header as row 1. */
export interface CsvProblem {
  row: number;
  column: string;
  message: string;
}

const TRUE = new Set(['true', 'yes', 'y', '1']);
const FALSE = new Set(['false', 'no', 'n', '0', '']);

const COLUMN_KINDS: Record<(typeof CATALOGUE_CSV_COLUMNS)[number], CsvColumnKind> = {
  name: 'text', synonyms: 'text', figType: 'text', bearsBreba: 'boolean', bearsMain: 'boolean', ripeningClass: 'text', typicalDaysToRipen: 'number', notes: 'text', sources: 'text',
};

/**
 * The catalogue as CSV, one row per variety, through the one formula-safe writer
 * (shared/domain/spreadsheet-csv.ts); the import below reads its neutralised cells back unchanged.
 */
export function catalogueToCsv(varieties: Pick<Variety, (typeof CATALOGUE_CSV_COLUMNS)[number]>[]): string {
  return toSpreadsheetCsv(
    CATALOGUE_CSV_COLUMNS.map((name) => ({ name, kind: COLUMN_KINDS[name] })),
    varieties.map((v) => [v.name, v.synonyms.join('; '), v.figType, v.bearsBreba, v.bearsMain, v.ripeningClass, v.typicalDaysToRipen, v.notes, v.sources]),
  );
}

/**
 * Read a catalogue CSV into variety inputs. All or nothing: any problem in any row means no rows
 * come back, only the list of problems (row, column, message).
 */
export function parseCatalogueCsv(text: string): { ok: true; rows: VarietyInput[] } | { ok: false; problems: CsvProblem[] } {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim(), transform: restoreNeutralisedText });
  const problems: CsvProblem[] = [];
  const header = parsed.meta.fields ?? [];
  for (const column of ['name', 'figType', 'bearsBreba', 'bearsMain'] as const) {
    if (!header.includes(column)) problems.push({ row: 1, column, message: `The header has no “${column}” column` });
  }
  for (const error of parsed.errors) problems.push({ row: (error.row ?? 0) + 2, column: '_', message: error.message });
  if (problems.length) return { ok: false, problems };

  const rows: VarietyInput[] = [];
  const names = new Map<string, number>();
  parsed.data.forEach((record, index) => {
    const row = index + 2;
    const bool = (column: 'bearsBreba' | 'bearsMain'): boolean | undefined => {
      const value = (record[column] ?? '').trim().toLowerCase();
      if (TRUE.has(value)) return true;
      if (FALSE.has(value)) return false;
      problems.push({ row, column, message: `Use true or false, not “${record[column]}”` });
      return undefined;
    };
    const days = (record.typicalDaysToRipen ?? '').trim();
    const candidate = {
      name: record.name ?? '',
      synonyms: (record.synonyms ?? '').split(';').map((s) => s.trim()).filter(Boolean),
      figType: (record.figType ?? '').trim(),
      bearsBreba: bool('bearsBreba'),
      bearsMain: bool('bearsMain'),
      ripeningClass: (record.ripeningClass ?? '').trim() || null,
      typicalDaysToRipen: days === '' ? null : decimalNumber(days),
      notes: record.notes ?? '',
      sources: record.sources ?? '',
    };
    const result = varietyInputSchema.safeParse(candidate);
    if (!result.success) {
      for (const issue of result.error.issues) {
        const column = String(issue.path[0] ?? '_');
        // a bad boolean is already reported in plain words above
        if ((column === 'bearsBreba' || column === 'bearsMain') && candidate[column] === undefined) continue;
        problems.push({ row, column, message: issue.message });
      }
      return;
    }
    const key = result.data.name.toLowerCase();
    const earlier = names.get(key);
    if (earlier) problems.push({ row, column: 'name', message: `“${result.data.name}” is already on row ${earlier}` });
    names.set(key, row);
    rows.push(result.data);
  });
  return problems.length ? { ok: false, problems } : { ok: true, rows };
}
