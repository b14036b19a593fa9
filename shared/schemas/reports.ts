import { z } from 'zod';
import { CROPS, FIG_TYPES, GROWING_FORMS, OUTCOMES, PLANT_ORIGINS, REPORT_STATUSES, VARIETY_STATUSES } from '../domain/codes';
import { reportRuleIssues } from '../domain/report-rules';
import { numberFromText } from './text-number';

/*
 * Harvest reports on the wire. One schema per shape: the Express routes parse with these, the
 * report form validates with createReportInputSchema (zodResolver), the CSV import runs every row
 * through it too. Dates are 'YYYY-MM-DD' strings; timestamps ISO-8601 strings.
 */

export const NOTES_MAX = 2000;
export const PRACTICE_MAX = 300;
export const REASON_MAX = 500;
export const PHOTOS_PER_REPORT = 6;
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;

const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'Use a date like 2025-08-14', abort: true })
  .refine((value) => {
    const date = new Date(`${value}T00:00:00Z`);
    return !Number.isNaN(date.getTime()) && date.toISOString().slice(0, 10) === value;
  }, { message: 'That day does not exist' });

/** An optional calendar date: an empty form field or a missing CSV cell becomes null. */
const optionalDateSchema = z
  .union([z.literal(''), isoDateSchema])
  .nullish()
  .transform((value) => value || null);

const practiceSchema = (what: string) =>
  z.string().trim().max(PRACTICE_MAX, { message: `Keep ${what} under ${PRACTICE_MAX} characters` }).default('');

/** The fields a grower writes, before the cross-field rules; also the base of a partial edit. */
const reportFieldsSchema = z.object({
  /** An accepted (or already proposed) catalogue variety... */
  varietyId: z.number().int().positive().nullish().transform((value) => value ?? null),
  /** ...or a name that is not listed yet: it becomes a proposal for editors to review. */
  proposedVarietyName: z
    .string()
    .trim()
    .max(80, { message: 'Keep the name under 80 characters' })
    .nullish()
    .transform((value) => value || null),
  /** One of the grower's trees, or null with a label for a new tree. */
  treeId: z.number().int().positive().nullish().transform((value) => value ?? null),
  newTreeLabel: z.string().trim().max(80, { message: 'Keep the label under 80 characters' }).nullish().transform((value) => value || null),
  lat: z.number({ message: 'Enter the latitude as a number' }).min(-90, { message: 'Latitude runs from -90 to 90' }).max(90, { message: 'Latitude runs from -90 to 90' }),
  lon: z.number({ message: 'Enter the longitude as a number' }).min(-180, { message: 'Longitude runs from -180 to 180' }).max(180, { message: 'Longitude runs from -180 to 180' }),
  form: z.enum(GROWING_FORMS, { message: 'Choose how the tree grows' }),
  origin: z.enum(PLANT_ORIGINS, { message: 'Choose where the plant came from' }).default('unknown'),
  yearPlanted: z
    .number({ message: 'Enter a year like 2019' })
    .int({ message: 'Enter a whole year' })
    .min(1900, { message: 'Enter a year from 1900 on' })
    .nullish()
    .transform((value) => value ?? null),
  season: z.number({ message: 'Enter the season year, like 2025' }).int({ message: 'Enter a whole year' }).min(1950, { message: 'Enter a year from 1950 on' }),
  crop: z.enum(CROPS, { message: 'Choose breba or main crop' }),
  outcome: z.enum(OUTCOMES, { message: 'Choose what the crop did' }),
  firstRipeDate: optionalDateSchema,
  lastHarvestDate: optionalDateSchema,
  springFrostDate: optionalDateSchema,
  fallFrostDate: optionalDateSchema,
  pinched: z.boolean().default(false),
  pinchedDate: optionalDateSchema,
  winterProtection: practiceSchema('winter protection'),
  feeding: practiceSchema('feeding'),
  watering: practiceSchema('watering'),
  notes: z.string().trim().max(NOTES_MAX, { message: `Keep notes under ${NOTES_MAX} characters` }).default(''),
});

type ReportFields = z.output<typeof reportFieldsSchema>;

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/**
 * Rules that need several fields at once; shared by create and by an edit merged with the stored
 * row. They also run when some single field failed (so the form shows every problem at once), so
 * they only look at fields that are well formed.
 */
