import type { RequestHandler } from 'express';
import { HttpError } from '../lib/http-error';

/**
 * Refuse a JSON body whose declared length is over the limit before reading any of it.
 * (express.json alone also answers 413, but only after draining the whole body.) The connection
 * is closed after the answer, so a client cannot make the server read a huge body it will discard.
 */
export function refuseLargeJson(limitBytes: number): RequestHandler {
  return (req, res, next) => {
    const declared = Number(req.get('content-length') ?? 0);
    if (declared > limitBytes && req.is('application/json')) {
      res.setHeader('Connection', 'close');
      throw new HttpError(413, 'body_too_large', `The request body is too large (at most ${Math.round(limitBytes / 1024)} KB)`);
    }
    next();
  };
}

/**
 * Refuse a multipart upload whose declared length is over `limitBytes` (plus room for the form
 * fields and multipart framing) with 413 before reading any of it, naming the limit under `field`.
 * The connection is closed after the answer. A body without a declared length (chunked) is still
 * cut off by multer's own fileSize limit.
 */
export function refuseLargeUpload(limitBytes: number, field: string, overheadBytes = 64 * 1024): RequestHandler {
  return (req, res, next) => {
    const declared = Number(req.get('content-length') ?? 0);
    if (declared > limitBytes + overheadBytes) {
      res.setHeader('Connection', 'close');
      const message = `The file is larger than ${Math.round(limitBytes / 1024 / 1024)} MB, the most an upload may be`;
      throw new HttpError(413, 'file_too_large', message, { [field]: [message] });
    }
    next();
  };
}
