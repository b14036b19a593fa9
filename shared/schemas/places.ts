import { z } from 'zod';
import { blankToUndefined, numberFromText } from './text-number';

/** GET /api/places?q=&near=: towns whose name starts with q, largest first or, with near, nearest and largest first (GeoNames, CC-BY 4.0). */
export const placeSearchQuerySchema = z.object({
  q: z
    .string({ message: 'q is required: a town name' })
    .trim()
    .min(2, { message: 'q must have at least 2 letters' })
    .max(80, { message: 'q must have at most 80 characters' }),
  /** "lat,lon" of the map's centre or the grower's home: nearer towns come first. */
  near: z.preprocess(
    blankToUndefined,
    z
    .string()
    .trim()
    .regex(/^-?\d+(\.\d+)?,-?\d+(\.\d+)?$/, { message: 'near must be "lat,lon" in decimal degrees' })
    .transform((text, ctx) => {
      const [lat, lon] = text.split(',').map(Number) as [number, number];
      if (Math.abs(lat) > 90 || Math.abs(lon) > 180) {
        ctx.addIssue({ code: 'custom', message: 'near must be a latitude within ±90 and a longitude within ±180' });
        return z.NEVER;
      }
      return { lat, lon };
    })
    .optional(),
  ),
  limit: numberFromText(z.coerce.number({ message: 'limit must be a number' }).int().min(1, { message: 'limit must be at least 1' }).max(20, { message: 'limit must be at most 20' }).default(8)),
});
export type PlaceSearchQuery = z.infer<typeof placeSearchQuerySchema>;

export const placeSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  /** Where it is, in words: region (US states only) and country. */
  context: z.string(),
  country: z.string(),
  lat: z.number(),
  lon: z.number(),
  population: z.number().int(),
});
export type Place = z.infer<typeof placeSchema>;

export const placeSearchResponseSchema = z.object({ places: z.array(placeSchema) });
export type PlaceSearchResponse = z.infer<typeof placeSearchResponseSchema>;

/** GET /api/places/nearest?lat=&lon=: the town to name a point by ("near Albany, NY"). */
export const nearestPlaceQuerySchema = z.object({
  lat: numberFromText(z.coerce.number({ message: 'lat must be a number' }).min(-90, { message: 'lat must be between -90 and 90' }).max(90, { message: 'lat must be between -90 and 90' })),
  lon: numberFromText(z.coerce.number({ message: 'lon must be a number' }).min(-180, { message: 'lon must be between -180 and 180' }).max(180, { message: 'lon must be between -180 and 180' })),
});
export const nearestPlaceResponseSchema = z.object({ place: placeSchema.nullable(), distanceKm: z.number().nullable() });
export type NearestPlaceResponse = z.infer<typeof nearestPlaceResponseSchema>;

/** How far a town may be and still name a point. */
export const NEAREST_PLACE_MAX_KM = 50;
