import { OUTCOME_RING_COLORS, RING_STEPS } from '../pin-rings';

/** The pins' ring as SVG, for the legend and the details (same parts, same colours, same order). */
export function OutcomeRing({ steps, size = 24 }: { steps: { ripened: number; unripe: number; other: number }; size?: number }) {
  const r = 10;
  const circumference = 2 * Math.PI * r;
  let offset = 0;
  const parts = (
    [
      [steps.ripened, OUTCOME_RING_COLORS.ripened],
      [steps.unripe, OUTCOME_RING_COLORS.unripe],
      [steps.other, OUTCOME_RING_COLORS.other],
    ] as const
  ).map(([n, color]) => {
    const length = (n / RING_STEPS) * circumference;
    const arc = { color, length, offset };
    offset += length;
    return arc;
  });
  return (
    <svg width={size} height={size} viewBox="0 0 28 28" aria-hidden="true" className="shrink-0">
      <circle cx="14" cy="14" r="13.5" fill="#faf6ef" />
      <g transform="rotate(-90 14 14)">
        {parts.map((p, i) => (p.length > 0 ? <circle key={i} cx="14" cy="14" r={r} fill="none" stroke={p.color} strokeWidth="6.5" strokeDasharray={`${p.length} ${circumference - p.length}`} strokeDashoffset={-p.offset} /> : null))}
      </g>
      <circle cx="14" cy="14" r="13" fill="none" stroke="rgba(43,34,48,0.35)" strokeWidth="0.8" />
    </svg>
  );
}
