/** A day of year as a short calendar date ("Apr 27"), read on a common (non-leap) year. */
export function formatDoy(doy: number | null | undefined): string {
  if (doy === null || doy === undefined) return '—';
  return new Date(Date.UTC(2021, 0, doy)).toLocaleDateString('en', { month: 'short', day: 'numeric', timeZone: 'UTC' });
}

/** A freeze threshold in deg F with its deg C value, as the climate normals name them. */
export function thresholdLabel(thresholdF: number): string {
  const c = Math.round(((thresholdF - 32) * 5) / 9 * 10) / 10;
  return `${thresholdF} °F (${c === 0 ? '0' : c.toFixed(1)} °C)`;
}
