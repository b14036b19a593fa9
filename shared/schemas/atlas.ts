import { z } from 'zod';
import { CROPS, FIG_TYPES, GROWING_FORMS, RIPENING_CLASSES, SEASON_FIT_VERDICTS } from '../domain/codes';
import { chanceSchema } from './chance';
import { MIN_PUBLIC_RADIUS_KM } from '../domain/public-grid';
import { numberFromText } from './text-number';

/*
 * The regional engine's wire shapes: GET /api/atlas/near and GET /api/varieties/:id/fit.
 * The pure functions in shared/domain produce these pieces; the server only gathers the rows.
 */

/** Latitude and longitude from a query string or a form: an empty value is missing, never 0 (the equator). */
export const latSchema = numberFromText(z.coerce.number({ message: 'lat must be a number' }).min(-90, { message: 'lat must be between -90 and 90' }).max(90, { message: 'lat must be between -90 and 90' }));
export const lonSchema = numberFromText(z.coerce.number({ message: 'lon must be a number' }).min(-180, { message: 'lon must be between -180 and 180' }).max(180, { message: 'lon must be between -180 and 180' }));

/**
 * The radius of every public radius query: at least one public grid cell (MIN_PUBLIC_RADIUS_KM,
 * 8 km), since answers are per cell and a narrower circle only invites probing below it.
 */
export const publicRadiusKmSchema = numberFromText(
  z.coerce
    .number({ message: 'radiusKm must be a number' })
    .min(MIN_PUBLIC_RADIUS_KM, { message: `radiusKm must be at least ${MIN_PUBLIC_RADIUS_KM} km (the public grid cell: no answer is finer than that)` })
    .max(500, { message: 'radiusKm must be at most 500' })
    .default(100),
);

export const nearQuerySchema = z.object({
  lat: latSchema,
  lon: lonSchema,
  radiusKm: publicRadiusKmSchema,
  /** Rank for this growing form (season fit and ranking); all forms are counted either way. */
  form: z.enum(GROWING_FORMS).optional(),
});
export type NearQuery = z.infer<typeof nearQuerySchema>;

export const fitQuerySchema = z.object({
  lat: latSchema,
  lon: lonSchema,
  form: z.enum(GROWING_FORMS).default('ground'),
  radiusKm: nearQuerySchema.shape.radiusKm,
});
export type FitQuery = z.infer<typeof fitQuerySchema>;

/** A count of trees and the share of them that ripened, with a 90 % interval on the share. */
export const shareSchema = z.object({
  trees: z.number(),
  reports: z.number().int(),
  ripened: z.number(),
  share: z.number().nullable(),
  interval90: z.object({ low: z.number(), high: z.number() }).nullable(),
});
export type Share = z.infer<typeof shareSchema>;

/** Frost-free season length at a point, estimated from stations (and growers' frost dates). */
export const seasonEstimateSchema = z.object({
  thresholdF: z.number().int(),
  /** Frost-free days not exceeded in 10 / 50 / 90 % of years (10 % = a short year). */
  days10: z.number().nullable(),
  days50: z.number().nullable(),
  days90: z.number().nullable(),
  lastSpringDoy50: z.number().nullable(),
  firstFallDoy50: z.number().nullable(),
  stationCount: z.number().int(),
  reportFrostCount: z.number().int(),
  nearestStationKm: z.number().nullable(),
  /**
   * "never": every station in range is frost-free all year (NOAA -6666): no frost date is given.
   * "any-month": a freeze can come in any month at every station in range (-4444): no season.
   */
  freezeNote: z.enum(['never', 'any-month']).nullable().default(null),
  /** Growing degree days base 50 °F (10 °C) in a typical year, °F-days; null when no station in range gives heat. */
  gdd50F: z.number().nullable().default(null),
  heatStationCount: z.number().int().default(0),
  /** Average annual extreme minimum (°F) and its USDA-style half-zone, from daily records in range. */
  extremeMinF: z.number().nullable().default(null),
  hardinessZone: z.string().nullable().default(null),
  coldStationCount: z.number().int().default(0),
  /** The kinds of station the figures rest on, with their periods. */
  sources: z.array(z.object({ source: z.enum(['daily', 'normals']), period: z.string().nullable(), stations: z.number().int() })).default([]),
  /** Plain words: how the number was made, or why there is none. */
  method: z.string(),
  stations: z.array(
    z.object({
      id: z.number().int(),
      name: z.string(),
      /** The station's own id (GHCN for NOAA stations). */
      code: z.string().nullable().default(null),
      /** "daily": computed from its daily record (has a detail page); "normals": NOAA's published normals. */
      source: z.enum(['daily', 'normals']).default('daily'),
      period: z.string().nullable().default(null),
      freezeNote: z.enum(['never', 'any-month']).nullable().default(null),
      distanceKm: z.number(),
      days50: z.number().nullable(),
      gdd50F: z.number().nullable().default(null),
      weight: z.number(),
    }),
  ),
});
export type SeasonEstimate = z.infer<typeof seasonEstimateSchema>;

