/**
 * The CSV (and GeoJSON) forms of harvest reports: the import columns growers fill, the conversion
 * of one text row into a candidate for createReportInputSchema, and the public export rows.
 * Pure: the server imports and exports with it, the client shows the column list and the template.
 */
import { decimalNumber } from '../schemas/text-number';
import type { Crop, FigType, GrowingForm, Outcome, PlantOrigin } from './codes';
import { toSpreadsheetCsv, type CsvColumnKind } from './spreadsheet-csv';
import { DATA_LICENCE, DATA_LICENCE_NOTICE } from './data-licence';

export interface CsvColumn {
  name: string;
  required: boolean;
  /** How the template writes its example (numbers stay numbers; text is formula-safe). */
  kind: CsvColumnKind;
  /** What to write, in plain words (shown in the README and on the import page). */
  help: string;
  example: string;
}

/** Import columns, in template order. Names are the API's field names where one exists. */
export const IMPORT_COLUMNS: CsvColumn[] = [
  { name: 'tree', kind: 'text', required: false, help: 'Your label for the tree. Rows with the same label are one tree across seasons; a label you already use adds to that tree. Empty: a new tree named after the variety.', example: 'Back fence fig' },
  { name: 'variety', kind: 'text', required: false, help: 'A catalogue variety name or synonym. Leave empty when you fill proposedVarietyName.', example: 'Lantern Amber' },
  { name: 'proposedVarietyName', kind: 'text', required: false, help: 'A name not in the catalogue yet; editors review it.', example: '' },
  { name: 'lat', kind: 'number', required: true, help: 'Latitude of the tree in decimal degrees (stays private; others see a 5 km grid).', example: '42.6526' },
  { name: 'lon', kind: 'number', required: true, help: 'Longitude in decimal degrees, negative west of Greenwich.', example: '-73.7562' },
  { name: 'form', kind: 'text', required: true, help: 'ground, container, wall or greenhouse.', example: 'ground' },
  { name: 'origin', kind: 'text', required: false, help: 'cutting, air-layer, graft, tissue-culture, seedling or unknown (default).', example: 'cutting' },
  { name: 'yearPlanted', kind: 'number', required: false, help: 'Year the tree was planted where it grows now.', example: '2020' },
  { name: 'season', kind: 'number', required: true, help: 'The season year this row describes.', example: '2025' },
  { name: 'crop', kind: 'text', required: true, help: 'breba or main.', example: 'main' },
  { name: 'outcome', kind: 'text', required: true, help: 'no-fruit, dropped, unripe or ripened.', example: 'ripened' },
  { name: 'firstRipeDate', kind: 'text', required: false, help: 'YYYY-MM-DD, only when the crop ripened.', example: '2025-09-02' },
  { name: 'lastHarvestDate', kind: 'text', required: false, help: 'YYYY-MM-DD, on or after the first ripe date.', example: '2025-10-05' },
  { name: 'springFrostDate', kind: 'text', required: false, help: 'YYYY-MM-DD of the last spring frost you saw at the tree.', example: '2025-04-28' },
  { name: 'fallFrostDate', kind: 'text', required: false, help: 'YYYY-MM-DD of the first fall frost; the latest of the four dates.', example: '2025-10-14' },
  { name: 'pinched', kind: 'text', required: false, help: 'yes or no: did you pinch the growing tips?', example: 'yes' },
  { name: 'pinchedDate', kind: 'text', required: false, help: 'YYYY-MM-DD when you pinched.', example: '2025-06-20' },
  { name: 'winterProtection', kind: 'text', required: false, help: 'Free text, up to 300 characters.', example: 'Wrapped in burlap' },
  { name: 'feeding', kind: 'text', required: false, help: 'Free text, up to 300 characters.', example: '' },
  { name: 'watering', kind: 'text', required: false, help: 'Free text, up to 300 characters.', example: 'Weekly in July' },
  { name: 'notes', kind: 'text', required: false, help: 'Free text, up to 2000 characters.', example: '' },
];

export const IMPORT_MAX_ROWS = 1000;

/** A small template with the header and one example row. */
export function importTemplateCsv(): string {
  const example = IMPORT_COLUMNS.map((c) => (c.kind === 'number' ? (c.example === '' ? null : Number(c.example)) : c.example));
  return toSpreadsheetCsv(IMPORT_COLUMNS, [example]);
}

/** One problem in one cell (or row, when column is '_'); line numbers count the header as line 1. */
export interface CsvCellError {
  line: number;
  column: string;
  message: string;
}

/** A text row turned into the shape createReportInputSchema expects, plus the variety name to look up. */
export interface CsvCandidate {
  varietyName: string | null;
  treeLabel: string | null;
  input: Record<string, unknown>;
}

