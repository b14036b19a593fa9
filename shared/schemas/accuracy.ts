import { z } from 'zod';

const scoresSchema = z.object({ brier: z.number(), logLoss: z.number() });

/** GET /api/accuracy: leave-one-grower-out cross-validation of the chance (issue 16). */
export const modelAccuracySchema = z.object({
  /** 'pending' until the background job has computed the figures once. */
  status: z.enum(['ready', 'pending']),
  computedAt: z.string().nullable(),
  /** Held-out tree-seasons (n), trees and growers. */
  treeSeasons: z.number().int(),
  trees: z.number().int(),
  growers: z.number().int(),
  /** Share of the tree-seasons from invented demo growers (0..1). */
  demoShare: z.number(),
  scores: z
    .object({ chance: scoresSchema, overallRate: scoresSchema, adjustedShare: scoresSchema })
    .nullable(),
  /** 1 − Brier(chance) / Brier(overall rate); above 0 means better than the variety's overall rate. */
  brierSkillScore: z.number().nullable(),
  bins: z.array(
    z.object({ from: z.number(), to: z.number(), count: z.number().int(), meanPredicted: z.number().nullable(), observed: z.number().nullable() }),
  ),
  method: z.string(),
});
export type ModelAccuracy = z.infer<typeof modelAccuracySchema>;
