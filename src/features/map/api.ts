import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { cellResponseSchema, pinsResponseSchema, type PinFilters } from '@shared/schemas/pins';
import { seasonAtResponseSchema } from '@shared/schemas/season-surface';
import { savedPlaceListSchema } from '@shared/schemas/saved-places';
import { stationListSchema } from '@shared/schemas/stations';
import { varietyListSchema } from '@shared/schemas/varieties';
import { waspAreaCollectionSchema } from '@shared/schemas/wasp-areas';
import { ApiError, apiFetch } from '../../lib/api-client';
import { filterParams, pinsUrl } from './pins-url';

/** The atlas map's reads. Keys sit under ['map'] so they never collide with other features' caches. */
export const mapQueries = {
  all: ['map'] as const,
  pins: (bbox: string, zoom: number, filters: PinFilters) =>
    queryOptions({
      queryKey: [...mapQueries.all, 'pins', bbox, zoom, filters],
      queryFn: ({ signal }) => apiFetch(pinsUrl(bbox, zoom, filters), pinsResponseSchema, { signal }),
      placeholderData: keepPreviousData,
      staleTime: 60_000,
    }),
  cell: (lat: number, lon: number, filters: PinFilters) =>
    queryOptions({
      queryKey: [...mapQueries.all, 'cell', lat, lon, filters],
      queryFn: () => apiFetch(`/api/atlas/pins/cell?${new URLSearchParams({ lat: String(lat), lon: String(lon), ...filterParams(filters) })}`, cellResponseSchema),
    }),
  /** The season estimate at a point (what the season surface shows there, with its evidence). */
  seasonAt: (lat: number, lon: number) =>
    queryOptions({
      queryKey: [...mapQueries.all, 'season-at', lat, lon],
      queryFn: () => apiFetch(`/api/atlas/season-at?${new URLSearchParams({ lat: String(lat), lon: String(lon) })}`, seasonAtResponseSchema),
      staleTime: 60_000,
    }),
  varieties: () => queryOptions({ queryKey: [...mapQueries.all, 'varieties'], queryFn: () => apiFetch('/api/varieties', varietyListSchema), staleTime: 5 * 60_000 }),
  waspAreas: () => queryOptions({ queryKey: [...mapQueries.all, 'wasp-areas'], queryFn: () => apiFetch('/api/wasp-areas', waspAreaCollectionSchema), staleTime: 5 * 60_000 }),
  /** Stations for the frost-free layer; an absent or failing endpoint just means nothing to draw. */
  stations: () =>
    queryOptions({
      queryKey: [...mapQueries.all, 'stations'],
      queryFn: async () => {
        try {
          return await apiFetch('/api/stations', stationListSchema);
        } catch {
          return { stations: [] };
        }
      },
      staleTime: 5 * 60_000,
    }),
  /** The signed-in grower's home place, or null for a visitor or someone without one. */
  homePlace: () =>
    queryOptions({
      queryKey: [...mapQueries.all, 'home-place'],
      queryFn: async () => {
        try {
          const { places } = await apiFetch('/api/saved-places', savedPlaceListSchema);
          return places.find((p) => p.isHome) ?? null;
        } catch (error) {
          if (error instanceof ApiError && (error.status === 401 || error.status === 403 || error.status === 404)) return null;
          throw error;
        }
      },
      staleTime: 5 * 60_000,
      retry: false,
    }),
};
