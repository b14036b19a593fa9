import type { Express, RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import fs from 'node:fs';
import path from 'node:path';

/** A year: Vite's hashed file names change with their content, so a cached copy is never stale. */
const IMMUTABLE = 'public, max-age=31536000, immutable';
/** index.html, the service worker and its manifest name the hashed files: always revalidated. */
const REVALIDATE = 'no-cache';

/**
 * Serve the built client (dist/): the brotli or gzip copy Vite wrote beside each file
 * (vite-plugin-compression2) when the browser takes it, with `Content-Encoding` and
 * `Vary: Accept-Encoding`; hashed files under /assets/ cached for good, everything else revalidated.
 * Every other GET that is not an API, upload or tile path gets index.html (client-side routes).
 */
export function serveClient(app: Express, clientDir: string): void {
  const indexHtml = path.join(clientDir, 'index.html');
  if (!fs.existsSync(indexHtml)) return;
  const files: RequestHandler = expressStaticGzip(clientDir, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      index: false,
      setHeaders: (res, file) => {
        const hashed = path.relative(clientDir, file).startsWith(`assets${path.sep}`);
        res.setHeader('Cache-Control', hashed ? IMMUTABLE : REVALIDATE);
      },
    },
  });
  app.use(files);
  app.get(/^(?!\/(?:api|uploads|tiles)\/).*/, (req, res, next) => {
    req.url = '/index.html';
    files(req, res, next);
  });
}
