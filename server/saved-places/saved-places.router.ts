import { Router } from 'express';
import { savedPlaceInputSchema, savedPlaceListSchema, savedPlacePatchSchema, savedPlaceResponseSchema } from '../../shared/schemas/saved-places';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { requireSignedIn } from '../middleware/require-role';
import { deleteSavedPlace, findOwnSavedPlace, insertSavedPlace, listSavedPlaces, updateSavedPlace } from './saved-places.repo';
import { idParamsSchema } from '../lib/path-params';

/**
 * A grower's saved places (signed in, owner only). Someone else's place answers 404, as if it did
 * not exist, so ids reveal nothing. At most one place is home.
 */
export function createSavedPlacesRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireSignedIn);

  router.get('/', (req, res) => {
    res.json(savedPlaceListSchema.parse({ places: listSavedPlaces(db, req.user!.id) }));
  });

  router.post('/', (req, res) => {
    const input = savedPlaceInputSchema.parse(req.body);
    res.status(201).json(savedPlaceResponseSchema.parse({ place: insertSavedPlace(db, req.user!.id, input) }));
  });

  router.patch('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const patch = savedPlacePatchSchema.parse(req.body);
    if (!findOwnSavedPlace(db, req.user!.id, id)) throw notFound('Saved place');
    res.json(savedPlaceResponseSchema.parse({ place: updateSavedPlace(db, req.user!.id, id, patch) }));
  });

  router.delete('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    if (!deleteSavedPlace(db, req.user!.id, id)) throw notFound('Saved place');
    res.status(204).end();
  });

  return router;
}
