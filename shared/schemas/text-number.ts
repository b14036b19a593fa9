import { z } from 'zod';

/** Text that is empty or only whitespace (an empty form field, query parameter or CSV cell) is "not given". */
export const blankToUndefined = (value: unknown): unknown => (typeof value === 'string' && value.trim() === '' ? undefined : value);

/**
 * Plain decimal notation only: an optional sign, digits, an optional decimal point ("42", "-73.81",
 * ".5", "7."). JavaScript's Number() also reads "0x10" as 16, "0b11", "0o7", "1e3" as 1000 and
 * "Infinity": a typed field means what it shows, so those are refused rather than silently converted.
 * Exponents are refused too: no field of the app needs them, and "1e3" in a latitude is a slip.
 */
export const DECIMAL_TEXT = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

/** The number written in `text` (surrounding spaces allowed), or NaN unless it is plain decimal notation. */
export function decimalNumber(text: string): number {
  const trimmed = text.trim();
  return DECIMAL_TEXT.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** Text becomes its decimal number (or NaN, which the inner schema refuses); blank text becomes undefined. */
const readDecimalText = (value: unknown): unknown => {
  const given = blankToUndefined(value);
  return typeof given === 'string' ? decimalNumber(given) : given;
};

/**
 * Read a number from text without turning an empty field into 0: `z.coerce.number()` alone makes
 * '' (and '  ') 0, so an empty latitude would silently become the equator, and '0x10' 16. Wrap the
 * whole schema, with `.optional()` or `.default()` inside: an empty optional field is then absent
 * (or takes its default), an empty required one fails with the inner schema's message, naming the
 * field, and text that is not plain decimal notation fails the same way.
 *
 *     lat: numberFromText(z.coerce.number({ message: 'lat must be a number' }).min(-90).max(90))
 */
export function numberFromText<T extends z.ZodType>(schema: T) {
  return z.preprocess(readDecimalText, schema);
}
