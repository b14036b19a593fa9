import { z } from 'zod';

/**
 * The id the phone's outbox gives each report it keeps (a UUID from crypto.randomUUID()). Sent as
 * `clientId` beside the report's fields on POST /api/reports, it makes the post idempotent: the same
 * grower sending the same id again gets the report stored the first time (200), not a copy.
 */
export const clientIdSchema = z
  .string()
  .regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'clientId must be 8 to 64 letters, digits or dashes (a UUID)' })
  .optional();

export const reportClientIdInputSchema = z.object({ clientId: clientIdSchema });
