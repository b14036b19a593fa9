import { Router } from 'express';
import { z } from 'zod';
import { validateWaspGeometry } from '../../shared/domain/wasp-geometry';
import {
  waspAreaCollectionSchema,
  waspAreaInputSchema,
  waspAreaRecordListQuerySchema,
  waspAreaRecordListSchema,
  waspAreaRecordResponseSchema,
  waspAreaUpdateSchema,
  type WaspAreaGeometry,
} from '../../shared/schemas/wasp-areas';
import type { Db } from '../db/client';
import { HttpError, notFound } from '../lib/http-error';
import { requireRole } from '../middleware/require-role';
import { createWaspArea, findWaspAreaRecord, listWaspAreaRecords, listWaspAreas, retireWaspArea, updateWaspArea } from './wasp-areas.repo';
import { idParamsSchema } from '../lib/path-params';

const listQuerySchema = z.object({ includeRetired: z.enum(['true', 'false']).optional() });

/** Check an uploaded or drawn geometry; a bad one answers 400 naming each problem under `geometry`. */
function checkedGeometry(input: unknown): WaspAreaGeometry {
  const result = validateWaspGeometry(input);
  if (!result.ok) throw new HttpError(400, 'invalid_geometry', `The area’s outline has problems: ${result.problems.join('; ')}`, { geometry: result.problems });
  return result.geometry;
}

/** Areas where the fig wasp is recorded as established: public reads as GeoJSON, editors' records and writes. */
export function createWaspAreasRouter({ db }: { db: Db }): Router {
  const router = Router();
  const editor = requireRole('editor');

  router.get('/', (req, res) => {
    const query = listQuerySchema.parse(req.query);
    res.json(waspAreaCollectionSchema.parse(listWaspAreas(db, { includeRetired: query.includeRetired === 'true' })));
  });

  router.get('/records', editor, (req, res) => {
    res.json(waspAreaRecordListSchema.parse(listWaspAreaRecords(db, waspAreaRecordListQuerySchema.parse(req.query))));
  });

  router.get('/records/:id', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const area = findWaspAreaRecord(db, id);
    if (!area) throw notFound('Wasp area');
    res.json(waspAreaRecordResponseSchema.parse({ area }));
  });

  router.post('/', editor, (req, res) => {
    const input = waspAreaInputSchema.parse(req.body);
    const area = createWaspArea(db, { ...input, geometry: checkedGeometry(input.geometry) }, req.user!.id);
    res.status(201).json(waspAreaRecordResponseSchema.parse({ area }));
  });

  router.patch('/:id', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { geometry, ...rest } = waspAreaUpdateSchema.parse(req.body);
    const area = updateWaspArea(db, id, { ...rest, ...(geometry !== undefined ? { geometry: checkedGeometry(geometry) } : {}) }, req.user!.id);
    res.json(waspAreaRecordResponseSchema.parse({ area }));
  });

  router.post('/:id/retire', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    res.json(waspAreaRecordResponseSchema.parse({ area: retireWaspArea(db, id, req.user!.id) }));
  });

  return router;
}
