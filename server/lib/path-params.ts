import { z } from 'zod';

/**
 * A path's id (`/api/reports/:id`): digits only. `z.coerce.number()` read "0x10" as 16 and "1e1" as
 * 10, so one record answered to several addresses; an id is what it shows or a 400 that names it.
 */
export const pathId = z
  .string()
  .regex(/^\d{1,15}$/, { message: 'must be a whole number written in digits' })
  .transform(Number)
  .pipe(z.number().int().positive({ message: 'must be 1 or more' }));

export const idParamsSchema = z.object({ id: pathId });
