import { QueryClient } from '@tanstack/react-query';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { PinsResponse } from '@shared/schemas/pins';
import { buildEarlyPinsScript } from '../../vite.config';
import { mapQueries } from '../../src/features/map/api';
import { prefetchFirstPins } from '../../src/features/map/first-pins';
import { EARLY_PINS_KEY, firstPinsRequest } from '../../src/features/map/first-view';

/*
 * The inline script index.html runs before the app (built by the same plugin as `vite build`) must ask
 * for exactly what the app's pins query asks for, or the app would ask again; and the app must take
 * that answer only when it is the one it wants.
 */

let script = '';
beforeAll(async () => {
  script = (await buildEarlyPinsScript()).code;
}, 60_000);

const PINS: PinsResponse = {
  type: 'FeatureCollection',
  features: [{ type: 'Feature', geometry: { type: 'Point', coordinates: [-73.8, 42.7] }, properties: { kind: 'cell', reports: 3, ripened: 2, unripe: 1, reportId: null } }],
  totalReports: 3,
  dataVersion: '7',
};

/** A window of this size at this address, with fetch recording what is asked and answering `answer`. */
function openAt(url: string, width: number, height: number, answer: unknown = PINS): string[] {
  const { happyDOM } = window as unknown as { happyDOM: { setURL: (url: string) => void; setViewport: (size: { width: number; height: number }) => void } };
  happyDOM.setURL(`http://localhost${url}`);
  happyDOM.setViewport({ width, height });
  const asked: string[] = [];
  vi.stubGlobal('fetch', (input: string) => {
    asked.push(String(input));
    return Promise.resolve(new Response(JSON.stringify(answer), { status: 200, headers: { 'Content-Type': 'application/json' } }));
  });
  return asked;
}

/** What the app's own query fetches for its first view, with no early request to take. */
async function appFirstPinsUrl(): Promise<string[]> {
  const asked = openAt(`${window.location.pathname}${window.location.search}`, window.innerWidth, window.innerHeight);
  const queryClient = new QueryClient();
  prefetchFirstPins(queryClient);
  await vi.waitFor(() => expect(queryClient.isFetching()).toBe(0));
  return asked;
}

afterEach(() => {
  delete window[EARLY_PINS_KEY];
  vi.unstubAllGlobals();
});

describe('the early pins request in index.html', () => {
  const cases = [
    { width: 390, height: 844, url: '/' },
    { width: 1440, height: 900, url: '/?type=common&crop=main&from=2025&to=2021' },
    { width: 768, height: 1024, url: '/?variety=7&outcome=ripened&form=container&layers=wasp&lat=42.6526&lon=-73.7562&zoom=9.50' },
    // Across the 180th meridian, and malformed values the app drops.
    { width: 320, height: 568, url: '/?lat=-41.3&lon=179.9&zoom=3.2&crop=winter&from=20x' },
  ];

  it.each(cases)('asks for what the app’s query asks for ($width x $height, $url)', async ({ width, height, url }) => {
    const asked = openAt(url, width, height);
    window.eval(script);
    const early = window[EARLY_PINS_KEY];
    expect(early).toBeDefined();
    expect(asked).toEqual([early!.url]);
    await expect(early!.answer).resolves.toEqual(PINS);

    delete window[EARLY_PINS_KEY];
    expect(await appFirstPinsUrl()).toEqual([early!.url]);
  });

  it('stays quiet away from the atlas home', () => {
    const asked = openAt('/reports/new?lat=42&lon=-73&zoom=9', 390, 844);
    window.eval(script);
    expect(window[EARLY_PINS_KEY]).toBeUndefined();
    expect(asked).toEqual([]);
  });

  it('is small enough to sit inline in the page (under 3 KB)', () => {
    expect(new TextEncoder().encode(script).length).toBeLessThan(3 * 1024);
  });
});

describe('the app takes the early answer', () => {
  /** Run the app's start-up with an early request of `url` answering `answer`; what it fetched itself, and what it cached. */
  async function startWith(early: { url: string; answer: unknown }) {
    const asked = openAt('/?type=common', 390, 844);
    window[EARLY_PINS_KEY] = { url: early.url, answer: Promise.resolve(early.answer) };
    const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    prefetchFirstPins(queryClient);
    await vi.waitFor(() => expect(queryClient.isFetching()).toBe(0));
    const request = firstPinsRequest(window.location, 390, 844)!;
    return { asked, request, cached: queryClient.getQueryData(mapQueries.pins(request.bbox, request.zoom, request.filters).queryKey) };
  }
  const urlOfThisView = () => {
    openAt('/?type=common', 390, 844);
    return firstPinsRequest(window.location, 390, 844)!.url;
  };

  it('when it asked the same URL: nothing is asked again, the answer fills the query the map reads', async () => {
    const { asked, cached } = await startWith({ url: urlOfThisView(), answer: PINS });
    expect(asked).toEqual([]);
    expect(cached).toEqual(PINS);
    expect(window[EARLY_PINS_KEY]).toBeUndefined();
  });

  it('asks itself when the early request was for another view, failed, or answered something else', async () => {
    const url = urlOfThisView();
    const other = url.replace('zoom=4', 'zoom=5');
    for (const early of [
      { url: other, answer: { ...PINS, totalReports: 99 } },
      { url, answer: null },
      { url, answer: { error: { code: 'internal', message: 'boom' } } },
      { url, answer: { ...PINS, features: 'none' } },
    ]) {
      const { asked, request, cached } = await startWith(early);
      expect(asked).toEqual([request.url]);
      expect(cached).toEqual(PINS);
    }
  });
});
