import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { placeSearchResponseSchema } from '@shared/schemas/places';
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
};

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
