import { useQuery } from '@tanstack/react-query';
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { MethodNote } from '../../../components/method-note';
import { stationQueries } from '../../stations/api';
import { useUnits } from '../../units/use-units';

/** The same words as the season cards above the chart. */
const YEAR_LABEL: Record<number, string> = { 10: 'Short year', 50: 'Typical year', 90: 'Long year' };

/**
 * The nearest station's frost dates at 32 deg F: for 10, 50 and 90 % probability, a bar from the
 * last spring freeze to the first fall freeze (the frost-free span), drawn on a day-of-year axis.
 */
export function StationFrostChart({ stationId, distanceKm }: { stationId: number; distanceKm: number }) {
  const units = useUnits();
  const doyLabel = units.dayOfYear;
  const { data, error, isLoading } = useQuery(stationQueries.detail(stationId));
  if (isLoading) return <p className="text-sm text-ink/70">Loading the station…</p>;
  if (error) return <p className="text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  const at32 = data.summaries.filter((s) => s.thresholdF === 32 && s.lastSpringDoy !== null && s.firstFallDoy !== null).sort((a, b) => a.probability - b.probability);
  if (at32.length === 0) return <p className="text-sm text-ink/70">{data.station.name} has no frost-date summary yet.</p>;
  const rows = at32.map((s) => ({
    level: YEAR_LABEL[s.probability] ?? `${s.probability} %`,
    before: s.lastSpringDoy!,
    span: s.firstFallDoy! - s.lastSpringDoy!,
    spring: doyLabel(s.lastSpringDoy!),
    fall: doyLabel(s.firstFallDoy!),
    days: s.seasonDays,
  }));
  return (
    <figure>
      <div className="h-40 w-full">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 480, height: 180 }}>
          <BarChart data={rows} layout="vertical" margin={{ top: 4, right: 12, bottom: 4, left: 4 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#efdfe8" horizontal={false} />
            <XAxis type="number" domain={[1, 365]} ticks={[1, 60, 121, 182, 244, 305, 365]} tickFormatter={(d: number) => doyLabel(d)} tick={{ fontSize: 11 }} />
            <YAxis type="category" dataKey="level" width={92} tick={{ fontSize: 11 }} />
            <Tooltip
              formatter={(_value, name, item) => {
                const p = item.payload as (typeof rows)[number];
                return name === 'span' ? [`${p.spring} to ${p.fall}${p.days !== null ? ` (season ${p.days} days)` : ''}`, 'frost-free'] : [p.spring, 'last spring freeze'];
              }}
            />
            <Bar dataKey="before" stackId="s" fill="transparent" isAnimationActive={false} />
            <Bar dataKey="span" stackId="s" fill="#a9c79d" radius={3} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption>
        <MethodNote
          method={
            <>
              Frost-free span at {units.temperature(32)}, as in national climate normals: in the short year (10 %) a freeze after the spring date, or before the fall date, comes in only 1 year of 10
              (a safe span); in the typical year (50 %) in half the years; in the long year (90 %) in 9 years of 10.
            </>
          }
        >
          Nearest station: {data.station.name}, {units.distance(distanceKm)} away. Each bar runs from the last spring freeze to the first fall freeze:{' '}
          {rows.map((r) => `${r.level.toLowerCase()} ${r.spring} to ${r.fall}`).join('; ')}.
        </MethodNote>
      </figcaption>
    </figure>
  );
}
