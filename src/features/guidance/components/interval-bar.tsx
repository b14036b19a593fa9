/**
 * A small horizontal bar from 0 to 100 %: the 90 % interval as a band, the observed share as a
 * tick and, when given, the adjusted share as a dot. Text beside it carries the same numbers.
 */
export function IntervalBar({ share, low, high, adjusted, label, className = 'w-32' }: { share: number | null; low: number | null; high: number | null; adjusted?: number | null; label: string; className?: string }) {
  const pct = (v: number) => `${Math.max(0, Math.min(1, v)) * 100}%`;
  return (
    <div role="img" aria-label={label} title={label} className={`relative h-3 shrink-0 rounded-full bg-fig-50 ring-1 ring-fig-100 ${className}`}>
      {low !== null && high !== null && <div className="absolute inset-y-0 rounded-full bg-leaf-300" style={{ left: pct(low), width: `calc(${pct(high)} - ${pct(low)})` }} />}
      {share !== null && <div className="absolute -inset-y-0.5 w-0.5 bg-leaf-700" style={{ left: pct(share) }} />}
      {adjusted !== null && adjusted !== undefined && <div className="absolute top-1/2 size-2 -translate-x-1/2 -translate-y-1/2 rounded-full border border-white bg-fig-600" style={{ left: pct(adjusted) }} />}
    </div>
  );
}

export const percent = (v: number | null | undefined) => (v === null || v === undefined ? '—' : `${Math.round(v * 100)} %`);
