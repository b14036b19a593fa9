import type { RequestHandler } from 'express';
import { HttpError } from '../lib/http-error';

/** The header the client sends on every state-changing request. */
export const CSRF_HEADER = 'x-syconium-request';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery defence for a JSON API (OWASP "custom request header" pattern):
 * a browser cannot add a custom header to a cross-site request without a CORS pre-flight, which
 * this server never grants; and when the browser says where the request came from, it must be
 * this origin. Cookies are also SameSite=Lax.
 */
export const csrfGuard: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  if (req.get(CSRF_HEADER) !== '1') {
    throw new HttpError(403, 'csrf', `State-changing requests need the ${CSRF_HEADER} header`);
  }
  const site = req.get('sec-fetch-site');
  if (site && site !== 'same-origin' && site !== 'none') {
    throw new HttpError(403, 'csrf', 'Cross-site requests are not accepted');
  }
  next();
};
