import { queryOptions } from '@tanstack/react-query';
import { auditPageSchema, type AuditQuery } from '@shared/schemas/audit';
import { apiFetch } from '../../lib/api-client';

export const auditQueries = {
  all: ['audit'] as const,
  page: (query: Partial<AuditQuery>) =>
    queryOptions({
      queryKey: [...auditQueries.all, 'page', query],
      queryFn: () => {
        const params = new URLSearchParams(Object.entries(query).filter((e): e is [string, string | number] => e[1] !== undefined && e[1] !== '').map(([k, v]) => [k, String(v)]));
        return apiFetch(`/api/audit?${params}`, auditPageSchema);
      },
      placeholderData: (previous) => previous,
    }),
};