export const pollinationCheckSchema = z.object({
  figType: z.enum(FIG_TYPES),
  crop: z.enum(CROPS),
  needsWasp: z.boolean().nullable(),
  waspEstablished: z.boolean(),
  /** Can fruit of this crop be expected here without the grower arranging caprification? */
  fruitExpected: z.enum(['yes', 'no', 'uncertain']),
  explanation: z.string(),
});
export type PollinationCheck = z.infer<typeof pollinationCheckSchema>;

/** The check for both crops of a fig type at a place. */
export const pollinationChecksSchema = z.object({ breba: pollinationCheckSchema, main: pollinationCheckSchema });
export type PollinationChecks = z.infer<typeof pollinationChecksSchema>;

export const seasonFitSchema = z.object({
  verdict: z.enum(SEASON_FIT_VERDICTS),
  form: z.enum(GROWING_FORMS),
  localSeasonDays: z.number().nullable(),
  /** Season days the variety needed: from all its trees' reports (nearby ones included), else its catalogue class. */
  neededDays: z.number().nullable(),
  neededFrom: z.enum(['reports', 'catalogue', 'none']),
  /** The assumed head start of this form over a tree in the ground (adjustable assumption). */
  headStartDays: z.number(),
  marginDays: z.number().nullable(),
  /** Typical yearly heat here, growing degree days base 50 °F (10 °C); null when no station in range gives it. */
  localHeatF: z.number().nullable().default(null),
  /** Heat from the last spring frost to the first ripe main-crop fig the variety needs. */
  neededHeatF: z.number().nullable().default(null),
  neededHeatFrom: z.enum(['reports', 'catalogue', 'none']).default('none'),
  /** Heat here (with the form's warmth) minus the need; null when either is unknown. */
  heatMarginF: z.number().nullable().default(null),
  /** What holds the verdict down: too few frost-free days, too little heat, both; null when likely or unknown. */
  limitedBy: z.enum(['days', 'heat', 'both']).nullable().default(null),
  explanation: z.string(),
});
export type SeasonFit = z.infer<typeof seasonFitSchema>;

export const varietyEvidenceSchema = z.object({
  rank: z.number().int(),
  varietyId: z.number().int(),
  name: z.string(),
  figType: z.enum(FIG_TYPES),
  ripeningClass: z.enum(RIPENING_CLASSES).nullable(),
  isFictional: z.boolean(),
  growers: z.number().int(),
  all: shareSchema,
  byCrop: z.object({ breba: shareSchema, main: shareSchema }),
  byForm: z.object({ ground: shareSchema, container: shareSchema, wall: shareSchema, greenhouse: shareSchema }),
  /** Distance-weighted share pulled toward the variety's overall rate when local trees are few. */
  adjustedShare: z.number().nullable(),
  overallShare: z.number().nullable(),
  medianFirstRipeDoy: z.number().nullable(),
  medianDaysFrostToRipe: z.number().nullable(),
  seasonFit: seasonFitSchema,
  /** The calibrated chance of an edible crop (issue 16, shared/domain/chance-model.ts); null when the model has not seen the variety. */
  chance: chanceSchema.nullable(),
  /** One line in plain words: why this rank. */
  reason: z.string(),
});
export type VarietyEvidence = z.infer<typeof varietyEvidenceSchema>;

export const nearResponseSchema = z.object({
  point: z.object({ lat: z.number(), lon: z.number() }),
  radiusKm: z.number(),
  form: z.enum(GROWING_FORMS),
  season: seasonEstimateSchema,
  wasp: z.object({
    established: z.boolean(),
    areas: z.array(z.object({ id: z.number().int(), name: z.string(), source: z.string(), observedOn: z.string() })),
  }),
  totals: z.object({ reports: z.number().int(), trees: z.number().int(), growers: z.number().int() }),
  varieties: z.array(varietyEvidenceSchema),
  /**
   * The pollination check for each fig type among `varieties` (it depends only on the fig type and
   * whether the wasp is established here, so it is given once per type, not per variety).
   */
  pollinationByFigType: z.partialRecord(z.enum(FIG_TYPES), pollinationChecksSchema),
  /** How the shares were adjusted and ranked, in plain words. */
  method: z.string(),
});
export type NearResponse = z.infer<typeof nearResponseSchema>;

export const fitResponseSchema = z.object({
  variety: z.object({ id: z.number().int(), name: z.string(), figType: z.enum(FIG_TYPES) }),
  season: seasonEstimateSchema,
  seasonFit: seasonFitSchema,
  pollination: pollinationChecksSchema,
});
export type FitResponse = z.infer<typeof fitResponseSchema>;
