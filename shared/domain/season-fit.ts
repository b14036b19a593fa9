import type { GrowingForm, RipeningClass } from './codes';
import type { SeasonFit } from '../schemas/atlas';
import { countOf } from './plural';

/**
 * Season fit: does the local frost-free season leave room for a variety's main crop to ripen?
 *
 *   available = local frost-free days (50 % year) + the growing form's head start
 *   needed    = days from the last spring frost to the first ripe main-crop fig
 *   margin    = available - needed
 *
 * `needed` comes from growers' reports elsewhere when at least MIN_TREES_FOR_REPORTED_NEED trees give
 * it, else from the catalogue (the variety's typical days, else its ripening class), else it is
 * unknown. Verdict: margin >= MARGIN_LIKELY_DAYS is likely (about three weeks of picking before
 * the fall freeze), margin >= 0 marginal (the first figs ripen, the rest may not), below 0 unlikely.
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

/** Fewest trees whose reports we trust over the catalogue. */
export const MIN_TREES_FOR_REPORTED_NEED = 3;
/** Margin of days from which a fit counts as likely. */
export const MARGIN_LIKELY_DAYS = 21;

export type SeasonFitInput = {
  /** Local frost-free days in a typical (50 %) year; null when unknown. */
  localSeasonDays: number | null;
  /** Median days from spring frost to first ripe in reports elsewhere (see varietyOverall). */
  neededDaysFromReports: number | null;
  /** Trees behind that median. */
  reportsBehindNeed: number;
  ripeningClass: RipeningClass | null;
  /** The catalogue's typical days from last spring frost to first ripe main-crop fig. */
  typicalDaysToRipen: number | null;
  form: GrowingForm;
  /** Override of FORM_HEAD_START_DAYS[form]. */
  headStartDays?: number;
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
    neededWords = `Reports from ${countOf(input.reportsBehindNeed, 'tree')} elsewhere show about ${neededDays} days from the last spring frost to the first ripe fig`;
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
  const base = { form: input.form, localSeasonDays: local, neededDays, neededFrom, headStartDays };
  if (local === null) {
    return {
      ...base,
      verdict: 'unknown',
      marginDays: null,
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
      explanation: `${seasonWords} Neither reports nor the catalogue say how long this variety needs.`,
    };
  }
  const marginDays = available - neededDays;
  const verdict = marginDays >= MARGIN_LIKELY_DAYS ? 'likely' : marginDays >= 0 ? 'marginal' : 'unlikely';
  const tail =
    verdict === 'likely'
      ? `That leaves about ${marginDays} days of picking before the fall freeze: the main crop is likely to ripen.`
      : verdict === 'marginal'
        ? `That leaves only about ${marginDays} days before the fall freeze: the first figs may ripen, many may not.`
        : `That is about ${-marginDays} days more than the season gives: the main crop is unlikely to ripen.`;
  return { ...base, verdict, marginDays, explanation: `${seasonWords} ${neededWords}. ${tail}` };
}
