import express, { Router } from 'express';
import path from 'node:path';

export const TILE_SETS = ['base', 'us', 'water', 'places'] as const;

/**
 * The map's own vector tiles, built by `npm run tiles` into <tilesDir>/build as gzipped z/x/y.pbf
 * files. They are sent as stored, with `Content-Encoding: gzip`. A tile that was not built (open
 * sea, or past a set's zooms) answers 204, which MapLibre draws as an empty tile.
 */
export function createTilesRouter({ tilesDir }: { tilesDir: string }): Router {
  const router = Router();
  const buildDir = path.join(tilesDir, 'build');

  router.use(
    express.static(buildDir, {
      index: false,
      acceptRanges: false,
      fallthrough: true,
      maxAge: '1d',
      setHeaders: (res, file) => {
        if (file.endsWith('.pbf')) {
          res.setHeader('Content-Type', 'application/vnd.mapbox-vector-tile');
          res.setHeader('Content-Encoding', 'gzip');
        } else {
          res.setHeader('Cache-Control', 'no-cache');
        }
      },
    }),
  );

  const tilePath = new RegExp(`^/(${TILE_SETS.join('|')})/\\d{1,2}/\\d{1,7}/\\d{1,7}\\.pbf$`);
  router.get(/.*/, (req, res) => {
    if (tilePath.test(req.path)) {
      res.setHeader('Cache-Control', 'public, max-age=86400');
      res.status(204).end();
      return;
    }
    res.status(404).json({ error: { code: 'not_found', message: `No tile at ${req.path}` } });
  });

  return router;
}
