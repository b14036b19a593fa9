import { z } from 'zod';
import { ROLES } from '../domain/codes';
import { numberFromText } from './text-number';
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
/** GET /api/users (admins): one page of accounts whose name or e-mail contains q, optionally of one role. */
export const userListQuerySchema = z.object({
  q: z.string().trim().max(100, { message: 'q must have at most 100 characters' }).optional(),
  role: z.enum(ROLES, { message: `role must be one of ${ROLES.join(', ')}` }).optional(),
  page: numberFromText(z.coerce.number({ message: 'page must be a number' }).int({ message: 'page must be a whole number' }).min(1, { message: 'page must be at least 1' }).default(1)),
  pageSize: numberFromText(z.coerce.number({ message: 'pageSize must be a number' }).int({ message: 'pageSize must be a whole number' }).min(1, { message: 'pageSize must be at least 1' }).max(200, { message: 'pageSize must be at most 200' }).default(25)),
});
export type UserListQuery = z.input<typeof userListQuerySchema>;

export const userListSchema = z.object({ users: z.array(userListItemSchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });

export const changeRoleInputSchema = z.object({ role: z.enum(ROLES) });
