import { z } from 'zod';
import { FIG_TYPES, RIPENING_CLASSES, VARIETY_STATUSES } from '../domain/codes';

/** A variety as the API sends it. */
export const varietySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  synonyms: z.array(z.string()),
  figType: z.enum(FIG_TYPES),
  bearsBreba: z.boolean(),
  bearsMain: z.boolean(),
  ripeningClass: z.enum(RIPENING_CLASSES).nullable(),
  typicalDaysToRipen: z.number().int().nullable(),
  notes: z.string(),
  sources: z.string(),
  status: z.enum(VARIETY_STATUSES),
  isFictional: z.boolean(),
});
export type Variety = z.infer<typeof varietySchema>;

export const varietyListQuerySchema = z.object({
  /** Matches the name or a synonym, case-insensitively. */
  q: z.string().trim().max(100).optional(),
  status: z.enum(VARIETY_STATUSES).optional(),
});
export type VarietyListQuery = z.infer<typeof varietyListQuerySchema>;

export const varietyListSchema = z.object({ varieties: z.array(varietySchema) });
export const varietyResponseSchema = z.object({ variety: varietySchema });
