// `npm run bench -- client`: a first visit on a phone over a weak mobile signal, measured in headless
// Chromium (Debian's, playwright-core) with DevTools' throttling: Slow 4G (1.6 Mbit/s down, 750 kbit/s
// up, 150 ms round trip; Network.emulateNetworkConditions), a 4x slower CPU
// (Emulation.setCPUThrottlingRate) and a 390x844 screen (device pixel ratio 1: this machine draws
// WebGL in software, where a 3x canvas measures the renderer, not the page). Each run is a new browser context (cold cache,
// no service worker). Printed for the atlas home and, on the same run, for an empty page (the floor of
// this profile): time to first paint, to first pins drawn, JavaScript received before first paint and
// all bytes of the first screen (tiles, pins, fonts included), as transferred (compressed).
import { execSync } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type CDPSession } from 'playwright-core';
import { CHROMIUM_ARGS, ensureChromium } from '../ensure-chromium';
import { startServerProcess } from '../server-process';

const RUNS = Number(process.env.CLIENT_BENCH_RUNS ?? 3);
const PROFILE = { downloadKbps: 1600, uploadKbps: 750, rttMs: 150, cpuSlowdown: 4, width: 390, height: 844 };
const TARGETS = { firstPinsMs: 3000, jsBeforePaintKB: 350, firstScreenKB: 800 };
/** How long the first screen may take to settle before a run gives up waiting for pins. */
const SETTLE_MS = 4000;
const TIMEOUT_MS = 60_000;

interface Figures {
  firstPaintMs: number;
  /** The first pins on screen: the page's preview (SVG) or the map, whichever comes first. */
  firstPinsMs: number | null;
  /** Pins drawn by MapLibre on the map. */
  mapPinsMs: number | null;
  jsBeforePaintBytes: number;
  firstScreenBytes: number;
  requests: number;
  /** Bytes by kind (script, tile, fetch, font, document, stylesheet, other). */
  byKind: Record<string, number>;
}

interface Served {
  path: string;
  bytes: number;
}

/**
 * Between the browser and the server, a proxy on this machine that counts the bytes of every answer
 * as sent (compressed bodies plus headers). It sees what the page's DevTools session does not: the
 * requests of MapLibre's worker (its own script, the tiles).
 */
async function countingProxy(target: string) {
  const served: Served[] = [];
  const upstream = new URL(target);
  const server = http.createServer((req, res) => {
    const forward = http.request({ host: upstream.hostname, port: upstream.port, path: req.url, method: req.method, headers: req.headers }, (answer) => {
      let bytes = answer.rawHeaders.reduce((sum, part) => sum + part.length + 2, 20);
      res.writeHead(answer.statusCode ?? 502, answer.rawHeaders);
      answer.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        res.write(chunk);
      });
      answer.on('end', () => {
        res.end();
        served.push({ path: req.url ?? '', bytes });
      });
    });
    forward.on('error', () => res.destroy());
    req.pipe(forward);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, served, close: () => server.close() };
}

const kindOfPath = (p: string) =>
  p.startsWith('/tiles/') ? 'tiles' : p.startsWith('/api/') ? 'api' : /\.m?js(\?|$)/.test(p) ? 'script' : /\.woff2?$/.test(p) ? 'font' : /\.css$/.test(p) ? 'css' : 'other';

/** Watches the page's responses (for the scripts received before first paint) and sets the throttling. */
async function watchNetwork(session: CDPSession) {
  const responses = new Map<string, { kind: string; url: string }>();
  const finished: { kind: string; bytes: number; at: number; url: string }[] = [];
  const kindOf = (type: string, url: string) => (url.includes('/tiles/') ? 'tile' : /\.(m?js)(\?|$)/.test(url) ? 'script' : type.toLowerCase());
  session.on('Network.responseReceived', (e) => responses.set(e.requestId, { kind: kindOf(e.type ?? 'Other', e.response.url), url: e.response.url }));
  session.on('Network.loadingFinished', (e) => {
    const response = responses.get(e.requestId);
    // encodedDataLength: bytes on the wire (compressed body and headers); `timestamp` in seconds.
    finished.push({ kind: response?.kind ?? 'other', bytes: e.encodedDataLength, at: e.timestamp * 1000, url: response?.url ?? '' });
  });
  const conditions = { offline: false, latency: PROFILE.rttMs, downloadThroughput: (PROFILE.downloadKbps * 1000) / 8, uploadThroughput: (PROFILE.uploadKbps * 1000) / 8 };
  await session.send('Network.enable');
  await session.send('Network.setCacheDisabled', { cacheDisabled: false });
  await session.send('Network.emulateNetworkConditions', conditions);
  await session.send('Emulation.setCPUThrottlingRate', { rate: PROFILE.cpuSlowdown });
  return { finished };
}

