import { z } from 'zod';
import { FIG_TYPES, RIPENING_CLASSES, VARIETY_STATUSES } from '../domain/codes';
import { numberFromText } from './text-number';

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

/* ---------- Editors' catalogue (editor role) ---------- */

const optionalText = (max: number) => z.string().trim().max(max);

/** POST /api/varieties and the editor's form: one variety with the sources behind its claims. */
export const varietyInputSchema = z
  .object({
    name: z.string().trim().min(2, 'Give the variety a name of at least 2 characters').max(80),
    synonyms: z.array(z.string().trim().min(1).max(80)).max(30).default([]),
    figType: z.enum(FIG_TYPES),
    bearsBreba: z.boolean(),
    bearsMain: z.boolean(),
    ripeningClass: z.enum(RIPENING_CLASSES).nullable().default(null),
    typicalDaysToRipen: z.number().int().min(60, 'Use 60 to 300 days').max(300, 'Use 60 to 300 days').nullable().default(null),
    notes: optionalText(2000).default(''),
    sources: optionalText(4000).default(''),
  })
  .superRefine((v, ctx) => {
    if (!v.bearsBreba && !v.bearsMain) ctx.addIssue({ code: 'custom', path: ['bearsMain'], message: 'A variety bears at least one crop' });
    const claims = v.ripeningClass !== null || v.typicalDaysToRipen !== null || v.figType !== 'unknown';
    if (claims && !v.sources.trim()) ctx.addIssue({ code: 'custom', path: ['sources'], message: 'Name a source for the fig type and ripening claims (one per line)' });
    const lower = v.name.toLowerCase();
    const seen = new Set<string>();
    for (const synonym of v.synonyms) {
      const key = synonym.toLowerCase();
      if (key === lower) ctx.addIssue({ code: 'custom', path: ['synonyms'], message: `“${synonym}” is the variety’s own name` });
      else if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['synonyms'], message: `“${synonym}” is listed twice` });
      seen.add(key);
    }
  });
export type VarietyInput = z.infer<typeof varietyInputSchema>;
export type VarietyFormValues = z.input<typeof varietyInputSchema>;

export const mergeVarietyInputSchema = z.object({ intoId: z.number().int().positive() });
export const rejectVarietyInputSchema = z.object({ reason: z.string().trim().min(5, 'Tell the grower why, in a sentence').max(500) });

export const CATALOGUE_SORTS = ['name', 'status', 'figType', 'reportCount', 'createdAt'] as const;

/** GET /api/varieties/catalogue: every variety, any status, paginated on the server. */
export const catalogueQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  status: z.enum(VARIETY_STATUSES).optional(),
  figType: z.enum(FIG_TYPES).optional(),
  sort: z.enum(CATALOGUE_SORTS).default('name'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  limit: numberFromText(z.coerce.number().int().min(1).max(200).default(25)),
  offset: numberFromText(z.coerce.number().int().min(0).default(0)),
});
export type CatalogueQuery = z.infer<typeof catalogueQuerySchema>;

export const catalogueEntrySchema = varietySchema.extend({
  reportCount: z.number().int(),
  proposedBy: z.string().nullable(),
  reviewNote: z.string().nullable(),
  mergedIntoId: z.number().int().nullable(),
  mergedIntoName: z.string().nullable(),
  createdAt: z.string(),
});
export type CatalogueEntry = z.infer<typeof catalogueEntrySchema>;
export const catalogueSchema = z.object({ items: z.array(catalogueEntrySchema), total: z.number().int() });

export const mergeResultSchema = z.object({ kept: varietySchema, movedReports: z.number().int(), addedSynonyms: z.array(z.string()) });

/** POST /api/varieties/import: the CSV text (same columns as the export). */
export const catalogueImportInputSchema = z.object({ csv: z.string().min(1, 'The file is empty').max(2_000_000) });
export const catalogueImportResultSchema = z.object({ created: z.number().int(), updated: z.number().int() });

/** The columns of the catalogue CSV, in order. Lists (synonyms) are separated by "; ". */
export const CATALOGUE_CSV_COLUMNS = ['name', 'synonyms', 'figType', 'bearsBreba', 'bearsMain', 'ripeningClass', 'typicalDaysToRipen', 'notes', 'sources'] as const;
