import { Router } from 'express';
import { DIGEST_RADIUS_KM, digestSettingsInputSchema, digestSettingsSchema, messageResponseSchema, unsubscribeInputSchema } from '../../shared/schemas/email';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import { requireSignedIn } from '../middleware/require-role';
import { findHomePlace, findSubscription, unsubscribeByToken, upsertSubscription } from './digest.repo';

/** GET/PUT /digest (the signed-in grower's settings) and POST /unsubscribe (by token, no sign-in). */
export function createDigestRouter({ db }: { db: Db }): Router {
  const router = Router();

  const settings = (userId: number) => {
    const sub = findSubscription(db, userId);
    return digestSettingsSchema.parse({
      active: sub?.active ?? false,
      radiusKm: sub?.radiusKm ?? DIGEST_RADIUS_KM.default,
      lastSentAt: sub?.lastSentAt ?? null,
      home: findHomePlace(db, userId) ?? null,
    });
  };

  router.get('/digest', requireSignedIn, (req, res) => {
    res.json(settings(req.user!.id));
  });

  router.put('/digest', requireSignedIn, (req, res) => {
    const input = digestSettingsInputSchema.parse(req.body);
    if (input.active && !findHomePlace(db, req.user!.id)) {
      throw new HttpError(400, 'no_home_place', 'Save a home place on the atlas first: the digest is centred on it', {
        active: ['Save a home place on the atlas first: the digest is centred on it'],
      });
    }
    upsertSubscription(db, req.user!.id, input);
    res.json(settings(req.user!.id));
  });

  router.post('/unsubscribe', (req, res) => {
    const { token } = unsubscribeInputSchema.parse(req.body);
    if (!unsubscribeByToken(db, token)) {
      throw new HttpError(404, 'unknown_link', 'This unsubscribe link does not match any digest. Nothing was changed.');
    }
    res.json(messageResponseSchema.parse({ message: 'You are unsubscribed from the nearby digest. You can subscribe again on your account page.' }));
  });

  return router;
}
