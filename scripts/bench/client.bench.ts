// `npm run bench -- client`: a first visit on a phone over a weak mobile signal, measured in headless
// Chromium (Debian's, playwright-core) with DevTools' throttling: Slow 4G (1.6 Mbit/s down, 750 kbit/s
// up, 150 ms round trip; Network.emulateNetworkConditions), a 4x slower CPU
// (Emulation.setCPUThrottlingRate) and a 390x844 screen. Each run is a new browser context (cold cache,
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
  firstPinsMs: number | null;
  jsBeforePaintBytes: number;
  firstScreenBytes: number;
  requests: number;
  /** Bytes by kind (script, tile, fetch, font, document, stylesheet, other). */
  byKind: Record<string, number>;
}

/** Watches every response of the page and of its workers (MapLibre fetches tiles in a worker). */
async function watchNetwork(session: CDPSession) {
  const responses = new Map<string, { kind: string; url: string }>();
  const finished: { kind: string; bytes: number; at: number }[] = [];
  const kindOf = (type: string, url: string) => (url.includes('/tiles/') ? 'tile' : /\.(m?js)(\?|$)/.test(url) ? 'script' : type.toLowerCase());
  session.on('Network.responseReceived', (e) => responses.set(e.requestId, { kind: kindOf(e.type ?? 'Other', e.response.url), url: e.response.url }));
  session.on('Network.loadingFinished', (e) => {
    const response = responses.get(e.requestId);
    // encodedDataLength: bytes on the wire (compressed body and headers); `timestamp` in seconds.
    finished.push({ kind: response?.kind ?? 'other', bytes: e.encodedDataLength, at: e.timestamp * 1000 });
  });
  const conditions = { offline: false, latency: PROFILE.rttMs, downloadThroughput: (PROFILE.downloadKbps * 1000) / 8, uploadThroughput: (PROFILE.uploadKbps * 1000) / 8 };
  await session.send('Network.enable');
  await session.send('Network.setCacheDisabled', { cacheDisabled: false });
  await session.send('Network.emulateNetworkConditions', conditions);
  await session.send('Emulation.setCPUThrottlingRate', { rate: PROFILE.cpuSlowdown });
  return { finished };
}

