/**
 * USDA plant hardiness zones from the average annual extreme minimum temperature (USDA ARS / PRISM
 * Climate Group, 2023 Plant Hardiness Zone Map, based on 1991-2020). Zones 1-13 are 10 °F wide and
 * split into half-zones a/b 5 °F wide: zone n "a" starts at 10n - 70 °F, "b" at 10n - 65 °F.
 * A band includes its lower bound and excludes its upper one (5 °F is 7b, 10 °F is 8a).
 */

export type HardinessZone = { zone: string; lowF: number; highF: number };

/**
 * The half-zone of an average annual extreme minimum in °F. Below -60 °F gives zone "below 1a"
 * (lowF -Infinity); 70 °F and above gives "above 13b" (highF Infinity): the map has no zone there.
 */
export function hardinessZone(extremeMinF: number): HardinessZone {
  if (!Number.isFinite(extremeMinF)) throw new RangeError('extremeMinF must be a finite number');
  if (extremeMinF < -60) return { zone: 'below 1a', lowF: Number.NEGATIVE_INFINITY, highF: -60 };
  if (extremeMinF >= 70) return { zone: 'above 13b', lowF: 70, highF: Number.POSITIVE_INFINITY };
  const step = Math.floor((extremeMinF + 60) / 5); // 0 = 1a, 1 = 1b, ... 25 = 13b
  const lowF = -60 + step * 5;
  return { zone: `${Math.floor(step / 2) + 1}${step % 2 === 0 ? 'a' : 'b'}`, lowF, highF: lowF + 5 };
}

/** The same from an extreme minimum in °C. */
export function hardinessZoneFromC(extremeMinC: number): HardinessZone {
  return hardinessZone((extremeMinC * 9) / 5 + 32);
}
