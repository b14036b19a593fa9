import { hashKey, queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { meResponseSchema, type CurrentUser, type SignInInput, type SignUpInput } from '@shared/schemas/auth';
import type { Role } from '@shared/domain/codes';
import { apiFetch } from '../../lib/api-client';

const userResponseSchema = meResponseSchema.required();

export const authQueries = {
  all: ['auth'] as const,
  me: () =>
    queryOptions({
      queryKey: [...authQueries.all, 'me'],
      queryFn: ({ signal }) => apiFetch('/api/auth/me', meResponseSchema, { signal }),
      staleTime: 60_000,
    }),
};

/**
 * After a request that changed who is signed in or what their account says: show the account its
 * answer carries, then refresh everything else the viewer sees.
 *
 * A GET /api/auth/me still on its way was answered before the change (a freshly loaded page asks for
 * it at once, alongside the change). Invalidating alone does not help: while the query has no data
 * yet, TanStack Query joins the refetch to that fetch in flight instead of starting a new one, and
 * the older answer then lands as fresh data. So that fetch is cancelled (its answer ignored) first.
 */
export async function showCurrentUser(queryClient: QueryClient, user: CurrentUser | null): Promise<void> {
  const me = authQueries.me();
  await queryClient.cancelQueries({ queryKey: me.queryKey, exact: true });
  queryClient.setQueryData(me.queryKey, { user });
  const meHash = hashKey(me.queryKey);
  await queryClient.invalidateQueries({ predicate: (query) => query.queryHash !== meHash });
}

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
    onSuccess: ({ user }) => showCurrentUser(queryClient, user),
  });
}

export const useSignIn = () => useAuthMutation<SignInInput>('/api/auth/sign-in');
export const useSignUp = () => useAuthMutation<SignUpInput>('/api/auth/sign-up');

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch('/api/auth/sign-out', z.undefined(), { method: 'POST' }),
    onSuccess: () => showCurrentUser(queryClient, null),
  });
}
