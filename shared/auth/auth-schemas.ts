import { z } from 'zod';
import { roles } from './roles';
import type { UnitSystem } from '../units/units';

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
export const linkTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{20,128}$/, 'This link is not valid');

/**
 * The user's unit system (`UnitSystem` in shared/units/units.ts). The two names are written out here,
 * checked against that type, so that the sign-in screens do not load the units table and its mathjs.
 */
export const unitSystemSchema = z.enum(['SI', 'IP'] as const satisfies readonly UnitSystem[]);

/** Where to go after signing in or finishing an account: a path of this site only. */
export const returnUrlSchema = z
  .string()
  .max(500, 'That return address is too long')
  .regex(/^\/(?![/\\])[^\s]*$/, 'Use a path of this site');

/**
 * POST /api/v1/auth/sign-up: the first step of a new account. The answer is the same (202) whether or
 * not the address already has an account, so that nobody can learn who uses Tailroom: a new address
 * gets a link to finish (choosing the password there), a known one a note saying it has an account.
 */
export const signUpInputSchema = z.strictObject({
  email: emailSchema,
  name: personNameSchema,
  /** Name of the new organisation; defaults to "<name>'s firm". */
  organizationName: organizationNameSchema.optional(),
  /** Where the e-mailed link leads after the account is made (a path of this site). */
  returnUrl: returnUrlSchema.optional(),
});
export type SignUpInput = z.infer<typeof signUpInputSchema>;

/** The 202 answer to POST /api/v1/auth/sign-up. */
export const signUpStartedSchema = z.object({ email: z.string(), message: z.string() });
export type SignUpStarted = z.infer<typeof signUpStartedSchema>;

/** GET /api/v1/auth/sign-ups/:token: what the e-mailed link is for (400 `invalid_sign_up_link` when it is used or expired). */
export const pendingSignUpSchema = z.object({
  email: z.string(),
  name: z.string(),
  organizationName: z.string().nullable(),
  expiresAt: z.string(),
});
export type PendingSignUp = z.infer<typeof pendingSignUpSchema>;

/** POST /api/v1/auth/sign-ups/:token: the password, which makes the account (201 with the session). */
export const finishSignUpSchema = z.strictObject({ password: passwordSchema });
export type FinishSignUp = z.infer<typeof finishSignUpSchema>;

/** POST /api/v1/invitation-links/:token/account: a new account for the invited address (201 with the session). */
export const invitedAccountInputSchema = z.strictObject({
  name: personNameSchema,
  password: passwordSchema,
});
export type InvitedAccountInput = z.infer<typeof invitedAccountInputSchema>;

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
