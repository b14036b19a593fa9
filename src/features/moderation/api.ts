import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { moderationQueueSchema, moderationSummarySchema, type ModerationQueueQuery } from '@shared/schemas/moderation';
import { apiFetch } from '../../lib/api-client';

export const moderationQueries = {
  all: ['moderation'] as const,
  queue: (query: ModerationQueueQuery) =>
    queryOptions({
      queryKey: [...moderationQueries.all, 'queue', query],
      queryFn: () => {
        const params = new URLSearchParams({ kind: query.kind, limit: String(query.limit), offset: String(query.offset) });
        if (query.rule) params.set('rule', query.rule);
        return apiFetch(`/api/moderation/queue?${params}`, moderationQueueSchema);
      },
      placeholderData: (previous) => previous,
    }),
  summary: () => queryOptions({ queryKey: [...moderationQueries.all, 'summary'], queryFn: () => apiFetch('/api/moderation/summary', moderationSummarySchema) }),
};

function useModerationMutation<TInput>(mutationFn: (input: TInput) => Promise<unknown>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => {
      queryClient.invalidateQueries({ queryKey: moderationQueries.all });
      queryClient.invalidateQueries({ queryKey: ['reports'] });
      queryClient.invalidateQueries({ queryKey: ['audit'] });
    },
  });
}

/** Hide and restore belong to the reports API; the queue calls them and refreshes itself. */
export const useHideFromQueue = () =>
  useModerationMutation(({ id, reason }: { id: number; reason: string }) => apiFetch(`/api/reports/${id}/hide`, z.unknown(), { method: 'POST', json: { reason } }));
export const useRestoreFromQueue = () => useModerationMutation((id: number) => apiFetch(`/api/reports/${id}/restore`, z.unknown(), { method: 'POST' }));
export const useClearFlag = () => useModerationMutation((flagId: number) => apiFetch(`/api/moderation/flags/${flagId}/clear`, z.unknown(), { method: 'POST' }));
export const useMarkReviewed = () => useModerationMutation((id: number) => apiFetch(`/api/moderation/reports/${id}/reviewed`, z.undefined(), { method: 'POST' }));
