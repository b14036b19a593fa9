import type { QueryClient } from '@tanstack/react-query';
import { mapQueries } from './api';
import { DEFAULT_VIEW, parseAtlasUrl, toBbox, type MapView } from './url-state';

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

/** The first view of the atlas home for this window (the address's view, else the default). */
export function firstViewport(search: string): Viewport {
  const state = parseAtlasUrl(new URLSearchParams(search));
  return estimateViewport(state.view ?? DEFAULT_VIEW, window.innerWidth, window.innerHeight);
}

/** On the atlas home, ask for the first pins at once, in parallel with the map's code. */
export function prefetchFirstPins(queryClient: QueryClient): void {
  if (window.location.pathname !== '/') return;
  const { bbox, zoom } = firstViewport(window.location.search);
  const { filters } = parseAtlasUrl(new URLSearchParams(window.location.search));
  void queryClient.prefetchQuery(mapQueries.pins(bbox, zoom, filters));
}
