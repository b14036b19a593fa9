import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { nearestPlaceResponseSchema, placeSearchResponseSchema, type Place } from '@shared/schemas/places';
import { useCurrentUser } from '../auth/api';
import { savedPlaceListSchema, savedPlaceResponseSchema, type SavedPlaceInput, type SavedPlacePatch } from '@shared/schemas/saved-places';
import { apiFetch } from '../../lib/api-client';

export const savedPlaceQueries = {
  all: ['saved-places'] as const,
  list: () => queryOptions({ queryKey: [...savedPlaceQueries.all, 'list'], queryFn: () => apiFetch('/api/saved-places', savedPlaceListSchema) }),
};

export interface NearPoint {
  lat: number;
  lon: number;
}

/** The bias point rounded to about 1 km, so panning a little reuses the cached answers. */
function nearParam(near: NearPoint | null | undefined): string | undefined {
  return near ? `${near.lat.toFixed(2)},${near.lon.toFixed(2)}` : undefined;
}

export const placeSearchQueries = {
  all: ['places'] as const,
  search: (q: string, near?: NearPoint | null) => {
    const text = q.trim();
    const nearText = nearParam(near);
    return queryOptions({
      queryKey: [...placeSearchQueries.all, 'search', text.toLowerCase(), nearText ?? ''],
      queryFn: ({ signal }) => apiFetch(`/api/places?${new URLSearchParams({ q: text, ...(nearText ? { near: nearText } : {}) })}`, placeSearchResponseSchema, { signal }),
      enabled: text.length >= 2,
      staleTime: 10 * 60_000,
    });
  },
  /** The town that names a point ("near Albany, NY"); the answer is cached by the server for an hour. */
  nearest: (lat: number, lon: number) =>
    queryOptions({
      queryKey: [...placeSearchQueries.all, 'nearest', lat.toFixed(3), lon.toFixed(3)],
      queryFn: () => apiFetch(`/api/places/nearest?${new URLSearchParams({ lat: lat.toFixed(4), lon: lon.toFixed(4) })}`, nearestPlaceResponseSchema),
      staleTime: 60 * 60_000,
    }),
};

/** A town as a grower names it: "Albany, NY" in the US, "Lyon, France" elsewhere. */
export function placeLabel(place: Pick<Place, 'name' | 'context' | 'country'>): string {
  const [first, ...rest] = place.context.split(', ');
  return place.country === 'US' && rest.length ? `${place.name}, ${first}` : `${place.name}, ${place.context}`;
}

/** The signed-in grower's home place (the saved place marked home), or null. */
export function useHomePlace() {
  const { user } = useCurrentUser();
  const saved = useQuery({ ...savedPlaceQueries.list(), enabled: !!user });
  return saved.data?.places.find((p) => p.isHome) ?? null;
}

export function useSavePlace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SavedPlaceInput) => apiFetch('/api/saved-places', savedPlaceResponseSchema, { method: 'POST', json: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: savedPlaceQueries.all }),
  });
}

export function useUpdatePlace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...patch }: SavedPlacePatch & { id: number }) => apiFetch(`/api/saved-places/${id}`, savedPlaceResponseSchema, { method: 'PATCH', json: patch }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: savedPlaceQueries.all }),
  });
}

export function useDeletePlace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiFetch(`/api/saved-places/${id}`, z.undefined(), { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: savedPlaceQueries.all }),
  });
}
