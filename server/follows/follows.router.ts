import { Router } from 'express';
import { followInputSchema, followListSchema } from '../../shared/schemas/follows';
import type { Db } from '../db/client';
import { HttpError, notFound } from '../lib/http-error';
import { requireSignedIn } from '../middleware/require-role';
import { findVariety } from '../varieties/varieties.repo';
import { countFollows, FOLLOW_LIMITS, followPlace, followVariety, listFollows, unfollowPlace, unfollowVariety } from './follows.repo';
import { idParamsSchema } from '../lib/path-params';

/**
 * The signed-in grower's follows: GET /, POST / ({kind:'variety', varietyId} or {kind:'place', name,
 * lat, lon}), DELETE /varieties/:id, DELETE /places/:id. Owner only; another's place answers 404.
 */
export function createFollowsRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireSignedIn);
  const list = (userId: number) => followListSchema.parse(listFollows(db, userId));

  router.get('/', (req, res) => {
    res.json(list(req.user!.id));
  });

  router.post('/', (req, res) => {
    const input = followInputSchema.parse(req.body);
    const userId = req.user!.id;
    const counts = countFollows(db, userId);
    if (input.kind === 'variety') {
      const variety = findVariety(db, input.varietyId);
      if (!variety || variety.status !== 'accepted') throw new HttpError(400, 'invalid_variety', 'That variety is not in the catalogue', { varietyId: ['That variety is not in the catalogue'] });
      if (counts.varieties >= FOLLOW_LIMITS.varieties) throw new HttpError(400, 'too_many', `You follow ${FOLLOW_LIMITS.varieties} varieties already`, { varietyId: [`At most ${FOLLOW_LIMITS.varieties} varieties`] });
      followVariety(db, userId, input.varietyId);
    } else {
      if (counts.places >= FOLLOW_LIMITS.places) throw new HttpError(400, 'too_many', `You follow ${FOLLOW_LIMITS.places} places already`, { name: [`At most ${FOLLOW_LIMITS.places} places`] });
      followPlace(db, userId, { name: input.name, lat: input.lat, lon: input.lon });
    }
    res.status(201).json(list(userId));
  });

  router.delete('/varieties/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    if (!unfollowVariety(db, req.user!.id, id)) throw notFound('Followed variety');
    res.json(list(req.user!.id));
  });

  router.delete('/places/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    if (!unfollowPlace(db, req.user!.id, id)) throw notFound('Followed place');
    res.json(list(req.user!.id));
  });

  return router;
}
