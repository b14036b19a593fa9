import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { FREEZE_THRESHOLDS_F, PROBABILITY_LEVELS } from '@shared/domain/codes';
import type { StationDetail } from '@shared/schemas/stations';
import { stationQueries } from '../api';
import { useStationLabels } from './doy';
import { DateText } from '../../units/components/date-text';

/** A station's computed frost picture: the 10/50/90 % summary, a chart of every year, and the table. */
export function StationDetailView({ id }: { id: number }) {
  const { data, isLoading, error } = useQuery(stationQueries.detail(id));
  if (isLoading) return <p className="text-ink/70">Loading the station…</p>;
  if (error) return <p role="alert">{error.message}</p>;
  if (!data) return null;
  const { station } = data;
  return (
    <section aria-labelledby="station-title" className="flex flex-col gap-6">
      <header>
        <h2 id="station-title" className="text-xl font-semibold text-fig-900">
          {station.name}
        </h2>
        <p className="text-sm text-ink/70">
          {station.code ? `${station.code} · ` : ''}
          {station.lat.toFixed(4)}, {station.lon.toFixed(4)}
          {station.elevationM !== null ? ` · ${station.elevationM} m` : ''} · {station.dayCount.toLocaleString()} days from <DateText iso={station.firstDate} /> to <DateText iso={station.lastDate} />
        </p>
      </header>
      <SummaryTable summaries={data.summaries} />
      <FreezeChart detail={data} />
      <FreezeYearTable freezeYears={data.freezeYears} />
    </section>
  );
}

