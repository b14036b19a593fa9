import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { followListSchema, type FollowInput } from '@shared/schemas/follows';
import { apiFetch } from '../../lib/api-client';

export const followQueries = {
  all: ['follows'] as const,
  mine: () => queryOptions({ queryKey: [...followQueries.all, 'mine'], queryFn: () => apiFetch('/api/follows', followListSchema) }),
};

/** Follow or unfollow; every answer is the grower's whole list, shown at once. */
export function useFollowMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: { follow: FollowInput } | { unfollowVariety: number } | { unfollowPlace: number }) =>
      'follow' in action
        ? apiFetch('/api/follows', followListSchema, { method: 'POST', json: action.follow })
        : 'unfollowVariety' in action
          ? apiFetch(`/api/follows/varieties/${action.unfollowVariety}`, followListSchema, { method: 'DELETE' })
          : apiFetch(`/api/follows/places/${action.unfollowPlace}`, followListSchema, { method: 'DELETE' }),
    onSuccess: (list) => {
      queryClient.setQueryData(followQueries.mine().queryKey, list);
      void queryClient.invalidateQueries({ queryKey: ['variety-page'] });
    },
  });
}
