/** Organisations, their members (at least one owner always) and invitations (a link by e-mail, one pending per address). */
import type { Request } from 'express';
import type { Knex } from 'knex';
import { linkTokenSchema } from '@shared/auth/auth-schemas';
import type { Role } from '@shared/auth/roles';
import type { Invitation, InvitationPreview, Member } from '@shared/orgs/org-schemas';
import type { Config } from '../../config';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { invitationMail } from '../../mail/messages';
import { audit } from '../audit/audit-service';
import { hashLinkToken, newLinkToken } from '../auth/link-tokens';
import { hashPassword } from '../auth/passwords';
import * as users from '../auth/users-repo';
import { assertCanAddMember } from '../billing/plan-limits';
import * as invitations from './invitations-repo';
import * as orgs from './orgs-repo';
import { recipientAddresses } from '../reports/reports-repo';

const LAST_OWNER = new HttpError(
  409,
  'last_owner',
  'An organisation needs at least one owner: make someone else owner first',
);
const memberNotFound = () => new HttpError(404, 'not_found', 'That member was not found');

export function createOrganization(db: Knex, name: string, ownerId: string): Promise<string> {
  return db.transaction((trx) => orgs.createOrganization(trx, name, ownerId));
}

export function listMembers(db: Knex, organizationId: string): Promise<Member[]> {
  return orgs.listMembers(db, organizationId);
}

export async function changeRole(
  db: Knex,
  req: Request,
  actorId: string,
  organizationId: string,
  userId: string,
  role: Role,
): Promise<Member> {
  const member = await db.transaction(async (trx) => {
    const before = await orgs.findMember(trx, organizationId, userId);
    if (!before) throw memberNotFound();
    if (before.role === 'owner' && role !== 'owner' && (await orgs.lockedOwnerCount(trx, organizationId)) <= 1)
      throw LAST_OWNER;
    await orgs.setRole(trx, organizationId, userId, role);
    return { ...before, role };
  });
  await audit(db, req, { type: 'role_changed', organizationId, userId: actorId, detail: { member: userId, role } });
  return member;
}

export async function removeMember(
  db: Knex,
  req: Request,
  actorId: string,
  organizationId: string,
  userId: string,
): Promise<void> {
  await db.transaction(async (trx) => {
    const before = await orgs.findMember(trx, organizationId, userId);
    if (!before) throw memberNotFound();
    if (before.role === 'owner' && (await orgs.lockedOwnerCount(trx, organizationId)) <= 1) throw LAST_OWNER;
    await orgs.removeMember(trx, organizationId, userId);
  });
  await audit(db, req, { type: 'member_removed', organizationId, userId: actorId, detail: { member: userId } });
}

export function listInvitations(db: Knex, organizationId: string): Promise<Invitation[]> {
  return invitations.listForOrganization(db, organizationId);
}

/** Invites an address by e-mail; the e-mail is sent inside the transaction, so a failed one saves nothing (502). */
export async function invite(
  deps: { db: Knex; config: Config; mailer: Mailer },
  req: Request,
  inviter: { organizationId: string; id: string; name: string },
  input: { email: string; role: Role },
): Promise<Invitation> {
  const { db, config, mailer } = deps;
  const { organizationId } = inviter;
  const created = await db.transaction(async (trx) => {
    if (await orgs.isMemberByEmail(trx, organizationId, input.email)) {
      throw new HttpError(409, 'already_member', 'That person is already a member of this organisation', [
        { path: 'email', message: 'Already a member' },
      ]);
    }
    // A new invitation replaces any earlier pending one for the same address.
    const replaced = await invitations.revokePendingFor(trx, organizationId, input.email);
    if (replaced === 0) await assertCanAddMember(trx, organizationId);
    const { token, hash } = newLinkToken();
    const expiresAt = new Date(Date.now() + config.invitationDays * 86_400_000);
    const row = await invitations.insertInvitation(trx, {
      organizationId,
      email: input.email,
      role: input.role,
      tokenHash: hash,
      invitedBy: inviter.id,
      expiresAt,
    });
    const organizationName = await orgs.organizationName(trx, organizationId);
    // Sent inside the transaction: if the e-mail cannot be sent, nothing is saved and the owner can retry.
    try {
      await mailer.send(
        invitationMail(input.email, `${config.publicUrl}/invitations/${token}`, {
          organizationName,
          invitedByName: inviter.name,
          role: input.role,
          days: config.invitationDays,
        }),
      );
    } catch (err) {
      req.log.error({ err }, 'invitation e-mail failed');
      throw new HttpError(
        502,
        'mail_failed',
        'The invitation e-mail could not be sent; nothing was saved, please try again',
      );
    }
    return {
      id: row.id,
      email: input.email,
      role: input.role,
      invitedByName: inviter.name,
      createdAt: row.created_at.toISOString(),
      expiresAt: expiresAt.toISOString(),
      status: 'pending' as const,
    };
  });
  await audit(db, req, {
    type: 'invitation_created',
    organizationId,
    userId: inviter.id,
    detail: { email: input.email, role: input.role },
  });
  return created;
}

