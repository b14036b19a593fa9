import { describe, expect, it } from 'vitest';
import { reportRuleIssues } from '../../shared/domain/report-rules';
import { createReportInputSchema } from '../../shared/schemas/reports';

const base = { season: 2024, outcome: 'ripened' };

describe('report date order', () => {
  // The order of a fig season (spring frost, ripening, harvest, fall frost) is common practice, no source.
  it('accepts dates in order, with first ripe and last harvest on the same day', () => {
    expect(reportRuleIssues({ ...base, springFrostDate: '2024-04-28', firstRipeDate: '2024-09-02', lastHarvestDate: '2024-09-02', fallFrostDate: '2024-10-14' })).toEqual([]);
  });

  it('puts the problem on the later field, and skips over missing dates', () => {
    expect(reportRuleIssues({ ...base, springFrostDate: '2024-05-01', fallFrostDate: '2024-04-30' })).toEqual([
      { field: 'fallFrostDate', message: 'The first fall frost must come after the last spring frost (2024-05-01)' },
    ]);
    expect(reportRuleIssues({ ...base, springFrostDate: '2024-05-01', firstRipeDate: '2024-05-01' })[0]?.field).toBe('firstRipeDate');
  });

  it('wants every date in the season year and ripe dates only for a crop that ripened', () => {
    const issues = reportRuleIssues({ ...base, outcome: 'unripe', firstRipeDate: '2024-09-01', fallFrostDate: '2025-10-01' });
    expect(issues.map((i) => i.field).sort()).toEqual(['fallFrostDate', 'firstRipeDate']);
  });

  it('checks the planting year and the pinch date', () => {
    expect(reportRuleIssues({ ...base, yearPlanted: 2025 }).map((i) => i.field)).toEqual(['yearPlanted']);
    expect(reportRuleIssues({ ...base, pinched: false, pinchedDate: '2024-06-01' }).map((i) => i.field)).toEqual(['pinchedDate']);
  });
});

describe('createReportInputSchema', () => {
  it('reports every problem at once, including cross-field ones while a single field is wrong', () => {
    const result = createReportInputSchema.safeParse({ season: 2024, crop: 'main', form: 'ground', outcome: 'ripened', springFrostDate: '2024-05-01', firstRipeDate: '2024-04-20' });
    expect(result.success).toBe(false);
    expect([...new Set(result.error!.issues.map((i) => String(i.path[0])))].sort()).toEqual(['firstRipeDate', 'lat', 'lon', 'varietyId']);
  });

  it('turns empty form values into nulls and fills defaults', () => {
    const value = createReportInputSchema.parse({ varietyId: 3, lat: 42.6, lon: -73.7, form: 'ground', season: 2024, crop: 'main', outcome: 'unripe', firstRipeDate: '', newTreeLabel: '' });
    expect(value).toMatchObject({ firstRipeDate: null, newTreeLabel: null, origin: 'unknown', pinched: false, notes: '', treeId: null, proposedVarietyName: null });
  });

  it('refuses a day that does not exist', () => {
    const result = createReportInputSchema.safeParse({ varietyId: 3, lat: 42.6, lon: -73.7, form: 'ground', season: 2023, crop: 'main', outcome: 'ripened', firstRipeDate: '2023-02-29' });
    // 2023 is not a leap year (Gregorian rule: divisible by 4, except centuries not divisible by 400).
    expect(result.error?.issues.map((i) => [i.path[0], i.message])).toEqual([['firstRipeDate', 'That day does not exist']]);
  });
});
