/**
 * "Why no figs?": pure rules that turn a grower's answers and the atlas's local data into likely
 * causes, most likely first, each with what to try next season. No I/O; the page gathers the data.
 *
 * Where the facts come from (see CHECKS.md): fig types and their pollination needs from Texas A&M
 * AgriLife EHT-019 and Condit 1955; everything else (juvenile plants, slow-to-bear varieties, water
 * stress and nutrition behind dropped fruit, pinching, containers starting earlier, ~150 frost-free
 * days being short) is common practice without a single published source. Wording is our own.
 */
import type { FigType } from './codes';
import type { FitResponse, NearResponse } from '../schemas/atlas';
import { countOf } from './plural';
import {
  diagnosisAnswersSchema,
  diagnosisLocalDataSchema,
  type Cause,
  type CauseCode,
  type DiagnosisAnswers,
  type DiagnosisAnswersInput,
  type DiagnosisLocalData,
  type DiagnosisLocalDataInput,
  type Symptom,
} from '../schemas/diagnosis';

/** The questions of the stepper, by key. */
export type QuestionKey = 'variety' | 'crop' | 'treeAge' | 'origin' | 'form' | 'sun' | 'watering' | 'feeding' | 'pinching' | 'place';

/**
 * Only the questions that matter for what the grower saw, in the order the stepper asks them.
 * No fruit: age, origin and vigour matter; dropped fruit: type (pollination), water, food;
 * unripe at frost: season, warmth and pinching.
 */
export function questionsFor(symptom: Symptom): QuestionKey[] {
  switch (symptom) {
    case 'no-fruit':
      return ['variety', 'treeAge', 'origin', 'form', 'sun', 'feeding', 'watering', 'place'];
    case 'dropped':
      return ['variety', 'crop', 'treeAge', 'form', 'watering', 'feeding', 'sun', 'place'];
    case 'unripe':
      return ['variety', 'crop', 'form', 'sun', 'pinching', 'feeding', 'place'];
  }
}

/** Whether the crop the grower watched needs the wasp, for a fig type (Texas A&M EHT-019; Condit 1955). */
export function cropNeedsWasp(figType: FigType, crop: DiagnosisAnswers['crop']): boolean | null {
  if (figType === 'smyrna') return true;
  if (figType === 'caprifig') return true;
  if (figType === 'common') return false;
  if (figType === 'san-pedro') {
    if (crop === 'breba') return false;
    if (crop === 'main' || crop === 'both') return true;
    return null; // depends on the crop the grower watched
  }
  return null;
}

/** Fully dormant fig wood survives to about 12-15 °F (California Rare Fruit Growers, "Fig" fruit facts): the warmer end. */
export const DORMANT_WOOD_HARDY_F = 15;

/** A season of about 150 frost-free days is short for many main crops (common practice, no source). */
export const SHORT_SEASON_DAYS = 150;

const LIKELIHOOD = (score: number): Cause['likelihood'] => (score >= 3 ? 'high' : score >= 2 ? 'medium' : 'low');

/** Fixed order used to break ties, so the same answers always give the same list. */
const TIE_ORDER: CauseCode[] = [
  'pollination',
  'juvenile-plant',
  'season-too-short',
  'water-stress',
  'young-tree',
  'weak-tree',
  'not-enough-heat',
  'winter-dieback',
  'poor-nutrition',
  'too-much-nitrogen',
  'no-pinching',
  'pollination-unknown-type',
  'variety-struggles-here',
  'keep-records',
];

const TITLES: Record<CauseCode, string> = {
  'juvenile-plant': 'The plant is still juvenile',
  'young-tree': 'The tree is young, or the variety is slow to bear',
  'weak-tree': 'The tree is short of sun or strength',
  'too-much-nitrogen': 'Lots of leaves, little fruit: too much nitrogen',
  'water-stress': 'Water stress',
  'poor-nutrition': 'Poor nutrition',
  pollination: 'The figs needed the fig wasp',
  'pollination-unknown-type': 'Possibly a type that needs the wasp',
  'season-too-short': 'The season is too short for this variety and form',
  'not-enough-heat': 'Not enough summer heat',
  'winter-dieback': 'Winter cold killed the wood the breba crop grows on',
  'no-pinching': 'Fruit set came too late in the summer',
  'variety-struggles-here': 'This variety rarely ripens near you',
  'keep-records': 'No single clear cause',
};

