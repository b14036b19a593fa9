import { z } from 'zod';
import { CROPS, FLAG_STATUSES, GROWING_FORMS, OUTCOMES, REPORT_STATUSES } from '../domain/codes';
import { SUSPICION_RULES } from '../domain/moderation-rules';
import { numberFromText } from './text-number';

/** Which part of the queue to show: open flags, rule findings, both, or hidden reports (to restore). */
export const MODERATION_KINDS = ['all', 'flagged', 'suspicious', 'hidden'] as const;
export type ModerationKind = (typeof MODERATION_KINDS)[number];

export const moderationQueueQuerySchema = z.object({
  kind: z.enum(MODERATION_KINDS).default('all'),
  rule: z.enum(SUSPICION_RULES).optional(),
  limit: numberFromText(z.coerce.number().int().min(1).max(100).default(20)),
  offset: numberFromText(z.coerce.number().int().min(0).default(0)),
});
export type ModerationQueueQuery = z.infer<typeof moderationQueueQuerySchema>;

export const reportFlagSchema = z.object({
  id: z.number().int(),
  reason: z.string(),
  status: z.enum(FLAG_STATUSES),
  flaggedBy: z.string().nullable(),
  createdAt: z.string(),
});

export const moderationItemSchema = z.object({
  report: z.object({
    id: z.number().int(),
    grower: z.string(),
    varietyId: z.number().int().nullable(),
    varietyName: z.string().nullable(),
    season: z.number().int(),
    crop: z.enum(CROPS),
    outcome: z.enum(OUTCOMES),
    form: z.enum(GROWING_FORMS),
    lat: z.number(),
    lon: z.number(),
    springFrostDate: z.string().nullable(),
    firstRipeDate: z.string().nullable(),
    lastHarvestDate: z.string().nullable(),
    fallFrostDate: z.string().nullable(),
    notes: z.string(),
    status: z.enum(REPORT_STATUSES),
    hiddenReason: z.string().nullable(),
    hiddenAt: z.string().nullable(),
    createdAt: z.string(),
  }),
  flags: z.array(reportFlagSchema),
  suspicions: z.array(z.object({ rule: z.enum(SUSPICION_RULES), message: z.string() })),
});
export type ModerationItem = z.infer<typeof moderationItemSchema>;
export const moderationQueueSchema = z.object({ items: z.array(moderationItemSchema), total: z.number().int() });

/** GET /api/moderation/summary: what needs an editor's attention, for the overview tab. */
export const moderationSummarySchema = z.object({
  openFlags: z.number().int(),
  proposedVarieties: z.number().int(),
  suspiciousReports: z.number().int(),
  hiddenReports: z.number().int(),
  activeWaspAreas: z.number().int(),
});
export type ModerationSummary = z.infer<typeof moderationSummarySchema>;
