import { hashKey, queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { meResponseSchema, type CurrentUser, type SignInInput, type SignUpInput } from '@shared/schemas/auth';
import type { Role } from '@shared/domain/codes';
import { messageResponseSchema } from '@shared/schemas/email';
import { ApiError, apiFetch } from '../../lib/api-client';

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
/**
 * Join: the server answers every sign-up the same way (it never tells whether the address already has
 * an account) and starts no session. Then sign in with the same details: that works for a new account
 * (unconfirmed, it can save drafts) and fails for a taken address unless this is its owner's password.
 * `user` null: show the sign-up answer (the owner of a taken address was mailed).
 */
export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: SignUpInput): Promise<{ user: CurrentUser | null; message: string }> => {
      const { message } = await apiFetch('/api/auth/sign-up', messageResponseSchema, { method: 'POST', json: input });
      try {
        const { user } = await apiFetch('/api/auth/sign-in', userResponseSchema, { method: 'POST', json: { email: input.email, password: input.password } });
        return { user, message };
      } catch (error) {
        if (error instanceof ApiError && (error.status === 401 || error.status === 429)) return { user: null, message };
        throw error;
      }
    },
    onSuccess: ({ user }) => (user ? showCurrentUser(queryClient, user) : undefined),
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch('/api/auth/sign-out', z.undefined(), { method: 'POST' }),
    onSuccess: () => showCurrentUser(queryClient, null),
  });
}
