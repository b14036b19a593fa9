import { distanceKm, type LatLon } from '../../shared/domain/geo';
import { formatDistance, type UnitPrefs } from '../../shared/domain/units';

const RAD = Math.PI / 180;
const COMPASS = ['north', 'north-east', 'east', 'south-east', 'south', 'south-west', 'west', 'north-west'] as const;

/** Initial great-circle bearing from a to b, degrees clockwise from true north (0..360). */
export function initialBearingDeg(a: LatLon, b: LatLon): number {
  const φ1 = a.lat * RAD;
  const φ2 = b.lat * RAD;
  const Δλ = (b.lon - a.lon) * RAD;
  const y = Math.sin(Δλ) * Math.cos(φ2);
  const x = Math.cos(φ1) * Math.sin(φ2) - Math.sin(φ1) * Math.cos(φ2) * Math.cos(Δλ);
  return ((Math.atan2(y, x) / RAD) % 360 + 360) % 360;
}

/** The eight-point compass word for a bearing (each word covers 45 degrees centred on it). */
export function compassWord(bearingDeg: number): (typeof COMPASS)[number] {
  return COMPASS[Math.round((((bearingDeg % 360) + 360) % 360) / 45) % 8]!;
}

/**
 * Town-level wording of where a report is, seen from the home place and measured to the report's
 * public grid cell (never the exact point): "within about 5 km" inside the grid's own size,
 * otherwise "about 23 km north-east", rounded to whole km.
 */
export function describePlace(home: LatLon, gridCell: LatLon, units: Pick<UnitPrefs, 'distance'> = { distance: 'km' }): string {
  const km = distanceKm(home, gridCell);
  if (km < 5) return units.distance === 'km' ? 'within about 5 km' : 'within about 3 mi';
  return `about ${formatDistance(km, units)} ${compassWord(initialBearingDeg(home, gridCell))}`;
}
