import { z } from 'zod';

/**
 * The calibrated chance that a variety gives an edible crop in a typical season at a point, grown in
 * the chosen form (issue 16). The model behind it is fitted off the request path; the near answer
 * carries it per variety, and "What ripens here" ranks and draws it.
 */
export const chanceSchema = z.object({
  /** Probability (0..1) of an edible crop in a typical season here, grown this way. */
  probability: z.number(),
  /** The interval around it (80 %), 0..1. */
  low: z.number(),
  high: z.number(),
  /** False when the evidence is too thin for a verdict: show "too little evidence (N trees)". */
  enoughEvidence: z.boolean(),
  /** Whole trees behind the figure (local and the variety's own elsewhere), never fractional. */
  trees: z.number().int(),
});
export type Chance = z.infer<typeof chanceSchema>;
