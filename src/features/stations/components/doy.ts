import { fahrenheitToCelsius, formatDayOfYear, type TemperatureUnit } from '@shared/domain/units';
import { useUnits } from '../../units/use-units';

/** A day of year as a short calendar date ("Apr 27"), read on a common (non-leap) year, in the grower's language. */
export function formatDoy(doy: number | null | undefined, locale = 'en-US'): string {
  return formatDayOfYear(doy, locale);
}

/** A freeze threshold as the climate normals name it (in °F), with the other unit beside it; the grower's unit first. */
export function thresholdLabel(thresholdF: number, unit: TemperatureUnit = 'F'): string {
  const c = Math.round(fahrenheitToCelsius(thresholdF) * 10) / 10;
  const cText = `${c === 0 ? '0' : c.toFixed(1)} °C`;
  return unit === 'F' ? `${thresholdF} °F (${cText})` : `${cText} (${thresholdF} °F)`;
}

/** Both, bound to the grower's units and language. */
export function useStationLabels() {
  const units = useUnits();
  return { formatDoy: (doy: number | null | undefined) => formatDoy(doy, units.prefs.locale), thresholdLabel: (f: number) => thresholdLabel(f, units.prefs.temperature) };
}
