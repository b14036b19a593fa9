import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  type EvidenceReport,
  adjustedShare,
  daysFrostToRipe,
  groupTreeEvidence,
  median,
  medianDaysFrostToRipe,
  medianFirstRipeDoy,
  normalQuantile,
  summarizeShare,
  tallyEvidence,
  varietyOverall,
  wilsonInterval,
} from '../../shared/domain/ripening-stats';

let nextId = 1;
function report(over: Partial<EvidenceReport>): EvidenceReport {
  const id = nextId++;
  return {
    reportId: id,
    treeId: id,
    userId: 1,
    varietyId: 1,
    crop: 'main',
    form: 'ground',
    outcome: 'ripened',
    season: 2024,
    distanceKm: 0,
    firstRipeDoy: null,
    springFrostDoy: null,
    ...over,
  };
}

describe('wilsonInterval', () => {
  it('matches Newcombe (1998) method 3 at 95 %', () => {
    // R. G. Newcombe, "Two-sided confidence intervals for the single proportion: comparison of seven methods",
    // Statistics in Medicine 17 (1998), Table II, method 3 (Wilson score without continuity correction).
    // Values recalled from memory of that table.
    const cases: [number, number, number, number][] = [
      [81, 263, 0.2553, 0.3662],
      [15, 148, 0.0624, 0.1605],
      [0, 20, 0, 0.1611],
      [1, 29, 0.0061, 0.1718],
    ];
    for (const [x, n, low, high] of cases) {
      const ci = wilsonInterval(x, n, 0.95)!;
      expect(ci.low).toBeCloseTo(low, 4);
      expect(ci.high).toBeCloseTo(high, 4);
    }
  });

  it('uses z = 1.6449 for 90 % and gives null without trees', () => {
    // Standard normal table: the 95th percentile is 1.6449, the 97.5th 1.9600.
    expect(normalQuantile(0.95)).toBeCloseTo(1.6449, 4);
    expect(normalQuantile(0.975)).toBeCloseTo(1.96, 4);
    expect(wilsonInterval(0, 0)).toBeNull();
    const ci90 = wilsonInterval(81, 263)!;
    const ci95 = wilsonInterval(81, 263, 0.95)!;
    expect(ci90.low).toBeGreaterThan(ci95.low);
    expect(ci90.high).toBeLessThan(ci95.high);
  });
});

describe('summarizeShare', () => {
  it('counts trees, not reports: one tree over many seasons is one tree', () => {
    // Issue 9: one grower's many reports of the same tree must not count as many independent trees.
    const reports = [
      report({ treeId: 10, season: 2021, outcome: 'ripened' }),
      report({ treeId: 10, season: 2022, outcome: 'ripened' }),
      report({ treeId: 10, season: 2023, outcome: 'unripe' }),
      report({ treeId: 10, season: 2024, outcome: 'ripened' }),
      report({ treeId: 11, outcome: 'dropped' }),
    ];
    const share = summarizeShare(reports);
    expect(share).toMatchObject({ trees: 2, reports: 5, ripened: 0.75, share: 0.375 });
    expect(share.interval90).toEqual(wilsonInterval(0.75, 2, 0.9));
  });

  it('gives nulls when there is nothing', () => {
    expect(summarizeShare([])).toEqual({ trees: 0, reports: 0, ripened: 0, share: null, interval90: null });
  });
});

describe('adjustedShare', () => {
  it('is the beta-binomial posterior mean when every tree is at the point', () => {
    // Conjugate beta prior Beta(a, b) with y successes in n trials has posterior mean (a + y) / (a + b + n)
    // (Gelman et al., Bayesian Data Analysis, 3rd ed., section 2.4). Here a = k p0, b = k (1 - p0).
    const local = [report({ outcome: 'ripened' }), report({ outcome: 'ripened' }), report({ outcome: 'unripe' })];
    const k = 4;
    const p0 = 0.25;
    expect(adjustedShare(local, p0, { priorStrength: k })).toBeCloseTo((k * p0 + 2) / (k + 3), 12);
  });

  it('leans on the overall rate when local trees are few or far, and on the local trees when they are many', () => {
    const one = [report({ outcome: 'ripened' })];
    const many = Array.from({ length: 60 }, () => report({ outcome: 'ripened' }));
    const far = [report({ outcome: 'ripened', distanceKm: 150 })];
    expect(adjustedShare(one, 0.2)!).toBeLessThan(0.5);
    expect(adjustedShare(many, 0.2)!).toBeGreaterThan(0.9);
    expect(adjustedShare(far, 0.2)!).toBeLessThan(adjustedShare(one, 0.2)!);
    expect(adjustedShare(far, 0.2)!).toBeGreaterThan(0.2);
  });

  it('falls back to the weighted share without an overall rate, and to null without anything', () => {
    expect(adjustedShare([report({ outcome: 'ripened' }), report({ outcome: 'unripe' })], null)).toBeCloseTo(0.5, 12);
    expect(adjustedShare([], null)).toBeNull();
    expect(adjustedShare([], 0.4)).toBeCloseTo(0.4, 12);
  });
});

