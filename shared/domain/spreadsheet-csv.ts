import Papa from 'papaparse';

/*
 * Every CSV the app writes goes through toSpreadsheetCsv, so that no cell a grower or editor typed
 * can run as a formula when the file is opened in a spreadsheet (OWASP "CSV Injection"; ASVS
 * 1.2.10). The rule is decided by the column's kind, not by the cell's look:
 *  - a `number` column holds numbers and is written as a bare number (a negative longitude stays
 *    the number -73.775, never text); anything else in it is a programming error and throws;
 *  - a `boolean` column is written true/false;
 *  - a `text` column is always quoted (RFC 4180) and neutralised: a cell starting with = + - @,
 *    a tab, a carriage return or a line feed, or holding a line break anywhere, gets a leading
 *    apostrophe (the spreadsheets' "this is text" mark), and so does every line inside the cell
 *    that starts with one of = + - @ tab (a reader that splits the cell at its line breaks then
 *    still sees no formula). A leading apostrophe is itself escaped the same way, so reading back
 *    with restoreNeutralisedText gives exactly the original text.
 */

export type CsvColumnKind = 'text' | 'number' | 'boolean';
export interface SpreadsheetColumn {
  name: string;
  kind: CsvColumnKind;
}
export type CsvCellValue = string | number | boolean | null | undefined;

/** Characters that make a spreadsheet read a cell as a formula (or hide one), at the cell's start. */
const CELL_START = /^[=+\-@\t\r\n']/;
/** The same at the start of a line inside a cell (line breaks themselves are handled by CELL_START and BREAK). */
const LINE_START = /(\r\n|\r|\n)([=+\-@\t'])/g;
const NEUTRALISED_LINE_START = /(\r\n|\r|\n)'([=+\-@\t'])/g;
const BREAK = /[\r\n]/;

/** A text cell as it may safely be written (see the module comment). */
export function neutraliseFormulaText(text: string): string {
  if (text === '') return text;
  const lines = text.replace(LINE_START, "$1'$2");
  return CELL_START.test(text) || BREAK.test(text) ? `'${lines}` : lines;
}

/** The original text of a cell written by neutraliseFormulaText (for importers of our own files). */
export function restoreNeutralisedText(cell: string): string {
  if (!cell.startsWith("'")) return cell;
  const rest = cell.slice(1);
  if (!CELL_START.test(rest) && !BREAK.test(rest)) return cell;
  return rest.replace(NEUTRALISED_LINE_START, '$1$2');
}

function cellFor(column: SpreadsheetColumn, value: CsvCellValue): string | number | boolean {
  if (value === null || value === undefined) return '';
  switch (column.kind) {
    case 'number':
      if (typeof value !== 'number' || !Number.isFinite(value)) throw new Error(`CSV column ${column.name} is numeric but got ${JSON.stringify(value)}`);
      return value;
    case 'boolean':
      if (typeof value !== 'boolean') throw new Error(`CSV column ${column.name} is true/false but got ${JSON.stringify(value)}`);
      return value;
    case 'text':
      return neutraliseFormulaText(String(value));
  }
}

/** A CSV (RFC 4180, CRLF, a final line break) of the rows, one value per column, safe to open in a spreadsheet. */
export function toSpreadsheetCsv(columns: readonly SpreadsheetColumn[], rows: readonly (readonly CsvCellValue[])[]): string {
  // Column names are the app's own identifiers, written bare.
  for (const c of columns) if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(c.name)) throw new Error(`CSV column name ${JSON.stringify(c.name)} is not a plain identifier`);
  const header = columns.map((c) => c.name).join(',');
  if (rows.length === 0) return `${header}\r\n`;
  const data = rows.map((row) => columns.map((column, i) => cellFor(column, row[i])));
  // Text cells quoted (OWASP: wrap each text cell in double quotes), numbers and booleans bare.
  const body = Papa.unparse(data, { quotes: columns.map((c) => c.kind === 'text'), quoteChar: '"', escapeChar: '"', newline: '\r\n', escapeFormulae: false, header: false });
  return `${header}\r\n${body}\r\n`;
}
