// The built client is sent precompressed (brotli, else gzip) with long caching for hashed files only.
import express from 'express';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { serveClient } from '../../server/client/serve-client';

let dir: string;
let app: express.Express;
const js = `export const figs = ${JSON.stringify('breba '.repeat(500))};\n`;
const html = '<!doctype html><title>Syconium</title><script type="module" src="/assets/app-a1B2c3D4.js"></script>';

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-client-'));
  fs.mkdirSync(path.join(dir, 'assets'));
  // As vite-plugin-compression2 writes them: the file, file.br and file.gz side by side.
  const write = (name: string, body: string) => {
    fs.writeFileSync(path.join(dir, name), body);
    fs.writeFileSync(path.join(dir, `${name}.br`), zlib.brotliCompressSync(body));
    fs.writeFileSync(path.join(dir, `${name}.gz`), zlib.gzipSync(body));
  };
  write('assets/app-a1B2c3D4.js', js);
  write('index.html', html);
  fs.writeFileSync(path.join(dir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  app = express();
  app.get('/api/thing', (_req, res) => void res.json({ api: true }));
  serveClient(app, dir);
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** The bytes as sent (supertest would decompress them): status, headers, body. */
function get(url: string, acceptEncoding: string): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    const server = app.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      http
        .get({ host: '127.0.0.1', port, path: url, headers: { 'Accept-Encoding': acceptEncoding } }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => server.close(() => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) })));
        })
        .on('error', reject);
    });
  });
}

describe('serving the built client', () => {
  it('sends the brotli copy to a browser that takes it, with immutable caching for a hashed file', async () => {
    const res = await get('/assets/app-a1B2c3D4.js', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(js);
    expect(res.body.length).toBeLessThan(js.length / 10);
  });

  it('gzip when brotli is not accepted, the plain file when nothing is', async () => {
    const gz = await get('/assets/app-a1B2c3D4.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).toString()).toBe(js);
    const plain = await get('/assets/app-a1B2c3D4.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(js);
  });

  it('index.html for client-side routes, compressed but revalidated every time; other files too', async () => {
    for (const url of ['/', '/reports/new', '/editors/stations/12']) {
      const res = await get(url, 'br');
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBe('br');
      expect(res.headers['content-type']).toMatch(/text\/html/);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(zlib.brotliDecompressSync(res.body).toString()).toBe(html);
    }
    const icon = await supertest(app).get('/favicon.svg');
    expect(icon.headers['cache-control']).toBe('no-cache');
  });

  it('leaves API paths alone', async () => {
    await supertest(app).get('/api/thing').expect(200, { api: true });
    await supertest(app).get('/api/missing').expect(404);
  });
});
