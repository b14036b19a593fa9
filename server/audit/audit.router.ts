import { Router } from 'express';
import { auditPageSchema, auditQuerySchema } from '../../shared/schemas/audit';
import type { Db } from '../db/client';
import { requireRole } from '../middleware/require-role';
import { listAudit } from './audit.repo';

/** GET /api/audit: the audit log for editors and admins. */
export function createAuditRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireRole('editor'));
  router.get('/', (req, res) => {
    res.json(auditPageSchema.parse(listAudit(db, auditQuerySchema.parse(req.query))));
  });
  return router;
}
