import { useId } from 'react';
import { useUnits } from '../use-units';

const selectClass = 'rounded-md border border-fig-200 bg-white px-2 py-1 text-sm';

/** The top bar's version: one small button ("°F · mi") that opens the two selects. */
export function UnitsMenu() {
  const { prefs } = useUnits();
  return (
    <details className="relative" data-testid="units-menu">
      <summary className="cursor-pointer list-none rounded-md px-2 py-1.5 text-sm text-ink/80 hover:bg-fig-50">
        {/* The visible text is part of the name (axe: label-content-name-mismatch). */}
        <span className="sr-only">Units: </span>°{prefs.temperature} · {prefs.distance} <span aria-hidden="true">▾</span>
      </summary>
      <div className="absolute right-0 z-30 mt-1 rounded-md border border-fig-100 bg-white p-3 shadow-lg">
        <UnitsControl compact />
      </div>
    </details>
  );
}

/** Two small selects: °F or °C, km or miles. Saved to the account when signed in, to this browser otherwise. */
export function UnitsControl({ compact = false }: { compact?: boolean }) {
  const id = useId();
  const units = useUnits();
  const { prefs } = units;
  return (
    <div className={`flex flex-wrap items-center gap-2 ${compact ? 'text-xs' : 'text-sm'}`} data-testid="units-control">
      <label htmlFor={`${id}-t`} className={compact ? 'sr-only' : 'font-medium'}>
        Temperatures in
      </label>
      <select id={`${id}-t`} className={selectClass} value={prefs.temperature} onChange={(e) => units.setPrefs({ ...prefs, temperature: e.target.value as 'F' | 'C' })}>
        <option value="F">°F</option>
        <option value="C">°C</option>
      </select>
      <label htmlFor={`${id}-d`} className={compact ? 'sr-only' : 'font-medium'}>
        Distances in
      </label>
      <select id={`${id}-d`} className={selectClass} value={prefs.distance} onChange={(e) => units.setPrefs({ ...prefs, distance: e.target.value as 'km' | 'mi' })}>
        <option value="km">km</option>
        <option value="mi">miles</option>
      </select>
      {!compact && (
        <span className="text-xs text-ink/70">
          {units.source === 'account' ? 'Saved to your account.' : units.source === 'browser' ? 'Saved in this browser.' : 'From your browser’s language.'} Dates: {units.date(new Date().toISOString())}.
        </span>
      )}
    </div>
  );
}
