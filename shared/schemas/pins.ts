import { z } from 'zod';
import { CROPS, FIG_TYPES, GROWING_FORMS, OUTCOMES } from '../domain/codes';
import { latSchema, lonSchema } from './atlas';
import { decimalNumber, numberFromText } from './text-number';

/*
 * The atlas map's report pins: GET /api/atlas/pins (clusters and grid cells for a viewport) and
 * GET /api/atlas/pins/cell (the reports on one public grid cell). Only published reports, only
 * their public grid positions: no exact coordinates ever appear here.
 */

const yearSchema = (name: string) =>
  z.coerce.number({ message: `${name} must be a year` }).int({ message: `${name} must be a whole year` }).min(1900, { message: `${name} must be 1900 or later` }).max(2100, { message: `${name} must be 2100 or earlier` });

// An empty filter (`seasonFrom=`) is no filter, not 0; an empty zoom is missing.

/** The map's filters; every one is optional, and each narrows the reports shown. */
export const pinFiltersSchema = z
  .object({
    varietyId: numberFromText(z.coerce.number({ message: 'varietyId must be a number' }).int().positive({ message: 'varietyId must be a positive id' }).optional()),
    figType: z.enum(FIG_TYPES, { message: `figType must be one of ${FIG_TYPES.join(', ')}` }).optional(),
    crop: z.enum(CROPS, { message: `crop must be one of ${CROPS.join(', ')}` }).optional(),
    outcome: z.enum(OUTCOMES, { message: `outcome must be one of ${OUTCOMES.join(', ')}` }).optional(),
    form: z.enum(GROWING_FORMS, { message: `form must be one of ${GROWING_FORMS.join(', ')}` }).optional(),
    seasonFrom: numberFromText(yearSchema('seasonFrom').optional()),
    seasonTo: numberFromText(yearSchema('seasonTo').optional()),
  })
  .refine((f) => f.seasonFrom === undefined || f.seasonTo === undefined || f.seasonFrom <= f.seasonTo, {
    message: 'seasonFrom must not be after seasonTo',
    path: ['seasonFrom'],
  });
export type PinFilters = z.infer<typeof pinFiltersSchema>;

/** "west,south,east,north" in degrees; west may exceed east when the view crosses the 180th meridian. */
export const bboxSchema = z
  .string({ message: 'bbox is required as west,south,east,north' })
  .transform((value, ctx) => {
    const parts = value.split(',').map(decimalNumber);
    const [west, south, east, north] = parts;
    const ok =
      parts.length === 4 &&
      parts.every(Number.isFinite) &&
      Math.abs(west!) <= 180 &&
      Math.abs(east!) <= 180 &&
      Math.abs(south!) <= 90 &&
      Math.abs(north!) <= 90 &&
      south! <= north!;
    if (!ok) {
      ctx.addIssue({ code: 'custom', message: 'bbox must be west,south,east,north in degrees (longitudes -180..180, latitudes -90..90, south not above north)' });
      return z.NEVER;
    }
    return { west: west!, south: south!, east: east!, north: north! };
  });
export type Bbox = z.output<typeof bboxSchema>;

export const PIN_MAX_ZOOM = 22;

export const pinsQuerySchema = z.intersection(
  z.object({
    bbox: bboxSchema,
    zoom: numberFromText(z.coerce.number({ message: 'zoom must be a number' }).min(0, { message: 'zoom must be 0 or more' }).max(PIN_MAX_ZOOM, { message: `zoom must be at most ${PIN_MAX_ZOOM}` })),
  }),
  pinFiltersSchema,
);
export type PinsQuery = z.output<typeof pinsQuerySchema>;

/** A group of nearby grid cells: `reports` reports on `cells` cells; zoom to `expansionZoom` to see them apart. */
export const pinClusterPropertiesSchema = z.object({
  kind: z.literal('cluster'),
  clusterId: z.number().int(),
  cells: z.number().int(),
  reports: z.number().int(),
  ripened: z.number().int(),
  unripe: z.number().int(),
  expansionZoom: z.number().int(),
});

/** One public grid cell with `reports` reports; `reportId` is set when it holds exactly one. */
export const pinCellPropertiesSchema = z.object({
  kind: z.literal('cell'),
  reports: z.number().int(),
  /** Of `reports`, how many ripened and how many were still unripe at season's end (the rest dropped or bore nothing). */
  ripened: z.number().int(),
  unripe: z.number().int(),
  reportId: z.number().int().nullable(),
});

export const pinFeatureSchema = z.object({
  type: z.literal('Feature'),
  geometry: z.object({ type: z.literal('Point'), coordinates: z.tuple([z.number(), z.number()]) }),
  properties: z.discriminatedUnion('kind', [pinClusterPropertiesSchema, pinCellPropertiesSchema]),
});
export type PinFeature = z.infer<typeof pinFeatureSchema>;

/** GET /api/atlas/pins: a GeoJSON FeatureCollection, plus how many reports match in all. */
export const pinsResponseSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z.array(pinFeatureSchema),
  /** Reports matching the filters anywhere (not only in the view). */
  totalReports: z.number().int(),
  dataVersion: z.string(),
});
export type PinsResponse = z.infer<typeof pinsResponseSchema>;

export const cellQuerySchema = z.intersection(z.object({ lat: latSchema, lon: lonSchema }), pinFiltersSchema);
export type CellQuery = z.output<typeof cellQuerySchema>;

/** One report's public summary as the map's popup shows it. */
export const pinReportSummarySchema = z.object({
  id: z.number().int(),
  /** The accepted variety's id, for the link to its page (null for a name awaiting review). */
  varietyId: z.number().int().nullable().optional(),
  varietyName: z.string(),
  figType: z.enum(FIG_TYPES),
  crop: z.enum(CROPS),
  outcome: z.enum(OUTCOMES),
  season: z.number().int(),
  form: z.enum(GROWING_FORMS),
});
export type PinReportSummary = z.infer<typeof pinReportSummarySchema>;

/** GET /api/atlas/pins/cell: the reports on one grid cell (newest season first, at most `limit`). */
export const cellResponseSchema = z.object({
  cell: z.object({ lat: z.number(), lon: z.number() }),
  total: z.number().int(),
  reports: z.array(pinReportSummarySchema),
});
export type CellResponse = z.infer<typeof cellResponseSchema>;
