import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { WaspAreaStatus } from '@shared/domain/codes';
import { waspAreaCollectionSchema, waspAreaRecordListSchema, waspAreaRecordResponseSchema, type WaspAreaInput, type WaspAreaUpdate } from '@shared/schemas/wasp-areas';
import { apiFetch } from '../../lib/api-client';
import { mapQueries } from '../map/api';

export interface WaspAreaRecordFilters {
  status?: WaspAreaStatus;
  q?: string;
  limit: number;
  offset: number;
}

export const waspAreaQueries = {
  all: ['wasp-areas'] as const,
  /** Public GeoJSON (what the atlas map draws); with history for the editors' map. */
  geojson: (includeRetired = false) =>
    queryOptions({ queryKey: [...waspAreaQueries.all, 'geojson', includeRetired], queryFn: () => apiFetch(`/api/wasp-areas?includeRetired=${includeRetired}`, waspAreaCollectionSchema) }),
  records: (filters: WaspAreaRecordFilters) =>
    queryOptions({
      queryKey: [...waspAreaQueries.all, 'records', filters],
      queryFn: () => {
        const params = new URLSearchParams({ limit: String(filters.limit), offset: String(filters.offset) });
        if (filters.status) params.set('status', filters.status);
        if (filters.q) params.set('q', filters.q);
        return apiFetch(`/api/wasp-areas/records?${params}`, waspAreaRecordListSchema);
      },
      placeholderData: (previous) => previous,
    }),
};

function useWaspAreaMutation<TInput, TResult>(mutationFn: (input: TInput) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => {
      queryClient.invalidateQueries({ queryKey: waspAreaQueries.all });
      // the atlas map keeps its own copy of the public layer
      queryClient.invalidateQueries({ queryKey: mapQueries.waspAreas().queryKey });
      queryClient.invalidateQueries({ queryKey: ['audit'] });
      queryClient.invalidateQueries({ queryKey: ['moderation'] });
    },
  });
}

export const useCreateWaspArea = () => useWaspAreaMutation((input: WaspAreaInput) => apiFetch('/api/wasp-areas', waspAreaRecordResponseSchema, { method: 'POST', json: input }));
export const useUpdateWaspArea = () =>
  useWaspAreaMutation(({ id, input }: { id: number; input: WaspAreaUpdate }) => apiFetch(`/api/wasp-areas/${id}`, waspAreaRecordResponseSchema, { method: 'PATCH', json: input }));
export const useRetireWaspArea = () => useWaspAreaMutation((id: number) => apiFetch(`/api/wasp-areas/${id}/retire`, waspAreaRecordResponseSchema, { method: 'POST' }));
