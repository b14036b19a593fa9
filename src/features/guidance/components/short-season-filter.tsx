import { useQuery } from '@tanstack/react-query';
import { LABELS, type GrowingForm } from '@shared/domain/codes';
import { guidanceQueries } from '../api';
import { percent } from './interval-bar';

/**
 * Varieties that ripened in places with a season as short as this one (anywhere in the atlas),
 * for the filter on the ranked list and as a list of its own.
 */
export function useShortSeason(seasonDays: number | null, form: GrowingForm, enabled: boolean) {
  return useQuery({ ...guidanceQueries.shortSeason(seasonDays ?? 0, form), enabled: enabled && seasonDays !== null });
}

export function ShortSeasonList({ seasonDays, form }: { seasonDays: number; form: GrowingForm }) {
  const { data, isLoading, error } = useShortSeason(seasonDays, form, true);
  if (isLoading) return <p className="text-sm text-ink/70">Looking for seasons as short as this one…</p>;
  if (error) return <p className="text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  return (
    <div className="rounded-lg border border-leaf-300 bg-leaf-100/40 p-4" data-testid="short-season-list">
      <h3 className="font-medium text-fig-900">
        Ripened in seasons of {Math.round(data.seasonDays + data.toleranceDays)} frost-free days or fewer ({LABELS.growingForm[form].toLowerCase()}), anywhere in the atlas
      </h3>
      {data.varieties.length === 0 ? (
        <p className="mt-1 text-sm text-ink/80">No variety has a ripened report from a season this short yet.</p>
      ) : (
        <ul className="mt-2 flex flex-col gap-1 text-sm">
          {data.varieties.map((v) => (
            <li key={v.varietyId}>
              <span className="font-medium">{v.name}</span> — ripened on {Math.round(v.ripened * 10) / 10} of {v.trees} tree{v.trees === 1 ? '' : 's'} ({percent(v.share)}) from {v.growers} grower
              {v.growers === 1 ? '' : 's'}; shortest season with ripe figs: {v.shortestRipeSeasonDays} days
            </li>
          ))}
        </ul>
      )}
      <p className="mt-2 text-xs text-ink/70">{data.method}</p>
    </div>
  );
}
