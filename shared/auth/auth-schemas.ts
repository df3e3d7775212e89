import { z } from 'zod';
import { roles } from './roles';

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 256;
export const NAME_MAX_LENGTH = 100;
export const ORGANIZATION_NAME_MAX_LENGTH = 120;

export const emailSchema = z
  .string({ error: 'Enter an e-mail address' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long')
  .pipe(z.email('Enter a valid e-mail address'));

export const passwordSchema = z
  .string({ error: 'Enter a password' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters`);

export const personNameSchema = z
  .string({ error: 'Enter your name' })
  .trim()
  .min(1, 'Enter your name')
  .max(NAME_MAX_LENGTH, `Use at most ${NAME_MAX_LENGTH} characters`);

export const organizationNameSchema = z
  .string({ error: 'Enter a name' })
  .trim()
  .min(1, 'Enter a name')
  .max(ORGANIZATION_NAME_MAX_LENGTH, `Use at most ${ORGANIZATION_NAME_MAX_LENGTH} characters`);

/** Opaque link token (base64url of 32 random bytes). */
export const linkTokenSchema = z
  .string()
  .regex(/^[A-Za-z0-9_-]{20,128}$/, 'This link is not valid');

export const unitSystems = ['SI', 'IP'] as const;
export const unitSystemSchema = z.enum(unitSystems);
export type UnitSystem = z.infer<typeof unitSystemSchema>;

/** POST /api/v1/auth/sign-up */
export const signUpInputSchema = z.strictObject({
  email: emailSchema,
  name: personNameSchema,
  password: passwordSchema,
  /** Name of the new organisation; defaults to "<name>'s firm". Ignored with an invitation. */
  organizationName: organizationNameSchema.optional(),
  /** When present, the new account joins that invitation's organisation instead of creating one. */
  invitationToken: linkTokenSchema.optional(),
});
export type SignUpInput = z.infer<typeof signUpInputSchema>;

/** POST /api/v1/auth/sign-in */
export const signInInputSchema = z.strictObject({
  email: emailSchema,
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(PASSWORD_MAX_LENGTH),
});
export type SignInInput = z.infer<typeof signInInputSchema>;

/** POST /api/v1/auth/password-resets */
export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

/** POST /api/v1/auth/password-resets/:token */
export const passwordResetConfirmSchema = z.strictObject({ password: passwordSchema });
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirmSchema>;

/** PATCH /api/v1/me */
export const updateMeSchema = z.strictObject({
  name: personNameSchema.optional(),
  unitSystem: unitSystemSchema.optional(),
});
export type UpdateMe = z.infer<typeof updateMeSchema>;

/** PUT /api/v1/session/organization */
export const switchOrganizationSchema = z.strictObject({ organizationId: z.uuid('Unknown organisation') });
export type SwitchOrganization = z.infer<typeof switchOrganizationSchema>;

export const sessionUserSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  unitSystem: unitSystemSchema,
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const membershipSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  role: z.enum(roles),
});
export type MembershipSummary = z.infer<typeof membershipSummarySchema>;

/** GET /api/v1/session (also the answer to sign-up, sign-in, organisation switch, PATCH /me). */
export const sessionSchema = z.object({
  user: sessionUserSchema.nullable(),
  organizations: z.array(membershipSummarySchema),
  currentOrganizationId: z.uuid().nullable(),
  /** True where the development e-mail outbox is available (never in production). */
  devOutbox: z.boolean(),
});
export type Session = z.infer<typeof sessionSchema>;
