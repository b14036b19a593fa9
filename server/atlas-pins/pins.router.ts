import { Router } from 'express';
import { cellQuerySchema, cellResponseSchema, pinsQuerySchema, pinsResponseSchema, type PinFilters } from '../../shared/schemas/pins';
import type { Db } from '../db/client';
import { buildPinIndex, type PinIndex } from './pin-index';
import { atlasDataVersion } from '../db/data-version';
import { listCellReports, listPinCells } from './pins.repo';

const MAX_CACHED_FILTER_SETS = 24;

/** A filter set as a stable cache key. */
export function filterKey(filters: PinFilters): string {
  const entries = Object.entries(filters).filter(([, v]) => v !== undefined);
  return JSON.stringify(entries.sort(([a], [b]) => a.localeCompare(b)));
}

/**
 * A build slower than this marks a large atlas: its pins may then lag new reports by up to
 * `MAX_STALE_MS`, so a stream of writes does not rebuild the index for every read. A small atlas
 * (the demo, the tests) is always answered fresh.
 */
export const MAX_STALE_MS = 5_000;
const SLOW_MS = 50;

/** Pin indexes kept in memory per filter set, valid for one atlas data version (an O(1) read). */
export function createPinCache(db: Db) {
  const indexes = new Map<string, { version: string; index: PinIndex; builtAt: number; tookMs: number }>();

  return {
    get(filters: PinFilters, now = Date.now()): { version: string; index: PinIndex } {
      const v = String(atlasDataVersion(db));
      const key = filterKey(filters);
      const hit = indexes.get(key);
      if (hit && (hit.version === v || (hit.tookMs >= SLOW_MS && now - hit.builtAt < MAX_STALE_MS))) {
        // Refresh its place in the least-recently-used order.
        indexes.delete(key);
        indexes.set(key, hit);
        return hit;
      }
      const started = performance.now();
      const entry = { version: v, index: buildPinIndex(listPinCells(db, filters)), builtAt: now, tookMs: 0 };
      entry.tookMs = performance.now() - started;
      indexes.delete(key);
      indexes.set(key, entry);
      while (indexes.size > MAX_CACHED_FILTER_SETS) indexes.delete(indexes.keys().next().value!);
      return entry;
    },
  };
}

/** GET /api/atlas/pins and /api/atlas/pins/cell: public, published reports on the coarse grid only. */
export function createPinsRouter({ db }: { db: Db }): Router {
  const router = Router();
  const cache = createPinCache(db);

  router.get('/', (req, res) => {
    const { bbox, zoom, ...filters } = pinsQuerySchema.parse(req.query);
    const { version, index } = cache.get(filters);
    res.setHeader('Cache-Control', 'no-cache');
    res.json(pinsResponseSchema.parse({ type: 'FeatureCollection', features: index.query(bbox, zoom), totalReports: index.totalReports, dataVersion: version }));
  });

  router.get('/cell', (req, res) => {
    const query = cellQuerySchema.parse(req.query);
    const { total, reports } = listCellReports(db, query);
    res.json(cellResponseSchema.parse({ cell: { lat: query.lat, lon: query.lon }, total, reports }));
  });

  return router;
}
