import { z } from 'zod';
import { ROLES } from '../domain/codes';
import { DATA_LICENCE } from '../domain/data-licence';

export const emailSchema = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' }).max(254));

export const passwordSchema = z
  .string()
  .min(10, { message: 'Use at least 10 characters' })
  .max(200, { message: 'Use at most 200 characters' });

export const signUpInputSchema = z.object({
  email: emailSchema,
  displayName: z.string().trim().min(2, { message: 'Use at least 2 characters' }).max(60, { message: 'Use at most 60 characters' }),
  password: passwordSchema,
  /** The grower agrees that their published reports are open data under DATA_LICENCE (required to join). */
  acceptDataLicence: z.literal(true, { message: `Agree to share your published reports under ${DATA_LICENCE.name} to join` }),
});
export type SignUpInput = z.infer<typeof signUpInputSchema>;

export const signInInputSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, { message: 'Enter your password' }).max(200),
});
export type SignInInput = z.infer<typeof signInInputSchema>;

/** The signed-in user as the API shows them to themselves. */
export const currentUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(ROLES),
  emailVerified: z.boolean(),
  createdAt: z.string(),
});
export type CurrentUser = z.infer<typeof currentUserSchema>;

export const meResponseSchema = z.object({ user: currentUserSchema.nullable() });

export const userListItemSchema = currentUserSchema;
export const userListSchema = z.object({ users: z.array(userListItemSchema) });

export const changeRoleInputSchema = z.object({ role: z.enum(ROLES) });
