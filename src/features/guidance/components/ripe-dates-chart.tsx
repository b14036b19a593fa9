import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { plural } from '@shared/domain/units';
import { useUnits } from '../../units/use-units';
import { guidanceQueries } from '../api';

/** First-ripe dates by week of the year (bins from the API, dates in the grower's own style). */
export function WeeklyRipeBars({ bins, caption }: { bins: { week: number; startDoy: number; count: number }[]; caption: ReactNode }) {
  const units = useUnits();
  const data = bins.map((b) => ({ ...b, label: units.dayOfYear(b.startDoy) }));
  return (
    <figure className="mt-2">
      <div className="h-44 w-full">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 480, height: 180 }}>
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 4, left: -16 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#efdfe8" />
            <XAxis dataKey="label" tick={{ fontSize: 11 }} interval="preserveStartEnd" />
            <YAxis allowDecimals={false} tick={{ fontSize: 11 }} />
            <Tooltip formatter={(value) => [`${value} report(s)`, 'first ripe that week']} labelFormatter={(label) => `Week from ${label}`} />
            <Bar dataKey="count" fill="#8e4f73" radius={[3, 3, 0, 0]} maxBarSize={40} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-ink/70">{caption}</figcaption>
    </figure>
  );
}

/** Histogram of a variety's first-ripe dates near a point, by week of the year. */
export function RipeDatesChart({ varietyId, lat, lon, radiusKm }: { varietyId: number; lat: number; lon: number; radiusKm: number }) {
  const units = useUnits();
  const { data, error, isLoading } = useQuery(guidanceQueries.ripeDates(varietyId, { lat, lon, radiusKm }));
  if (isLoading) return <p className="mt-2 text-sm text-ink/70">Loading ripe dates…</p>;
  if (error) return <p className="mt-2 text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  if (data.reports === 0) return <p className="mt-2 text-sm text-ink/70">No first-ripe dates reported for {data.variety.name} within {units.distance(data.radiusKm)}.</p>;
  return (
    <WeeklyRipeBars
      bins={data.bins}
      caption={
        <>
          First ripe {data.crop === 'main' ? 'main-crop' : 'breba'} figs of {data.variety.name} within {units.distance(data.radiusKm)}, by week: {plural(data.reports, 'report')} from{' '}
          {plural(data.trees, 'tree')}; median {units.dayOfYear(data.medianDoy)}.
        </>
      }
    />
  );
}
