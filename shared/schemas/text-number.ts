import { z } from 'zod';

/** Text that is empty or only whitespace (an empty form field, query parameter or CSV cell) is "not given". */
export const blankToUndefined = (value: unknown): unknown => (typeof value === 'string' && value.trim() === '' ? undefined : value);

/**
 * Read a number from text without turning an empty field into 0: `z.coerce.number()` alone makes
 * '' (and '  ') 0, so an empty latitude would silently become the equator. Wrap the whole schema,
 * with `.optional()` or `.default()` inside: an empty optional field is then absent (or takes its
 * default), and an empty required one fails with the inner schema's message, naming the field.
 *
 *     lat: numberFromText(z.coerce.number({ message: 'lat must be a number' }).min(-90).max(90))
 */
export function numberFromText<T extends z.ZodType>(schema: T) {
  return z.preprocess(blankToUndefined, schema);
}
