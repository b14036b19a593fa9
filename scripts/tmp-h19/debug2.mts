import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS } from '../ensure-chromium';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
const context = await browser.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: Number(process.argv[3] ?? 1), isMobile: process.argv[4] === 'm', hasTouch: true, serviceWorkers: 'block' });
const page = await context.newPage();
const session = await context.newCDPSession(page);
await session.send('Network.enable');
let n = 0; const urls = new Map(); let t0 = 0;
session.on('Network.requestWillBeSent', (e) => { if (!t0) t0 = e.timestamp; urls.set(e.requestId, [e.request.url.replace('http://127.0.0.1:3108', ''), e.timestamp]); });
session.on('Network.loadingFinished', (e) => { n++; const [u, s] = urls.get(e.requestId) ?? ['?', 0]; console.log(`${((s - t0) * 1000).toFixed(0)}..${((e.timestamp - t0) * 1000).toFixed(0)} ms ${(e.encodedDataLength / 1000).toFixed(1)} KB ${u.slice(0, 90)}`); });
await session.send('Network.emulateNetworkConditions', { offline: false, latency: 150, downloadThroughput: 200000, uploadThroughput: 93750 });
await session.send('Emulation.setCPUThrottlingRate', { rate: Number(process.env.CPU ?? 4) });
page.on('pageerror', (e) => console.log('pageerror', e.message));
const t = Date.now();
await page.goto(process.argv[2] ?? 'http://127.0.0.1:3108/', { waitUntil: 'load' });
console.log('load', Date.now() - t);
for (let i = 0; i < 8; i++) {
  await page.waitForTimeout(2000);
  console.log(Date.now() - t, n, await page.evaluate(() => { const c = document.querySelectorAll('[data-pin-preview] circle').length; const m = (window as any).syconiumMap; if (!m) return 'no map, preview ' + c + ' ' + document.querySelector('[data-pin-preview]')?.getBoundingClientRect().width; try { const f = m.queryRenderedFeatures(); return JSON.stringify([f.length, [...new Set(f.map((x: any) => x.source))]]); } catch (e) { return String(e); } }));
}
await page.screenshot({ path: '/tmp/h19/home-throttled.png' });
await browser.close();
