import { describe, expect, it } from 'vitest';
import {
  defaultUnitsForLocale,
  formatDate,
  formatDateTime,
  formatDayOfYear,
  formatDistance,
  formatTemperature,
  kmToMiles,
  milesToKm,
  plural,
  radiusChoices,
  scaleBarLength,
  unitPrefsSchema,
} from '../../shared/domain/units';

describe('conversions', () => {
  it('uses the international mile (NIST Handbook 44, Appendix C: 1 mi = 1.609 344 km exactly)', () => {
    expect(milesToKm(1)).toBe(1.609344);
    // NIST: 100 km = 62.137 12 mi.
    expect(kmToMiles(100)).toBeCloseTo(62.13712, 5);
    expect(formatDistance(100, { distance: 'mi' })).toBe('62 mi');
    expect(formatDistance(100, { distance: 'km' })).toBe('100 km');
  });

  it('converts °F to °C by (F − 32) × 5/9 (NIST SP 811, B.9): 32 °F = 0 °C, 28 °F = −2.2 °C, 212 °F = 100 °C', () => {
    expect(formatTemperature(32, { temperature: 'C' })).toBe('0 °C');
    expect(formatTemperature(28, { temperature: 'C' })).toBe('-2.2 °C');
    expect(formatTemperature(212, { temperature: 'C' })).toBe('100 °C');
    expect(formatTemperature(28, { temperature: 'F' })).toBe('28 °F');
  });

  it('offers round radius choices in miles whose km value round-trips', () => {
    const choices = radiusChoices({ distance: 'mi' });
    expect(choices.map((c) => c.label)).toEqual(['15 mi', '30 mi', '60 mi', '125 mi', '185 mi']);
    for (const c of choices) expect(c.km).toBeLessThanOrEqual(500);
    expect(choices[2]!.km).toBeCloseTo(96.561, 3);
  });

  it('picks a 1-2-5 scale bar that fits', () => {
    expect(scaleBarLength(130, { distance: 'km' })).toEqual({ km: 100, label: '100 km' });
    const mi = scaleBarLength(130, { distance: 'mi' }); // 130 km ≈ 80.8 mi → 50 mi
    expect(mi.label).toBe('50 mi');
    expect(mi.km).toBeCloseTo(80.4672, 4);
  });
});

describe('defaults from the browser language', () => {
  it('reads the region: en-US → °F and miles, en-GB → °C and miles, fr-FR and de → °C and km (common practice, no source)', () => {
    expect(defaultUnitsForLocale('en-US')).toMatchObject({ temperature: 'F', distance: 'mi' });
    expect(defaultUnitsForLocale('en-GB')).toMatchObject({ temperature: 'C', distance: 'mi' });
    expect(defaultUnitsForLocale('fr-FR')).toMatchObject({ temperature: 'C', distance: 'km' });
    // A bare language is maximised to its likely region (Unicode CLDR likely subtags: de → de-Latn-DE).
    expect(defaultUnitsForLocale('de')).toMatchObject({ temperature: 'C', distance: 'km' });
    expect(defaultUnitsForLocale('not a tag!').locale).toBe('en-US');
  });

  it('validates a saved preference and names the field', () => {
    expect(unitPrefsSchema.safeParse({ temperature: 'F', distance: 'mi', locale: 'en-US' }).success).toBe(true);
    const bad = unitPrefsSchema.safeParse({ temperature: 'K', distance: 'mi', locale: 'en-US' });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.path).toEqual(['temperature']);
  });
});

describe('one date style through Intl', () => {
  // Expected strings are the Unicode CLDR medium date patterns as shipped with Node's ICU:
  // en-US "MMM d, y", en-GB "d MMM y", de "dd.MM.y".
  it('formats a calendar date without shifting it by a time zone', () => {
    expect(formatDate('2025-05-07', 'en-US')).toBe('May 7, 2025');
    expect(formatDate('2025-05-07', 'en-GB')).toBe('7 May 2025');
    expect(formatDate('2025-05-07', 'de-DE')).toBe('07.05.2025');
    expect(formatDate('2024-12-31', 'en-US')).toBe('Dec 31, 2024');
    expect(formatDate(null, 'en-US')).toBe('—');
  });

  it('formats a day of the year on a common year: day 1 = Jan 1, day 119 = Apr 29, day 365 = Dec 31', () => {
    expect(formatDayOfYear(1, 'en-US')).toBe('Jan 1');
    expect(formatDayOfYear(119, 'en-US')).toBe('Apr 29');
    expect(formatDayOfYear(119, 'en-GB')).toBe('29 Apr');
    expect(formatDayOfYear(365, 'en-US')).toBe('Dec 31');
  });

  it('formats a timestamp with its time', () => {
    expect(formatDateTime('2026-12-03T13:05:00Z', 'en-GB')).toMatch(/^3 Dec 2026, \d{2}:\d{2}$/);
  });

  it('never writes "1 trees"', () => {
    expect(plural(1, 'tree')).toBe('1 tree');
    expect(plural(2, 'tree')).toBe('2 trees');
    expect(plural(1, 'variety', 'varieties')).toBe('1 variety');
  });
});
