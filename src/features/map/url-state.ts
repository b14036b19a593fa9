import { CROPS, FIG_TYPES, GROWING_FORMS, OUTCOMES } from '@shared/domain/codes';
import type { PinFilters } from '@shared/schemas/pins';

/*
 * What the atlas keeps in its URL, so a view can be shared: the filters, the camera (lat, lon,
 * zoom) and the switched-on layers. Unknown or malformed values are dropped, never an error.
 */

export interface MapView {
  lat: number;
  lon: number;
  zoom: number;
}
export type OverlayName = 'wasp' | 'frost';
export interface AtlasUrlState {
  filters: PinFilters;
  view: MapView | null;
  layers: OverlayName[];
}

/** Where the map opens without a shared view or a saved home: the demo's north-east USA. */
export const DEFAULT_VIEW: MapView = { lat: 42.3, lon: -78.5, zoom: 4.6 };

const OVERLAYS: readonly OverlayName[] = ['wasp', 'frost'];

function oneOf<T extends string>(values: readonly T[], value: string | null): T | undefined {
  return value !== null && (values as readonly string[]).includes(value) ? (value as T) : undefined;
}

function int(value: string | null, min: number, max: number): number | undefined {
  if (value === null || !/^-?\d+$/.test(value)) return undefined;
  const n = Number(value);
  return n >= min && n <= max ? n : undefined;
}

function num(value: string | null, min: number, max: number): number | undefined {
  if (value === null || value.trim() === '') return undefined;
  const n = Number(value);
  return Number.isFinite(n) && n >= min && n <= max ? n : undefined;
}

export function parseAtlasUrl(params: URLSearchParams): AtlasUrlState {
  const filters: PinFilters = {
    varietyId: int(params.get('variety'), 1, Number.MAX_SAFE_INTEGER),
    figType: oneOf(FIG_TYPES, params.get('type')),
    crop: oneOf(CROPS, params.get('crop')),
    outcome: oneOf(OUTCOMES, params.get('outcome')),
    form: oneOf(GROWING_FORMS, params.get('form')),
    seasonFrom: int(params.get('from'), 1900, 2100),
    seasonTo: int(params.get('to'), 1900, 2100),
  };
  if (filters.seasonFrom !== undefined && filters.seasonTo !== undefined && filters.seasonFrom > filters.seasonTo) {
    [filters.seasonFrom, filters.seasonTo] = [filters.seasonTo, filters.seasonFrom];
  }
  const lat = num(params.get('lat'), -85, 85);
  const lon = num(params.get('lon'), -180, 180);
  const zoom = num(params.get('zoom'), 0, 20);
  const layers = (params.get('layers') ?? '').split(',').filter((l): l is OverlayName => (OVERLAYS as readonly string[]).includes(l));
  return {
    filters: Object.fromEntries(Object.entries(filters).filter(([, v]) => v !== undefined)) as PinFilters,
    view: lat !== undefined && lon !== undefined && zoom !== undefined ? { lat, lon, zoom } : null,
    layers: [...new Set(layers)],
  };
}

/** The URL parameters for a state, in a stable order; the view is rounded to what a link needs. */
export function atlasUrlParams(state: AtlasUrlState): URLSearchParams {
  const params = new URLSearchParams();
  const f = state.filters;
  if (f.varietyId !== undefined) params.set('variety', String(f.varietyId));
  if (f.figType) params.set('type', f.figType);
  if (f.crop) params.set('crop', f.crop);
  if (f.outcome) params.set('outcome', f.outcome);
  if (f.form) params.set('form', f.form);
  if (f.seasonFrom !== undefined) params.set('from', String(f.seasonFrom));
  if (f.seasonTo !== undefined) params.set('to', String(f.seasonTo));
  if (state.layers.length) params.set('layers', state.layers.join(','));
  if (state.view) {
    params.set('lat', state.view.lat.toFixed(4));
    params.set('lon', state.view.lon.toFixed(4));
    params.set('zoom', state.view.zoom.toFixed(2));
  }
  return params;
}

/** A map bounds as the pins API's bbox, with longitudes wrapped into -180..180 (west > east across the 180th meridian). */
export function toBbox(west: number, south: number, east: number, north: number): string {
  const lat = (v: number) => Math.max(-90, Math.min(90, v));
  // Rounded outward to a tenth of a degree, so small pans ask the same question again.
  const down = (v: number) => Math.floor(v * 10) / 10;
  const up = (v: number) => Math.ceil(v * 10) / 10;
  const s = lat(down(south)).toFixed(1);
  const n = lat(up(north)).toFixed(1);
  if (east - west >= 350) return `-180.0,${s},180.0,${n}`;
  const wrap = (v: number) => ((((v + 180) % 360) + 360) % 360) - 180;
  const w = Math.max(-180, down(wrap(west)));
  let e = Math.min(180, up(wrap(east)));
  if (e <= -180 && east > west) e = 180;
  return `${w.toFixed(1)},${s},${e.toFixed(1)},${n}`;
}
