import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { z } from 'zod';
import { apiErrorSchema } from '@shared/schemas/api-error';
import { stationDetailSchema, stationListSchema, type StationDetail } from '@shared/schemas/stations';
import { ApiError, apiFetch } from '../../lib/api-client';

export const stationQueries = {
  all: ['stations'] as const,
  list: () => queryOptions({ queryKey: [...stationQueries.all, 'list'], queryFn: () => apiFetch('/api/stations', stationListSchema) }),
  detail: (id: number) => queryOptions({ queryKey: [...stationQueries.all, 'detail', id], queryFn: () => apiFetch(`/api/stations/${id}`, stationDetailSchema) }),
};

/**
 * POST the station form with XMLHttpRequest, since fetch cannot report upload progress.
 * `onProgress` gets the sent fraction; `onSent` fires once the file is on the server and it is computing.
 */
export function sendStationUpload(form: FormData, onProgress: (fraction: number) => void, onSent: () => void): Promise<StationDetail> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/stations/upload');
    xhr.setRequestHeader('X-Syconium-Request', '1');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    xhr.upload.onload = () => onSent();
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload did not reach the server. Check the connection and try again.'));
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        resolve(stationDetailSchema.parse(body));
        return;
      }
      const parsed = apiErrorSchema.safeParse(body);
      reject(
        parsed.success
          ? new ApiError(xhr.status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.fields)
          : new ApiError(xhr.status, 'http_error', `The server answered ${xhr.status}`),
      );
    };
    xhr.send(form);
  });
}

export type UploadPhase = { state: 'idle' } | { state: 'uploading'; fraction: number } | { state: 'computing' } | { state: 'done'; detail: StationDetail } | { state: 'failed'; error: ApiError };

/** Upload a station file and follow it through sending, computing, and done or failed. */
export function useStationUpload() {
  const queryClient = useQueryClient();
  const [phase, setPhase] = useState<UploadPhase>({ state: 'idle' });
  const upload = useCallback(
    async (form: FormData) => {
      setPhase({ state: 'uploading', fraction: 0 });
      try {
        const detail = await sendStationUpload(
          form,
          (fraction) => setPhase({ state: 'uploading', fraction }),
          () => setPhase({ state: 'computing' }),
        );
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
