import { z } from 'zod';
import { CROPS, FIG_TYPES, GROWING_FORMS, PLANT_ORIGINS, SEASON_FIT_VERDICTS } from '../domain/codes';

/*
 * Shapes of the "Why no figs?" check. The stepper fills DiagnosisAnswers, the page gathers
 * DiagnosisLocalData from the regional engine, and shared/domain/diagnosis.ts turns both into causes.
 */

/** What the grower saw: the three ways a season fails (outcome codes without "ripened"). */
export const SYMPTOMS = ['no-fruit', 'dropped', 'unripe'] as const;
export type Symptom = (typeof SYMPTOMS)[number];

export const SUN_LEVELS = ['full', 'part', 'shade'] as const;
export const WATERING_PATTERNS = ['even', 'dry-spells', 'soggy', 'unsure'] as const;
export const FEEDING_PATTERNS = ['balanced', 'none', 'heavy-nitrogen', 'unsure'] as const;
export const PINCHING_PATTERNS = ['early-summer', 'late-summer', 'no', 'unsure'] as const;
export const CROP_SEEN = [...CROPS, 'both', 'unsure'] as const;

export const diagnosisAnswersSchema = z.object({
  symptom: z.enum(SYMPTOMS),
  varietyId: z.number().int().nullable().default(null),
  figType: z.enum(FIG_TYPES).default('unknown'),
  crop: z.enum(CROP_SEEN).default('unsure'),
  /** Years since the tree was planted or rooted; null when not known. */
  treeAgeYears: z.number().min(0).max(200).nullable().default(null),
  origin: z.enum(PLANT_ORIGINS).default('unknown'),
  form: z.enum(GROWING_FORMS).default('ground'),
  /** full = 6 hours or more of direct sun in summer, part = 3 to 6, shade = less. */
  sun: z.enum(SUN_LEVELS).default('full'),
  /** A warm spot: reflected heat from a wall or paving, shelter from cold wind. */
  warmSpot: z.boolean().default(false),
  watering: z.enum(WATERING_PATTERNS).default('unsure'),
  feeding: z.enum(FEEDING_PATTERNS).default('unsure'),
  pinching: z.enum(PINCHING_PATTERNS).default('unsure'),
});
export type DiagnosisAnswers = z.infer<typeof diagnosisAnswersSchema>;
export type DiagnosisAnswersInput = z.input<typeof diagnosisAnswersSchema>;

/** What the atlas knows about the grower's place (all optional: the check works without a place). */
export const diagnosisLocalDataSchema = z.object({
  /** Frost-free days at the point, 50 % level; null when there is no data in range. */
  seasonDays50: z.number().nullable().default(null),
  /** Frost-free days in a short year (10 % level). */
  seasonDays10: z.number().nullable().default(null),
  waspEstablished: z.boolean().nullable().default(null),
  /** How the grower's variety did nearby: trees counted and the share that ripened. */
  varietyTrees: z.number().nullable().default(null),
  varietyShare: z.number().min(0).max(1).nullable().default(null),
  /** The engine's season-fit verdict for this variety, place and form. */
  seasonFit: z.enum(SEASON_FIT_VERDICTS).nullable().default(null),
  neededDays: z.number().nullable().default(null),
  headStartDays: z.number().nullable().default(null),
  /** What limits the fit: too few days, too little heat, or both (the engine's `limitedBy`). */
  limitedBy: z.enum(['days', 'heat', 'both']).nullable().default(null),
  /** Typical yearly heat here (growing degree days base 50 °F). */
  heatF: z.number().nullable().default(null),
  /** Average annual extreme minimum (°F) and its USDA-style half-zone, from stations in range. */
  extremeMinF: z.number().nullable().default(null),
  hardinessZone: z.string().nullable().default(null),
});
export type DiagnosisLocalData = z.infer<typeof diagnosisLocalDataSchema>;
export type DiagnosisLocalDataInput = z.input<typeof diagnosisLocalDataSchema>;

export const CAUSE_CODES = [
  'juvenile-plant',
  'young-tree',
  'weak-tree',
  'too-much-nitrogen',
  'water-stress',
  'poor-nutrition',
  'pollination',
  'pollination-unknown-type',
  'season-too-short',
  'not-enough-heat',
  'winter-dieback',
  'no-pinching',
  'variety-struggles-here',
  'keep-records',
] as const;
export type CauseCode = (typeof CAUSE_CODES)[number];

export const causeSchema = z.object({
  code: z.enum(CAUSE_CODES),
  title: z.string(),
  likelihood: z.enum(['high', 'medium', 'low']),
  score: z.number(),
  /** Why this cause fits the answers and the local data, in plain words. */
  why: z.string(),
  /** What to try next season. */
  tryNext: z.array(z.string()),
  /** Safety notes to show beside the advice. */
  cautions: z.array(z.enum(['latex', 'spray', 'ladder'])),
});
export type Cause = z.infer<typeof causeSchema>;
