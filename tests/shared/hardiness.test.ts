import { describe, expect, it } from 'vitest';
import { hardinessZone, hardinessZoneFromC } from '../../shared/domain/hardiness';

describe('hardinessZone', () => {
  it('uses the 2023 USDA map bands', () => {
    // USDA ARS / PRISM, 2023 Plant Hardiness Zone Map: 7b = 5 to 10 F, 1a = -60 to -55 F, 13b = 65 to 70 F.
    expect(hardinessZone(7)).toEqual({ zone: '7b', lowF: 5, highF: 10 });
    expect(hardinessZone(-58)).toEqual({ zone: '1a', lowF: -60, highF: -55 });
    expect(hardinessZone(66.5)).toEqual({ zone: '13b', lowF: 65, highF: 70 });
  });

  it('follows the lower-bound formula 10n - 70 (a) and 10n - 65 (b) for every zone', () => {
    // USDA ARS / PRISM 2023: zones 10 F wide, half-zones 5 F wide.
    for (let n = 1; n <= 13; n++) {
      expect(hardinessZone(10 * n - 70)).toEqual({ zone: `${n}a`, lowF: 10 * n - 70, highF: 10 * n - 65 });
      expect(hardinessZone(10 * n - 65)).toEqual({ zone: `${n}b`, lowF: 10 * n - 65, highF: 10 * n - 60 });
    }
  });

  it('puts a bound into the upper band and says so outside the map', () => {
    expect(hardinessZone(5).zone).toBe('7b');
    expect(hardinessZone(10).zone).toBe('8a');
    expect(hardinessZone(4.99).zone).toBe('7a');
    expect(hardinessZone(-61).zone).toBe('below 1a');
    expect(hardinessZone(70).zone).toBe('above 13b');
  });

  it('accepts Celsius', () => {
    // -15 C = 5 F: the bottom of 7b (USDA 2023 bands).
    expect(hardinessZoneFromC(-15).zone).toBe('7b');
  });
});
