import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import {
  checkoutStartedSchema,
  checkoutStatusSchema,
  myMembershipSchema,
  supportOptionsSchema,
  supportSummarySchema,
  type CheckoutInput,
} from '@shared/schemas/support';
import { apiFetch } from '../../lib/api-client';

export const supportQueries = {
  all: ['support'] as const,
  options: () => queryOptions({ queryKey: [...supportQueries.all, 'options'], queryFn: () => apiFetch('/api/support/options', supportOptionsSchema), staleTime: 60_000 }),
  membership: () => queryOptions({ queryKey: [...supportQueries.all, 'membership'], queryFn: () => apiFetch('/api/support/membership', myMembershipSchema) }),
  /** Polled on the thank-you page until the provider's event has arrived. */
  checkout: (sessionId: string) =>
    queryOptions({
      queryKey: [...supportQueries.all, 'checkout', sessionId],
      queryFn: () => apiFetch(`/api/support/checkout/${encodeURIComponent(sessionId)}`, checkoutStatusSchema),
      refetchInterval: (query) => (query.state.data?.state === 'waiting' ? 1_000 : false),
    }),
  summary: () => queryOptions({ queryKey: [...supportQueries.all, 'summary'], queryFn: () => apiFetch('/api/support/summary', supportSummarySchema) }),
};

/** Start a checkout and go to the provider's hosted page. */
export function useStartCheckout() {
  return useMutation({
    mutationFn: (input: CheckoutInput) => apiFetch('/api/support/checkout', checkoutStartedSchema, { method: 'POST', json: input }),
    onSuccess: ({ url }) => window.location.assign(url),
  });
}

export function useCancelMembership() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch('/api/support/membership/cancel', myMembershipSchema, { method: 'POST' }),
    onSuccess: (data) => queryClient.setQueryData(supportQueries.membership().queryKey, data),
    onSettled: () => queryClient.invalidateQueries({ queryKey: supportQueries.all }),
  });
}

export function useSetSupporterMark() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (showMark: boolean) => apiFetch('/api/support/membership/mark', myMembershipSchema, { method: 'PUT', json: { showMark } }),
    onSuccess: (data) => {
      queryClient.setQueryData(supportQueries.membership().queryKey, data);
      // Reports show the mark beside the grower's name.
      void queryClient.invalidateQueries({ queryKey: ['reports'] });
    },
  });
}
