import { useQuery } from '@tanstack/react-query';
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { guidanceQueries } from '../api';

/** Histogram of a variety's first-ripe dates near a point, by week of the year. */
export function RipeDatesChart({ varietyId, lat, lon, radiusKm }: { varietyId: number; lat: number; lon: number; radiusKm: number }) {
  const { data, error, isLoading } = useQuery(guidanceQueries.ripeDates(varietyId, { lat, lon, radiusKm }));
  if (isLoading) return <p className="mt-2 text-sm text-ink/70">Loading ripe dates…</p>;
  if (error) return <p className="mt-2 text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  if (data.reports === 0) return <p className="mt-2 text-sm text-ink/70">No first-ripe dates reported for {data.variety.name} within {data.radiusKm} km.</p>;
  return (
    <figure className="mt-2">
      <div className="h-44 w-full">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 480, height: 180 }}>
          <BarChart data={data.bins} margin={{ top: 8, right: 8, bottom: 4, left: -16 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#efdfe8" />
            <XAxis dataKey="label" tick={{ fontSize: 11 }} interval="preserveStartEnd" />
            <YAxis allowDecimals={false} tick={{ fontSize: 11 }} />
            <Tooltip formatter={(value) => [`${value} report(s)`, 'first ripe that week']} labelFormatter={(label) => `Week from ${label}`} />
            <Bar dataKey="count" fill="#8e4f73" radius={[3, 3, 0, 0]} maxBarSize={40} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-ink/70">
        First ripe {data.crop === 'main' ? 'main-crop' : 'breba'} figs of {data.variety.name} within {data.radiusKm} km, by week: {data.reports} report{data.reports === 1 ? '' : 's'} from{' '}
        {data.trees} tree{data.trees === 1 ? '' : 's'}; median {data.medianLabel}.
      </figcaption>
    </figure>
  );
}
