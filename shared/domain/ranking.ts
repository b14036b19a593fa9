import type { PollinationChecks, VarietyEvidence } from '../schemas/atlas';
import type { Chance } from '../schemas/chance';
import type { ChanceBasis } from './chance-model';

/**
 * Ranking of varieties near a point by the chance of an edible crop in a typical season here,
 * grown this way (chance-model.ts). Varieties with enough evidence come first, by chance; then the
 * varieties with too little evidence (fewer than MIN_TREES_FOR_VERDICT trees), by chance, so one or
 * two lucky trees never lift a variety above well-evidenced ones; then any without a chance (the
 * model has not seen them yet), by adjusted share (0 when no crop can set here without the wasp);
 * last, the varieties none of whose crops can set fruit here without the wasp (a rule, not a score). Ties go by name (code-point order, so the result
 * never depends on the machine's locale), then by id: the ranking is the same for any input order.
 */
export type ChanceWithBasis = Chance & { basis: ChanceBasis };
export type RankInput = Omit<VarietyEvidence, 'rank' | 'reason' | 'chance'> & { pollination: PollinationChecks; chance: ChanceWithBasis | null };
/** A ranked variety, still with its pollination check (the near answer gives those per fig type) and the chance's basis. */
export type RankedVariety = Omit<VarietyEvidence, 'chance'> & { pollination: PollinationChecks; chance: ChanceWithBasis | null };

const pct = (x: number) => `${Math.round(x * 100)} %`;
/** Whole trees in words: "1 tree", "4 trees". */
export const treesWord = (n: number) => `${n} ${n === 1 ? 'tree' : 'trees'}`;

function group(item: RankInput): number {
  if (item.chance?.basis.rule === 'no-crop') return 3;
  if (!item.chance) return 2;
  return item.chance.enoughEvidence ? 0 : 1;
}

function sortValue(item: RankInput): number {
  if (item.chance) return item.chance.probability;
  // Without a chance, pollination is still a rule: no crop that can set here, nothing to rank on.
  if (item.pollination.main.fruitExpected === 'no' && item.pollination.breba.fruitExpected === 'no') return 0;
  return item.adjustedShare ?? item.all.share ?? -1;
}

function reasonFor(item: RankInput): string {
  const parts: string[] = [];
  const local = item.all.trees;
  const localWords = local === 0 ? 'no trees nearby' : `${treesWord(local)} nearby`;
  const c = item.chance;
  if (!c) {
    parts.push(`No chance computed yet; ${localWords}`);
  } else if (c.basis.rule === 'no-crop') {
    parts.push(`No edible crop is expected here without the fig wasp (${treesWord(c.trees)} reported in all)`);
  } else if (!c.enoughEvidence) {
    parts.push(`Too little evidence (${treesWord(c.trees)}): about ${pct(c.probability)} by the model, no verdict; ${localWords}`);
  } else {
    parts.push(`About ${pct(c.probability)} chance of an edible crop in a typical season here (${pct(c.low)} to ${pct(c.high)}), from ${treesWord(c.trees)}, ${localWords}`);
  }
  if (c?.basis.rule === 'breba-only') parts.push('only the breba crop counts here: the main crop needs the fig wasp');
  else if (item.pollination.main.fruitExpected === 'uncertain') parts.push('fig type unknown, pollination need uncertain');
  const heatOnly = item.seasonFit.limitedBy === 'heat';
  if (item.seasonFit.verdict === 'unlikely') parts.push(heatOnly ? 'enough days, but too little summer heat for the main crop' : 'the season looks too short for the main crop');
  else if (item.seasonFit.verdict === 'marginal') parts.push(heatOnly ? 'the summer heat is tight for the main crop' : 'the season is tight for the main crop');
  else if (item.seasonFit.verdict === 'likely') parts.push('the season fits');
  return `${parts.join('; ')}.`;
}

function byCodePoint(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Rank (1 = best) with a one-line reason each; pure and independent of input order. */
export function rankVarieties(items: RankInput[]): RankedVariety[] {
  const sorted = [...items].sort(
    (a, b) => group(a) - group(b) || sortValue(b) - sortValue(a) || byCodePoint(a.name, b.name) || a.varietyId - b.varietyId,
  );
  return sorted.map((item, i) => ({ ...item, rank: i + 1, reason: reasonFor(item) }));
}