async function measure(browser: Browser, url: string, served: Served[]): Promise<Figures> {
  served.length = 0;
  const context = await browser.newContext({ viewport: { width: PROFILE.width, height: PROFILE.height }, deviceScaleFactor: 1, isMobile: true, hasTouch: true, serviceWorkers: 'block' });
  const page = await context.newPage();
  const session = await context.newCDPSession(page);
  const { finished } = await watchNetwork(session);
  // Paint and pins, timed inside the page (performance.now(), from navigation start).
  // Plain JavaScript (a string): tsx would wrap a function's inner names in a helper the page lacks.
  await page.addInitScript(`
    window.__bench = {};
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries()) if (entry.name === 'first-contentful-paint') window.__bench.firstPaint ??= entry.startTime;
    }).observe({ type: 'paint', buffered: true });
    (function poll() {
      if (window.__bench.firstPins === undefined && document.querySelector('[data-pin-preview] circle')) window.__bench.firstPins = performance.now();
      try {
        // Before its style has loaded, the map throws here: keep polling.
        if (window.syconiumMap && window.syconiumMap.queryRenderedFeatures().some((f) => f.source === 'report-pins')) {
          window.__bench.mapPins = performance.now();
          window.__bench.firstPins ??= window.__bench.mapPins;
          return;
        }
      } catch {}
      setTimeout(poll, 25);
    })();
  `);
  // The navigation's start on the DevTools clock, to put responses on the page's clock.
  let navStart = 0;
  session.on('Network.requestWillBeSent', (e) => {
    if (!navStart && e.type === 'Document') navStart = e.timestamp * 1000;
  });
  await page.goto(url, { waitUntil: 'load', timeout: TIMEOUT_MS });
  const isAtlas = !url.endsWith('/empty');
  // A map that never draws its pins is reported as such (—), not as a crash of the whole run.
  if (isAtlas) await page.waitForFunction(() => (window as unknown as { __bench: { mapPins?: number } }).__bench.mapPins !== undefined, null, { timeout: TIMEOUT_MS, polling: 100 }).catch(() => undefined);
  // Let the first screen settle (tiles at the edges, the legend's data) before counting its bytes.
  await page.waitForTimeout(isAtlas ? SETTLE_MS : 500);
  if (process.env.CLIENT_BENCH_DEBUG) {
    console.log(await page.evaluate(() => JSON.stringify({ bench: (window as unknown as { __bench: unknown }).__bench, circles: document.querySelectorAll('[data-pin-preview] circle').length, url: location.href })));
    await page.screenshot({ path: `/tmp/client-bench-${Date.now()}.png` });
  }
  // CLIENT_BENCH_WATERFALL=1: when each answer finished (from navigation start), its bytes and path.
  if (process.env.CLIENT_BENCH_WATERFALL) for (const f of finished) console.log(`${((f.at - navStart) / 1000).toFixed(2)} s ${(f.bytes / 1000).toFixed(1).padStart(6)} KB  ${f.url.replace(/^https?:\/\/[^/]+/, '').slice(0, 100)}`);
  const marks = await page.evaluate(() => (window as unknown as { __bench: { firstPaint?: number; firstPins?: number; mapPins?: number } }).__bench);
  await context.close();
  const firstPaintMs = marks.firstPaint ?? NaN;
  const byKind: Record<string, number> = {};
  for (const answer of served) byKind[kindOfPath(answer.path)] = (byKind[kindOfPath(answer.path)] ?? 0) + answer.bytes;
  return {
    firstPaintMs,
    firstPinsMs: marks.firstPins ?? null,
    mapPinsMs: marks.mapPins ?? null,
    jsBeforePaintBytes: finished.filter((f) => f.kind === 'script' && f.at - navStart <= firstPaintMs).reduce((sum, f) => sum + f.bytes, 0),
    // The proxy's count (it sees the worker's requests too), or the page's own when that is larger.
    firstScreenBytes: Math.max(served.reduce((sum, answer) => sum + answer.bytes, 0), finished.reduce((sum, f) => sum + f.bytes, 0)),
    requests: served.length,
    byKind,
  };
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.length ? sorted[Math.floor((sorted.length - 1) / 2)]! : NaN;
};
const kb = (bytes: number) => `${(bytes / 1000).toFixed(0)} KB`;
const sec = (ms: number | null) => (ms === null || Number.isNaN(ms) ? '—' : `${(ms / 1000).toFixed(2)} s`);

