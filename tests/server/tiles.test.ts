import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();
// Tiles are served from <tilesDir>/build; give this test its own folder with one stored tile.
const tilesDir = path.join(ctx.dir, 'tiles');
const tile = zlib.gzipSync(Buffer.from([0x1a, 0x00]));
fs.mkdirSync(path.join(tilesDir, 'build/base/3/2'), { recursive: true });
fs.writeFileSync(path.join(tilesDir, 'build/base/3/2/1.pbf'), tile);
fs.writeFileSync(path.join(tilesDir, 'build/meta.json'), JSON.stringify({ format: 1 }));
const app = createTestContext({}, { tilesDir });

describe('GET /tiles', () => {
  it('sends a stored tile gzipped as stored, typed as a vector tile, cacheable', async () => {
    const res = await app.agent().get('/tiles/base/3/2/1.pbf').buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/vnd.mapbox-vector-tile');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toMatch(/max-age=86400/);
  });

  it('answers 204 (an empty tile) where nothing was built, and 404 for anything that is not a tile', async () => {
    const empty = await app.agent().get('/tiles/base/3/0/0.pbf');
    expect(empty.status).toBe(204);
    expect((await app.agent().get('/tiles/base/../../x.pbf')).status).toBe(404);
    expect((await app.agent().get('/tiles/elsewhere/1/0/0.pbf')).status).toBe(404);
  });

  it('serves meta.json without long caching', async () => {
    const res = await app.agent().get('/tiles/meta.json');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe(1);
    expect(res.headers['cache-control']).toBe('no-cache');
  });
});