function SummaryTable({ summaries }: { summaries: StationDetail['summaries'] }) {
  const { formatDoy, thresholdLabel } = useStationLabels();
  const at = (t: number, p: number) => summaries.find((s) => s.thresholdF === t && s.probability === p);
  return (
    <div>
      <h3 className="font-medium text-fig-900">Summary over the years</h3>
      <p className="mb-2 text-sm text-ink/70">
        As in national climate normals: the <em>10 %</em> spring date is later than the last freeze in only 1 year of 10 (a safe planting date); the 10 % season length is exceeded in 9 years of
        10 (a short year). Years: {summaries[0]?.years ?? 0}.
      </p>
      <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Freeze dates and frost-free season at 10, 50 and 90 % probability</caption>
          <thead className="bg-fig-50 text-ink/70">
            <tr>
              <th className="px-3 py-2 font-medium">Threshold</th>
              <th className="px-3 py-2 font-medium">Probability</th>
              <th className="px-3 py-2 font-medium">Last spring freeze</th>
              <th className="px-3 py-2 font-medium">First fall freeze</th>
              <th className="px-3 py-2 font-medium">Frost-free days</th>
            </tr>
          </thead>
          <tbody>
            {FREEZE_THRESHOLDS_F.flatMap((t) =>
              PROBABILITY_LEVELS.map((p) => {
                const s = at(t, p);
                return (
                  <tr key={`${t}-${p}`} className={`border-t border-fig-100 ${p === 50 ? 'bg-leaf-100/40 font-medium' : ''}`}>
                    <td className="px-3 py-1.5">{p === 10 ? thresholdLabel(t) : ''}</td>
                    <td className="px-3 py-1.5">{p} %</td>
                    <td className="px-3 py-1.5">{formatDoy(s?.lastSpringDoy)}</td>
                    <td className="px-3 py-1.5">{formatDoy(s?.firstFallDoy)}</td>
                    <td className="px-3 py-1.5">{s?.seasonDays ?? '—'}</td>
                  </tr>
                );
              }),
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

function FreezeChart({ detail }: { detail: StationDetail }) {
  const { formatDoy, thresholdLabel } = useStationLabels();
  const [thresholdF, setThresholdF] = useState<number>(32);
  const rows = useMemo(
    () => detail.freezeYears.filter((y) => y.thresholdF === thresholdF && !y.leftOutReason).map((y) => ({ year: y.year, spring: y.lastSpringDoy, fall: y.firstFallDoy })),
    [detail.freezeYears, thresholdF],
  );
  const median = detail.summaries.find((s) => s.thresholdF === thresholdF && s.probability === 50);
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-medium text-fig-900">Freeze dates year by year</h3>
        <label className="text-sm text-ink/80">
          Threshold{' '}
          <select className="rounded border border-fig-200 bg-white px-2 py-1" value={thresholdF} onChange={(e) => setThresholdF(Number(e.target.value))}>
            {FREEZE_THRESHOLDS_F.map((t) => (
              <option key={t} value={t}>
                {thresholdLabel(t)}
              </option>
            ))}
          </select>
        </label>
      </div>
      <div className="h-72 rounded-lg border border-fig-100 bg-white p-2" role="img" aria-label={`Last spring and first fall freeze at ${thresholdF} °F for each year, with the 50 % dates as lines`}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
            <CartesianGrid stroke="#efdfe8" />
            <XAxis dataKey="year" type="number" domain={['dataMin', 'dataMax']} tick={{ fontSize: 12 }} allowDecimals={false} />
            <YAxis domain={[1, 366]} ticks={[1, 60, 121, 182, 244, 305, 366]} tickFormatter={(v: number) => formatDoy(v)} tick={{ fontSize: 12 }} width={56} />
            <Tooltip formatter={(value) => formatDoy(Number(value))} labelFormatter={(label) => `Year ${label}`} />
            <Legend />
            <Line name="Last spring freeze" dataKey="spring" stroke="#3d5e39" dot={{ r: 2 }} strokeWidth={1} connectNulls={false} isAnimationActive={false} />
            <Line name="First fall freeze" dataKey="fall" stroke="#8e4f73" dot={{ r: 2 }} strokeWidth={1} connectNulls={false} isAnimationActive={false} />
            {median?.lastSpringDoy != null && <ReferenceLine y={median.lastSpringDoy} stroke="#3d5e39" strokeDasharray="5 4" label={{ value: `50 % spring ${formatDoy(median.lastSpringDoy)}`, fontSize: 11, position: 'insideTopLeft' }} />}
            {median?.firstFallDoy != null && <ReferenceLine y={median.firstFallDoy} stroke="#552c48" strokeDasharray="5 4" label={{ value: `50 % fall ${formatDoy(median.firstFallDoy)}`, fontSize: 11, position: 'insideBottomLeft' }} />}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </div>
  );
}

function FreezeYearTable({ freezeYears }: { freezeYears: StationDetail['freezeYears'] }) {
  const { formatDoy, thresholdLabel } = useStationLabels();
  const years = useMemo(() => {
    const byYear = new Map<number, Map<number, StationDetail['freezeYears'][number]>>();
    for (const row of freezeYears) {
      if (!byYear.has(row.year)) byYear.set(row.year, new Map());
      byYear.get(row.year)!.set(row.thresholdF, row);
    }
    return [...byYear.entries()].sort((a, b) => b[0] - a[0]);
  }, [freezeYears]);
  return (
    <div>
      <h3 className="font-medium text-fig-900">Every year</h3>
      <p className="mb-2 text-sm text-ink/70">
        “none” means no reading at or below the threshold in that half of the year. A year with too many missing days is shown in grey with the reason, and left out of the summary and the chart.
      </p>
      <div className="max-h-[28rem] overflow-auto rounded-lg border border-fig-100 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Last spring and first fall freeze and frost-free days for each year and threshold</caption>
          <thead className="sticky top-0 bg-fig-50 text-ink/70">
            <tr>
              <th rowSpan={2} className="px-3 py-2 font-medium">
                Year
              </th>
              {FREEZE_THRESHOLDS_F.map((t) => (
                <th key={t} colSpan={3} className="border-l border-fig-100 px-3 pt-2 font-medium">
                  {thresholdLabel(t)}
                </th>
              ))}
              <th rowSpan={2} className="border-l border-fig-100 px-3 py-2 font-medium">
                Left out
              </th>
            </tr>
            <tr>
              {FREEZE_THRESHOLDS_F.flatMap((t) => [
                <th key={`${t}-s`} className="border-l border-fig-100 px-3 pb-2 font-normal">
                  Spring
                </th>,
                <th key={`${t}-f`} className="px-3 pb-2 font-normal">
                  Fall
                </th>,
                <th key={`${t}-d`} className="px-3 pb-2 font-normal">
                  Days
                </th>,
              ])}
            </tr>
          </thead>
          <tbody>
            {years.map(([year, byThreshold]) => (
              <tr key={year} className={`border-t border-fig-100 ${leftOutWords(byThreshold) ? 'text-ink/50' : ''}`}>
                <th scope="row" className="px-3 py-1 font-medium">
                  {year}
                </th>
                {FREEZE_THRESHOLDS_F.flatMap((t) => {
                  const row = byThreshold.get(t);
                  return [
                    <td key={`${t}-s`} className="border-l border-fig-100 px-3 py-1">
                      {row ? (row.lastSpringDoy === null ? 'none' : formatDoy(row.lastSpringDoy)) : '—'}
                    </td>,
                    <td key={`${t}-f`} className="px-3 py-1">
                      {row ? (row.firstFallDoy === null ? 'none' : formatDoy(row.firstFallDoy)) : '—'}
                    </td>,
                    <td key={`${t}-d`} className="px-3 py-1">
                      {row?.seasonDays ?? '—'}
                    </td>,
                  ];
                })}
                <td className="border-l border-fig-100 px-3 py-1 text-xs">{leftOutWords(byThreshold)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** The reasons a year is left out, once when every threshold shares it, else per threshold. */
function leftOutWords(byThreshold: Map<number, StationDetail['freezeYears'][number]>): string {
  const reasons = FREEZE_THRESHOLDS_F.map((t) => [t, byThreshold.get(t)?.leftOutReason ?? null] as const).filter(([, r]) => r);
  if (reasons.length === 0) return '';
  if (reasons.length === FREEZE_THRESHOLDS_F.length && reasons.every(([, r]) => r === reasons[0]![1])) return reasons[0]![1]!;
  return reasons.map(([t, r]) => `${t} °F: ${r}`).join('; ');
}
