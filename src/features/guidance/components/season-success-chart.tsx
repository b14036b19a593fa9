import { useQuery } from '@tanstack/react-query';
import { Bar, CartesianGrid, ComposedChart, ErrorBar, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { LABELS, type GrowingForm } from '@shared/domain/codes';
import { MethodNote } from '../../../components/method-note';
import { guidanceQueries } from '../api';
import { countOf } from '@shared/domain/plural';

/** Ripening success against frost-free season length, across all reports, with 90 % intervals. */
export function SeasonSuccessChart({ form, localDays }: { form?: GrowingForm; localDays?: number | null }) {
  const { data, error, isLoading } = useQuery(guidanceQueries.seasonSuccess(form));
  if (isLoading) return <p className="text-sm text-ink/70">Loading…</p>;
  if (error) return <p className="text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  const rows = data.bins.map((b) => ({
    band: `${b.fromDays}–${b.toDays}`,
    fromDays: b.fromDays,
    toDays: b.toDays,
    share: b.share === null ? null : Math.round(b.share * 100),
    err: b.share === null || !b.interval90 ? [0, 0] : [Math.round((b.share - b.interval90.low) * 100), Math.round((b.interval90.high - b.share) * 100)],
    trees: b.trees,
  }));
  const here = localDays != null ? rows.find((r) => localDays >= r.fromDays && localDays <= r.toDays)?.band : undefined;
  return (
    <figure>
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 480, height: 180 }}>
          <ComposedChart data={rows} margin={{ top: 20, right: 8, bottom: 12, left: 8 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#efdfe8" />
            <XAxis dataKey="band" tick={{ fontSize: 11 }} label={{ value: 'Frost-free days in the season', position: 'insideBottom', offset: -8, fontSize: 11, fill: '#2b2230' }} />
            <YAxis domain={[0, 100]} unit=" %" tick={{ fontSize: 11 }} label={{ value: 'Trees that ripened', angle: -90, position: 'insideLeft', offset: 4, dy: 50, fontSize: 11, fill: '#2b2230' }} />
            <Tooltip formatter={(value, _name, item) => [`${value} % of ${countOf((item.payload as { trees: number }).trees, 'tree')}`, 'ripened']} labelFormatter={(label) => `${label} frost-free days`} />
            <Bar dataKey="share" fill="#5e8a57" radius={[3, 3, 0, 0]} maxBarSize={56}>
              <ErrorBar dataKey="err" width={4} stroke="#3d5e39" />
            </Bar>
            {here && <ReferenceLine x={here} stroke="#6b3a5b" strokeDasharray="4 2" label={{ value: 'here', position: 'top', fontSize: 11, fill: '#6b3a5b' }} />}
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption>
        <MethodNote
          method={
            <>
              {countOf(data.reports, 'report')}: {data.fromOwnFrostDates} with the grower’s own frost dates, {data.fromStations} from the nearest station; {data.withoutSeason} without a season left
              out. {data.method}
            </>
          }
        >
          Each bar is the share of trees that ripened their main crop in seasons of that many frost-free days{form ? ` (${LABELS.growingForm[form].toLowerCase()})` : ''}; the
          whisker shows the range it likely lies in (90 %).{here ? ' The dashed line marks this place’s typical season.' : ''}
        </MethodNote>
      </figcaption>
    </figure>
  );
}
