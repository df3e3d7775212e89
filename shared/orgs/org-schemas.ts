import { z } from 'zod';
import { emailSchema, organizationNameSchema } from '../auth/auth-schemas';
import { roles } from '../auth/roles';

export const roleSchema = z.enum(roles, { error: 'Choose owner, designer or viewer' });

/** POST /api/v1/organizations */
export const organizationInputSchema = z.strictObject({ name: organizationNameSchema });
export type OrganizationInput = z.infer<typeof organizationInputSchema>;

/** GET /api/v1/members */
export const memberSchema = z.object({
  userId: z.uuid(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  joinedAt: z.string(),
});
export type Member = z.infer<typeof memberSchema>;
export const memberListSchema = z.array(memberSchema);

/** PATCH /api/v1/members/:userId */
export const roleChangeSchema = z.strictObject({ role: roleSchema });
export type RoleChange = z.infer<typeof roleChangeSchema>;

/** POST /api/v1/invitations */
export const invitationInputSchema = z.strictObject({ email: emailSchema, role: roleSchema });
export type InvitationInput = z.infer<typeof invitationInputSchema>;

export const invitationStatuses = ['pending', 'accepted', 'revoked', 'expired'] as const;

/** GET /api/v1/invitations (owners) */
export const invitationSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  role: roleSchema,
  invitedByName: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
  status: z.enum(invitationStatuses),
});
export type Invitation = z.infer<typeof invitationSchema>;
export const invitationListSchema = z.array(invitationSchema);

/** GET /api/v1/invitation-links/:token (public) */
export const invitationPreviewSchema = z.object({
  organizationName: z.string(),
  role: roleSchema,
  email: z.string(),
  invitedByName: z.string(),
  expiresAt: z.string(),
  /** Whether an account with the invited e-mail exists (sign in rather than create one). */
  accountExists: z.boolean(),
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

/** GET /api/v1/dev/outbox (development only) */
export const outboxMessageSchema = z.object({
  id: z.string(),
  from: z.string(),
  /** Where a reply goes, when the message names it (a report's sending designer). */
  replyTo: z.string().default(''),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  receivedAt: z.string(),
  links: z.array(z.string()),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export const outboxMessageListSchema = z.array(outboxMessageSchema);

/** GET /api/v1/audit (owners): the organisation's security log, latest first. */
export const auditEntrySchema = z.object({
  id: z.string(),
  type: z.string(),
  detail: z.unknown(),
  ip: z.string().nullable(),
  at: z.string(),
  who: z.string(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;
export const auditLogSchema = z.array(auditEntrySchema);
