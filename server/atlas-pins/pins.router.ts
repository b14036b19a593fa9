import { Router } from 'express';
import { cellQuerySchema, cellResponseSchema, pinsQuerySchema, pinsResponseSchema } from '../../shared/schemas/pins';
import type { Db } from '../db/client';
import { createPinCache } from './pin-cache';
import { listCellReports } from './pins.repo';

/** GET /api/atlas/pins and /api/atlas/pins/cell: public, published reports on the coarse grid only. */
export function createPinsRouter({ db }: { db: Db }): Router {
  const router = Router();
  const cache = createPinCache(db);

  router.get('/', async (req, res) => {
    const { bbox, zoom, ...filters } = pinsQuerySchema.parse(req.query);
    const { version, index } = await cache.get(filters);
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
