import { queryOptions } from '@tanstack/react-query';
import { modelAccuracySchema } from '@shared/schemas/accuracy';
import { apiFetch } from '../../lib/api-client';

/** The chance model's cross-validated accuracy (GET /api/accuracy). */
export const accuracyQueries = {
  all: ['accuracy'] as const,
  current: () => queryOptions({ queryKey: [...accuracyQueries.all], queryFn: () => apiFetch('/api/accuracy', modelAccuracySchema), staleTime: 5 * 60_000 }),
};
