import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { currentUserSchema, userListSchema } from '@shared/schemas/auth';
import type { Role } from '@shared/domain/codes';
import { apiFetch } from '../../lib/api-client';

export const userQueries = {
  all: ['users'] as const,
  list: () => queryOptions({ queryKey: [...userQueries.all, 'list'], queryFn: () => apiFetch('/api/users', userListSchema) }),
};

export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, role }: { id: number; role: Role }) =>
      apiFetch(`/api/users/${id}/role`, z.object({ user: currentUserSchema }), { method: 'PATCH', json: { role } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userQueries.all }),
  });
}
