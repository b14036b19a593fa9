import type { PollinationChecks, VarietyEvidence } from '../schemas/atlas';

/**
 * Ranking of varieties near a point.
 *
 *   score = adjusted share (else the raw share) × pollination factor × season-fit factor
 *
 * Pollination factor: 0.25 when neither crop is expected without the wasp (Smyrna or caprifig
 * outside wasp areas), 0.6 when only the main crop is not (a San Pedro there: breba only), 0.85
 * when the main crop is uncertain (type unknown), else 1. Season-fit factor: 0.5 unlikely, 0.85
 * marginal, else 1. Varieties without any share come last. Ties go by name (code-point order, so
 * the result never depends on the machine's locale), then by id: the ranking is the same for any
 * order of the input rows.
 */
export type RankInput = Omit<VarietyEvidence, 'rank' | 'reason'> & { pollination: PollinationChecks };
/** A ranked variety, still with its pollination check (the near answer gives those per fig type). */
export type RankedVariety = VarietyEvidence & { pollination: PollinationChecks };

export const POLLINATION_FACTORS = { neither: 0.25, brebaOnly: 0.6, uncertain: 0.85 } as const;
export const FIT_FACTORS = { unlikely: 0.5, marginal: 0.85 } as const;

export const RANKING_METHOD =
  'Ranked by the adjusted share, lowered when fruit is not expected without the fig wasp here (to a quarter when ' +
  'no crop is, to 60 % when only the breba is) or when the season looks too short (halved) or tight (85 %); ' +
  'ties go by name.';

function pollinationFactor(item: RankInput): number {
  const main = item.pollination.main.fruitExpected;
  const breba = item.pollination.breba.fruitExpected;
  if (main === 'no' && breba === 'no') return POLLINATION_FACTORS.neither;
  if (main === 'no') return POLLINATION_FACTORS.brebaOnly;
  if (main === 'uncertain') return POLLINATION_FACTORS.uncertain;
  return 1;
}

function fitFactor(item: RankInput): number {
  if (item.seasonFit.verdict === 'unlikely') return FIT_FACTORS.unlikely;
  if (item.seasonFit.verdict === 'marginal') return FIT_FACTORS.marginal;
  return 1;
}

/** The score a variety is ranked by; null when it has no share at all. */
export function rankScore(item: RankInput): number | null {
  const share = item.adjustedShare ?? item.all.share;
  return share === null ? null : share * pollinationFactor(item) * fitFactor(item);
}

const pct = (x: number) => `${Math.round(x * 100)} %`;

function reasonFor(item: RankInput): string {
  const parts: string[] = [];
  const trees = item.all.trees;
  if (item.all.share === null) parts.push('No local trees reported yet');
  else {
    const adjusted = item.adjustedShare ?? item.all.share;
    // The share counts each tree's seasons as a fraction, so "40 % of 1 tree" would read as nonsense.
    parts.push(
      trees === 1
        ? `The one nearby tree ripened fruit in ${pct(item.all.share)} of its reported seasons (${pct(adjusted)} after weighting)`
        : `${trees} nearby trees ripened fruit in ${pct(item.all.share)} of their reported seasons, each tree counted once (${pct(adjusted)} after weighting)`,
    );
  }
  const main = item.pollination.main.fruitExpected;
  const breba = item.pollination.breba.fruitExpected;
  if (main === 'no' && breba === 'no') parts.push('ranked down: no edible crop is expected here without the fig wasp');
  else if (main === 'no') parts.push('ranked down: only the breba crop is expected without the fig wasp');
  else if (main === 'uncertain') parts.push('fig type unknown, pollination need uncertain');
  const heatOnly = item.seasonFit.limitedBy === 'heat';
  if (item.seasonFit.verdict === 'unlikely') parts.push(heatOnly ? 'ranked down: enough days, but too little summer heat for the main crop' : 'ranked down: the season looks too short for the main crop');
  else if (item.seasonFit.verdict === 'marginal') parts.push(heatOnly ? 'the summer heat is tight for the main crop' : 'the season is tight for the main crop');
  else if (item.seasonFit.verdict === 'likely') parts.push('the season fits');
  return `${parts.join('; ')}.`;
}

function byCodePoint(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Rank (1 = best) with a one-line reason each; pure and independent of input order. */
export function rankVarieties(items: RankInput[]): RankedVariety[] {
  const scored = items.map((item) => ({ item, score: rankScore(item) }));
  scored.sort((a, b) => {
    if (a.score !== b.score) {
      if (a.score === null) return 1;
      if (b.score === null) return -1;
      return b.score - a.score;
    }
    return byCodePoint(a.item.name, b.item.name) || a.item.varietyId - b.item.varietyId;
  });
  return scored.map(({ item }, i) => ({ ...item, rank: i + 1, reason: reasonFor(item) }));
}
