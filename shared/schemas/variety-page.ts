import { z } from 'zod';
import { CROPS } from '../domain/codes';
import { varietySchema } from './varieties';

/*
 * GET /api/varieties/:id/page: everything a variety's own page shows, from published reports
 * only, placed by their public grid cells (never a grower's exact place).
 */

export const varietyCellSchema = z.object({
  gridLat: z.number(),
  gridLon: z.number(),
  /** Trees in this cell whose report ripened figs / whose reports never did. */
  ripenedTrees: z.number().int(),
  failedTrees: z.number().int(),
});
export type VarietyCell = z.infer<typeof varietyCellSchema>;

export const varietyPageSchema = z.object({
  variety: varietySchema,
  totals: z.object({ reports: z.number().int(), trees: z.number().int(), growers: z.number().int(), ripenedTrees: z.number().int() }),
  cells: z.array(varietyCellSchema),
  /** First-ripe dates of ripened reports across the atlas, by week of the year (day-of-year bins). */
  ripeDates: z.object({
    crop: z.enum(CROPS),
    reports: z.number().int(),
    trees: z.number().int(),
    medianDoy: z.number().nullable(),
    bins: z.array(z.object({ week: z.number().int(), startDoy: z.number().int(), count: z.number().int() })),
  }),
  /** Days from the grower's last spring frost to the first ripe main-crop fig, on reports that gave both. */
  daysNeeded: z.object({ reports: z.number().int(), median: z.number().nullable(), low: z.number().nullable(), high: z.number().nullable() }),
  photos: z.array(z.object({ reportId: z.number().int(), season: z.number().int(), url: z.string(), thumbUrl: z.string() })),
  /** Whether the signed-in viewer follows it (false for visitors). */
  following: z.boolean(),
});
export type VarietyPage = z.infer<typeof varietyPageSchema>;
