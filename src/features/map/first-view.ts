import type { PinFilters } from '@shared/schemas/pins';
import { pinsUrl } from './pins-url';
import { DEFAULT_VIEW, parseAtlasUrl, toBbox, type MapView } from './url-state';

/*
 * The atlas home's first view, computed before the map exists. Nothing here may import zod,
 * TanStack Query or React: early-pins.ts, built from this module into an inline script in
 * index.html, must stay a few hundred bytes.
 */

/** What the pins query asks for: the bounding box of the view and its whole zoom. */
export interface Viewport {
  bbox: string;
  zoom: number;
}

/** MapLibre's world is 512 px wide at zoom 0 (Web Mercator). */
const WORLD_PX = 512;
const mercatorY = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));
const latitudeOf = (y: number) => (360 / Math.PI) * Math.atan(Math.exp(y)) - 90;

/**
 * The box a map of `width` x `height` pixels shows around `view`, before the map exists: the window
 * is at least the map's size, so this box holds the map's first view. It lets the pins be asked for
 * while MapLibre (the largest download of the first visit) is still on its way.
 */
export function estimateViewport(view: MapView, width: number, height: number): Viewport {
  const scale = WORLD_PX * 2 ** view.zoom;
  const halfLon = (width / 2 / scale) * 360;
  const y = mercatorY(view.lat);
  const halfY = (height / 2 / scale) * 2 * Math.PI;
  return { bbox: toBbox(view.lon - halfLon, latitudeOf(y - halfY), view.lon + halfLon, latitudeOf(y + halfY)), zoom: Math.floor(view.zoom) };
}

/** The first view's pins query: its arguments to `mapQueries.pins` and the URL that asks it. */
export interface FirstPinsRequest extends Viewport {
  filters: PinFilters;
  url: string;
}

/**
 * The pins the atlas home's first view shows in a window of `width` x `height` at this address (its
 * view, else the default; its filters), or null away from the atlas home.
 */
export function firstPinsRequest(location: { pathname: string; search: string }, width: number, height: number): FirstPinsRequest | null {
  if (location.pathname !== '/') return null;
  const state = parseAtlasUrl(new URLSearchParams(location.search));
  const { bbox, zoom } = estimateViewport(state.view ?? DEFAULT_VIEW, width, height);
  return { bbox, zoom, filters: state.filters, url: pinsUrl(bbox, zoom, state.filters) };
}

/**
 * What index.html's inline script (early-pins.ts) leaves on `window` under EARLY_PINS_KEY: the URL it
 * asked for and its parsed JSON answer, null when the request failed or was refused.
 */
export interface EarlyPins {
  url: string;
  answer: Promise<unknown>;
}

export const EARLY_PINS_KEY = 'syconiumEarlyPins';

declare global {
  interface Window {
    [EARLY_PINS_KEY]?: EarlyPins;
  }
}
