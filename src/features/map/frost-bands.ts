/**
 * Day bands for the frost-free season layer (32 deg F, the length reached in half the years).
 * Around 150 days is short for many varieties' main crop (common practice, no source); the bands
 * step by a month from there.
 */
export interface FrostBand {
  /** Lowest day count in the band (inclusive). */
  from: number;
  label: string;
  color: string;
}

export const FROST_BANDS: readonly FrostBand[] = [
  { from: 0, label: 'under 150 days', color: '#8fb3c9' },
  { from: 150, label: '150–179 days', color: '#b8d0b0' },
  { from: 180, label: '180–209 days', color: '#e3d98f' },
  { from: 210, label: '210–239 days', color: '#efb676' },
  { from: 240, label: '240 days or more', color: '#d9826b' },
];

/** The band a season length falls in; null when the station has no estimate. */
export function frostBandFor(days: number | null): FrostBand | null {
  if (days === null || !Number.isFinite(days)) return null;
  let band: FrostBand = FROST_BANDS[0]!;
  for (const b of FROST_BANDS) if (days >= b.from) band = b;
  return band;
}
