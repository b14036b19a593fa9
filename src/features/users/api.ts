import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { currentUserSchema, userListSchema, type UserListQuery } from '@shared/schemas/auth';
import type { Role } from '@shared/domain/codes';
import { apiFetch } from '../../lib/api-client';
import { authQueries, showCurrentUser } from '../auth/api';

export const userQueries = {
  all: ['users'] as const,
  list: (query: UserListQuery = {}) =>
    queryOptions({
      queryKey: [...userQueries.all, 'list', query],
      queryFn: () => apiFetch(`/api/users?${new URLSearchParams(Object.entries(query).flatMap(([k, v]) => (v === undefined || v === '' ? [] : [[k, String(v)]])))}`, userListSchema),
      placeholderData: keepPreviousData,
    }),
};

export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, role }: { id: number; role: Role }) =>
      apiFetch(`/api/users/${id}/role`, z.object({ user: currentUserSchema }), { method: 'PATCH', json: { role } }),
    onSuccess: async ({ user }) => {
      // An admin who changed their own role sees the app as that role at once (menus, editor pages).
      const me = queryClient.getQueryData(authQueries.me().queryKey)?.user;
      if (me?.id === user.id) await showCurrentUser(queryClient, user);
      else await queryClient.invalidateQueries({ queryKey: userQueries.all });
    },
  });
}
