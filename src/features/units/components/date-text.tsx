import { useUnits } from '../use-units';

/** A date in the grower's one date style, in a <time> element carrying the ISO value. */
export function DateText({ iso, withTime = false, className }: { iso: string | null | undefined; withTime?: boolean; className?: string }) {
  const units = useUnits();
  if (!iso) return <span className={className}>—</span>;
  return (
    <time dateTime={iso} className={className}>
      {withTime ? units.dateTime(iso) : units.date(iso)}
    </time>
  );
}

/** A day of the year ("Apr 29" / "29 Apr") in the grower's language. */
export function DayOfYearText({ doy }: { doy: number | null | undefined }) {
  return <>{useUnits().dayOfYear(doy)}</>;
}
