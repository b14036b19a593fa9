import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { Request, RequestHandler } from 'express';
import pino, { type Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { httpRequestDuration } from './metrics';

/*
 * One structured JSON line per request (pino-http), with a request id (X-Request-Id, echoed back) and
 * no personal data: no headers (cookies, session ids), no bodies, no query values (tokens, e-mail
 * addresses, searched places, exact coordinates on owner routes), no client address. The URL is
 * logged as its path with the query's keys only, and the route as its pattern.
 */

export function createLogger(level: string, destination?: pino.DestinationStream): Logger {
  return pino({ level, base: { app: 'syconium' }, timestamp: pino.stdTimeFunctions.isoTime }, destination);
}

/** `/api/atlas/near?lat=42.65&lon=-73.75` → `/api/atlas/near?lat&lon`: which parameters, never their values. */
export function loggableUrl(url: string): string {
  const q = url.indexOf('?');
  if (q < 0) return url;
  const keys = [...new URLSearchParams(url.slice(q + 1)).keys()];
  return `${url.slice(0, q)}?${[...new Set(keys)].map(encodeURIComponent).join('&')}`;
}

/** The matched route's pattern (`/api/reports/:id`), or a fixed word for what no route matched. */
export function routePattern(req: Request): string {
  const route = (req as { route?: { path: unknown } }).route;
  const path = req.originalUrl.split('?')[0]!;
  if (route) {
    if (typeof route.path !== 'string') return `${req.baseUrl}/*`;
    // req.baseUrl is reset once an error leaves the router, so the mount path is taken from the URL
    // instead: the route's pattern matched the URL's last segments, the mount paths (all literal) the rest.
    const own = route.path.split('/').filter(Boolean);
    const mount = path.split('/').filter(Boolean).slice(0, Math.max(0, path.split('/').filter(Boolean).length - own.length));
    return `/${[...mount, ...own].join('/')}`;
  }
  if (path.startsWith('/assets/')) return 'static asset';
  if (path.startsWith('/api/')) return 'unmatched api';
  return 'app shell or file';
}

const REQUEST_ID = /^[\w.-]{1,64}$/;

export function requestLogger(logger: Logger): RequestHandler {
  const http = pinoHttp({
    logger,
    // A balancer's id is kept (so its logs and ours join up) when it looks like an id; otherwise a new one.
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const incoming = req.headers['x-request-id'];
      const id = typeof incoming === 'string' && REQUEST_ID.test(incoming) ? incoming : randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    wrapSerializers: false,
    serializers: {
      req: (req: IncomingMessage & { id?: unknown; originalUrl?: string }) => ({ id: req.id, method: req.method, url: loggableUrl(req.originalUrl ?? req.url ?? '') }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
      // The error's kind and message, not the request that caused it (its body may hold anything).
      err: (err: Error) => ({ type: err.name, message: err.message }),
    },
    // Added when the answer is logged: only then is the matched route known.
    customSuccessObject: (req, _res, line) => ({ ...line, route: routePattern(req as Request) }),
    customErrorObject: (req, _res, _err, line) => ({ ...line, route: routePattern(req as Request) }),
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
  });
  return (req, res, next) => {
    const start = performance.now();
    res.once('finish', () => {
      httpRequestDuration.observe({ method: req.method, route: routePattern(req), status_code: String(res.statusCode) }, (performance.now() - start) / 1000);
    });
    http(req, res, next);
  };
}
