import type { FigType, GrowingForm, RipeningClass } from './codes';
import type { FitResponse, NearResponse, SeasonEstimate, Share, VarietyEvidence } from '../schemas/atlas';
import { pollinationChecks } from './pollination';
import { chanceMethod } from './chance-model';
import { rankVarieties, type ChanceWithBasis, type RankedVariety, type RankInput } from './ranking';
import { type TreeEvidence, type VarietyOverall, adjustedShareMethod, tallyEvidence } from './ripening-stats';
import { seasonFit } from './season-fit';

/**
 * One call per API answer: the server gathers rows (variety, local reports, the variety's overall
 * figures, the season estimate, the wasp areas) and these functions shape NearResponse/FitResponse.
 */

/** What the catalogue says about a variety. */
export type VarietyInfo = {
  id: number;
  name: string;
  figType: FigType;
  ripeningClass: RipeningClass | null;
  isFictional: boolean;
  typicalDaysToRipen: number | null;
};

export type { VarietyOverall };

export type VarietyEvidenceInput = {
  variety: VarietyInfo;
  /** This variety's tree rows within the radius, each with its distance from the point. */
  localTrees: TreeEvidence[];
  overall: VarietyOverall;
  /** The chance model's answer for this variety here (chance-model.ts chanceAt); null or absent: not computed. */
  chance?: ChanceWithBasis | null;
};

/**
 * The evidence for one variety near a point, before ranking (figures from tallyEvidence: trees
 * counted once, shares by crop and form, the adjusted share, main-crop medians). Medians of
 * first-ripe day and of days from spring frost to first ripe use the MAIN crop only (breba ripen
 * weeks earlier and would blur them).
 */
export function buildVarietyEvidence(
  input: VarietyEvidenceInput,
  context: { localSeasonDays: number | null; localHeatF?: number | null; waspEstablished: boolean; form: GrowingForm; headStartDays?: number; bandwidthKm?: number },
): RankInput {
  const { variety, overall } = input;
  const tally = tallyEvidence(input.localTrees, overall.share, { bandwidthKm: context.bandwidthKm });
  return {
    varietyId: variety.id,
    name: variety.name,
    figType: variety.figType,
    ripeningClass: variety.ripeningClass,
    isFictional: variety.isFictional,
    growers: tally.growers,
    all: tally.all,
    byCrop: tally.byCrop,
    byForm: tally.byForm,
    adjustedShare: tally.adjustedShare,
    overallShare: overall.share,
    medianFirstRipeDoy: tally.medianFirstRipeDoy,
    medianDaysFrostToRipe: tally.medianDaysFrostToRipe,
    pollination: pollinationChecks(variety.figType, context.waspEstablished),
    chance: input.chance ?? null,
    seasonFit: seasonFit({
      localSeasonDays: context.localSeasonDays,
      localHeatF: context.localHeatF ?? null,
      neededDaysFromReports: overall.neededDays,
      reportsBehindNeed: overall.treesBehindNeed,
      neededHeatFromReports: overall.neededHeatF ?? null,
      reportsBehindHeatNeed: overall.treesBehindHeatNeed ?? 0,
      ripeningClass: variety.ripeningClass,
      typicalDaysToRipen: variety.typicalDaysToRipen,
      form: context.form,
      headStartDays: context.headStartDays,
    }),
  };
}

/** The distance kernel's scale for a search radius: half the radius (50 km at the default 100 km). */
export function bandwidthForRadius(radiusKm: number): number {
  return Math.max(1, radiusKm / 2);
}

/**
 * The whole GET /api/atlas/near answer: evidence per variety (varieties without local reports are
 * left out), ranked, with totals and methods. The adjusted share's kernel scale is half the radius
 * unless `bandwidthKm` is given.
 */
