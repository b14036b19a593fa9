import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { catalogueToCsv, parseCatalogueCsv } from '../../shared/domain/variety-csv';
import { auditChanges } from '../../shared/domain/audit-diff';

const header = 'name,synonyms,figType,bearsBreba,bearsMain,ripeningClass,typicalDaysToRipen,notes,sources';

describe('catalogue CSV', () => {
  it('round-trips the export through the import, quoting commas and line breaks (RFC 4180)', () => {
    const variety = { name: 'Test, Black', synonyms: ['TB', 'Black T'], figType: 'common' as const, bearsBreba: true, bearsMain: true, ripeningClass: 'mid' as const, typicalDaysToRipen: 150, notes: 'Line one\nline two "quoted"', sources: 'A handbook, p. 3' };
    const csv = catalogueToCsv([variety]);
    expect(csv.split('\r\n')[0]).toBe(header);
    const parsed = parseCatalogueCsv(csv);
    expect(parsed).toEqual({ ok: true, rows: [variety] });
  });

  it('guards cells a spreadsheet would run as formulas, and reads them back unchanged', () => {
    // OWASP "CSV Injection": prefix cells starting with = + - @ tab or CR with a single quote
    const variety = { name: 'Guarded', synonyms: [], figType: 'unknown' as const, bearsBreba: false, bearsMain: true, ripeningClass: null, typicalDaysToRipen: null, notes: '=HYPERLINK("http://example.test")', sources: '-1 page' };
    const csv = catalogueToCsv([variety]);
    expect(csv).toContain(`"'=HYPERLINK(""http://example.test"")"`);
    expect(csv).toContain("'-1 page");
    expect(parseCatalogueCsv(csv)).toEqual({ ok: true, rows: [variety] });
  });

  it('reports every bad cell by row and column, and returns no rows at all', () => {
    const csv = [header, 'Good One,,common,true,true,early,120,,Some source', 'Bad Type,,purple,maybe,true,,,,', ',,common,true,true,,30,,x'].join('\n');
    const parsed = parseCatalogueCsv(csv);
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    const cells = parsed.problems.map((p) => `${p.row}:${p.column}`);
    expect(cells).toEqual(expect.arrayContaining(['3:bearsBreba', '3:figType', '4:name', '4:typicalDaysToRipen']));
    expect(cells).not.toContain('2:name');
    expect(parsed.problems.find((p) => p.column === 'bearsBreba')!.message).toBe('Use true or false, not “maybe”');
  });

  it('names a missing column and a name repeated in the file', () => {
    const missing = parseCatalogueCsv('name,figType\nA,common');
    expect(!missing.ok && missing.problems.map((p) => p.column)).toEqual(['bearsBreba', 'bearsMain']);
    const twice = parseCatalogueCsv([header, 'Alpha,,unknown,false,true,,,,', 'alpha,,unknown,false,true,,,,'].join('\n'));
    expect(!twice.ok && twice.problems).toEqual([{ row: 3, column: 'name', message: '“alpha” is already on row 2' }]);
  });

  it('parses what papaparse writes for an empty optional column', () => {
    expect(Papa.unparse([{ a: null }])).toBe('a\r\n');
  });
});

describe('auditChanges', () => {
  it('lists only the keys that changed, readably', () => {
    expect(auditChanges({ name: 'A', notes: '', synonyms: ['x'] }, { name: 'B', notes: '', synonyms: ['x', 'y'] })).toEqual([
      { key: 'name', before: 'A', after: 'B' },
      { key: 'synonyms', before: '["x"]', after: '["x","y"]' },
    ]);
    expect(auditChanges(null, { role: 'editor' })).toEqual([{ key: 'role', before: '—', after: 'editor' }]);
  });
});
