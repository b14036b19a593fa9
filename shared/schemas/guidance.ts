import { z } from 'zod';
import { CROPS, FIG_TYPES, GROWING_FORMS } from '../domain/codes';
import { latSchema, lonSchema, publicRadiusKmSchema } from './atlas';
import { numberFromText } from './text-number';

/* Wire shapes of the guidance charts and the short-season filter (GET /api/guidance/...). */

const intervalSchema = z.object({ low: z.number(), high: z.number() }).nullable();

export const ripeDatesQuerySchema = z.object({
  varietyId: numberFromText(z.coerce.number({ message: 'varietyId must be a number' }).int({ message: 'varietyId must be a whole number' }).positive({ message: 'varietyId must be positive' })),
  lat: latSchema,
  lon: lonSchema,
  radiusKm: publicRadiusKmSchema,
  crop: z.enum(CROPS).default('main'),
});
export type RipeDatesQuery = z.infer<typeof ripeDatesQuerySchema>;

export const ripeDatesResponseSchema = z.object({
  variety: z.object({ id: z.number().int(), name: z.string(), figType: z.enum(FIG_TYPES) }),
  radiusKm: z.number(),
  crop: z.enum(CROPS),
  reports: z.number().int(),
  trees: z.number().int(),
  medianDoy: z.number().nullable(),
  medianLabel: z.string().nullable(),
  bins: z.array(z.object({ week: z.number().int(), startDoy: z.number().int(), label: z.string(), count: z.number().int() })),
});
export type RipeDatesResponse = z.infer<typeof ripeDatesResponseSchema>;

export const seasonSuccessQuerySchema = z.object({
  form: z.enum(GROWING_FORMS).optional(),
  crop: z.enum(CROPS).default('main'),
  varietyId: numberFromText(z.coerce.number({ message: 'varietyId must be a number' }).int().positive().optional()),
  binDays: numberFromText(z.coerce.number({ message: 'binDays must be a number' }).int().min(5, { message: 'binDays must be at least 5' }).max(60, { message: 'binDays must be at most 60' }).default(20)),
});
export type SeasonSuccessQuery = z.infer<typeof seasonSuccessQuerySchema>;

export const seasonSuccessResponseSchema = z.object({
  crop: z.enum(CROPS),
  form: z.enum(GROWING_FORMS).nullable(),
  reports: z.number().int(),
  /** Reports left out because neither their own frost dates nor a station gave a season length. */
  withoutSeason: z.number().int(),
  fromOwnFrostDates: z.number().int(),
  fromStations: z.number().int(),
  bins: z.array(
    z.object({ fromDays: z.number(), toDays: z.number(), reports: z.number().int(), trees: z.number().int(), ripened: z.number(), share: z.number().nullable(), interval90: intervalSchema }),
  ),
  method: z.string(),
});
export type SeasonSuccessResponse = z.infer<typeof seasonSuccessResponseSchema>;

export const shortSeasonQuerySchema = z.object({
  seasonDays: numberFromText(z.coerce.number({ message: 'seasonDays must be a number' }).min(30, { message: 'seasonDays must be at least 30' }).max(366, { message: 'seasonDays must be at most 366' })),
  form: z.enum(GROWING_FORMS).optional(),
  toleranceDays: numberFromText(z.coerce.number({ message: 'toleranceDays must be a number' }).min(0).max(60, { message: 'toleranceDays must be at most 60' }).default(10)),
});
export type ShortSeasonQuery = z.infer<typeof shortSeasonQuerySchema>;

export const shortSeasonResponseSchema = z.object({
  seasonDays: z.number(),
  toleranceDays: z.number(),
  form: z.enum(GROWING_FORMS).nullable(),
  varieties: z.array(
    z.object({
      varietyId: z.number().int(),
      name: z.string(),
      figType: z.enum(FIG_TYPES),
      trees: z.number().int(),
      ripened: z.number(),
      growers: z.number().int(),
      reports: z.number().int(),
      share: z.number().nullable(),
      shortestRipeSeasonDays: z.number().nullable(),
    }),
  ),
  method: z.string(),
});
export type ShortSeasonResponse = z.infer<typeof shortSeasonResponseSchema>;
