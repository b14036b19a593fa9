import { Router } from 'express';
import { devMailListSchema, devMailMessageSchema } from '../../shared/schemas/email';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { clearDevMail, findDevMail, listDevMail } from './dev-mail.repo';

const isLoopback = (ip: string | undefined) => !!ip && (ip === '::1' || ip.startsWith('127.') || ip.startsWith('::ffff:127.'));

/**
 * A Host header naming this machine: localhost (and *.localhost, which browsers resolve to loopback
 * themselves, RFC 6761 section 6.3), 127.x.x.x or [::1]. A page on another site whose name an attacker
 * re-points at 127.0.0.1 (DNS rebinding) reaches us from loopback but with its own name as the Host.
 */
export function isLoopbackHostName(hostname: string | undefined): boolean {
  if (!hostname) return false;
  const name = hostname.toLowerCase().replace(/\.$/, '');
  return name === 'localhost' || name.endsWith('.localhost') || /^127(?:\.\d{1,3}){3}$/.test(name) || name === '[::1]' || name === '::1';
}

/**
 * The development mailbox: every message the local mail server received. Mounted only when the
 * development mail server is on (never by default in production), so elsewhere it is a 404.
 */
export function createDevMailRouter({ db }: { db: Db }): Router {
  const router = Router();
  // The mailbox holds every reset and verify link: only this machine may read it, even if a
  // development server is reachable from elsewhere. (Behind a proxy on loopback, req.ip is the client.)
  // The Host must name this machine too, so a rebound DNS name cannot read it from a local browser.
  router.use((req, _res, next) => {
    if (!isLoopback(req.ip) || !isLoopbackHostName(req.hostname)) throw notFound('This page');
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
