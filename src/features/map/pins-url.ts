import type { PinFilters } from '@shared/schemas/pins';

/*
 * The pins API's address for a view. Kept apart from api.ts (zod, TanStack Query) so the inline
 * script that asks for the first view's pins before the app arrives (early-pins.ts) is built from
 * this same code, and its URL is the one the app's query would ask for.
 */

/** The set filters as query parameters (unset ones left out). */
export function filterParams(filters: PinFilters): Record<string, string> {
  return Object.fromEntries(Object.entries(filters).filter(([, v]) => v !== undefined).map(([k, v]) => [k, String(v)]));
}

/** `/api/atlas/pins?bbox&zoom&filters`: what `mapQueries.pins(bbox, zoom, filters)` fetches. */
export function pinsUrl(bbox: string, zoom: number, filters: PinFilters): string {
  return `/api/atlas/pins?${new URLSearchParams({ bbox, zoom: String(zoom), ...filterParams(filters) })}`;
}
