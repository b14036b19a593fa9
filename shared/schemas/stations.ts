import { z } from 'zod';
import { blankToUndefined, numberFromText } from './text-number';

/** A climate station in lists and on the map's frost-free season layer. */
export const stationListItemSchema = z.object({
  id: z.number().int(),
  code: z.string().nullable(),
  name: z.string(),
  lat: z.number(),
  lon: z.number(),
  elevationM: z.number().nullable(),
  firstDate: z.string().nullable(),
  lastDate: z.string().nullable(),
  dayCount: z.number().int(),
  /** Frost-free days at 32 deg F not exceeded in half the years; null until computed or when unknown. */
  days50: z.number().nullable(),
});
export type StationListItem = z.infer<typeof stationListItemSchema>;

/** GET /api/stations (public). */
export const stationListSchema = z.object({ stations: z.array(stationListItemSchema) });

/** Units a station file's temperatures may be in; they are stored in deg C. */
export const STATION_UNITS = ['C', 'F'] as const;
export type StationUnit = (typeof STATION_UNITS)[number];

/**
 * POST /api/stations/upload: the form fields sent beside the CSV file (multipart, so every value
 * arrives as text). A station with the same code is replaced; without a code, a new one is made.
 */
export const stationUploadFieldsSchema = z.object({
  name: z.string({ message: 'Give the station a name' }).trim().min(1, { message: 'Give the station a name' }).max(120, { message: 'The name can be at most 120 characters' }),
  code: z.preprocess(blankToUndefined, z.string().trim().max(40, { message: 'The code can be at most 40 characters' }).optional()),
  // An empty field is missing, not 0 (z.coerce.number alone turns '' into 0, a station off West Africa).
  lat: numberFromText(z.coerce.number({ message: 'Enter the latitude as a number, e.g. 42.74' }).min(-90, { message: 'Latitude must be between -90 and 90' }).max(90, { message: 'Latitude must be between -90 and 90' })),
  lon: numberFromText(z.coerce.number({ message: 'Enter the longitude as a number, e.g. -73.81' }).min(-180, { message: 'Longitude must be between -180 and 180' }).max(180, { message: 'Longitude must be between -180 and 180' })),
  elevationM: numberFromText(
    z.coerce.number({ message: 'Enter the elevation in metres as a number, or leave it empty' }).min(-450, { message: 'Elevation must be at least -450 m' }).max(9000, { message: 'Elevation must be at most 9000 m' }).optional(),
  ),
  /** Left empty, the file's own layout decides (GHCN-Daily: deg C; year/month/day exports: deg F). */
  unit: z.preprocess(blankToUndefined, z.enum(STATION_UNITS, { message: 'The unit must be C, F or left empty' }).optional()),
});
export type StationUploadFields = z.infer<typeof stationUploadFieldsSchema>;

/** One year's freeze dates at one threshold (day of year; null = no freeze that half-year). */
export const stationFreezeYearSchema = z.object({
  thresholdF: z.number().int(),
  year: z.number().int(),
  lastSpringDoy: z.number().int().nullable(),
  firstFallDoy: z.number().int().nullable(),
  seasonDays: z.number().int().nullable(),
  /** Why the year is left out of the summaries (missing days); null when it counts. */
  leftOutReason: z.string().nullable().default(null),
});
export type StationFreezeYear = z.infer<typeof stationFreezeYearSchema>;

/** Dates and season length at one threshold and probability (10 / 50 / 90 %), over `years` years. */
export const stationSummarySchema = z.object({
  thresholdF: z.number().int(),
  probability: z.number().int(),
  lastSpringDoy: z.number().int().nullable(),
  firstFallDoy: z.number().int().nullable(),
  seasonDays: z.number().int().nullable(),
  years: z.number().int(),
});
export type StationSummary = z.infer<typeof stationSummarySchema>;

/** GET /api/stations/:id and the answer to an upload. */
export const stationDetailSchema = z.object({
  station: stationListItemSchema,
  freezeYears: z.array(stationFreezeYearSchema),
  summaries: z.array(stationSummarySchema),
});
export type StationDetail = z.infer<typeof stationDetailSchema>;

/** One NOAA climate-normals station's 32 °F figures and heat (GET /api/stations/normals/:code). */
export const normalsStationSchema = z.object({
  code: z.string(),
  name: z.string(),
  state: z.string().nullable(),
  lat: z.number(),
  lon: z.number(),
  elevationM: z.number().nullable(),
  /** Days of year (1 January = 1, a common year); null where the normals give no date. */
  lastSpringDoy50: z.number().int().nullable(),
  lastSpringDoy90: z.number().int().nullable(),
  firstFallDoy50: z.number().int().nullable(),
  firstFallDoy90: z.number().int().nullable(),
  /** Growing-season days reached in 50 % / 90 % of years. */
  seasonDays50: z.number().int().nullable(),
  seasonDays90: z.number().int().nullable(),
  /** "never": frost-free all year (-6666); "any-month": no frost-free season defined (-4444). */
  freezeNote: z.enum(['never', 'any-month']).nullable(),
  /** The special value in words, when there is one. */
  freezeWords: z.string().nullable(),
  gdd50F: z.number().nullable(),
  flag: z.string().nullable(),
  release: z.string(),
  periodStart: z.number().int(),
  periodEnd: z.number().int(),
});
export type NormalsStationView = z.infer<typeof normalsStationSchema>;

/** The normals releases held (GET /api/stations/normals). */
export const normalsReleasesSchema = z.object({
  releases: z.array(z.object({ name: z.string(), periodStart: z.number().int(), periodEnd: z.number().int(), source: z.string(), stationCount: z.number().int(), loadedAt: z.string() })),
});

/** POST /api/stations/bulk: the form field beside the files (the release a normals set belongs to). */
export const bulkImportFieldsSchema = z.object({
  release: z.preprocess(blankToUndefined, z.string().trim().regex(/^\d{4}-\d{4}$/, { message: 'The release must be a period such as 1991-2020' }).optional()),
});

export const bulkStationResultSchema = z.object({
  code: z.string(),
  name: z.string(),
  status: z.enum(['added', 'replaced', 'refused']),
  reason: z.string().nullable(),
});
export type BulkStationResult = z.infer<typeof bulkStationResultSchema>;

/** What a bulk import did: the set's layout, the normals release, counts, and each station. */
export const bulkImportSummarySchema = z.object({
  kind: z.enum(['normals-fixed-width', 'normals-csv', 'ghcn-daily']),
  release: z.string().nullable(),
  added: z.number().int(),
  replaced: z.number().int(),
  refused: z.number().int(),
  stations: z.array(bulkStationResultSchema),
});
export type BulkImportSummary = z.infer<typeof bulkImportSummarySchema>;

/**
 * The answer to a bulk import is a stream of JSON lines (application/x-ndjson): one `progress` line
 * per station as it is read and computed, then one `summary` (written) or `failed` (nothing
 * written, with every problem) line.
 */
export const bulkImportLineSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('progress'), code: z.string(), index: z.number().int(), total: z.number().int(), status: z.enum(['read', 'refused']), message: z.string().optional() }),
  z.object({ type: z.literal('summary'), summary: bulkImportSummarySchema }),
  z.object({ type: z.literal('failed'), status: z.number().int(), message: z.string(), problems: z.array(z.string()) }),
]);
export type BulkImportLine = z.infer<typeof bulkImportLineSchema>;