export function addReportIssues(raw: Partial<ReportFields>, ctx: z.RefinementCtx, now = new Date()): void {
  const text = (value: unknown) => (typeof value === 'string' && value.trim() !== '' ? value.trim() : null);
  const date = (value: unknown) => (typeof value === 'string' && ISO_DATE.test(value) ? value : null);
  const int = (value: unknown) => (typeof value === 'number' && Number.isInteger(value) ? value : null);
  const varietyId = raw.varietyId ?? null;
  const proposed = text(raw.proposedVarietyName);
  if (varietyId === null && proposed === null) {
    ctx.addIssue({ code: 'custom', path: ['varietyId'], message: 'Choose a variety, or propose a name if it is not listed' });
  }
  if (varietyId !== null && proposed !== null) {
    ctx.addIssue({ code: 'custom', path: ['proposedVarietyName'], message: 'Choose a listed variety or propose a name, not both' });
  }
  if (proposed !== null && proposed.length < 2) {
    ctx.addIssue({ code: 'custom', path: ['proposedVarietyName'], message: 'Use at least 2 characters' });
  }
  const season = int(raw.season);
  if (season === null) return;
  if (season > now.getUTCFullYear()) {
    ctx.addIssue({ code: 'custom', path: ['season'], message: 'The season cannot be in the future' });
  }
  const issues = reportRuleIssues({
    season,
    yearPlanted: int(raw.yearPlanted),
    outcome: typeof raw.outcome === 'string' ? raw.outcome : 'ripened',
    firstRipeDate: date(raw.firstRipeDate),
    lastHarvestDate: date(raw.lastHarvestDate),
    springFrostDate: date(raw.springFrostDate),
    fallFrostDate: date(raw.fallFrostDate),
    pinched: raw.pinched === true,
    pinchedDate: date(raw.pinchedDate),
  });
  for (const issue of issues) ctx.addIssue({ code: 'custom', path: [issue.field], message: issue.message });
}

/** POST /api/reports, the report form and every CSV row. */
export const createReportInputSchema = reportFieldsSchema.superRefine((value, ctx) => addReportIssues(value, ctx), { when: () => true });
export type CreateReportInput = z.input<typeof createReportInputSchema>;
export type CreateReportValues = z.output<typeof createReportInputSchema>;

/** PATCH /api/reports/:id: any subset of the fields; the server checks the rules on the merged report. */
export const updateReportInputSchema = reportFieldsSchema.partial();
export type UpdateReportInput = z.input<typeof updateReportInputSchema>;

/** The full rule check of a merged edit (the stored report with the edit applied). */
export const mergedReportSchema = createReportInputSchema;

export const reasonInputSchema = z.object({
  reason: z.string().trim().min(3, { message: 'Say briefly why (at least 3 characters)' }).max(REASON_MAX, { message: `Keep it under ${REASON_MAX} characters` }),
});
export type ReasonInput = z.infer<typeof reasonInputSchema>;

export const reportPhotoSchema = z.object({
  id: z.number().int(),
  url: z.string(),
  thumbUrl: z.string(),
  width: z.number().int(),
  height: z.number().int(),
});
export type ReportPhoto = z.infer<typeof reportPhotoSchema>;

const varietyRefSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  figType: z.enum(FIG_TYPES),
  status: z.enum(VARIETY_STATUSES),
});

/**
 * One report as a viewer may see it. `lat`/`lon` (exact) and `treeLabel` are null unless the
 * viewer owns the report or is an editor; everyone sees `gridLat`/`gridLon`. No e-mail ever.
 */
