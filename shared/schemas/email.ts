import { z } from 'zod';
import { currentUserSchema, emailSchema, passwordSchema } from './auth';
import { MIN_PUBLIC_RADIUS_KM } from '../domain/public-grid';

/** A token from an e-mailed link (random, base64url). */
export const emailTokenSchema = z.string().trim().min(16, { message: 'This link is incomplete' }).max(200, { message: 'This link is not valid' });

/** POST /api/auth/verify */
export const verifyInputSchema = z.object({ token: emailTokenSchema });

/** POST /api/auth/forgot: the answer is the same whether or not the address has an account. */
export const forgotInputSchema = z.object({ email: emailSchema });
export type ForgotInput = z.infer<typeof forgotInputSchema>;

/** POST /api/auth/reset */
export const resetInputSchema = z.object({ token: emailTokenSchema, password: passwordSchema });
export type ResetInput = z.infer<typeof resetInputSchema>;

/** A plain acknowledgement with a sentence to show. */
export const messageResponseSchema = z.object({ message: z.string() });

/** The digest's radius: at least the public grid cell, like every public radius query. */
export const DIGEST_RADIUS_KM = { min: MIN_PUBLIC_RADIUS_KM, max: 200, default: 50 } as const;

/** GET /api/email/digest (signed in): the grower's digest settings and the home place it is centred on. */
export const digestSettingsSchema = z.object({
  active: z.boolean(),
  radiusKm: z.number(),
  lastSentAt: z.string().nullable(),
  home: z.object({ name: z.string(), lat: z.number(), lon: z.number() }).nullable(),
});
export type DigestSettings = z.infer<typeof digestSettingsSchema>;

/** PUT /api/email/digest */
export const digestSettingsInputSchema = z.object({
  active: z.boolean(),
  radiusKm: z.coerce
    .number({ message: 'Enter a distance in km' })
    .min(DIGEST_RADIUS_KM.min, { message: `Use at least ${DIGEST_RADIUS_KM.min} km (the public grid cell)` })
    .max(DIGEST_RADIUS_KM.max, { message: `Use at most ${DIGEST_RADIUS_KM.max} km` }),
});
export type DigestSettingsInput = z.infer<typeof digestSettingsInputSchema>;

/** POST /api/email/unsubscribe: works without signing in. */
export const unsubscribeInputSchema = z.object({ token: emailTokenSchema });

/** The development mailbox (GET /api/dev/mail, development and tests only). */
export const devMailSummarySchema = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
});
export const devMailListSchema = z.object({ messages: z.array(devMailSummarySchema) });
export const devMailMessageSchema = devMailSummarySchema.extend({ text: z.string().nullable(), html: z.string().nullable() });
export type DevMailSummary = z.infer<typeof devMailSummarySchema>;
export type DevMailMessage = z.infer<typeof devMailMessageSchema>;

/**
 * POST /api/auth/verify answers with the account signed in on this browser as it is now (after the
 * confirmation if it is theirs; null for a visitor), for the client to show at once.
 */
export const verifyResponseSchema = z.object({ message: z.string(), user: currentUserSchema.nullable() });

/** POST /api/auth/reset answers with the account, now signed in on this browser only. */
export const resetResponseSchema = z.object({ user: currentUserSchema, message: z.string() });
