import { and, asc, eq, gte, lte } from 'drizzle-orm';
import { booleanPointInPolygon, point } from '@turf/turf';
import type { WaspAreaCollection, WaspAreaGeometry } from '../../shared/schemas/wasp-areas';
import type { Db } from '../db/client';
import { waspAreas } from '../db/schema';

type WaspAreaRow = typeof waspAreas.$inferSelect;

export function toFeature(row: WaspAreaRow): WaspAreaCollection['features'][number] {
  return {
    type: 'Feature',
    id: row.id,
    geometry: row.geometry as WaspAreaGeometry,
    properties: { id: row.id, name: row.name, source: row.source, observedOn: row.observedOn, status: row.status },
  };
}

export function listWaspAreas(db: Db, { includeRetired = false } = {}): WaspAreaCollection {
  const rows = db
    .select()
    .from(waspAreas)
    .where(includeRetired ? undefined : eq(waspAreas.status, 'active'))
    .orderBy(asc(waspAreas.name))
    .all();
  return { type: 'FeatureCollection', features: rows.map(toFeature) };
}

/** Active wasp areas that contain the point: a bounding-box query, then an exact polygon test. */
export function findWaspAreasAt(db: Db, lat: number, lon: number): WaspAreaRow[] {
  const candidates = db
    .select()
    .from(waspAreas)
    .where(and(eq(waspAreas.status, 'active'), lte(waspAreas.minLat, lat), gte(waspAreas.maxLat, lat), lte(waspAreas.minLon, lon), gte(waspAreas.maxLon, lon)))
    .all();
  const here = point([lon, lat]);
  return candidates.filter((row) => booleanPointInPolygon(here, row.geometry as WaspAreaGeometry));
}

/** The bounding box stored beside a geometry, so look-ups can skip most polygons. */
export function geometryBounds(geometry: WaspAreaGeometry): { minLat: number; maxLat: number; minLon: number; maxLon: number } {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const positions = polygons.flat(2);
  const lons = positions.map((p) => p[0]!);
  const lats = positions.map((p) => p[1]!);
  return { minLat: Math.min(...lats), maxLat: Math.max(...lats), minLon: Math.min(...lons), maxLon: Math.max(...lons) };
}
