import { Router } from 'express';
import { z } from 'zod';
import { hideReportInputSchema, moderationQueueQuerySchema, moderationQueueSchema, moderationSummarySchema } from '../../shared/schemas/moderation';
import type { Db } from '../db/client';
import { requireRole } from '../middleware/require-role';
import { clearFlag, hideReport, markReviewed, moderationQueue, moderationSummary, restoreReport, suspiciousReports } from './moderation.repo';

const idParamsSchema = z.object({ id: z.coerce.number().int().positive() });
const reportStateSchema = z.object({ report: z.object({ status: z.string(), hiddenReason: z.string().nullable(), hiddenAt: z.string().nullable() }) });

/** The editors' moderation queue and its actions. */
export function createModerationRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireRole('editor'));

  router.get('/queue', (req, res) => {
    res.json(moderationQueueSchema.parse(moderationQueue(db, moderationQueueQuerySchema.parse(req.query))));
  });

  router.get('/summary', (_req, res) => {
    res.json(moderationSummarySchema.parse(moderationSummary(db)));
  });

  router.post('/reports/:id/hide', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { reason } = hideReportInputSchema.parse(req.body);
    res.json(reportStateSchema.parse({ report: hideReport(db, id, reason, req.user!.id) }));
  });

  router.post('/reports/:id/restore', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    res.json(reportStateSchema.parse({ report: restoreReport(db, id, req.user!.id) }));
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
