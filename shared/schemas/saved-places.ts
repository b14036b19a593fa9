import { z } from 'zod';
import { GROWING_FORMS } from '../domain/codes';
import { latSchema, lonSchema } from './atlas';

export const savedPlaceSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  lat: z.number(),
  lon: z.number(),
  form: z.enum(GROWING_FORMS),
  isHome: z.boolean(),
});
export type SavedPlace = z.infer<typeof savedPlaceSchema>;

/** GET /api/saved-places (signed in): the grower's places; the home screen opens on the one marked isHome. */
export const savedPlaceListSchema = z.object({ places: z.array(savedPlaceSchema) });

export const savedPlaceInputSchema = z.object({
  name: z.string().trim().min(1, { message: 'Give the place a name' }).max(80),
  lat: latSchema,
  lon: lonSchema,
  form: z.enum(GROWING_FORMS).default('ground'),
  isHome: z.boolean().default(false),
});
export type SavedPlaceInput = z.infer<typeof savedPlaceInputSchema>;

/**
 * PATCH /api/saved-places/:id: any of the fields; no defaults, so what is left out stays as it was.
 * Unknown keys are refused (a misspelt field is an error, not a silent no-op).
 */
export const savedPlacePatchSchema = z
  .object({
    name: savedPlaceInputSchema.shape.name,
    lat: latSchema,
    lon: lonSchema,
    form: z.enum(GROWING_FORMS),
    isHome: z.boolean(),
  })
  .partial()
  .strict();
export type SavedPlacePatch = z.infer<typeof savedPlacePatchSchema>;

/** POST and PATCH answer with the place as saved. */
export const savedPlaceResponseSchema = z.object({ place: savedPlaceSchema });
