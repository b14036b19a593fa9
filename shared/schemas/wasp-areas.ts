import { z } from 'zod';
import { WASP_AREA_STATUSES } from '../domain/codes';

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
