import { Router } from 'express';
import { z } from 'zod';
import { waspAreaCollectionSchema } from '../../shared/schemas/wasp-areas';
import type { Db } from '../db/client';
import { listWaspAreas } from './wasp-areas.repo';

const listQuerySchema = z.object({ includeRetired: z.enum(['true', 'false']).optional() });

/** Areas where the fig wasp is recorded as established: public reads as GeoJSON. */
export function createWaspAreasRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', (req, res) => {
    const query = listQuerySchema.parse(req.query);
    res.json(waspAreaCollectionSchema.parse(listWaspAreas(db, { includeRetired: query.includeRetired === 'true' })));
  });

  return router;
}