async function measure(browser: Browser, url: string): Promise<Figures> {
  const context = await browser.newContext({ viewport: { width: PROFILE.width, height: PROFILE.height }, deviceScaleFactor: 3, isMobile: true, hasTouch: true, serviceWorkers: 'block' });
  const page = await context.newPage();
  const session = await context.newCDPSession(page);
  const { finished } = await watchNetwork(session);
  // Paint and pins, timed inside the page (performance.now(), from navigation start).
  await page.addInitScript(() => {
    const w = window as unknown as { __bench: { firstPaint?: number; firstPins?: number }; syconiumMap?: { queryRenderedFeatures: () => { source: string }[]; loaded: () => boolean } };
    w.__bench = {};
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries()) if (entry.name === 'first-paint' || entry.name === 'first-contentful-paint') w.__bench.firstPaint ??= entry.startTime;
    }).observe({ type: 'paint', buffered: true });
    const poll = () => {
      try {
        // Before its style has loaded, the map throws here: keep polling.
        if (w.syconiumMap?.queryRenderedFeatures().some((f) => f.source === 'report-pins')) {
          w.__bench.firstPins = performance.now();
          return;
        }
      } catch {
        // not ready
      }
      setTimeout(poll, 25);
    };
    poll();
  });
  // The navigation's start on the DevTools clock, to put responses on the page's clock.
  let navStart = 0;
  session.on('Network.requestWillBeSent', (e) => {
    if (!navStart && e.type === 'Document') navStart = e.timestamp * 1000;
  });
  await page.goto(url, { waitUntil: 'load', timeout: TIMEOUT_MS });
  const isAtlas = !url.endsWith('/empty');
  if (isAtlas) await page.waitForFunction(() => (window as unknown as { __bench: { firstPins?: number } }).__bench.firstPins !== undefined, null, { timeout: TIMEOUT_MS, polling: 100 });
  // Let the first screen settle (tiles at the edges, the legend's data) before counting its bytes.
  await page.waitForTimeout(isAtlas ? SETTLE_MS : 500);
  const marks = await page.evaluate(() => (window as unknown as { __bench: { firstPaint?: number; firstPins?: number } }).__bench);
  await context.close();
  const firstPaintMs = marks.firstPaint ?? NaN;
  const byKind: Record<string, number> = {};
  for (const f of finished) byKind[f.kind] = (byKind[f.kind] ?? 0) + f.bytes;
  return {
    firstPaintMs,
    firstPinsMs: marks.firstPins ?? null,
    jsBeforePaintBytes: finished.filter((f) => f.kind === 'script' && f.at - navStart <= firstPaintMs).reduce((sum, f) => sum + f.bytes, 0),
    firstScreenBytes: finished.reduce((sum, f) => sum + f.bytes, 0),
    requests: finished.length,
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
  // The floor: an empty page from a server on this machine, through the same throttling.
  const empty = http.createServer((_req, res) => res.writeHead(200, { 'Content-Type': 'text/html' }).end('<!doctype html><title>empty</title><p>.</p>'));
  await new Promise<void>((resolve) => empty.listen(0, '127.0.0.1', resolve));
  const emptyUrl = `http://127.0.0.1:${(empty.address() as AddressInfo).port}/empty`;
  const browser = await chromium.launch({ executablePath, headless: true, args: CHROMIUM_ARGS });
  try {
    // A warm-up visit so the server's pin cache and tree snapshot exist, as on a running site.
    await fetch(`${server.url}/api/atlas/pins?bbox=-100,30,-50,55&zoom=4`);
    const results: Record<'atlas' | 'empty', Figures[]> = { atlas: [], empty: [] };
    for (let run = 1; run <= RUNS; run++) {
      results.empty.push(await measure(browser, emptyUrl));
      results.atlas.push(await measure(browser, `${server.url}/`));
      const a = results.atlas.at(-1)!;
      console.log(`run ${run}: atlas first paint ${sec(a.firstPaintMs)}, first pins ${sec(a.firstPinsMs)}, JS before paint ${kb(a.jsBeforePaintBytes)}, first screen ${kb(a.firstScreenBytes)} in ${a.requests} responses (${Object.entries(a.byKind).map(([k, v]) => `${k} ${kb(v)}`).join(', ')})`);
    }
    const summary = (figures: Figures[]) => ({
      firstPaint: median(figures.map((f) => f.firstPaintMs)),
      firstPins: figures.every((f) => f.firstPinsMs !== null) ? median(figures.map((f) => f.firstPinsMs!)) : null,
      js: median(figures.map((f) => f.jsBeforePaintBytes)),
      bytes: median(figures.map((f) => f.firstScreenBytes)),
    });
    const atlas = summary(results.atlas);
    const floor = summary(results.empty);
    console.log(`\nSlow 4G (${PROFILE.downloadKbps / 1000} Mbit/s down, ${PROFILE.rttMs} ms RTT), CPU ${PROFILE.cpuSlowdown}x slower, ${PROFILE.width}x${PROFILE.height}; median of ${RUNS} cold visits`);
    console.log('page         first paint  first pins  JS before paint  first screen');
    console.log(`atlas home   ${sec(atlas.firstPaint).padStart(11)}  ${sec(atlas.firstPins).padStart(10)}  ${kb(atlas.js).padStart(15)}  ${kb(atlas.bytes).padStart(12)}`);
    console.log(`empty page   ${sec(floor.firstPaint).padStart(11)}  ${'—'.padStart(10)}  ${kb(floor.js).padStart(15)}  ${kb(floor.bytes).padStart(12)}`);
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
    await server.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

await main();
