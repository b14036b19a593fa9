import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  devMailListSchema,
  devMailMessageSchema,
  digestSettingsSchema,
  messageResponseSchema,
  resetResponseSchema,
  type DigestSettingsInput,
  type ForgotInput,
  type ResetInput,
  verifyResponseSchema,
} from '@shared/schemas/email';
import { apiFetch } from '../../lib/api-client';
import { showCurrentUser } from '../auth/api';

export const emailQueries = {
  all: ['email'] as const,
  digest: () => queryOptions({ queryKey: [...emailQueries.all, 'digest'], queryFn: () => apiFetch('/api/email/digest', digestSettingsSchema) }),
  devMail: () =>
    queryOptions({ queryKey: [...emailQueries.all, 'dev-mail'], queryFn: () => apiFetch('/api/dev/mail', devMailListSchema), refetchInterval: 4_000, staleTime: 2_000 }),
  devMailMessage: (id: number) =>
    queryOptions({ queryKey: [...emailQueries.all, 'dev-mail', id], queryFn: () => apiFetch(`/api/dev/mail/${id}`, devMailMessageSchema), staleTime: Infinity }),
};

/**
 * Confirm an address from the e-mailed link. The answer carries whoever is signed in on this browser
 * as they are now (confirmed, if it was their link); the banner goes at once, whatever an older
 * GET /api/auth/me says.
 */
export function useVerifyEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (token: string) => apiFetch('/api/auth/verify', verifyResponseSchema, { method: 'POST', json: { token } }),
    onSuccess: ({ user }) => showCurrentUser(queryClient, user),
  });
}

export function useResendVerification() {
  return useMutation({ mutationFn: () => apiFetch('/api/auth/verify/resend', messageResponseSchema, { method: 'POST' }) });
}

export function useForgotPassword() {
  return useMutation({ mutationFn: (input: ForgotInput) => apiFetch('/api/auth/forgot', messageResponseSchema, { method: 'POST', json: input }) });
}

export function useResetPassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ResetInput) => apiFetch('/api/auth/reset', resetResponseSchema, { method: 'POST', json: input }),
    // Who is signed in has changed: everything the viewer sees may change.
    onSuccess: ({ user }) => showCurrentUser(queryClient, user),
  });
}

export function useUpdateDigest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: DigestSettingsInput) => apiFetch('/api/email/digest', digestSettingsSchema, { method: 'PUT', json: input }),
    onSuccess: (settings) => queryClient.setQueryData(emailQueries.digest().queryKey, settings),
  });
}

export function useUnsubscribe() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (token: string) => apiFetch('/api/email/unsubscribe', messageResponseSchema, { method: 'POST', json: { token } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: emailQueries.all }),
  });
}

export function useClearDevMail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch('/api/dev/mail', z.undefined(), { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: emailQueries.all }),
  });
}
