import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { meResponseSchema, type SignInInput, type SignUpInput } from '@shared/schemas/auth';
import type { Role } from '@shared/domain/codes';
import { apiFetch } from '../../lib/api-client';

const userResponseSchema = meResponseSchema.required();

export const authQueries = {
  all: ['auth'] as const,
  me: () => queryOptions({ queryKey: [...authQueries.all, 'me'], queryFn: () => apiFetch('/api/auth/me', meResponseSchema), staleTime: 60_000 }),
};

/** The signed-in user, or null for a visitor. */
export function useCurrentUser() {
  const query = useQuery(authQueries.me());
  return { user: query.data?.user ?? null, isLoading: query.isLoading };
}

const RANK: Record<Role, number> = { grower: 1, editor: 2, admin: 3 };
export function hasRole(user: { role: Role } | null, minimum: Role): boolean {
  return !!user && RANK[user.role] >= RANK[minimum];
}

function useAuthMutation<TInput>(path: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TInput) => apiFetch(path, userResponseSchema, { method: 'POST', json: input }),
    // Everything the viewer can see may change with who they are.
    onSuccess: () => queryClient.invalidateQueries(),
  });
}

export const useSignIn = () => useAuthMutation<SignInInput>('/api/auth/sign-in');
export const useSignUp = () => useAuthMutation<SignUpInput>('/api/auth/sign-up');

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch('/api/auth/sign-out', z.undefined(), { method: 'POST' }),
    onSuccess: () => queryClient.invalidateQueries(),
  });
}
