import { Router } from 'express';
import { placeSearchQuerySchema, placeSearchResponseSchema } from '../../shared/schemas/places';
import { worldGazetteer, type Gazetteer } from './gazetteer';

/** GET /api/places?q=: town search for the map, from the embedded gazetteer (no remote geocoder). */
export function createPlacesRouter({ gazetteer = worldGazetteer }: { gazetteer?: () => Gazetteer } = {}): Router {
  const router = Router();
  router.get('/', (req, res) => {
    const { q, limit, near } = placeSearchQuerySchema.parse(req.query);
    res.setHeader('Cache-Control', 'public, max-age=3600');
    res.json(placeSearchResponseSchema.parse({ places: gazetteer().search(q, limit, near) }));
  });
  return router;
}
