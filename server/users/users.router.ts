import { Router } from 'express';
import { changeRoleInputSchema, userListQuerySchema, userListSchema } from '../../shared/schemas/auth';
import type { Db } from '../db/client';
import { recordAudit } from '../audit/audit.repo';
import { notFound } from '../lib/http-error';
import { requireRole } from '../middleware/require-role';
import { findUserById, listUsers, setUserRole, toCurrentUser } from './users.repo';
import { idParamsSchema } from '../lib/path-params';

/** Admin-only user management: list accounts, change a role. */
export function createUsersRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', (req, res) => {
    const query = userListQuerySchema.parse(req.query);
    const { rows, total } = listUsers(db, query);
    res.json(userListSchema.parse({ users: rows.map(toCurrentUser), total, page: query.page, pageSize: query.pageSize }));
  });

  router.patch('/:id/role', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { role } = changeRoleInputSchema.parse(req.body);
    const before = findUserById(db, id);
    if (!before) throw notFound('User');
    const after = db.transaction(() => {
      const updated = setUserRole(db, id, role)!;
      recordAudit(db, { actorId: req.user!.id, action: 'user.role', entityType: 'user', entityId: id, before: { role: before.role }, after: { role } });
      return updated;
    });
    res.json({ user: toCurrentUser(after) });
  });

  return router;
}
