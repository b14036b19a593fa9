import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FIG_TYPES, SEASON_FIT_VERDICTS } from '../../shared/domain/codes';
import { pollinationChecks } from '../../shared/domain/pollination';
import { type RankInput, rankScore, rankVarieties } from '../../shared/domain/ranking';
import { seasonFit } from '../../shared/domain/season-fit';
import { varietyEvidenceSchema } from '../../shared/schemas/atlas';
import type { FigType, SeasonFitVerdict } from '../../shared/domain/codes';

const emptyShare = { trees: 0, reports: 0, ripened: 0, share: null, interval90: null };
function item(id: number, name: string, figType: FigType, share: number | null, verdict: SeasonFitVerdict = 'likely', wasp = false): RankInput {
  const s = share === null ? emptyShare : { trees: 10, reports: 14, ripened: share * 10, share, interval90: { low: 0, high: 1 } };
  const fit = seasonFit({ localSeasonDays: 180, neededDaysFromReports: null, reportsBehindNeed: 0, ripeningClass: null, typicalDaysToRipen: null, form: 'ground' });
  return {
    varietyId: id,
    name,
    figType,
    ripeningClass: null,
    isFictional: true,
    growers: 3,
    all: s,
    byCrop: { breba: emptyShare, main: s },
    byForm: { ground: s, container: emptyShare, wall: emptyShare, greenhouse: emptyShare },
    adjustedShare: share,
    overallShare: share,
    medianFirstRipeDoy: null,
    medianDaysFrostToRipe: null,
    pollination: pollinationChecks(figType, wasp),
    seasonFit: { ...fit, verdict },
  };
}

describe('rankVarieties', { timeout: 30_000 }, () => {
  it('ranks a Smyrna or San Pedro variety below a common one outside wasp areas, despite a higher share', () => {
    // Texas A&M AgriLife EHT-019: only the common fig is recommended where the fig wasp is absent;
    // Condit 1955: the San Pedro main crop drops unless caprified.
    const ranked = rankVarieties([item(1, 'Fictional Smyrna', 'smyrna', 0.8), item(2, 'Fictional Common', 'common', 0.7), item(3, 'Fictional San Pedro', 'san-pedro', 0.75)]);
    expect(ranked.map((v) => v.name)).toEqual(['Fictional Common', 'Fictional San Pedro', 'Fictional Smyrna']);
    expect(ranked[2].reason).toMatch(/fig wasp/);
    expect(ranked.map((v) => v.rank)).toEqual([1, 2, 3]);
    // What is sent: each variety without its pollination check (given per fig type in the answer).
    for (const { pollination: _perFigType, ...v } of ranked) expect(varietyEvidenceSchema.parse(v)).toEqual(v);
  });

  it('lets the Smyrna variety lead where the wasp is established', () => {
    const ranked = rankVarieties([item(1, 'Fictional Smyrna', 'smyrna', 0.8, 'likely', true), item(2, 'Fictional Common', 'common', 0.7, 'likely', true)]);
    expect(ranked[0].name).toBe('Fictional Smyrna');
  });

  it('ranks an unlikely season fit down, puts varieties without a share last and breaks ties by name then id', () => {
    const ranked = rankVarieties([
      item(5, 'Beta', 'common', null),
      item(4, 'Alpha', 'common', 0.9, 'unlikely'),
      item(3, 'Gamma', 'common', 0.6),
      item(2, 'Delta', 'common', 0.6),
      item(1, 'Delta', 'common', 0.6),
    ]);
    expect(ranked.map((v) => [v.name, v.varietyId])).toEqual([
      ['Delta', 1],
      ['Delta', 2],
      ['Gamma', 3],
      ['Alpha', 4],
      ['Beta', 5],
    ]);
    expect(rankScore(ranked[3])).toBeCloseTo(0.45, 12);
    expect(ranked[4].reason).toMatch(/No local trees/);
  });

  it('gives the same ranking for any order of the input rows (property test)', () => {
    const arbItem = fc
      .record({
        id: fc.integer({ min: 1, max: 40 }),
        name: fc.constantFrom('Alpha', 'Beta', 'Gamma', 'alpha', 'Ébano', 'Delta'),
        figType: fc.constantFrom(...FIG_TYPES),
        share: fc.option(fc.constantFrom(0, 0.25, 0.5, 0.6, 0.75, 1), { nil: null }),
        verdict: fc.constantFrom(...SEASON_FIT_VERDICTS),
        wasp: fc.boolean(),
      })
      .map((r) => item(r.id, r.name, r.figType, r.share, r.verdict, r.wasp));
    fc.assert(
      fc.property(
        fc.uniqueArray(arbItem, { selector: (v) => v.varietyId, maxLength: 25 }).chain((items) =>
          fc.tuple(fc.constant(items), fc.shuffledSubarray(items, { minLength: items.length, maxLength: items.length })),
        ),
        ([items, shuffled]) => {
          expect(rankVarieties(shuffled)).toEqual(rankVarieties(items));
        },
      ),
      { numRuns: 300 },
    );
  });
});
