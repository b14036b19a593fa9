import { Router } from 'express';
import { moderationQueueQuerySchema, moderationQueueSchema, moderationSummarySchema } from '../../shared/schemas/moderation';
import type { Db } from '../db/client';
import { requireRole } from '../middleware/require-role';
import { clearFlag, markReviewed, moderationQueue, moderationSummary, suspiciousReports } from './moderation.repo';
import { idParamsSchema } from '../lib/path-params';

/**
 * The editors' moderation queue and its actions. Hiding and restoring a report live with the
 * reports (POST /api/reports/:id/hide and /restore); the queue's screen calls those.
 */
export function createModerationRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireRole('editor'));

  router.get('/queue', (req, res) => {
    res.json(moderationQueueSchema.parse(moderationQueue(db, moderationQueueQuerySchema.parse(req.query))));
  });

  router.get('/summary', (_req, res) => {
    res.json(moderationSummarySchema.parse(moderationSummary(db)));
  });

  router.post('/reports/:id/reviewed', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    markReviewed(db, id, req.user!.id, suspiciousReports(db).get(id) ?? []);
    res.status(204).end();
  });

  router.post('/flags/:id/clear', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const flag = clearFlag(db, id, req.user!.id);
    res.json({ flag: { id: flag.id, status: flag.status } });
  });

  return router;
}