export const reportSchema = z.object({
  id: z.number().int(),
  treeId: z.number().int(),
  treeLabel: z.string().nullable(),
  variety: varietyRefSchema.nullable(),
  proposedVarietyName: z.string().nullable(),
  lat: z.number().nullable(),
  lon: z.number().nullable(),
  gridLat: z.number(),
  gridLon: z.number(),
  form: z.enum(GROWING_FORMS),
  origin: z.enum(PLANT_ORIGINS),
  yearPlanted: z.number().int().nullable(),
  season: z.number().int(),
  crop: z.enum(CROPS),
  outcome: z.enum(OUTCOMES),
  firstRipeDate: z.string().nullable(),
  lastHarvestDate: z.string().nullable(),
  springFrostDate: z.string().nullable(),
  fallFrostDate: z.string().nullable(),
  pinched: z.boolean(),
  pinchedDate: z.string().nullable(),
  winterProtection: z.string(),
  feeding: z.string(),
  watering: z.string(),
  notes: z.string(),
  status: z.enum(REPORT_STATUSES),
  /** Only the owner and editors see why a report was hidden. */
  hiddenReason: z.string().nullable(),
  hiddenAt: z.string().nullable(),
  /** `supporter`: the grower chose to show that they fund the atlas (and their membership is paid up). */
  grower: z.object({ displayName: z.string(), supporter: z.boolean() }),
  photos: z.array(reportPhotoSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
  viewer: z.object({
    isOwner: z.boolean(),
    canModerate: z.boolean(),
    /** The viewer already has an open flag on this report. */
    hasOpenFlag: z.boolean(),
    /** Open flags on the report (editors only; 0 for others). */
    openFlags: z.number().int(),
  }),
});
export type Report = z.infer<typeof reportSchema>;

export const reportResponseSchema = z.object({
  report: reportSchema,
  /** Plain words for the grower, e.g. why a report was saved as a draft. */
  notice: z.string().optional(),
});

export const reportListItemSchema = z.object({
  id: z.number().int(),
  treeId: z.number().int(),
  treeLabel: z.string().nullable(),
  varietyId: z.number().int().nullable(),
  varietyName: z.string(),
  varietyStatus: z.enum(VARIETY_STATUSES).nullable(),
  figType: z.enum(FIG_TYPES),
  lat: z.number().nullable(),
  lon: z.number().nullable(),
  gridLat: z.number(),
  gridLon: z.number(),
  form: z.enum(GROWING_FORMS),
  origin: z.enum(PLANT_ORIGINS),
  season: z.number().int(),
  crop: z.enum(CROPS),
  outcome: z.enum(OUTCOMES),
  firstRipeDate: z.string().nullable(),
  status: z.enum(REPORT_STATUSES),
  photoCount: z.number().int(),
  thumbUrl: z.string().nullable(),
  growerName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type ReportListItem = z.infer<typeof reportListItemSchema>;

export const REPORT_SORTS = ['season', 'createdAt', 'updatedAt', 'variety', 'crop', 'outcome', 'form', 'status'] as const;
export type ReportSort = (typeof REPORT_SORTS)[number];

/** An optional whole number from the query string; an empty one (`varietyId=`) is no filter, not 0. */
const optionalInt = (name: string) => numberFromText(z.coerce.number({ message: `${name} must be a number` }).int({ message: `${name} must be a whole number` }).optional());

/** The public filters, shared by the list and both exports. */
export const reportFilterSchema = z.object({
  varietyId: optionalInt('varietyId'),
  figType: z.enum(FIG_TYPES).optional(),
  crop: z.enum(CROPS).optional(),
  outcome: z.enum(OUTCOMES).optional(),
  form: z.enum(GROWING_FORMS).optional(),
  seasonFrom: optionalInt('seasonFrom'),
  seasonTo: optionalInt('seasonTo'),
});
export type ReportFilter = z.infer<typeof reportFilterSchema>;

/** GET /api/reports: `mine=true` lists the signed-in grower's own reports (any status). */
export const reportListQuerySchema = reportFilterSchema.extend({
  mine: z
    .enum(['true', 'false'], { message: 'mine must be true or false' })
    .optional()
    .transform((value) => value === 'true'),
  /** Only with mine=true. */
  status: z.enum(REPORT_STATUSES).optional(),
  /** One tree's reports (its seasons together): published ones, or all of them with mine=true. */
  treeId: optionalInt('treeId'),
  /** Variety name or tree label contains this (case-insensitive). */
  q: z.string().trim().max(100).optional(),
  sort: z.enum(REPORT_SORTS).default('createdAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: numberFromText(z.coerce.number().int().min(1).default(1)),
  pageSize: numberFromText(z.coerce.number().int().min(1).max(500).default(50)),
});
export type ReportListQuery = z.input<typeof reportListQuerySchema>;

export const reportListSchema = z.object({
  reports: z.array(reportListItemSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type ReportList = z.infer<typeof reportListSchema>;

export const treeSchema = z.object({
  id: z.number().int(),
  label: z.string(),
  reportCount: z.number().int(),
  /** The variety and place of the tree's latest report, to fill the form. */
  lastVarietyId: z.number().int().nullable(),
  lastVarietyName: z.string().nullable(),
  lastLat: z.number().nullable(),
  lastLon: z.number().nullable(),
  lastForm: z.enum(GROWING_FORMS).nullable(),
  lastOrigin: z.enum(PLANT_ORIGINS).nullable(),
  lastYearPlanted: z.number().int().nullable(),
});
export type Tree = z.infer<typeof treeSchema>;
export const treeListSchema = z.object({ trees: z.array(treeSchema) });

export const photoListSchema = z.object({ photos: z.array(reportPhotoSchema) });

export const importResultSchema = z.object({ imported: z.number().int(), reportIds: z.array(z.number().int()), drafts: z.number().int() });
export type ImportResult = z.infer<typeof importResultSchema>;