interface Draft {
  code: CauseCode;
  score: number;
  why: string[];
  tryNext: string[];
  cautions: Cause['cautions'];
}

const PINCH_ADVICE =
  'In early summer, pinch the soft tip of each fruiting shoot once it has five or six leaves, so the tree puts its effort into the figs already forming instead of new length.';

/**
 * Likely causes for what the grower saw, most likely first. Each cause says why it fits and what to
 * try next season. Answers and local data are parsed with their schemas, so missing fields take the
 * "not known" defaults.
 */
export function diagnose(answersInput: DiagnosisAnswersInput, localInput: DiagnosisLocalDataInput = {}): Cause[] {
  const a: DiagnosisAnswers = diagnosisAnswersSchema.parse(answersInput);
  const local: DiagnosisLocalData = diagnosisLocalDataSchema.parse(localInput);
  const drafts = new Map<CauseCode, Draft>();
  const add = (code: CauseCode, score: number, why: string, tryNext: string[] = [], cautions: Cause['cautions'] = []) => {
    const d = drafts.get(code) ?? { code, score: 0, why: [], tryNext: [], cautions: [] };
    d.score += score;
    d.why.push(why);
    for (const t of tryNext) if (!d.tryNext.includes(t)) d.tryNext.push(t);
    for (const c of cautions) if (!d.cautions.includes(c)) d.cautions.push(c);
    drafts.set(code, d);
  };

  const age = a.treeAgeYears;
  const juvenileOrigin = a.origin === 'seedling' || a.origin === 'tissue-culture';
  const shortLocalSeason = local.seasonDays50 !== null && local.seasonDays50 <= SHORT_SEASON_DAYS + 10;
  const needsWasp = cropNeedsWasp(a.figType, a.crop);
  const waspAbsent = local.waspEstablished === false;

  // --- The plant itself: juvenile or young (common practice, no source) ---
  if (a.symptom === 'no-fruit' || a.symptom === 'dropped') {
    if (juvenileOrigin && (age === null || age < 5)) {
      const what = a.origin === 'seedling' ? 'A tree grown from seed' : 'A small tissue-culture plant';
      add(
        'juvenile-plant',
        a.symptom === 'no-fruit' ? 3.5 : 1.5,
        `${what} often stays juvenile for several years before it fruits${age !== null ? `, and yours is ${age} year${age === 1 ? '' : 's'} old` : ''}.`,
        ['Give it time and good growing conditions; count on several seasons.', 'If you want figs sooner, add a rooted cutting or air layer of a variety known to ripen near you.'],
      );
    }
    if (age !== null && age <= 2) {
      add(
        'young-tree',
        a.symptom === 'no-fruit' ? 2.5 : 1.5,
        `At ${age} year${age === 1 ? '' : 's'} the tree is still building roots; young trees often make no figs or shed the few they start, and many varieties take three years or more to bear.`,
        ['Let it grow a strong root system: steady water, full sun, a light balanced feed.', 'Judge the variety again after its third summer.'],
      );
    } else if (age === null && a.symptom === 'no-fruit' && !juvenileOrigin) {
      add('young-tree', 1, 'Many varieties take three years or more to bear; if the tree is young, waiting may be all it needs.', ['Note when the tree was planted, so next year’s check can tell.']);
    }
  }

  // --- Vigour: sun, warmth, feeding (common practice, no source) ---
  if (a.sun !== 'full' || a.feeding === 'none') {
    const reasons: string[] = [];
    if (a.sun === 'shade') reasons.push('it gets less than about three hours of direct sun');
    if (a.sun === 'part') reasons.push('it gets only part-day sun');
    if (a.feeding === 'none') reasons.push('it has not been fed');
    const base = a.sun === 'shade' ? 2.5 : a.sun === 'part' ? 1.5 : 1;
    add(
      'weak-tree',
      a.symptom === 'unripe' ? base - 0.5 : base,
      `A fig fruits from strong new growth; ${reasons.join(' and ')}.`,
      [
        a.sun !== 'full' ? (a.form === 'container' ? 'Move the container to the sunniest spot you have, ideally six hours of sun or more.' : 'Next planting, choose the sunniest, warmest spot; thin shading branches around it.') : '',
        a.feeding === 'none' ? 'Feed lightly in spring with a balanced fertiliser; containers need regular small feeds.' : '',
      ].filter(Boolean),
      ['spray'],
    );
  }
  if (a.feeding === 'heavy-nitrogen' && a.symptom !== 'dropped') {
    add(
      'too-much-nitrogen',
      a.symptom === 'no-fruit' ? 2 : 1.5,
      'Rich, high-nitrogen feeding pushes leafy shoots at the expense of fruit and keeps the tree growing late into the season.',
      ['Switch to a light, balanced feed and stop feeding by midsummer.'],
    );
  }

  // --- Water and food behind dropped fruit (common practice, no source) ---
  if (a.watering === 'dry-spells' || a.watering === 'soggy') {
    const dry = a.watering === 'dry-spells';
    const score = a.symptom === 'dropped' ? 3 : 1;
    add(
      'water-stress',
      a.form === 'container' && dry ? score + 0.5 : score,
      dry
        ? `The soil dried out between waterings; a thirsty fig sheds its young fruit first${a.form === 'container' ? ', and containers dry out fast in summer heat' : ''}.`
        : 'The soil stayed wet: roots that sit in water rot, and a tree with failing roots drops its figs.',
      dry
        ? ['Water deeply and evenly through summer; mulch the root zone.', a.form === 'container' ? 'Check containers daily in hot weather; a larger pot or a saucer of gravel helps.' : 'During dry spells, water once or twice a week to the full root depth.']
        : ['Let the top few centimetres dry between waterings.', a.form === 'container' ? 'Repot into a free-draining mix in a pot with open drainage holes.' : 'Improve drainage, or plant on a raised mound.'],
    );
  }
  if (a.symptom === 'dropped' && (a.feeding === 'none' || a.feeding === 'unsure')) {
    add(
      'poor-nutrition',
      a.feeding === 'none' ? (a.form === 'container' ? 2 : 1.5) : 0.5,
      a.feeding === 'none'
        ? `An unfed tree${a.form === 'container' ? ' in a container, whose mix runs out of food within a season,' : ''} may not carry the fruit it sets.`
        : 'If the tree has not been fed for a while, short supplies can make it shed fruit.',
      ['Feed lightly and regularly from spring to midsummer; follow the product label.'],
      ['spray'],
    );
  }

  // --- Pollination (Texas A&M EHT-019; Condit 1955) ---
  if (a.symptom === 'dropped' || a.symptom === 'no-fruit') {
    if (needsWasp === true) {
      const typeWords =
        a.figType === 'smyrna'
          ? 'A Smyrna-type fig only matures its fruit after pollination by the fig wasp'
          : a.figType === 'caprifig'
            ? 'A caprifig is the wasp’s host, not an eating fig; its fruit is not meant to ripen for eating'
            : 'A San Pedro-type fig sets its breba crop on its own, but its main crop falls unless the fig wasp pollinates it';
      const score = waspAbsent ? 4 : local.waspEstablished === true ? 0.5 : 2.5;
      const where = waspAbsent ? ', and the atlas has no record of the wasp where you grow' : local.waspEstablished === true ? '; the wasp is recorded near you, so this is less likely' : '';
      add(
        'pollination',
        a.symptom === 'dropped' ? score : score - 1,
        `${typeWords}${where}.`,
        waspAbsent
          ? ['Grow a common-type variety (fruit without pollination) that ripens near you.', a.figType === 'san-pedro' ? 'Keep this tree for its breba crop: avoid hard winter pruning, which removes the wood it fruits on.' : 'Caprifigs and the wasp cannot simply be added where the wasp does not live; ask your local extension service before trying.']
          : ['Check whether caprifigs carrying the wasp grow nearby; ask your local extension service.'],
        waspAbsent && a.figType === 'san-pedro' ? ['latex'] : [],
      );
    } else if (needsWasp === null && a.symptom === 'dropped' && waspAbsent) {
      add(
        'pollination-unknown-type',
        1.5,
        'The fig type is not known and the wasp is not recorded near you; if it is a Smyrna or San Pedro type, its main-crop figs fall without pollination.',
        ['Find out the variety’s type in the catalogue; only common figs are a safe choice where the wasp is absent.'],
      );
    }
  }

  // --- Season and heat for fruit still hard at frost ---
  if (a.symptom === 'unripe') {
    const fit = local.seasonFit;
    const seasonWords = local.seasonDays50 !== null ? `about ${Math.round(local.seasonDays50)} frost-free days in a typical year` : null;
    const needWords = local.neededDays !== null ? `; this variety needed about ${Math.round(local.neededDays)} days in growers' reports` : '';
    let score = 1.5;
    if (local.limitedBy === 'heat') score = 0.5; // days enough; heat is the limit (below)
    else if (fit === 'unlikely') score = 4;
    else if (fit === 'marginal') score = 3;
    else if (fit === 'likely') score = 0.5;
    else if (shortLocalSeason) score = 3;
    else if (local.seasonDays50 !== null && local.seasonDays50 > 210) score = 0.5;
    const tryNext =
      a.form === 'ground'
        ? ['Grow the next tree in a container you can start under cover and move out early; containers warm up sooner in spring.', 'Or plant against a south-facing warm wall (north-facing south of the equator).', 'Choose an early-ripening variety that has ripened in seasons as short as yours.']
        : a.form === 'container'
          ? ['Start the container earlier under cover and move it out as soon as frosts end.', 'Choose an early-ripening variety that has ripened in seasons as short as yours.']
          : ['Choose an early-ripening variety that has ripened in seasons as short as yours.'];
    add(
      'season-too-short',
      a.form === 'greenhouse' ? Math.max(0.5, score - 1.5) : score,
      seasonWords
        ? `Your place has ${seasonWords}${needWords}${fit ? ` (season fit: ${fit})` : ''}.`
        : 'Figs left hard and green at the first frost usually mean the season ran out before the crop could finish.',
      tryNext,
    );
    if (local.limitedBy === 'heat' || local.limitedBy === 'both') {
      add(
        'not-enough-heat',
        fit === 'unlikely' ? 4 : 3,
        `The frost-free season here is long enough, but the summer is cool: about ${local.heatF !== null ? Math.round(local.heatF).toLocaleString('en-US') : 'too few'} growing degree days (base 50 °F) in a typical year, less than this variety needs to ripen.`,
        ['Grow it against a sunny wall or under cover, where it gathers more heat.', 'Or choose an early variety with a smaller heat need.'],
      );
    }
    if (a.sun !== 'full' || (!a.warmSpot && (shortLocalSeason || fit === 'marginal' || fit === 'unlikely'))) {
      add(
        'not-enough-heat',
        a.sun === 'shade' ? 2.5 : a.sun === 'part' ? 2 : 1,
        a.sun !== 'full' ? 'Figs need warmth to ripen; a tree with limited sun ripens later.' : 'In a short season every bit of extra warmth counts, and the tree is not in a sheltered warm spot.',
        ['Use reflected heat: a sunny wall, paving, or dark mulch; shelter from cold wind.'],
      );
    }
    if (a.pinching === 'no' || a.pinching === 'unsure' || a.pinching === 'late-summer') {
      const late = a.pinching === 'late-summer';
      add(
        'no-pinching',
        shortLocalSeason || fit === 'marginal' || fit === 'unlikely' ? 2 : 1,
        late
          ? 'Pinching in late summer comes too late to bring fruit set forward.'
          : 'In short seasons, growers pinch shoot tips in early summer to bring the figs forward; it was not done.',
        [PINCH_ADVICE],
        ['latex'],
      );
    }
  }

  // --- Winter dieback takes the breba crop ---
  // The breba crop forms on last year's wood. Fully dormant fig wood is hardy to about 12-15 °F
  // (California Rare Fruit Growers, "Fig" fruit facts; shared/CHECKS.md): where the average coldest
  // night of the year is below that, the wood dies back most winters and the brebas with it.
  const brebaInQuestion = a.crop === 'breba' || a.crop === 'both' || (a.crop === 'unsure' && (a.symptom === 'no-fruit' || a.symptom === 'dropped'));
  if (brebaInQuestion && local.extremeMinF !== null && local.extremeMinF < DORMANT_WOOD_HARDY_F && a.form !== 'greenhouse' && a.form !== 'container') {
    add(
      'winter-dieback',
      a.crop === 'breba' ? 3.5 : a.crop === 'both' ? 2.5 : 1.5,
      `The coldest night of an average winter here is about ${Math.round(local.extremeMinF)} °F${local.hardinessZone ? ` (hardiness zone ${local.hardinessZone})` : ''}, colder than the 12-15 °F dormant fig wood survives: the shoots that would carry the breba crop die back, so the tree fruits only on the new season's wood (the main crop).`,
      ['Protect the tree over winter (wrap it, or bend it down and cover it) to keep last year’s wood alive.', 'Grow it in a container you move into an unheated shelter for winter.', 'Rely on the main crop: choose a variety whose main crop ripens near you.'],
    );
  }

  // --- How the variety did nearby (regional engine) ---
  if (local.varietyShare !== null && local.varietyTrees !== null && local.varietyTrees >= 3 && local.varietyShare < 0.35) {
    add(
      'variety-struggles-here',
      local.varietyShare < 0.15 ? 2.5 : 1.5,
      `Near you, ${Math.round(local.varietyShare * 100)} % of ${countOf(Math.round(local.varietyTrees), 'tree')} of this variety ripened fruit.`,
      ['Look at “What ripens here” for varieties with a better record near you.'],
    );
  }

  const causes = [...drafts.values()]
    .filter((d) => d.score > 0)
    .sort((x, y) => y.score - x.score || TIE_ORDER.indexOf(x.code) - TIE_ORDER.indexOf(y.code))
    .map(
      (d): Cause => ({
        code: d.code,
        title: TITLES[d.code],
        likelihood: LIKELIHOOD(d.score),
        score: Math.round(d.score * 10) / 10,
        why: d.why.join(' '),
        tryNext: d.tryNext,
        cautions: d.cautions,
      }),
    );

  if (causes.length === 0 || causes[0]!.score < 1.5) {
    causes.push({
      code: 'keep-records',
      title: TITLES['keep-records'],
      likelihood: 'low',
      score: 0,
      why: 'Your answers do not point at one clear cause.',
      tryNext: ['Keep notes next season: when leaves come, when figs form, watering and feeding, first frost.', 'Post a report, so the atlas can compare your tree with others nearby.'],
      cautions: [],
    });
  }
  return causes;
}

/**
 * The local data the rules use, taken from the regional engine's answers (either may be missing:
 * no place chosen, or the engine could not answer).
 */
export function localDataFrom(near: NearResponse | null | undefined, fit: FitResponse | null | undefined, varietyId: number | null): DiagnosisLocalData {
  const evidence = near && varietyId !== null ? near.varieties.find((v) => v.varietyId === varietyId) : undefined;
  const season = fit?.season ?? near?.season;
  const seasonFit = fit?.seasonFit ?? evidence?.seasonFit;
  return {
    seasonDays50: season?.days50 ?? null,
    seasonDays10: season?.days10 ?? null,
    waspEstablished: near ? near.wasp.established : fit ? fit.pollination.main.waspEstablished : null,
    varietyTrees: evidence ? evidence.all.trees : null,
    varietyShare: evidence ? evidence.all.share : null,
    seasonFit: seasonFit?.verdict ?? null,
    neededDays: seasonFit?.neededDays ?? null,
    headStartDays: seasonFit?.headStartDays ?? null,
    limitedBy: seasonFit?.limitedBy ?? null,
    heatF: season?.gdd50F ?? null,
    extremeMinF: season?.extremeMinF ?? null,
    hardinessZone: season?.hardinessZone ?? null,
  };
}
