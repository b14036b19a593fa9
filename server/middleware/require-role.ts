import type { RequestHandler } from 'express';
import type { Role } from '../../shared/domain/codes';
import { HttpError } from '../lib/http-error';

const RANK: Record<Role, number> = { grower: 1, editor: 2, admin: 3 };

/**
 * Allow signed-in users whose role is at least `minimum` (grower < editor < admin).
 * 401 when signed out, 403 when the role is too low.
 */
export function requireRole(minimum: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in first');
    if (RANK[req.user.role] < RANK[minimum]) throw new HttpError(403, 'forbidden', `This needs the ${minimum} role`);
    next();
  };
}

export const requireSignedIn = requireRole('grower');

/** True when the viewer may see exact locations and e-mails of others' records. */
export function isEditor(user: Express.User | undefined): boolean {
  return !!user && RANK[user.role] >= RANK.editor;
}
