import type { QueryClient, QueryFunctionContext } from '@tanstack/react-query';
import { pinsResponseSchema } from '@shared/schemas/pins';
import { mapQueries } from './api';
import { EARLY_PINS_KEY, firstPinsRequest, type EarlyPins } from './first-view';

/**
 * On the atlas home, have the first view's pins in the cache as early as possible, in parallel with
 * the map's code. index.html's inline script (early-pins.ts) has usually asked for them already,
 * before any of the app's JavaScript arrived: when it asked exactly what `mapQueries.pins` would ask
 * (same URL, so same query key), its answer fills the cache, checked with the same schema; with no
 * early request, another URL (the window changed size meanwhile), a failed request or an answer
 * that does not parse, the pins are fetched the usual way.
 */
export function prefetchFirstPins(queryClient: QueryClient): void {
  const early = window[EARLY_PINS_KEY];
  // Taken once: a later fetch of the same view (a refetch, a return to the page) asks the server.
  delete window[EARLY_PINS_KEY];
  const request = firstPinsRequest(window.location, window.innerWidth, window.innerHeight);
  if (!request) return;
  // request.url is what this query fetches (both build it with pinsUrl).
  const options = mapQueries.pins(request.bbox, request.zoom, request.filters);
  if (!early || early.url !== request.url) {
    void queryClient.prefetchQuery(options);
    return;
  }
  void queryClient.prefetchQuery({ ...options, queryFn: (context) => earlyAnswerOr(early, () => options.queryFn!(context as QueryFunctionContext<typeof options.queryKey>)) });
}

async function earlyAnswerOr<T>(early: EarlyPins, fetchAgain: () => T | Promise<T>) {
  const parsed = pinsResponseSchema.safeParse(await early.answer);
  return parsed.success ? parsed.data : fetchAgain();
}
