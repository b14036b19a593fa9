import { describe, expect, it } from 'vitest';
import { importErrorsByLine } from '../../src/features/reports/api';

describe('import error list', () => {
  it('groups the server’s rows.<line>.<column> fields by line, in line order', () => {
    const grouped = importErrorsByLine({
      'rows.12.season': ['Enter the season year, like 2025'],
      'rows.3.form': ['Choose how the tree grows'],
      'rows.3._': ['Too many fields'],
      lat: ['not a row field'],
    });
    expect(grouped).toEqual([
      { line: 3, problems: [{ column: 'form', messages: ['Choose how the tree grows'] }, { column: '(whole row)', messages: ['Too many fields'] }] },
      { line: 12, problems: [{ column: 'season', messages: ['Enter the season year, like 2025'] }] },
    ]);
  });
});
