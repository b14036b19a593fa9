/**
 * The domain's fixed codes (see DEVELOPERS.md, "Domain words"). The database and the API store
 * these codes; the screens show the labels. Pure data: imported by the client, the server and
 * the Drizzle schema alike.
 */

export const FIG_TYPES = ['common', 'san-pedro', 'smyrna', 'caprifig', 'unknown'] as const;
export type FigType = (typeof FIG_TYPES)[number];

export const CROPS = ['breba', 'main'] as const;
export type Crop = (typeof CROPS)[number];

export const OUTCOMES = ['no-fruit', 'dropped', 'unripe', 'ripened'] as const;
export type Outcome = (typeof OUTCOMES)[number];

export const GROWING_FORMS = ['ground', 'container', 'wall', 'greenhouse'] as const;
export type GrowingForm = (typeof GROWING_FORMS)[number];

export const PLANT_ORIGINS = ['cutting', 'air-layer', 'graft', 'tissue-culture', 'seedling', 'unknown'] as const;
export type PlantOrigin = (typeof PLANT_ORIGINS)[number];

export const RIPENING_CLASSES = ['early', 'mid', 'late'] as const;
export type RipeningClass = (typeof RIPENING_CLASSES)[number];

/** Signed-in roles; a visitor is simply someone without a session. */
export const ROLES = ['grower', 'editor', 'admin'] as const;
export type Role = (typeof ROLES)[number];
export type Viewer = Role | 'visitor';

/** Freeze thresholds in deg F, as in the national climate normals; stored in deg C. */
export const FREEZE_THRESHOLDS_F = [32, 28, 24] as const;
export type FreezeThresholdF = (typeof FREEZE_THRESHOLDS_F)[number];

export const PROBABILITY_LEVELS = [10, 50, 90] as const;
export type ProbabilityLevel = (typeof PROBABILITY_LEVELS)[number];

export const SEASON_FIT_VERDICTS = ['likely', 'marginal', 'unlikely', 'unknown'] as const;
export type SeasonFitVerdict = (typeof SEASON_FIT_VERDICTS)[number];

export const REPORT_STATUSES = ['published', 'draft', 'hidden'] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

export const VARIETY_STATUSES = ['accepted', 'proposed', 'rejected', 'merged'] as const;
export type VarietyStatus = (typeof VARIETY_STATUSES)[number];

export const FLAG_STATUSES = ['open', 'cleared', 'actioned'] as const;
export type FlagStatus = (typeof FLAG_STATUSES)[number];

export const WASP_AREA_STATUSES = ['active', 'retired'] as const;
export type WaspAreaStatus = (typeof WASP_AREA_STATUSES)[number];

/** Labels people read. Our own wording; the codes above are the contract. */
export const LABELS = {
  figType: {
    common: 'Common (no pollination needed)',
    'san-pedro': 'San Pedro (breba sets alone, main crop needs the wasp)',
    smyrna: 'Smyrna (needs the fig wasp)',
    caprifig: 'Caprifig (wasp host, not for eating)',
    unknown: 'Type not known',
  },
  crop: { breba: 'Breba (last year’s wood)', main: 'Main crop (this year’s wood)' },
  outcome: {
    'no-fruit': 'No fruit formed',
    dropped: 'Fruit formed, then dropped',
    unripe: 'Still hard and green at frost',
    ripened: 'Ripened',
  },
  growingForm: { ground: 'In the ground', container: 'In a container', wall: 'Against a warm wall', greenhouse: 'Greenhouse' },
  plantOrigin: {
    cutting: 'Rooted cutting',
    'air-layer': 'Air layer',
    graft: 'Graft',
    'tissue-culture': 'Tissue-culture plant',
    seedling: 'Seedling',
    unknown: 'Not known',
  },
  ripeningClass: { early: 'Early', mid: 'Mid-season', late: 'Late' },
  role: { visitor: 'Visitor', grower: 'Grower', editor: 'Editor', admin: 'Admin' },
  verdict: { likely: 'Likely to ripen', marginal: 'Marginal', unlikely: 'Unlikely to ripen', unknown: 'Not enough data' },
} as const;
