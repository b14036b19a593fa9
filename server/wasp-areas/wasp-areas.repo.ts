import { and, asc, count, desc, eq, gte, lte, sql, type SQL } from 'drizzle-orm';
import { area, booleanPointInPolygon, point } from '@turf/turf';
import type { WaspAreaStatus } from '../../shared/domain/codes';
import type { WaspAreaCollection, WaspAreaGeometry, WaspAreaRecord } from '../../shared/schemas/wasp-areas';
import type { Db } from '../db/client';
import { perDb } from '../db/prepared';
import { users, waspAreas } from '../db/schema';
import { recordAudit } from '../audit/audit.repo';
import { HttpError, notFound } from '../lib/http-error';

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
// Prepared once per database: every GET /atlas/near runs it.
const activeAreasAround = perDb((db) => {
  const lat = sql.placeholder('lat');
  const lon = sql.placeholder('lon');
  return db
    .select()
    .from(waspAreas)
    .where(and(eq(waspAreas.status, 'active'), lte(waspAreas.minLat, lat), gte(waspAreas.maxLat, lat), lte(waspAreas.minLon, lon), gte(waspAreas.maxLon, lon)))
    .prepare();
});

export function findWaspAreasAt(db: Db, lat: number, lon: number): WaspAreaRow[] {
  const candidates = activeAreasAround(db).all({ lat, lon });
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

/* ---------- Editors' records: list with history, create, edit, retire (each audited) ---------- */

export function toRecord(row: WaspAreaRow & { createdBy?: string | null }): WaspAreaRecord {
  const geometry = row.geometry as WaspAreaGeometry;
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return {
    id: row.id,
    name: row.name,
    source: row.source,
    observedOn: row.observedOn,
    status: row.status,
    retiredAt: row.retiredAt,
    geometry,
    vertexCount: polygons.flat(1).reduce((n, ring) => n + ring.length, 0),
    areaKm2: Math.round((area(geometry) / 1e6) * 10) / 10,
    createdBy: row.createdBy ?? null,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}

/** Audit snapshot without the (large) geometry, plus its size. */
function snapshot(record: WaspAreaRecord) {
  const { geometry, ...rest } = record;
  return { ...rest, geometryType: geometry.type };
}

export function listWaspAreaRecords(db: Db, query: { status?: WaspAreaStatus; q?: string; limit: number; offset: number }): { items: WaspAreaRecord[]; total: number } {
  const conditions: SQL[] = [];
  if (query.status) conditions.push(eq(waspAreas.status, query.status));
  if (query.q) conditions.push(sql`lower(${waspAreas.name}) LIKE ${`%${query.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`} ESCAPE '\\'`);
  const where = conditions.length ? and(...conditions) : undefined;
  const total = db.select({ n: count() }).from(waspAreas).where(where).get()!.n;
  const rows = db
    .select({ area: waspAreas, createdBy: users.displayName })
    .from(waspAreas)
    .leftJoin(users, eq(users.id, waspAreas.createdById))
    .where(where)
    .orderBy(asc(waspAreas.status), desc(waspAreas.observedOn), asc(waspAreas.id))
    .limit(query.limit)
    .offset(query.offset)
    .all();
  return { items: rows.map((r) => toRecord({ ...r.area, createdBy: r.createdBy })), total };
}

export function findWaspAreaRecord(db: Db, id: number): WaspAreaRecord | undefined {
  const row = db.select({ area: waspAreas, createdBy: users.displayName }).from(waspAreas).leftJoin(users, eq(users.id, waspAreas.createdById)).where(eq(waspAreas.id, id)).get();
  return row ? toRecord({ ...row.area, createdBy: row.createdBy }) : undefined;
}

export function createWaspArea(db: Db, input: { name: string; source: string; observedOn: string; geometry: WaspAreaGeometry }, actorId: number): WaspAreaRecord {
  return db.transaction(() => {
    const { id } = db
      .insert(waspAreas)
      .values({ ...input, ...geometryBounds(input.geometry), createdById: actorId })
      .returning({ id: waspAreas.id })
      .get();
    const after = findWaspAreaRecord(db, id)!;
    recordAudit(db, { actorId, action: 'wasp-area.create', entityType: 'wasp-area', entityId: id, after: snapshot(after) });
    return after;
  });
}

export function updateWaspArea(db: Db, id: number, changes: { name?: string; source?: string; observedOn?: string; geometry?: WaspAreaGeometry }, actorId: number): WaspAreaRecord {
  return db.transaction(() => {
    const before = findWaspAreaRecord(db, id);
    if (!before) throw notFound('Wasp area');
    db.update(waspAreas)
      .set({ ...changes, ...(changes.geometry ? geometryBounds(changes.geometry) : {}), updatedAt: new Date().toISOString() })
      .where(eq(waspAreas.id, id))
      .run();
    const after = findWaspAreaRecord(db, id)!;
    const geometryChanged = changes.geometry && JSON.stringify(before.geometry) !== JSON.stringify(after.geometry);
    recordAudit(db, {
      actorId,
      action: 'wasp-area.update',
      entityType: 'wasp-area',
      entityId: id,
      before: { ...snapshot(before), ...(geometryChanged ? { geometry: before.geometry } : {}) },
      after: { ...snapshot(after), ...(geometryChanged ? { geometry: after.geometry } : {}) },
    });
    return after;
  });
}

/** Retire an area: it leaves the map and the pollination check but stays in the record. */
export function retireWaspArea(db: Db, id: number, actorId: number): WaspAreaRecord {
  return db.transaction(() => {
    const before = findWaspAreaRecord(db, id);
    if (!before) throw notFound('Wasp area');
    if (before.status === 'retired') throw new HttpError(409, 'already_retired', 'This area is already retired');
    const at = new Date().toISOString();
    db.update(waspAreas).set({ status: 'retired', retiredAt: at, updatedAt: at }).where(eq(waspAreas.id, id)).run();
    const after = findWaspAreaRecord(db, id)!;
    recordAudit(db, { actorId, action: 'wasp-area.retire', entityType: 'wasp-area', entityId: id, before: snapshot(before), after: snapshot(after) });
    return after;
  });
}
