import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { z } from 'zod';
import { normalsReleasesSchema, stationDetailSchema, stationListSchema, type StationDetail } from '@shared/schemas/stations';
import { ApiError, apiFetch, uploadWithProgress } from '../../lib/api-client';

export const stationQueries = {
  all: ['stations'] as const,
  list: () => queryOptions({ queryKey: [...stationQueries.all, 'list'], queryFn: () => apiFetch('/api/stations', stationListSchema) }),
  detail: (id: number) => queryOptions({ queryKey: [...stationQueries.all, 'detail', id], queryFn: () => apiFetch(`/api/stations/${id}`, stationDetailSchema) }),
  normals: () => queryOptions({ queryKey: [...stationQueries.all, 'normals'], queryFn: () => apiFetch('/api/stations/normals', normalsReleasesSchema) }),
};


export type UploadPhase = { state: 'idle' } | { state: 'uploading'; fraction: number } | { state: 'computing' } | { state: 'done'; detail: StationDetail } | { state: 'failed'; error: ApiError };

/** Upload a station file and follow it through sending, computing, and done or failed. */
export function useStationUpload() {
  const queryClient = useQueryClient();
  const [phase, setPhase] = useState<UploadPhase>({ state: 'idle' });
  const upload = useCallback(
    async (form: FormData) => {
      setPhase({ state: 'uploading', fraction: 0 });
      try {
        const detail = await uploadWithProgress('/api/stations/upload', form, stationDetailSchema, {
          onProgress: (fraction) => setPhase({ state: 'uploading', fraction }),
          onSent: () => setPhase({ state: 'computing' }),
        });
        await queryClient.invalidateQueries({ queryKey: stationQueries.all });
        setPhase({ state: 'done', detail });
        return detail;
      } catch (error) {
        const apiError = error instanceof ApiError ? error : new ApiError(0, 'client', String(error));
        setPhase({ state: 'failed', error: apiError });
        return undefined;
      }
    },
    [queryClient],
  );
  return { phase, upload, reset: () => setPhase({ state: 'idle' }) };
}

export function useDeleteStation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiFetch(`/api/stations/${id}`, z.undefined(), { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: stationQueries.all }),
  });
}
