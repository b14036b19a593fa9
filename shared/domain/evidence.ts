import type { FigType, GrowingForm, RipeningClass } from './codes';
import type { FitResponse, NearResponse, SeasonEstimate } from '../schemas/atlas';
import { pollinationChecks } from './pollination';
import { RANKING_METHOD, rankVarieties, type RankInput } from './ranking';
import {
  ADJUSTED_SHARE_METHOD,
  type EvidenceReport,
  adjustedShare,
  medianDaysFrostToRipe,
  medianFirstRipeDoy,
  summarizeShare,
} from './ripening-stats';
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

/** A variety's figures over all its reports (see varietyOverall in ripening-stats.ts). */
export type VarietyOverall = { share: number | null; neededDays: number | null; treesBehindNeed: number };

export type VarietyEvidenceInput = {
  variety: VarietyInfo;
  /** This variety's reports within the radius, each with its distance from the point. */
  localReports: EvidenceReport[];
  overall: VarietyOverall;
};

/**
 * The evidence for one variety near a point, before ranking. Medians of first-ripe day and of days
 * from spring frost to first ripe use the MAIN crop only (breba ripen weeks earlier and would blur
 * them).
 */
export function buildVarietyEvidence(
  input: VarietyEvidenceInput,
  context: { localSeasonDays: number | null; waspEstablished: boolean; form: GrowingForm; headStartDays?: number },
): RankInput {
  const { variety, localReports: reports, overall } = input;
  const only = (pred: (r: EvidenceReport) => boolean) => summarizeShare(reports.filter(pred));
  const main = reports.filter((r) => r.crop === 'main');
  return {
    varietyId: variety.id,
    name: variety.name,
    figType: variety.figType,
    ripeningClass: variety.ripeningClass,
    isFictional: variety.isFictional,
    growers: new Set(reports.map((r) => r.userId)).size,
    all: summarizeShare(reports),
    byCrop: { breba: only((r) => r.crop === 'breba'), main: only((r) => r.crop === 'main') },
    byForm: {
      ground: only((r) => r.form === 'ground'),
      container: only((r) => r.form === 'container'),
      wall: only((r) => r.form === 'wall'),
      greenhouse: only((r) => r.form === 'greenhouse'),
    },
    adjustedShare: adjustedShare(reports, overall.share),
    overallShare: overall.share,
    medianFirstRipeDoy: medianFirstRipeDoy(main),
    medianDaysFrostToRipe: medianDaysFrostToRipe(main),
    pollination: pollinationChecks(variety.figType, context.waspEstablished),
    seasonFit: seasonFit({
      localSeasonDays: context.localSeasonDays,
      neededDaysFromReports: overall.neededDays,
      reportsBehindNeed: overall.treesBehindNeed,
      ripeningClass: variety.ripeningClass,
      typicalDaysToRipen: variety.typicalDaysToRipen,
      form: context.form,
      headStartDays: context.headStartDays,
    }),
  };
}

/** The whole GET /api/atlas/near answer: evidence per variety, ranked, with totals and methods. */
export function buildNearResponse(input: {
  point: { lat: number; lon: number };
  radiusKm: number;
  form?: GrowingForm;
  season: SeasonEstimate;
  wasp: NearResponse['wasp'];
  varieties: VarietyEvidenceInput[];
}): NearResponse {
  const form = input.form ?? 'ground';
  const context = { localSeasonDays: input.season.days50, waspEstablished: input.wasp.established, form };
  const all = input.varieties.flatMap((v) => v.localReports);
  return {
    point: input.point,
    radiusKm: input.radiusKm,
    form,
    season: input.season,
    wasp: input.wasp,
    totals: {
      reports: all.length,
      trees: new Set(all.map((r) => r.treeId)).size,
      growers: new Set(all.map((r) => r.userId)).size,
    },
    varieties: rankVarieties(input.varieties.filter((v) => v.localReports.length > 0).map((v) => buildVarietyEvidence(v, context))),
    method: `${ADJUSTED_SHARE_METHOD} ${RANKING_METHOD}`,
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
      neededDaysFromReports: input.overall.neededDays,
      reportsBehindNeed: input.overall.treesBehindNeed,
      ripeningClass: variety.ripeningClass,
      typicalDaysToRipen: variety.typicalDaysToRipen,
      form: input.form,
      headStartDays: input.headStartDays,
    }),
    pollination: pollinationChecks(variety.figType, input.waspEstablished),
  };
}