export async function revokeInvitation(
  db: Knex,
  req: Request,
  actorId: string,
  organizationId: string,
  invitationId: string,
): Promise<void> {
  if (!(await invitations.revokeInvitation(db, organizationId, invitationId)))
    throw new HttpError(404, 'not_found', 'That invitation was not found');
  await audit(db, req, {
    type: 'invitation_revoked',
    organizationId,
    userId: actorId,
    detail: { invitation: invitationId },
  });
}

/** The invitation of a link that can still be used: 404 for an unknown or withdrawn one, 410 for one used or expired. */
async function usableInvitation(db: Knex, token: unknown, lock = false): Promise<invitations.InvitationRecord> {
  const parsed = linkTokenSchema.safeParse(token);
  const found = parsed.success
    ? await invitations.findByTokenHash(db, hashLinkToken(parsed.data), { lock })
    : undefined;
  if (!found || found.status === 'revoked') {
    throw new HttpError(404, 'invitation_not_found', 'This invitation link is not valid');
  }
  if (found.status === 'accepted')
    throw new HttpError(410, 'invitation_used', 'This invitation has already been accepted');
  if (found.status === 'expired') {
    throw new HttpError(410, 'invitation_expired', 'This invitation has expired; ask for a new one');
  }
  return found;
}

/** What an invitation link offers, so its page can say who invited whom to what. */
export async function invitationPreview(db: Knex, token: unknown): Promise<InvitationPreview> {
  const invitation = await usableInvitation(db, token);
  const details = await invitations.invitationDetails(db, invitation.id);
  if (!details) throw new HttpError(404, 'invitation_not_found', 'This invitation link is not valid');
  return {
    organizationName: details.organization_name,
    role: invitation.role,
    email: invitation.email,
    invitedByName: details.invited_by_name ?? 'A former member',
    expiresAt: invitation.expiresAt.toISOString(),
    accountExists: await users.emailExists(db, invitation.email),
  };
}

/** A new account for the invited address (the link shows the address is the holder's), joined to the organisation. */
export async function acceptWithNewAccount(
  db: Knex,
  token: unknown,
  input: { name: string; password: string },
): Promise<{ user: users.UserRecord; organizationId: string; role: Role }> {
  await usableInvitation(db, token);
  const passwordHash = await hashPassword(input.password);
  return db
    .transaction(async (trx) => {
      const invitation = await usableInvitation(trx, token, true);
      if (await users.emailExists(trx, invitation.email)) throw users.emailTaken();
      const user = await users.insert(trx, { email: invitation.email, name: input.name, passwordHash });
      await orgs.addMember(trx, invitation.organizationId, user.id, invitation.role);
      await invitations.markAccepted(trx, invitation.id);
      return { user, organizationId: invitation.organizationId, role: invitation.role };
    })
    .catch((err: unknown) => {
      throw users.isUniqueViolation(err) ? users.emailTaken() : err;
    });
}

/** Joins a signed-in user to the organisation of an invitation sent to the user's address (403 for another address). */
export async function acceptAsUser(db: Knex, token: unknown, user: users.UserRecord): Promise<string> {
  return db.transaction(async (trx) => {
    const invitation = await usableInvitation(trx, token, true);
    if (invitation.email !== user.email) {
      throw new HttpError(
        403,
        'wrong_account',
        `This invitation was sent to ${invitation.email}; sign in with that address`,
      );
    }
    await orgs.addMember(trx, invitation.organizationId, user.id, invitation.role);
    await invitations.markAccepted(trx, invitation.id);
    return invitation.organizationId;
  });
}

/** The addresses an organisation's mail goes to: its members, its invitations and its report recipients (none if the user no longer belongs to it). */
export async function organizationAddresses(db: Knex, organizationId: string, userId: string): Promise<Set<string>> {
  if (!(await orgs.roleOf(db, organizationId, userId))) return new Set();
  const [members, invited, recipients] = await Promise.all([
    orgs.memberAddresses(db, organizationId),
    invitations.invitedAddresses(db, organizationId),
    recipientAddresses(db, organizationId),
  ]);
  return new Set([...members, ...invited, ...recipients]);
}

/** The user's role in the organisation, when the user is a member. */
export const roleOf = orgs.roleOf;
