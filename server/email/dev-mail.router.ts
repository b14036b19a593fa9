import { Router } from 'express';
import { devMailListSchema, devMailMessageSchema } from '../../shared/schemas/email';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { clearDevMail, findDevMail, listDevMail } from './dev-mail.repo';

const isLoopback = (ip: string | undefined) => !!ip && (ip === '::1' || ip.startsWith('127.') || ip.startsWith('::ffff:127.'));

/**
 * The development mailbox: every message the local mail server received. Mounted only when the
 * development mail server is on (never by default in production), so elsewhere it is a 404.
 */
export function createDevMailRouter({ db }: { db: Db }): Router {
  const router = Router();
  // The mailbox holds every reset and verify link: only this machine may read it, even if a
  // development server is reachable from elsewhere. (Behind a proxy on loopback, req.ip is the client.)
  router.use((req, _res, next) => {
    if (!isLoopback(req.ip)) throw notFound('This page');
    next();
  });

  router.get('/', (_req, res) => {
    const messages = listDevMail(db).map(({ id, from, to, subject, receivedAt }) => ({ id, from, to, subject, receivedAt }));
    res.json(devMailListSchema.parse({ messages }));
  });

  router.get('/:id', (req, res) => {
    const row = findDevMail(db, Number(req.params.id));
    if (!row) throw notFound('That message');
    const { id, from, to, subject, receivedAt, text, html } = row;
    res.json(devMailMessageSchema.parse({ id, from, to, subject, receivedAt, text, html }));
  });

  router.delete('/', (_req, res) => {
    clearDevMail(db);
    res.status(204).end();
  });

  return router;
}
