import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis, ZAxis } from 'recharts';
import type { ModelAccuracy } from '@shared/schemas/accuracy';

const pct = (x: number) => Math.round(x * 100);

/**
 * Reliability diagram: for each tenth of the predicted chance, the share of tree-seasons that gave
 * an edible crop, against the mean chance given; on the diagonal, the chance means what it says.
 * Dot area follows the count.
 */
export function ReliabilityChart({ bins }: { bins: ModelAccuracy['bins'] }) {
  const points = bins
    .filter((b) => b.count > 0 && b.meanPredicted !== null && b.observed !== null)
    .map((b) => ({ predicted: pct(b.meanPredicted!), observed: pct(b.observed!), count: b.count, band: `${pct(b.from)}–${pct(b.to)} %` }));
  const diagonal = [
    { predicted: 0, ideal: 0 },
    { predicted: 100, ideal: 100 },
  ];
  return (
    <div className="h-72 w-full" role="img" aria-label="Reliability diagram: observed share of edible crops against the predicted chance, in ten bins">
      <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 480, height: 260 }}>
        <ComposedChart margin={{ top: 12, right: 12, bottom: 20, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#efdfe8" />
          <XAxis type="number" dataKey="predicted" domain={[0, 100]} ticks={[0, 20, 40, 60, 80, 100]} unit=" %" tick={{ fontSize: 11 }} label={{ value: 'Chance given', position: 'insideBottom', offset: -12, fontSize: 11, fill: '#2b2230' }} />
          <YAxis type="number" domain={[0, 100]} ticks={[0, 20, 40, 60, 80, 100]} unit=" %" tick={{ fontSize: 11 }} label={{ value: 'Edible crop seen', angle: -90, position: 'insideLeft', offset: 4, dy: 50, fontSize: 11, fill: '#2b2230' }} />
          <ZAxis type="number" dataKey="count" range={[30, 400]} />
          <Line data={diagonal} dataKey="ideal" stroke="#b59aab" strokeDasharray="4 3" dot={false} isAnimationActive={false} legendType="none" />
          <Scatter data={points} dataKey="observed" fill="#5e8a57" isAnimationActive={false} />
          <Tooltip
            cursor={false}
            formatter={(value, name) => [`${value} %`, name === 'observed' ? 'edible crop seen' : String(name)]}
            content={({ active, payload }) => {
              const p = active && payload?.[0]?.payload as (typeof points)[number] | undefined;
              if (!p || !('count' in p)) return null;
              return (
                <div className="rounded border border-fig-100 bg-white px-2 py-1 text-xs shadow">
                  Chance {p.band}: {p.count} tree-seasons, mean chance {p.predicted} %, edible crop in {p.observed} %
                </div>
              );
            }}
          />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
