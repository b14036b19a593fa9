import { z } from 'zod';
import { FIG_TYPES } from '../domain/codes';
import { latSchema, lonSchema } from './atlas';

/*
 * What a grower follows (issue 18 item 2): varieties and places. Both are private to the grower;
 * their news goes into the weekly nearby digest. GET/POST /api/follows, DELETE /api/follows/...
 */

export const followInputSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('variety'), varietyId: z.number({ message: 'varietyId must be a number' }).int().positive({ message: 'varietyId must be a variety id' }) }),
    z.object({
      kind: z.literal('place'),
      name: z.string({ message: 'name is required' }).trim().min(1, { message: 'name must not be empty' }).max(80, { message: 'name must have at most 80 characters' }),
      lat: latSchema,
      lon: lonSchema,
    }),
  ],
  { message: 'kind must be variety or place' },
);
export type FollowInput = z.infer<typeof followInputSchema>;

export const followedVarietySchema = z.object({ varietyId: z.number().int(), name: z.string(), figType: z.enum(FIG_TYPES), createdAt: z.string() });
export const followedPlaceSchema = z.object({ id: z.number().int(), name: z.string(), lat: z.number(), lon: z.number(), createdAt: z.string() });
export type FollowedVariety = z.infer<typeof followedVarietySchema>;
export type FollowedPlace = z.infer<typeof followedPlaceSchema>;

export const followListSchema = z.object({ varieties: z.array(followedVarietySchema), places: z.array(followedPlaceSchema) });
export type FollowList = z.infer<typeof followListSchema>;
