import { z } from 'zod';
import { unitPrefsSchema } from '../domain/units';

/** GET/PUT /api/account/units: the grower's saved units and date language (null: not chosen yet). */
export const unitPrefsResponseSchema = z.object({ units: unitPrefsSchema.nullable() });
export type UnitPrefsResponse = z.infer<typeof unitPrefsResponseSchema>;