async function main() {
  const executablePath = ensureChromium();
  console.log('Building the client (vite build) and tiles if missing…');
  execSync('npx vite build --logLevel warn', { stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } });
  execSync('npx tsx scripts/tiles/build-tiles.ts --if-missing', { stdio: 'inherit' });

  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-client-bench-'));
  const server = await startServerProcess({ SYCONIUM_DB: path.join(dir, 'bench.db'), SYCONIUM_UPLOADS: path.join(dir, 'uploads'), LOG_LEVEL: 'warn' });
  // The floor: an empty page from a server on this machine, through the same proxy and throttling.
  const empty = http.createServer((_req, res) => res.writeHead(200, { 'Content-Type': 'text/html' }).end('<!doctype html><title>empty</title><p>.</p>'));
  await new Promise<void>((resolve) => empty.listen(0, '127.0.0.1', resolve));
  const emptyProxy = await countingProxy(`http://127.0.0.1:${(empty.address() as AddressInfo).port}`);
  const proxy = await countingProxy(server.url);
  const browser = await chromium.launch({ executablePath, headless: true, args: CHROMIUM_ARGS });
  try {
    // A warm-up visit so the server's pin cache and tree snapshot exist, as on a running site.
    await fetch(`${server.url}/api/atlas/pins?bbox=-100,30,-50,55&zoom=4`);
    const results: Record<'atlas' | 'empty', Figures[]> = { atlas: [], empty: [] };
    for (let run = 1; run <= RUNS; run++) {
      results.empty.push(await measure(browser, `${emptyProxy.url}/empty`, emptyProxy.served));
      results.atlas.push(await measure(browser, `${proxy.url}/`, proxy.served));
      const a = results.atlas.at(-1)!;
      console.log(`run ${run}: atlas first paint ${sec(a.firstPaintMs)}, first pins ${sec(a.firstPinsMs)}, pins on the map ${sec(a.mapPinsMs)}, JS before paint ${kb(a.jsBeforePaintBytes)}, first screen ${kb(a.firstScreenBytes)} in ${a.requests} responses (${Object.entries(a.byKind).map(([k, v]) => `${k} ${kb(v)}`).join(', ')})`);
    }
    const summary = (figures: Figures[]) => ({
      firstPaint: median(figures.map((f) => f.firstPaintMs)),
      firstPins: figures.every((f) => f.firstPinsMs !== null) ? median(figures.map((f) => f.firstPinsMs!)) : null,
      mapPins: figures.every((f) => f.mapPinsMs !== null) ? median(figures.map((f) => f.mapPinsMs!)) : null,
      js: median(figures.map((f) => f.jsBeforePaintBytes)),
      bytes: median(figures.map((f) => f.firstScreenBytes)),
    });
    const atlas = summary(results.atlas);
    const floor = summary(results.empty);
    console.log(`\nSlow 4G (${PROFILE.downloadKbps / 1000} Mbit/s down, ${PROFILE.rttMs} ms RTT), CPU ${PROFILE.cpuSlowdown}x slower, ${PROFILE.width}x${PROFILE.height}; median of ${RUNS} cold visits`);
    console.log('page         first paint  first pins  pins on map  JS before paint  first screen');
    console.log(`atlas home   ${sec(atlas.firstPaint).padStart(11)}  ${sec(atlas.firstPins).padStart(10)}  ${sec(atlas.mapPins).padStart(11)}  ${kb(atlas.js).padStart(15)}  ${kb(atlas.bytes).padStart(12)}`);
    console.log(`empty page   ${sec(floor.firstPaint).padStart(11)}  ${'—'.padStart(10)}  ${'—'.padStart(11)}  ${kb(floor.js).padStart(15)}  ${kb(floor.bytes).padStart(12)}`);
    const checks = [
      ['first pins drawn', atlas.firstPins !== null && atlas.firstPins < TARGETS.firstPinsMs, `${sec(atlas.firstPins)} < ${TARGETS.firstPinsMs / 1000} s`],
      ['JS before first paint', atlas.js < TARGETS.jsBeforePaintKB * 1000, `${kb(atlas.js)} < ${TARGETS.jsBeforePaintKB} KB`],
      ['first screen', atlas.bytes < TARGETS.firstScreenKB * 1000, `${kb(atlas.bytes)} < ${TARGETS.firstScreenKB} KB`],
    ] as const;
    for (const [name, ok, detail] of checks) console.log(`${ok ? 'met' : 'MISSED'}: ${name} ${detail}`);
    if (checks.some(([, ok]) => !ok)) process.exitCode = 1;
  } finally {
    await browser.close();
    empty.close();
    emptyProxy.close();
    proxy.close();
    await server.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

await main();
