import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { blankToUndefined, decimalNumber, numberFromText } from '../../shared/schemas/text-number';

describe('numberFromText', () => {
  const schema = z.object({
    lat: numberFromText(z.coerce.number({ message: 'lat must be a number' }).min(-90).max(90)),
    radiusKm: numberFromText(z.coerce.number().gt(0).default(100)),
    season: numberFromText(z.coerce.number().int().optional()),
  });

  it('reads numbers from text as z.coerce.number does', () => {
    expect(schema.parse({ lat: '42.5', radiusKm: '25', season: '2024' })).toEqual({ lat: 42.5, radiusKm: 25, season: 2024 });
    expect(schema.parse({ lat: 0 })).toEqual({ lat: 0, radiusKm: 100 });
  });

  it('treats an empty or blank value as not given, never 0', () => {
    // The very case z.coerce.number gets wrong: Number('') and Number('  ') are 0.
    expect(z.coerce.number().parse('')).toBe(0);
    expect(schema.parse({ lat: '1', radiusKm: '', season: '  ' })).toEqual({ lat: 1, radiusKm: 100 });
    for (const lat of ['', ' ', '\t', undefined]) {
      const result = schema.safeParse({ lat });
      expect(result.success).toBe(false);
      expect(z.flattenError(result.error!).fieldErrors).toEqual({ lat: ['lat must be a number'] });
    }
  });

  it('leaves anything but blank text alone', () => {
    expect(blankToUndefined(' 3 ')).toBe(' 3 ');
    expect(blankToUndefined(0)).toBe(0);
    expect(blankToUndefined(null)).toBeNull();
    expect(blankToUndefined('')).toBeUndefined();
  });

  it('accepts plain decimal notation only: 0x10 is refused, never read as 16', () => {
    // Number('0x10') is 16, Number('1e3') 1000, Number('0b11') 3, Number('Infinity') Infinity (ECMAScript StringToNumber).
    expect(Number('0x10')).toBe(16);
    for (const text of ['0x10', '0X1F', '0b11', '0o7', '1e3', '2E-1', 'Infinity', '-Infinity', 'NaN', '1_000', '42,5', '4 2', '+-1', '.', '--1', '١٢']) {
      expect(decimalNumber(text), text).toBeNaN();
      const result = schema.safeParse({ lat: text });
      expect(result.success, text).toBe(false);
      expect(z.flattenError(result.error!).fieldErrors, text).toEqual({ lat: ['lat must be a number'] });
    }
    for (const [text, value] of [['42', 42], [' -73.81 ', -73.81], ['+5', 5], ['.5', 0.5], ['7.', 7], ['007', 7], ['-0', -0]] as const) {
      expect(decimalNumber(text), text).toBe(value);
    }
    expect(schema.parse({ lat: '-0.25', season: '2024' })).toEqual({ lat: -0.25, radiusKm: 100, season: 2024 });
  });
});
