import { timingSafeEqual } from 'node:crypto';
import express, { type Request, type Router } from 'express';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import { metricsRegistry } from './metrics';

const LOOPBACK = new Set(['127.0.0.1', '::1', '::ffff:127.0.0.1']);

/** A Bearer token equal to the configured one (compared in constant time). */
function hasToken(req: Request, token: string | undefined): boolean {
  if (!token) return false;
  const given = /^Bearer (.+)$/.exec(req.get('authorization') ?? '')?.[1];
  if (!given) return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/**
 * GET /metrics for Prometheus: from this machine (req.ip is loopback; behind a proxy on loopback,
 * `trust proxy` makes req.ip the outside client, who is refused) or with `Authorization: Bearer
 * <SYCONIUM_METRICS_TOKEN>`. Others get a 404, as if there were nothing here.
 */
export function createMetricsRouter({ metricsToken }: { metricsToken?: string }): Router {
  const router = express.Router();
  router.get('/metrics', async (req, res) => {
    if (!LOOPBACK.has(req.ip ?? '') && !hasToken(req, metricsToken)) throw new HttpError(404, 'not_found', 'Not found');
    res.set('Content-Type', metricsRegistry.contentType).set('Cache-Control', 'no-store');
    res.send(await metricsRegistry.metrics());
  });
  return router;
}

/**
 * Health for a balancer or an orchestrator: `live` says the process answers (restart it if not);
 * `ready` says it can serve now: the database answers a read (take it out of rotation if not).
 * `/api/health` stays as it was (the test harness and older checks wait on it).
 */
export function createHealthRouter({ db }: { db: Db }): Router {
  const router = express.Router();
  router.get('/', (_req, res) => void res.json({ ok: true }));
  router.get('/live', (_req, res) => void res.set('Cache-Control', 'no-store').json({ ok: true }));
  router.get('/ready', (_req, res) => {
    res.set('Cache-Control', 'no-store');
    try {
      db.sqlite.prepare('SELECT count(*) FROM __drizzle_migrations').get();
      res.json({ ok: true, database: 'ok' });
    } catch {
      res.status(503).json({ ok: false, database: 'unavailable' });
    }
  });
  return router;
}
