import { Router } from 'express';
import type { Db } from '../db/client';
import type { Config } from '../lib/config';
import { notFound } from '../lib/http-error';
import { canView, findPhotoByFile } from '../reports/reports.repo';
import { PHOTO_NAME_PATTERN, photoDir } from './photos';

/**
 * Serve stored report photos at /uploads/reports/<name>. Only names the server generated are
 * accepted, and a photo of a draft or hidden report goes only to those who may see the report.
 */
export function createUploadsRouter({ db, config }: { db: Db; config: Config }): Router {
  const router = Router();
  router.get('/reports/:name', (req, res, next) => {
    const name = String(req.params.name);
    if (!PHOTO_NAME_PATTERN.test(name)) throw notFound('Photo');
    const found = findPhotoByFile(db, name);
    if (!found || !canView(found.report, req.user)) throw notFound('Photo');
    const isPublic = found.report.status === 'published';
    res.sendFile(
      name,
      {
        root: photoDir(config.uploadsDir),
        dotfiles: 'deny',
        // A name never changes content, but an editor can hide its report at any time: a cache may keep
        // a published photo yet must ask again before each use (an ETag answer is a cheap 304 while it
        // stays published, a 404 once hidden). Never `immutable` or a long max-age: a hidden photo would
        // go on being served from browsers and shared caches for days. Others' views stay private.
        headers: { 'Cache-Control': isPublic ? 'public, no-cache' : 'private, no-store', 'X-Content-Type-Options': 'nosniff' },
      },
      (error) => {
        if (error) next((error as NodeJS.ErrnoException).code === 'ENOENT' ? notFound('Photo') : error);
      },
    );
  });
  return router;
}
