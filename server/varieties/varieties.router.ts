import { Router } from 'express';
import { z } from 'zod';
import { varietyListQuerySchema, varietyListSchema, varietyResponseSchema } from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { findVisibleVariety, listVarieties } from './varieties.repo';

export const idParamsSchema = z.object({ id: z.coerce.number().int().positive() });

/** The variety catalogue: public reads (a grower's proposed name only once a published report carries it). */
export function createVarietiesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', (req, res) => {
    const query = varietyListQuerySchema.parse(req.query);
    res.json(varietyListSchema.parse({ varieties: listVarieties(db, query, req.user) }));
  });

  router.get('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const variety = findVisibleVariety(db, id, req.user);
    if (!variety) throw notFound('Variety');
    res.json(varietyResponseSchema.parse({ variety }));
  });

  return router;
}
