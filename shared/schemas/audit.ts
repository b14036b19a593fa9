import { z } from 'zod';
import { numberFromText } from './text-number';

/** GET /api/audit: filters and server-side pagination (newest first). */
export const auditQuerySchema = z.object({
  actorId: numberFromText(z.coerce.number().int().positive().optional()),
  action: z.string().trim().max(60).optional(),
  entityType: z.string().trim().max(40).optional(),
  entityId: numberFromText(z.coerce.number().int().positive().optional()),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  limit: numberFromText(z.coerce.number().int().min(1).max(200).default(25)),
  offset: numberFromText(z.coerce.number().int().min(0).default(0)),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditEntrySchema = z.object({
  id: z.number().int(),
  actorId: z.number().int().nullable(),
  actor: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.number().int().nullable(),
  /** The record in words (a variety's or person's name, a report's variety and season); null when gone. */
  entityName: z.string().nullable().default(null),
  before: z.unknown(),
  after: z.unknown(),
  createdAt: z.string(),
});
export type AuditEntryView = z.infer<typeof auditEntrySchema>;

export const auditPageSchema = z.object({
  items: z.array(auditEntrySchema),
  total: z.number().int(),
  /** Names for the ids inside before/after: variety ids (varietyId, mergedIntoId...) and person ids (userId...). */
  names: z.object({ varieties: z.record(z.string(), z.string()), users: z.record(z.string(), z.string()) }).default({ varieties: {}, users: {} }),
  /** Values for the filter menus. */
  facets: z.object({
    actions: z.array(z.string()),
    entityTypes: z.array(z.string()),
    actors: z.array(z.object({ id: z.number().int(), name: z.string() })),
  }),
});
export type AuditPage = z.infer<typeof auditPageSchema>;
