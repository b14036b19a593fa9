import type { GrowingForm, RipeningClass } from './codes';
import type { SeasonFit } from '../schemas/atlas';
import { countOf } from './plural';

/**
 * Season fit: does the local frost-free season leave room for a variety's main crop to ripen, and
 * does the summer give it enough heat?
 *
 *   available = local frost-free days (50 % year) + the growing form's head start
 *   needed    = days from the last spring frost to the first ripe main-crop fig
 *   margin    = available - needed
 *
 * `needed` comes from growers' reports (all the variety's trees in the ground, nearby ones included) when at least MIN_TREES_FOR_REPORTED_NEED trees give
 * it, else from the catalogue (the variety's typical days, else its ripening class), else it is
 * unknown. Verdict: margin >= MARGIN_LIKELY_DAYS is likely (about three weeks of picking before
 * the fall freeze), margin >= 0 marginal (the first figs ripen, the rest may not), below 0 unlikely.
 *
 * Heat is judged the same way, in growing degree days base 50 °F (10 °C), daily mean method:
 *
 *   available heat = the typical year's heat here × the growing form's warmth factor
 *   needed heat    = heat from the last spring frost to the first ripe main-crop fig
 *
 * The typical year's heat is the season estimate's `gdd50F` (stations' daily maxima and minima, else
 * NOAA's normals); nearly all of it falls between the frosts where figs freeze back. The needed heat
 * comes from reports where enough trees give it, else from the catalogue (see below). The verdict is
 * the worse of the two, and `limitedBy` says which one limits: a long cool coastal season has
 * "enough days, too little heat". Without a heat figure here, days alone decide, as before.
 */

/**
 * Assumed head start of each growing form over a tree in the ground, in days (an ADJUSTABLE
 * ASSUMPTION, common practice, no source): containers warm sooner in spring and can be moved out
 * early or in late (about three weeks); a warm wall gives about two; a greenhouse about six.
 */
export const FORM_HEAD_START_DAYS: Record<GrowingForm, number> = {
  ground: 0,
  container: 21,
  wall: 14,
  greenhouse: 45,
};

/**
 * Days from the last spring frost to the first ripe main-crop fig assumed for each catalogue
 * ripening class when reports are few (common practice, no source). With these a season of about
 * 150 frost-free days is short for mid and late varieties, as growers say.
 */
export const RIPENING_CLASS_NEED_DAYS: Record<RipeningClass, number> = { early: 110, mid: 130, late: 155 };

/**
 * Heat from the last spring frost to the first ripe main-crop fig for each ripening class, °F-days
 * base 50 (an ADJUSTABLE ASSUMPTION, no source): about 12 °F-days per day of the class's need in a
 * fig-growing summer. A catalogue figure of typical days is converted at the same rate.
 */
export const RIPENING_CLASS_NEED_HEAT_F: Record<RipeningClass, number> = { early: 1500, mid: 1900, late: 2350 };
export const HEAT_PER_NEEDED_DAY_F = 12;

/**
 * How much more heat each form gathers than a tree in the ground (an ADJUSTABLE ASSUMPTION, common
 * practice, no source): a dark pot a little, a south wall more, a greenhouse half as much again.
 */
export const FORM_HEAT_FACTOR: Record<GrowingForm, number> = { ground: 1, container: 1.05, wall: 1.15, greenhouse: 1.5 };

/** Heat margin (°F-days) from which heat counts as ample: about three weeks of a fig summer. */
export const MARGIN_LIKELY_HEAT_F = 250;

/** Fewest trees whose reports we trust over the catalogue. */
export const MIN_TREES_FOR_REPORTED_NEED = 3;
/** Margin of days from which a fit counts as likely. */
export const MARGIN_LIKELY_DAYS = 21;

export type SeasonFitInput = {
  /** Local frost-free days in a typical (50 %) year; null when unknown. */
  localSeasonDays: number | null;
  /** Median days from spring frost to first ripe over all the variety's trees in the ground (see varietyOverall). */
  neededDaysFromReports: number | null;
  /** Trees behind that median. */
  reportsBehindNeed: number;
  ripeningClass: RipeningClass | null;
  /** The catalogue's typical days from last spring frost to first ripe main-crop fig. */
  typicalDaysToRipen: number | null;
  form: GrowingForm;
  /** Override of FORM_HEAD_START_DAYS[form]. */
  headStartDays?: number;
  /** Typical yearly heat here, GDD base 50 °F; null or absent when unknown (days alone decide). */
  localHeatF?: number | null;
  /** Median heat from spring frost to first ripe fig in reports (see heatNeed), and the trees behind it. */
  neededHeatFromReports?: number | null;
  reportsBehindHeatNeed?: number;
};

const FORM_WORDS: Record<GrowingForm, string> = {
  ground: 'a tree in the ground',
  container: 'a container',
  wall: 'a warm wall',
  greenhouse: 'a greenhouse',
};

