import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FIG_TYPES, SEASON_FIT_VERDICTS } from '../../shared/domain/codes';
import { pollinationChecks } from '../../shared/domain/pollination';
import { type ChanceWithBasis, type RankInput, rankVarieties } from '../../shared/domain/ranking';
import { roundedForTheWire } from '../../shared/domain/evidence';
import { seasonFit } from '../../shared/domain/season-fit';
import { varietyEvidenceSchema } from '../../shared/schemas/atlas';
import type { FigType, SeasonFitVerdict } from '../../shared/domain/codes';

const emptyShare = { trees: 0, reports: 0, ripened: 0, share: null, interval90: null };
function chance(probability: number | null, trees = 12, rule: ChanceWithBasis['basis']['rule'] = null): ChanceWithBasis | null {
  if (probability === null) return null;
  return { probability, low: probability / 2, high: (1 + probability) / 2, enoughEvidence: trees >= 5, trees, basis: { rule, modelProbability: probability, localTrees: Math.min(trees, 3) } };
}
function item(id: number, name: string, figType: FigType, share: number | null, verdict: SeasonFitVerdict = 'likely', wasp = false, c: ChanceWithBasis | null = chance(share)): RankInput {
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
    chance: c,
  };
}

describe('rankVarieties', { timeout: 30_000 }, () => {
  it('ranks by the chance, and what is sent parses', () => {
    const ranked = rankVarieties([item(1, 'Fictional Low', 'common', 0.3), item(2, 'Fictional High', 'common', 0.8), item(3, 'Fictional Mid', 'common', 0.5)]);
    expect(ranked.map((v) => v.name)).toEqual(['Fictional High', 'Fictional Mid', 'Fictional Low']);
    expect(ranked.map((v) => v.rank)).toEqual([1, 2, 3]);
    expect(ranked[0].reason).toMatch(/^About 80 % chance of an edible crop in a typical season here \(40 % to 90 %\), from 12 trees, 10 trees nearby/);
    for (const v of ranked) expect(varietyEvidenceSchema.parse(roundedForTheWire(v))).toEqual(roundedForTheWire(v));
  });

  it('never lets a variety with too little evidence outrank a well-evidenced one, and says how many whole trees', () => {
    // Two lucky trees, 100 % ripe: still after the 60 % variety backed by 15 trees.
    const ranked = rankVarieties([item(1, 'Fictional Lucky', 'common', 1, 'likely', false, chance(0.95, 2)), item(2, 'Fictional Steady', 'common', 0.6, 'likely', false, chance(0.6, 15))]);
    expect(ranked.map((v) => v.name)).toEqual(['Fictional Steady', 'Fictional Lucky']);
    expect(ranked[1].reason).toMatch(/^Too little evidence \(2 trees\)/);
    expect(rankVarieties([item(1, 'Fictional One', 'common', 1, 'likely', false, chance(0.9, 1))])[0].reason).toMatch(/\(1 tree\)/);
  });

  it('says when no crop can set without the wasp, or only the breba counts', () => {
    const ranked = rankVarieties([item(1, 'Fictional Smyrna', 'smyrna', 0.8, 'likely', false, chance(0, 12, 'no-crop')), item(2, 'Fictional San Pedro', 'san-pedro', 0.5, 'likely', false, chance(0.5, 12, 'breba-only'))]);
    expect(ranked.map((v) => v.name)).toEqual(['Fictional San Pedro', 'Fictional Smyrna']);
    expect(ranked[0].reason).toMatch(/only the breba crop counts here/);
    expect(ranked[1].reason).toMatch(/No edible crop is expected here without the fig wasp/);
  });

  it('puts varieties without a chance last, by adjusted share, and breaks ties by name then id', () => {
    const ranked = rankVarieties([
      item(5, 'Beta', 'common', null),
      item(4, 'Alpha', 'common', 0.9, 'likely', false, null),
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
    expect(ranked[4].reason).toMatch(/No chance computed yet; no trees nearby/);
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
        trees: fc.integer({ min: 1, max: 9 }),
      })
      .map((r) => item(r.id, r.name, r.figType, r.share, r.verdict, r.wasp, chance(r.share, r.trees)));
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
