import express, { type RequestHandler } from 'express';

/** The session cookie's name. */
export const SESSION_COOKIE = 'syconium.sid';

const READS = new Set(['GET', 'HEAD']);

/**
 * The login session (express-session, then passport's look-up of the signed-in user), run only
 * for a request that can use it. A read without the session cookie is anonymous and has no
 * session to load; express-session would make one, random id and all, only to drop it at the end.
 * Every sign-in and sign-out is a POST, so those always get a session.
 */
export function loginSession(...handlers: RequestHandler[]): RequestHandler {
  const chain = express.Router();
  chain.use(...handlers);
  return (req, res, next) => {
    if (READS.has(req.method) && !req.headers.cookie?.includes(`${SESSION_COOKIE}=`)) return next();
    chain(req, res, next);
  };
}
