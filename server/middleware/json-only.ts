import type { RequestHandler } from 'express';
import { HttpError } from '../lib/http-error';

/**
 * The API reads JSON (and multipart forms on its upload routes), nothing else. A write whose body is
 * text/plain, a urlencoded form or has no type at all would reach the routes as `req.body` undefined,
 * where it could be half-read, taken for an empty request or trip a 500; it is refused here with 415
 * before any route runs. (A write with no body, or an empty one, is left to the route.)
 */
export const jsonOrMultipartOnly: RequestHandler = (req, _res, next) => {
  if (req.method === 'GET' || req.method === 'HEAD' || req.method === 'OPTIONS') return next();
  if (req.get('content-length') === '0') return next();
  if (req.is(['application/json', 'multipart/form-data']) === false) {
    throw new HttpError(415, 'unsupported_media_type', `Send the request body as JSON (Content-Type: application/json)${req.get('content-type') ? `, not ${req.get('content-type')!.split(';')[0]}` : ''}`);
  }
  next();
};