const NUMBER_COLUMNS = ['lat', 'lon', 'yearPlanted', 'season'] as const;
const TRUE_WORDS = new Set(['yes', 'y', 'true', '1', 'x']);
const FALSE_WORDS = new Set(['no', 'n', 'false', '0', '']);

/**
 * Convert one CSV row (header name -> text) into a candidate input. Empty cells become absent;
 * numbers and yes/no are converted here so that the shared schema names the same column as the
 * file when something is wrong.
 */
export function csvRowToCandidate(row: Record<string, string | undefined>, line: number): { candidate: CsvCandidate; errors: CsvCellError[] } {
  const errors: CsvCellError[] = [];
  const text = (name: string) => (row[name] ?? '').trim();
  const input: Record<string, unknown> = {};
  for (const column of IMPORT_COLUMNS) {
    const value = text(column.name);
    if (column.name === 'tree' || column.name === 'variety') continue;
    if (value === '') continue;
    if ((NUMBER_COLUMNS as readonly string[]).includes(column.name)) {
      const number = decimalNumber(value);
      if (Number.isFinite(number)) input[column.name] = number;
      else errors.push({ line, column: column.name, message: `“${value}” is not a number` });
    } else if (column.name === 'pinched') {
      const word = value.toLowerCase();
      if (TRUE_WORDS.has(word)) input.pinched = true;
      else if (FALSE_WORDS.has(word)) input.pinched = false;
      else errors.push({ line, column: 'pinched', message: 'Write yes or no' });
    } else {
      input[column.name] = value;
    }
  }
  return { candidate: { varietyName: text('variety') || null, treeLabel: text('tree') || null, input }, errors };
}

/** Which CSV column a schema field's error belongs to. */
export function columnForField(field: string): string {
  if (field === 'varietyId') return 'variety';
  if (field === 'treeId' || field === 'newTreeLabel') return 'tree';
  return field;
}

/** Header names the import does not know (a typo would otherwise drop a column silently). */
export function unknownColumns(header: string[]): string[] {
  const known = new Set(IMPORT_COLUMNS.map((c) => c.name));
  return header.filter((name) => name.trim() !== '' && !known.has(name.trim()));
}

/**
 * A published report as anyone may download it: the coarse grid position only, no exact place,
 * no e-mail, no account id, no free text. `treeId` lets a reader count one tree's seasons once.
 */
export interface PublicReportRow {
  reportId: number;
  treeId: number;
  variety: string;
  varietyStatus: string;
  figType: FigType;
  season: number;
  crop: Crop;
  outcome: Outcome;
  form: GrowingForm;
  origin: PlantOrigin;
  yearPlanted: number | null;
  gridLat: number;
  gridLon: number;
  firstRipeDate: string | null;
  lastHarvestDate: string | null;
  springFrostDate: string | null;
  fallFrostDate: string | null;
  pinched: boolean;
}

/** The public export's columns, in order, each with its kind (numbers stay numbers in a spreadsheet). */
const EXPORT_COLUMN_KINDS: { [K in keyof PublicReportRow]: CsvColumnKind } = {
  reportId: 'number', treeId: 'number', variety: 'text', varietyStatus: 'text', figType: 'text', season: 'number', crop: 'text', outcome: 'text',
  form: 'text', origin: 'text', yearPlanted: 'number', gridLat: 'number', gridLon: 'number', firstRipeDate: 'text', lastHarvestDate: 'text',
  springFrostDate: 'text', fallFrostDate: 'text', pinched: 'boolean',
};
export const EXPORT_COLUMNS = Object.keys(EXPORT_COLUMN_KINDS) as (keyof PublicReportRow)[];

/** Public rows as the CSV download (shared/domain/spreadsheet-csv.ts: formula-safe text, numbers as numbers). */
export function publicRowsToCsv(rows: PublicReportRow[]): string {
  return toSpreadsheetCsv(
    EXPORT_COLUMNS.map((name) => ({ name, kind: EXPORT_COLUMN_KINDS[name] })),
    rows.map((row) => EXPORT_COLUMNS.map((column) => row[column])),
  );
}

/** Public rows as a GeoJSON FeatureCollection of points at the grid cell centres (lon, lat order). */
export function publicRowsToGeoJson(rows: PublicReportRow[]) {
  return {
    type: 'FeatureCollection' as const,
    // Foreign members (RFC 7946 §6.1): the licence and credit travel with the file.
    licence: { name: DATA_LICENCE.name, title: DATA_LICENCE.title, url: DATA_LICENCE.url },
    attribution: DATA_LICENCE.attribution,
    notice: DATA_LICENCE_NOTICE,
    features: rows.map(({ gridLat, gridLon, ...properties }) => ({
      type: 'Feature' as const,
      id: properties.reportId,
      geometry: { type: 'Point' as const, coordinates: [gridLon, gridLat] },
      properties,
    })),
  };
}
