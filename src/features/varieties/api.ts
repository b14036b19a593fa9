import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import {
  catalogueImportResultSchema,
  catalogueSchema,
  mergeResultSchema,
  varietyListSchema,
  varietyResponseSchema,
  type CatalogueQuery,
  type VarietyInput,
} from '@shared/schemas/varieties';
import { varietyPageSchema } from '@shared/schemas/variety-page';
import { apiFetch } from '../../lib/api-client';

const toSearch = (params: Record<string, string | number | undefined>) =>
  new URLSearchParams(Object.entries(params).filter((e): e is [string, string | number] => e[1] !== undefined && e[1] !== '').map(([k, v]) => [k, String(v)])).toString();

export const varietyQueries = {
  all: ['varieties'] as const,
  catalogue: (filters: Partial<CatalogueQuery>) =>
    queryOptions({
      queryKey: [...varietyQueries.all, 'catalogue', filters],
      queryFn: () => apiFetch(`/api/varieties/catalogue?${toSearch(filters)}`, catalogueSchema),
      placeholderData: (previous) => previous,
    }),
  accepted: () => queryOptions({ queryKey: [...varietyQueries.all, 'accepted'], queryFn: () => apiFetch('/api/varieties', varietyListSchema), staleTime: 60_000 }),
};

function useCatalogueMutation<TInput, TResult>(mutationFn: (input: TInput) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => {
      queryClient.invalidateQueries({ queryKey: varietyQueries.all });
      queryClient.invalidateQueries({ queryKey: ['moderation'] });
      queryClient.invalidateQueries({ queryKey: ['audit'] });
    },
  });
}

export const useCreateVariety = () => useCatalogueMutation((input: VarietyInput) => apiFetch('/api/varieties', varietyResponseSchema, { method: 'POST', json: input }));
export const useUpdateVariety = () =>
  useCatalogueMutation(({ id, input }: { id: number; input: VarietyInput }) => apiFetch(`/api/varieties/${id}`, varietyResponseSchema, { method: 'PATCH', json: input }));
export const useAcceptVariety = () =>
  useCatalogueMutation(({ id, input }: { id: number; input: VarietyInput }) => apiFetch(`/api/varieties/${id}/accept`, varietyResponseSchema, { method: 'POST', json: input }));
export const useRejectVariety = () =>
  useCatalogueMutation(({ id, reason }: { id: number; reason: string }) => apiFetch(`/api/varieties/${id}/reject`, varietyResponseSchema, { method: 'POST', json: { reason } }));
export const useMergeVariety = () =>
  useCatalogueMutation(({ id, intoId }: { id: number; intoId: number }) => apiFetch(`/api/varieties/${id}/merge`, mergeResultSchema, { method: 'POST', json: { intoId } }));
export const useImportCatalogue = () => useCatalogueMutation((csv: string) => apiFetch('/api/varieties/import', catalogueImportResultSchema, { method: 'POST', json: { csv } }));

export const EXPORT_URL = '/api/varieties/export.csv';

/** A variety's own page (public; `following` reflects the signed-in viewer). */
export const varietyPageQueries = {
  page: (id: number) => queryOptions({ queryKey: ['variety-page', id], queryFn: () => apiFetch(`/api/varieties/${id}/page`, varietyPageSchema) }),
};