describe('medians', () => {
  it('takes the middle value, or the mean of the middle two (common practice, no source)', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([null, 5, undefined])).toBe(5);
    expect(median([])).toBeNull();
  });

  it('lets each tree count once in the first-ripe median', () => {
    const reports = [
      report({ treeId: 1, firstRipeDoy: 200 }),
      report({ treeId: 1, firstRipeDoy: 202 }),
      report({ treeId: 1, firstRipeDoy: 204 }),
      report({ treeId: 2, firstRipeDoy: 240 }),
      report({ treeId: 3, firstRipeDoy: 250 }),
    ];
    // Per tree: 202, 240, 250; the median of reports (204) would let tree 1 outvote the others.
    expect(medianFirstRipeDoy(reports)).toBe(240);
  });

  it('counts days from the last spring frost to the first ripe fig, across the new year too', () => {
    expect(daysFrostToRipe({ springFrostDoy: 110, firstRipeDoy: 230 })).toBe(120);
    // Southern hemisphere: frost 10 September (253), first ripe 1 February (32): 144 days.
    expect(daysFrostToRipe({ springFrostDoy: 253, firstRipeDoy: 32 })).toBe(144);
    expect(daysFrostToRipe({ springFrostDoy: null, firstRipeDoy: 32 })).toBeNull();
    expect(
      medianDaysFrostToRipe([report({ springFrostDoy: 100, firstRipeDoy: 200 }), report({ springFrostDoy: 120, firstRipeDoy: 240 })]),
    ).toBe(110);
  });

  it('gives a variety’s overall figures from its main crop in the ground', () => {
    const overall = varietyOverall(groupTreeEvidence([
      report({ treeId: 1, springFrostDoy: 100, firstRipeDoy: 230 }),
      report({ treeId: 2, springFrostDoy: 100, firstRipeDoy: 250 }),
      report({ treeId: 3, form: 'container', springFrostDoy: 100, firstRipeDoy: 180 }),
      report({ treeId: 4, crop: 'breba', springFrostDoy: 100, firstRipeDoy: 170 }),
      report({ treeId: 5, outcome: 'unripe' }),
    ]));
    expect(overall).toEqual({ share: 0.8, neededDays: 140, treesBehindNeed: 2 });
  });
});

describe('tallyEvidence', { timeout: 30_000 }, () => {
  it('gives the same figures in one pass as the plain functions (property test)', () => {
    const arbReport = fc.record({
      treeId: fc.integer({ min: 1, max: 12 }),
      userId: fc.integer({ min: 1, max: 5 }),
      crop: fc.constantFrom('breba' as const, 'main' as const),
      form: fc.constantFrom('ground' as const, 'container' as const, 'wall' as const, 'greenhouse' as const),
      outcome: fc.constantFrom('no-fruit' as const, 'dropped' as const, 'unripe' as const, 'ripened' as const),
      // A few places only, so one tree often has several reports in one row (and sometimes rows in two places).
      distanceKm: fc.constantFrom(0, 3.2, 48.5, 250),
      firstRipeDoy: fc.option(fc.integer({ min: 150, max: 300 }), { nil: null }),
      springFrostDoy: fc.option(fc.integer({ min: 60, max: 150 }), { nil: null }),
    });
    fc.assert(
      fc.property(fc.array(arbReport, { maxLength: 40 }), fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: null }), (rows, overall) => {
        const reports = rows.map((r) => report(r));
        // The server stores and reads tree rows; the figures must equal the per-report definitions.
        const t = tallyEvidence(groupTreeEvidence(reports), overall);
        const close = (a: number | null, b: number | null) => (a === null || b === null ? expect(a).toBe(b) : expect(a).toBeCloseTo(b, 9));
        const same = (a: ReturnType<typeof summarizeShare>, b: ReturnType<typeof summarizeShare>) => {
          expect([a.trees, a.reports]).toEqual([b.trees, b.reports]);
          close(a.ripened, b.ripened);
          close(a.share, b.share);
          close(a.interval90?.low ?? null, b.interval90?.low ?? null);
        };
        same(t.all, summarizeShare(reports));
        same(t.byCrop.main, summarizeShare(reports.filter((r) => r.crop === 'main')));
        same(t.byForm.wall, summarizeShare(reports.filter((r) => r.form === 'wall')));
        close(t.adjustedShare, adjustedShare(reports, overall));
        const main = reports.filter((r) => r.crop === 'main');
        close(t.medianFirstRipeDoy, medianFirstRipeDoy(main));
        close(t.medianDaysFrostToRipe, medianDaysFrostToRipe(main));
        expect(t.growers).toBe(new Set(reports.map((r) => r.userId)).size);
        const o = varietyOverall(groupTreeEvidence(reports));
        close(o.share, summarizeShare(reports).share);
        const need = reports.filter((r) => r.crop === 'main' && r.form === 'ground' && daysFrostToRipe(r) !== null);
        close(o.neededDays, medianDaysFrostToRipe(need));
        expect(o.treesBehindNeed).toBe(new Set(need.map((r) => r.treeId)).size);
      }),
      { numRuns: 300 },
    );
  });
});
