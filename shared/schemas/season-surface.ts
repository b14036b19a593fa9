import { z } from 'zod';
import { SURFACE_MAX_ZOOM, SURFACE_MIN_ZOOM } from '../domain/season-surface';
import { latSchema, lonSchema, seasonEstimateSchema } from './atlas';

/*
 * The map's season surface: GET /api/atlas/season-grid/:z/:x/:y (one tile's nodes) and
 * GET /api/atlas/season-at?lat&lon (the estimate at any point, with what it stands on).
 */

export const seasonGridParamsSchema = z
  .object({
    z: z.coerce.number({ message: 'z must be a number' }).int({ message: 'z must be a whole number' }).min(SURFACE_MIN_ZOOM, { message: `z must be ${SURFACE_MIN_ZOOM} or more` }).max(SURFACE_MAX_ZOOM, { message: `z must be at most ${SURFACE_MAX_ZOOM}` }),
    x: z.coerce.number({ message: 'x must be a number' }).int({ message: 'x must be a whole number' }).min(0, { message: 'x must be 0 or more' }),
    y: z.coerce.number({ message: 'y must be a number' }).int({ message: 'y must be a whole number' }).min(0, { message: 'y must be 0 or more' }),
  })
  .refine((t) => t.x < 2 ** t.z, { message: 'x must be below 2^z', path: ['x'] })
  .refine((t) => t.y < 2 ** t.z, { message: 'y must be below 2^z', path: ['y'] });
export type SeasonGridParams = z.infer<typeof seasonGridParamsSchema>;

/**
 * One tile's nodes, row by row from the north-west corner, (cells + 1)² of each list: the typical
 * frost-free days at 32 °F (null where nothing is in range), the stations and grower frost seasons
 * in range, and the nearest station's distance.
 */
export const seasonGridSchema = z.object({
  z: z.number().int(),
  x: z.number().int(),
  y: z.number().int(),
  cells: z.number().int(),
  radiusKm: z.number(),
  /** The stations and atlas data versions the nodes were computed at (changes when either moves). */
  version: z.string(),
  days50: z.array(z.number().nullable()),
  stations: z.array(z.number().int()),
  reports: z.array(z.number().int()),
  nearestKm: z.array(z.number().nullable()),
});
export type SeasonGrid = z.infer<typeof seasonGridSchema>;

export const seasonAtQuerySchema = z.object({ lat: latSchema, lon: lonSchema });
export const seasonAtResponseSchema = z.object({ point: z.object({ lat: z.number(), lon: z.number() }), radiusKm: z.number(), season: seasonEstimateSchema });
export type SeasonAtResponse = z.infer<typeof seasonAtResponseSchema>;