/** The verdict with the numbers behind it and a plain explanation. */
export function seasonFit(input: SeasonFitInput): SeasonFit {
  const headStartDays = input.headStartDays ?? FORM_HEAD_START_DAYS[input.form];
  let neededDays: number | null = null;
  let neededFrom: SeasonFit['neededFrom'] = 'none';
  let neededWords = '';
  if (input.neededDaysFromReports !== null && input.reportsBehindNeed >= MIN_TREES_FOR_REPORTED_NEED) {
    neededDays = Math.round(input.neededDaysFromReports);
    neededFrom = 'reports';
    neededWords = `Reports from ${countOf(input.reportsBehindNeed, 'tree')} in the ground (nearby and elsewhere) show about ${neededDays} days from the last spring frost to the first ripe fig`;
  } else if (input.typicalDaysToRipen !== null) {
    neededDays = Math.round(input.typicalDaysToRipen);
    neededFrom = 'catalogue';
    neededWords = `Too few reports give the ripening time of this variety, so the catalogue figure of ${neededDays} days from the last spring frost to the first ripe fig is used`;
  } else if (input.ripeningClass !== null) {
    neededDays = RIPENING_CLASS_NEED_DAYS[input.ripeningClass];
    neededFrom = 'catalogue';
    neededWords = `Too few reports give the ripening time of this variety; as a ${input.ripeningClass}-ripening variety it is assumed to need about ${neededDays} days from the last spring frost to the first ripe fig`;
  }

  const local = input.localSeasonDays === null ? null : Math.round(input.localSeasonDays);
  const heat = heatPart(input);
  const base = { form: input.form, localSeasonDays: local, neededDays, neededFrom, headStartDays, ...heat.fields };
  if (local === null) {
    return {
      ...base,
      verdict: 'unknown',
      marginDays: null,
      limitedBy: null,
      explanation: 'No frost-free season is known near this place, so the fit cannot be judged.',
    };
  }
  const available = local + headStartDays;
  const seasonWords =
    headStartDays > 0
      ? `The frost-free season here is about ${local} days in a typical year; with an assumed ${headStartDays}-day head start for ${FORM_WORDS[input.form]}, about ${available}.`
      : `The frost-free season here is about ${local} days in a typical year.`;
  if (neededDays === null) {
    return {
      ...base,
      verdict: 'unknown',
      marginDays: null,
      limitedBy: null,
      explanation: `${seasonWords} Neither reports nor the catalogue say how long this variety needs.`,
    };
  }
  const marginDays = available - neededDays;
  const daysVerdict = marginDays >= MARGIN_LIKELY_DAYS ? 'likely' : marginDays >= 0 ? 'marginal' : 'unlikely';
  const heatVerdict = heat.verdict;
  const verdict = heatVerdict && RANK[heatVerdict] > RANK[daysVerdict] ? heatVerdict : daysVerdict;
  const limitedBy: SeasonFit['limitedBy'] =
    verdict === 'likely' ? null : heatVerdict === null ? 'days' : RANK[heatVerdict] === RANK[daysVerdict] ? 'both' : RANK[heatVerdict] > RANK[daysVerdict] ? 'heat' : 'days';
  const tail =
    verdict === 'likely'
      ? `That leaves about ${marginDays} days of picking before the fall freeze: the main crop is likely to ripen.`
      : limitedBy === 'heat'
        ? `Enough days, too little heat: ${heat.words} ${verdict === 'marginal' ? 'the first figs may ripen, many may not.' : 'the main crop is unlikely to ripen, however long the season.'}`
        : limitedBy === 'both'
          ? `Too few days and too little heat: ${heat.words} ${verdict === 'marginal' ? 'the first figs may ripen, many may not.' : 'the main crop is unlikely to ripen.'}`
          : verdict === 'marginal'
            ? `That leaves only about ${marginDays} days before the fall freeze: the first figs may ripen, many may not.`
            : `That is about ${-marginDays} days more than the season gives: the main crop is unlikely to ripen.`;
  const heatNote = heat.words && verdict === 'likely' ? ` ${heat.words}` : '';
  return { ...base, verdict, marginDays, limitedBy, explanation: `${seasonWords} ${neededWords}. ${tail}${heatNote}` };
}

const RANK = { likely: 0, marginal: 1, unlikely: 2 } as const;

/** The heat half of the fit: its fields, verdict (null without heat here or a need) and one sentence. */
function heatPart(input: SeasonFitInput): {
  fields: Pick<SeasonFit, 'localHeatF' | 'neededHeatF' | 'neededHeatFrom' | 'heatMarginF'>;
  verdict: 'likely' | 'marginal' | 'unlikely' | null;
  words: string;
} {
  let neededHeatF: number | null = null;
  let neededHeatFrom: SeasonFit['neededHeatFrom'] = 'none';
  if (input.neededHeatFromReports != null && (input.reportsBehindHeatNeed ?? 0) >= MIN_TREES_FOR_REPORTED_NEED) {
    neededHeatF = Math.round(input.neededHeatFromReports);
    neededHeatFrom = 'reports';
  } else if (input.typicalDaysToRipen !== null) {
    neededHeatF = Math.round(input.typicalDaysToRipen * HEAT_PER_NEEDED_DAY_F);
    neededHeatFrom = 'catalogue';
  } else if (input.ripeningClass !== null) {
    neededHeatF = RIPENING_CLASS_NEED_HEAT_F[input.ripeningClass];
    neededHeatFrom = 'catalogue';
  }
  const localHeatF = input.localHeatF == null ? null : Math.round(input.localHeatF);
  if (localHeatF === null || neededHeatF === null) return { fields: { localHeatF, neededHeatF, neededHeatFrom, heatMarginF: null }, verdict: null, words: '' };
  const availableHeat = Math.round(localHeatF * FORM_HEAT_FACTOR[input.form]);
  const heatMarginF = availableHeat - neededHeatF;
  const verdict = heatMarginF >= MARGIN_LIKELY_HEAT_F ? 'likely' : heatMarginF >= 0 ? 'marginal' : 'unlikely';
  const from = neededHeatFrom === 'reports' ? `reports from ${input.reportsBehindHeatNeed} trees show` : 'the catalogue assumes';
  const form = input.form === 'ground' ? '' : ` (${availableHeat} with ${FORM_WORDS[input.form]})`;
  const words = `a typical year here gives about ${localHeatF} growing degree days (base 50 °F)${form}, and ${from} about ${neededHeatF} from the last spring frost to the first ripe fig;`;
  return { fields: { localHeatF, neededHeatF, neededHeatFrom, heatMarginF }, verdict, words };
}
