import { Router } from 'express';
import { NEAREST_PLACE_MAX_KM, nearestPlaceQuerySchema, nearestPlaceResponseSchema, placeSearchQuerySchema, placeSearchResponseSchema } from '../../shared/schemas/places';
import { worldGazetteer, type Gazetteer } from './gazetteer';

/** GET /api/places?q=: town search for the map, from the embedded gazetteer (no remote geocoder). */
export function createPlacesRouter({ gazetteer = worldGazetteer }: { gazetteer?: () => Gazetteer } = {}): Router {
  const router = Router();
  router.get('/', (req, res) => {
    const { q, limit, near } = placeSearchQuerySchema.parse(req.query);
    res.setHeader('Cache-Control', 'public, max-age=3600');
    res.json(placeSearchResponseSchema.parse({ places: gazetteer().search(q, limit, near) }));
  });
  // The town that names a point ("near Albany, NY") for What ripens here and the compare page.
  router.get('/nearest', (req, res) => {
    const point = nearestPlaceQuerySchema.parse(req.query);
    const found = gazetteer().nearest(point, NEAREST_PLACE_MAX_KM);
    res.setHeader('Cache-Control', 'public, max-age=3600');
    res.json(nearestPlaceResponseSchema.parse({ place: found?.place ?? null, distanceKm: found ? Math.round(found.distanceKm * 10) / 10 : null }));
  });
  return router;
}
