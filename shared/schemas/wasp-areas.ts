import { z } from 'zod';
import { WASP_AREA_STATUSES } from '../domain/codes';
import { numberFromText } from './text-number';

/** A wasp area's properties as carried on its GeoJSON feature. */
export const waspAreaPropertiesSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  source: z.string(),
  observedOn: z.string(),
  status: z.enum(WASP_AREA_STATUSES),
});
export type WaspAreaProperties = z.infer<typeof waspAreaPropertiesSchema>;

const position = z.array(z.number()).min(2).max(3);
const polygonCoordinates = z.array(z.array(position));

export const waspAreaGeometrySchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('Polygon'), coordinates: polygonCoordinates }),
  z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(polygonCoordinates) }),
]);
export type WaspAreaGeometry = z.infer<typeof waspAreaGeometrySchema>;

/** GET /api/wasp-areas: a GeoJSON FeatureCollection of the areas (active ones unless asked). */
export const waspAreaCollectionSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z.array(
    z.object({
      type: z.literal('Feature'),
      id: z.number().int(),
      geometry: waspAreaGeometrySchema,
      properties: waspAreaPropertiesSchema,
    }),
  ),
});
export type WaspAreaCollection = z.infer<typeof waspAreaCollectionSchema>;

/* ---------- Editors' wasp-area records (editor role) ---------- */

const isoDate = z.iso.date({ message: 'Use a date like 2025-07-15' });

/**
 * POST /api/wasp-areas: the geometry may be a Feature, a FeatureCollection of one area or a bare
 * Polygon/MultiPolygon; the server checks it with validateWaspGeometry (shared/domain/wasp-geometry.ts).
 */
export const waspAreaInputSchema = z.object({
  name: z.string().trim().min(2, 'Name the area').max(120),
  source: z.string().trim().min(3, 'Say where the record comes from (survey, extension note, publication…)').max(1000),
  observedOn: isoDate.refine((d) => d <= new Date().toISOString().slice(0, 10), 'The date observed cannot be in the future'),
  geometry: z.unknown().refine((g) => g !== undefined && g !== null, 'Draw the area on the map or upload a GeoJSON file'),
});
export type WaspAreaInput = z.infer<typeof waspAreaInputSchema>;
/** PATCH /api/wasp-areas/:id: any of the fields; unknown keys and an empty change are refused. */
export const waspAreaUpdateSchema = waspAreaInputSchema
  .partial()
  .strict()
  .refine((change) => Object.values(change).some((v) => v !== undefined), { message: 'Nothing to change: send a name, source, observedOn or geometry' });
export type WaspAreaUpdate = z.infer<typeof waspAreaUpdateSchema>;

export const waspAreaRecordSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  source: z.string(),
  observedOn: z.string(),
  status: z.enum(WASP_AREA_STATUSES),
  retiredAt: z.string().nullable(),
  geometry: waspAreaGeometrySchema,
  vertexCount: z.number().int(),
  areaKm2: z.number(),
  createdBy: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type WaspAreaRecord = z.infer<typeof waspAreaRecordSchema>;

export const waspAreaRecordListQuerySchema = z.object({
  status: z.enum(WASP_AREA_STATUSES).optional(),
  q: z.string().trim().max(100).optional(),
  limit: numberFromText(z.coerce.number().int().min(1).max(200).default(25)),
  offset: numberFromText(z.coerce.number().int().min(0).default(0)),
});
export const waspAreaRecordListSchema = z.object({ items: z.array(waspAreaRecordSchema), total: z.number().int() });
export const waspAreaRecordResponseSchema = z.object({ area: waspAreaRecordSchema });
