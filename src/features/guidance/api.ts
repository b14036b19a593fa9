import { queryOptions } from '@tanstack/react-query';
import type { GrowingForm } from '@shared/domain/codes';
import { MIN_PUBLIC_RADIUS_KM } from '@shared/domain/public-grid';
import { fitResponseSchema, nearResponseSchema } from '@shared/schemas/atlas';
import { ripeDatesResponseSchema, seasonSuccessResponseSchema, shortSeasonResponseSchema } from '@shared/schemas/guidance';
import { varietyListSchema } from '@shared/schemas/varieties';
import { apiFetch } from '../../lib/api-client';

const qs = (params: Record<string, string | number | undefined>) =>
  new URLSearchParams(Object.entries(params).filter((e): e is [string, string | number] => e[1] !== undefined).map(([k, v]) => [k, String(v)])).toString();

export interface PointQuery {
  lat: number;
  lon: number;
  radiusKm: number;
  form: GrowingForm;
}

/** Queries of the guidance pages: the regional engine's answers and the guidance chart data. */
export const guidanceQueries = {
  all: ['guidance'] as const,
  near: (q: PointQuery) => queryOptions({ queryKey: [...guidanceQueries.all, 'near', q], queryFn: () => apiFetch(`/api/atlas/near?${qs({ ...q })}`, nearResponseSchema) }),
  fit: (varietyId: number, q: PointQuery) =>
    queryOptions({ queryKey: [...guidanceQueries.all, 'fit', varietyId, q], queryFn: () => apiFetch(`/api/varieties/${varietyId}/fit?${qs({ ...q })}`, fitResponseSchema) }),
  ripeDates: (varietyId: number, q: { lat: number; lon: number; radiusKm: number }) =>
    queryOptions({
      queryKey: [...guidanceQueries.all, 'ripe-dates', varietyId, q],
      queryFn: () => apiFetch(`/api/guidance/ripe-dates?${qs({ varietyId, ...q, radiusKm: Math.max(MIN_PUBLIC_RADIUS_KM, q.radiusKm) })}`, ripeDatesResponseSchema),
    }),
  seasonSuccess: (form?: GrowingForm) =>
    queryOptions({ queryKey: [...guidanceQueries.all, 'season-success', form ?? 'all'], queryFn: () => apiFetch(`/api/guidance/season-success?${qs({ form })}`, seasonSuccessResponseSchema), staleTime: 5 * 60_000 }),
  shortSeason: (seasonDays: number, form?: GrowingForm) =>
    queryOptions({
      queryKey: [...guidanceQueries.all, 'short-season', seasonDays, form ?? 'all'],
      queryFn: () => apiFetch(`/api/guidance/short-season?${qs({ seasonDays: Math.round(seasonDays), form })}`, shortSeasonResponseSchema),
    }),
  varieties: () => queryOptions({ queryKey: [...guidanceQueries.all, 'varieties'], queryFn: () => apiFetch('/api/varieties', varietyListSchema), staleTime: 5 * 60_000 }),
};
