import { useQuery, type UseQueryResult } from '@tanstack/react-query';
import { LABELS, type GrowingForm } from '@shared/domain/codes';
import { plural } from '@shared/domain/units';
import type { ShortSeasonResponse } from '@shared/schemas/guidance';
import { VarietyLink } from '../../varieties/components/variety-link';
import { guidanceQueries } from '../api';
import { percent } from './interval-bar';

/**
 * Varieties that ripened in places with a season as short as this one (anywhere in the atlas),
 * for the summary on top of What ripens here and the table's filter.
 */
export function useShortSeason(seasonDays: number | null, form: GrowingForm, enabled: boolean) {
  return useQuery({ ...guidanceQueries.shortSeason(seasonDays ?? 0, form), enabled: enabled && seasonDays !== null });
}

/** One paragraph on top of the table: what ripened in seasons this short, and a switch to keep only those rows. */
export function ShortSeasonSummary({
  seasonDays,
  form,
  query,
  filtering,
  onFilter,
}: {
  seasonDays: number | null;
  form: GrowingForm;
  query: UseQueryResult<ShortSeasonResponse>;
  filtering: boolean;
  onFilter: (on: boolean) => void;
}) {
  const box = 'rounded-lg border border-leaf-300 bg-leaf-100/40 px-4 py-3 text-sm';
  if (seasonDays === null)
    return <p className={box}>No season length is known within range, so we cannot say which varieties ripened in seasons as short as this one.</p>;
  if (query.isLoading) return <p className={box}>Looking for seasons as short as this one…</p>;
  if (query.error) return <p className={`${box} text-red-700`}>{query.error.message}</p>;
  const data = query.data;
  if (!data) return null;
  const limit = Math.round(data.seasonDays + data.toleranceDays);
  return (
    <div className={box} data-testid="short-season-summary">
      <p>
        <strong className="font-medium">Seasons as short as this one:</strong>{' '}
        {data.varieties.length === 0 ? (
          <>no variety has a ripened report from a season of {limit} frost-free days or fewer ({LABELS.growingForm[form].toLowerCase()}) yet.</>
        ) : (
          <>
            {plural(data.varieties.length, 'variety', 'varieties')} ripened somewhere with {limit} frost-free days or fewer ({LABELS.growingForm[form].toLowerCase()}):{' '}
            {data.varieties.map((v, i) => (
              <span key={v.varietyId}>
                {i > 0 ? ', ' : ''}
                <VarietyLink id={v.varietyId} name={v.name} />
                <span className="hidden text-ink/70 sm:inline"> ({percent(v.share)} of {plural(v.trees, 'tree')}, shortest {v.shortestRipeSeasonDays} days)</span>
              </span>
            ))}
            .
          </>
        )}
      </p>
      {data.varieties.length > 0 && (
        <label className="mt-2 flex items-center gap-2">
          <input type="checkbox" checked={filtering} onChange={(e) => onFilter(e.target.checked)} />
          Show only these in the table
        </label>
      )}
    </div>
  );
}
