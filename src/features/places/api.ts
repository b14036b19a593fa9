import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { nearestPlaceResponseSchema, placeSearchResponseSchema, type Place } from '@shared/schemas/places';
import { savedPlaceListSchema, savedPlaceResponseSchema, type SavedPlaceInput, type SavedPlacePatch } from '@shared/schemas/saved-places';
import { apiFetch } from '../../lib/api-client';

export const savedPlaceQueries = {
  all: ['saved-places'] as const,
  list: () => queryOptions({ queryKey: [...savedPlaceQueries.all, 'list'], queryFn: () => apiFetch('/api/saved-places', savedPlaceListSchema) }),
};

export const placeSearchQueries = {
  all: ['places'] as const,
  search: (q: string) =>
    queryOptions({
      queryKey: [...placeSearchQueries.all, 'search', q],
      queryFn: () => apiFetch(`/api/places?${new URLSearchParams({ q })}`, placeSearchResponseSchema),
      enabled: q.trim().length >= 2,
      staleTime: 5 * 60_000,
    }),
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
