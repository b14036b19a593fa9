import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { HttpError } from '../lib/http-error';

/** Unknown routes under /api answer JSON, not the client's HTML. */
export const apiNotFound: RequestHandler = (req) => {
  throw new HttpError(404, 'not_found', `No API route for ${req.method} ${req.originalUrl.split('?')[0]}`);
};

function zodFields(error: ZodError): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

const MULTIPART_ERRORS = /^(Malformed part header|Unexpected end of (form|file)|Multipart: Boundary not found|Malformed content type|Malformed urlencoded form|Request (aborted|closed|error))$/;

/** The only place that shapes error JSON: { error: { code, message, fields? } }. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (err instanceof ZodError) {
    const fields = zodFields(err);
    const names = Object.keys(fields).join(', ');
    res.status(400).json({ error: { code: 'invalid_input', message: `Please check: ${names}`, fields } });
    return;
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, fields: err.fields } });
    return;
  }
  // busboy (inside multer) rejects a malformed multipart body with a plain Error: the client's fault.
  if (err instanceof Error && MULTIPART_ERRORS.test(err.message)) {
    res.status(400).json({ error: { code: 'malformed_upload', message: `The upload is not a well-formed multipart form (${err.message})` } });
    return;
  }
  // body-parser and multer errors carry a status and a type
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
  if (status >= 400 && status < 500) {
    const code = err.type === 'entity.parse.failed' ? 'malformed_json' : err.type === 'entity.too.large' ? 'body_too_large' : 'bad_request';
    const message = code === 'malformed_json' ? 'The request body is not valid JSON' : code === 'body_too_large' ? 'The request body is too large' : String(err.message ?? 'Bad request');
    res.status(status).json({ error: { code, message } });
    return;
  }
  if (err?.code === 'SQLITE_FULL' || err?.code === 'SQLITE_READONLY' || err?.code === 'SQLITE_IOERR' || err?.code === 'SQLITE_BUSY') {
    console.error(`[syconium] storage unavailable on ${req.method} ${req.originalUrl}:`, err.code);
    res.status(503).json({ error: { code: 'storage_unavailable', message: 'Storage is unavailable right now; nothing was saved. Please try again later.' } });
    return;
  }
  console.error(`[syconium] ${req.method} ${req.originalUrl} failed:`, err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side' } });
};