export function buildNearResponse(input: {
  point: { lat: number; lon: number };
  radiusKm: number;
  form?: GrowingForm;
  season: SeasonEstimate;
  wasp: NearResponse['wasp'];
  varieties: VarietyEvidenceInput[];
  bandwidthKm?: number;
}): NearResponse {
  const form = input.form ?? 'ground';
  const bandwidthKm = input.bandwidthKm ?? bandwidthForRadius(input.radiusKm);
  const context = { localSeasonDays: input.season.days50, localHeatF: input.season.gdd50F, waspEstablished: input.wasp.established, form, bandwidthKm };
  const trees = new Set<number>();
  const growers = new Set<number>();
  let reports = 0;
  for (const v of input.varieties) {
    for (const row of v.localTrees) {
      reports += row.reports;
      trees.add(row.treeId);
      growers.add(row.userId);
    }
  }
  const ranked = rankVarieties(input.varieties.filter((v) => v.localTrees.length > 0).map((v) => buildVarietyEvidence(v, context)));
  const pollinationByFigType: NearResponse['pollinationByFigType'] = {};
  for (const v of ranked) pollinationByFigType[v.figType] ??= v.pollination;
  return {
    point: input.point,
    radiusKm: input.radiusKm,
    form,
    season: input.season,
    wasp: input.wasp,
    totals: { reports, trees: trees.size, growers: growers.size },
    varieties: ranked.map(roundedForTheWire),
    pollinationByFigType,
    method: `${chanceMethod(bandwidthKm)} ${adjustedShareMethod(bandwidthKm)}`,
  };
}

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;
const roundOrNull = (x: number | null, places: number) => (x === null ? null : round(x, places));

/** A share as sent: shares and interval ends to 4 decimals (0.01 %), ripened trees to 3. */
function roundedShare(s: Share): Share {
  return {
    trees: s.trees,
    reports: s.reports,
    ripened: round(s.ripened, 3),
    share: roundOrNull(s.share, 4),
    interval90: s.interval90 && { low: round(s.interval90.low, 4), high: round(s.interval90.high, 4) },
  };
}

/**
 * A ranked variety as sent, after ranking on the full figures: 17 significant digits of a share say
 * nothing a reader can use and made up a third of a near answer's bytes. Its pollination check is
 * given once per fig type (pollinationByFigType).
 */
export function roundedForTheWire({ pollination: _givenPerFigType, chance, ...v }: RankedVariety): VarietyEvidence {
  return {
    ...v,
    chance: chance && { probability: round(chance.probability, 4), low: round(chance.low, 4), high: round(chance.high, 4), enoughEvidence: chance.enoughEvidence, trees: chance.trees },
    all: roundedShare(v.all),
    byCrop: { breba: roundedShare(v.byCrop.breba), main: roundedShare(v.byCrop.main) },
    byForm: { ground: roundedShare(v.byForm.ground), container: roundedShare(v.byForm.container), wall: roundedShare(v.byForm.wall), greenhouse: roundedShare(v.byForm.greenhouse) },
    adjustedShare: roundOrNull(v.adjustedShare, 4),
    overallShare: roundOrNull(v.overallShare, 4),
  };
}

/** The GET /api/varieties/:id/fit answer. */
export function buildFitResponse(input: {
  variety: VarietyInfo;
  overall: VarietyOverall;
  season: SeasonEstimate;
  waspEstablished: boolean;
  form: GrowingForm;
  headStartDays?: number;
}): FitResponse {
  const { variety } = input;
  return {
    variety: { id: variety.id, name: variety.name, figType: variety.figType },
    season: input.season,
    seasonFit: seasonFit({
      localSeasonDays: input.season.days50,
      localHeatF: input.season.gdd50F,
      neededDaysFromReports: input.overall.neededDays,
      reportsBehindNeed: input.overall.treesBehindNeed,
      neededHeatFromReports: input.overall.neededHeatF ?? null,
      reportsBehindHeatNeed: input.overall.treesBehindHeatNeed ?? 0,
      ripeningClass: variety.ripeningClass,
      typicalDaysToRipen: variety.typicalDaysToRipen,
      form: input.form,
      headStartDays: input.headStartDays,
    }),
    pollination: pollinationChecks(variety.figType, input.waspEstablished),
  };
}
