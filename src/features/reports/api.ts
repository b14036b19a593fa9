import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  importResultSchema,
  photoListSchema,
  reportListSchema,
  reportResponseSchema,
  treeListSchema,
  type ReportFilter,
  type ReportListQuery,
  type UpdateReportInput,
} from '@shared/schemas/reports';
import { varietyListSchema } from '@shared/schemas/varieties';
import { fitResponseSchema } from '@shared/schemas/atlas';
import { apiFetch, uploadWithProgress } from '../../lib/api-client';

const toSearch = (params: Record<string, unknown>) =>
  new URLSearchParams(Object.entries(params).flatMap(([k, v]) => (v === undefined || v === null || v === '' ? [] : [[k, String(v)]]))).toString();

export const reportQueries = {
  all: ['reports'] as const,
  list: (query: ReportListQuery) =>
    queryOptions({ queryKey: [...reportQueries.all, 'list', query], queryFn: () => apiFetch(`/api/reports?${toSearch(query)}`, reportListSchema), placeholderData: keepPreviousData }),
  detail: (id: number) => queryOptions({ queryKey: [...reportQueries.all, 'detail', id], queryFn: () => apiFetch(`/api/reports/${id}`, reportResponseSchema) }),
  trees: () => queryOptions({ queryKey: [...reportQueries.all, 'trees'], queryFn: () => apiFetch('/api/reports/trees', treeListSchema) }),
  varieties: (q: string) =>
    queryOptions({
      queryKey: [...reportQueries.all, 'variety-search', q],
      queryFn: () => apiFetch(`/api/varieties?${toSearch({ q })}`, varietyListSchema),
      staleTime: 5 * 60_000,
    }),
  /** Nearby evidence for a variety (the regional engine); a missing endpoint just shows nothing. */
  fit: (varietyId: number, lat: number, lon: number, form: string) =>
    queryOptions({
      queryKey: [...reportQueries.all, 'fit', varietyId, lat, lon, form],
      queryFn: () => apiFetch(`/api/varieties/${varietyId}/fit?${toSearch({ lat, lon, form })}`, fitResponseSchema),
      retry: false,
    }),
};

/** The public export of the published reports a filter matches (GET /api/reports/export.csv or .geojson). */
export const exportUrl = (format: 'csv' | 'geojson', filter: ReportFilter) => `/api/reports/export.${format}?${toSearch(filter)}`;

function useReportMutation<TInput, TOutput>(mutationFn: (input: TInput) => Promise<TOutput>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn, onSuccess: () => queryClient.invalidateQueries({ queryKey: reportQueries.all }) });
}

export const useUpdateReport = () =>
  useReportMutation(({ id, ...patch }: UpdateReportInput & { id: number }) => apiFetch(`/api/reports/${id}`, reportResponseSchema, { method: 'PATCH', json: patch }));
export const useDeleteReport = () => useReportMutation((id: number) => apiFetch(`/api/reports/${id}`, z.undefined(), { method: 'DELETE' }));
export const usePublishReport = () => useReportMutation((id: number) => apiFetch(`/api/reports/${id}/publish`, reportResponseSchema, { method: 'POST' }));
export const useHideReport = () => useReportMutation(({ id, reason }: { id: number; reason: string }) => apiFetch(`/api/reports/${id}/hide`, reportResponseSchema, { method: 'POST', json: { reason } }));
export const useRestoreReport = () => useReportMutation((id: number) => apiFetch(`/api/reports/${id}/restore`, reportResponseSchema, { method: 'POST' }));
export const useFlagReport = () => useReportMutation(({ id, reason }: { id: number; reason: string }) => apiFetch(`/api/reports/${id}/flags`, z.unknown(), { method: 'POST', json: { reason } }));
export const useDeletePhoto = () =>
  useReportMutation(({ id, photoId }: { id: number; photoId: number }) => apiFetch(`/api/reports/${id}/photos/${photoId}`, z.undefined(), { method: 'DELETE' }));

export function useUploadPhotos() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, files, onProgress }: { id: number; files: File[]; onProgress: (share: number) => void }) => {
      const form = new FormData();
      for (const file of files) form.append('photos', file);
      return uploadWithProgress(`/api/reports/${id}/photos`, form, photoListSchema, { onProgress });
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reportQueries.all }),
  });
}

export function useImportReports() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress: (share: number) => void }) => {
      const form = new FormData();
      form.append('file', file);
      return uploadWithProgress('/api/reports/import', form, importResultSchema, { onProgress });
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reportQueries.all }),
  });
}

/** Group an import's error fields ("rows.<line>.<column>") by line for the error table. */
export function importErrorsByLine(fields: Record<string, string[]>): { line: number; problems: { column: string; messages: string[] }[] }[] {
  const byLine = new Map<number, { column: string; messages: string[] }[]>();
  for (const [key, messages] of Object.entries(fields)) {
    const match = /^rows\.(\d+)\.(.+)$/.exec(key);
    if (!match) continue;
    const line = Number(match[1]);
    if (!byLine.has(line)) byLine.set(line, []);
    byLine.get(line)!.push({ column: match[2] === '_' ? '(whole row)' : match[2]!, messages });
  }
  return [...byLine.entries()].sort(([a], [b]) => a - b).map(([line, problems]) => ({ line, problems }));
}
