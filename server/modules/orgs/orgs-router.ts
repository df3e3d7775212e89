import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { invitedAccountInputSchema, linkTokenSchema } from '@shared/auth/auth-schemas';
import {
  invitationInputSchema,
  organizationInputSchema,
  roleChangeSchema,
  type InvitationPreview,
} from '@shared/orgs/org-schemas';
import type { Config } from '../../config';
import { authorize, currentUser, orgContext, requireUser } from '../../http/authorize';
import { audit } from '../audit/audit';
import { assertCanAddMember } from '../billing/plan-limits';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { invitationMail } from '../../mail/messages';
import { hashLinkToken, newLinkToken } from '../auth/link-tokens';
import { hashPassword } from '../auth/passwords';
import { sessionView, startSession } from '../auth/session-view';
import * as users from '../auth/users-repo';
import * as orgs from './orgs-repo';
import * as invitations from './invitations-repo';

const userIdParam = z.object({ userId: z.uuid('Unknown member') });
const invitationIdParam = z.object({ invitationId: z.uuid('Unknown invitation') });

const LAST_OWNER = new HttpError(
  409,
  'last_owner',
  'An organisation needs at least one owner: make someone else owner first',
);

export function orgsRouter(db: Knex, config: Config, mailer: Mailer): Router {
  const router = Router();
  const devOutbox = Boolean(config.devOutboxUrl);

  router.post('/organizations', requireUser, async (req, res) => {
    const { name } = organizationInputSchema.parse(req.body);
    const id = await db.transaction((trx) => orgs.createOrganization(trx, name, currentUser(req).id));
    req.session.organizationId = id;
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.get('/members', authorize(db, 'org:read'), async (req, res) => {
    res.json(await orgs.listMembers(db, orgContext(req).organizationId));
  });

  router.patch('/members/:userId', authorize(db, 'member:manage'), async (req, res) => {
    const { userId } = userIdParam.parse(req.params);
    const { role } = roleChangeSchema.parse(req.body);
    const { organizationId } = orgContext(req);
    const member = await db.transaction(async (trx) => {
      const before = await orgs.findMember(trx, organizationId, userId);
      if (!before) throw new HttpError(404, 'not_found', 'That member was not found');
      if (before.role === 'owner' && role !== 'owner' && (await orgs.lockedOwnerCount(trx, organizationId)) <= 1) {
        throw LAST_OWNER;
      }
      await trx('memberships')
        .where({ organization_id: organizationId, user_id: userId })
        .update({ role, updated_at: trx.fn.now() });
      return { ...before, role };
    });
    await audit(db, req, { type: 'role_changed', organizationId, userId: orgContext(req).user.id, detail: { member: userId, role } });
    res.json(member);
  });

  router.delete('/members/:userId', authorize(db, 'member:manage'), async (req, res) => {
    const { userId } = userIdParam.parse(req.params);
    const { organizationId } = orgContext(req);
    await db.transaction(async (trx) => {
      const before = await orgs.findMember(trx, organizationId, userId);
      if (!before) throw new HttpError(404, 'not_found', 'That member was not found');
      if (before.role === 'owner' && (await orgs.lockedOwnerCount(trx, organizationId)) <= 1) throw LAST_OWNER;
      await trx('memberships').where({ organization_id: organizationId, user_id: userId }).delete();
    });
    await audit(db, req, { type: 'member_removed', organizationId, userId: orgContext(req).user.id, detail: { member: userId } });
    res.status(204).end();
  });

  router.get('/invitations', authorize(db, 'member:manage'), async (req, res) => {
    res.json(await invitations.listForOrganization(db, orgContext(req).organizationId));
  });

  router.post('/invitations', authorize(db, 'member:manage'), async (req, res) => {
    const input = invitationInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await db.transaction(async (trx) => {
      const alreadyMember: unknown = await trx('memberships as m')
        .join('users as u', 'u.id', 'm.user_id')
        .where({ 'm.organization_id': organizationId, 'u.email': input.email })
        .first('m.user_id');
      if (alreadyMember) {
        throw new HttpError(409, 'already_member', 'That person is already a member of this organisation', [
          { path: 'email', message: 'Already a member' },
        ]);
      }
      // A new invitation replaces any earlier pending one for the same address.
      const replaced = await trx('invitations')
        .where({ organization_id: organizationId, email: input.email })
        .whereNull('accepted_at')
        .whereNull('revoked_at')
        .update({ revoked_at: trx.fn.now() });
      if (replaced === 0) await assertCanAddMember(trx, organizationId);
      const { token, hash } = newLinkToken();
      const expiresAt = new Date(Date.now() + config.invitationDays * 86_400_000);
      const [row] = await trx('invitations')
        .insert({
          organization_id: organizationId,
          email: input.email,
          role: input.role,
          token_hash: hash,
          invited_by: user.id,
          expires_at: expiresAt,
        })
        .returning<{ id: string; created_at: Date }[]>(['id', 'created_at']);
      if (!row) throw new Error('insert returned no row');
      const org = await trx('organizations').where({ id: organizationId }).first<{ name: string }>('name');
      // Sent inside the transaction: if the e-mail cannot be sent, nothing is saved and the owner can retry.
      try {
        await mailer.send(
          invitationMail(input.email, `${config.publicUrl}/invitations/${token}`, {
            organizationName: org.name,
            invitedByName: user.name,
            role: input.role,
            days: config.invitationDays,
          }),
        );
      } catch (err) {
        req.log.error({ err }, 'invitation e-mail failed');
        throw new HttpError(502, 'mail_failed', 'The invitation e-mail could not be sent; nothing was saved, please try again');
      }
      return {
        id: row.id,
        email: input.email,
        role: input.role,
        invitedByName: user.name,
        createdAt: row.created_at.toISOString(),
        expiresAt: expiresAt.toISOString(),
        status: 'pending' as const,
      };
    });
    await audit(db, req, { type: 'invitation_created', organizationId, userId: user.id, detail: { email: input.email, role: input.role } });
    res.status(201).location(`/api/v1/invitations/${created.id}`).json(created);
  });

  router.delete('/invitations/:invitationId', authorize(db, 'member:manage'), async (req, res) => {
    const { invitationId } = invitationIdParam.parse(req.params);
    const updated = await db('invitations')
      .where({ id: invitationId, organization_id: orgContext(req).organizationId })
      .update({ revoked_at: db.raw('COALESCE(revoked_at, now())') });
    if (!updated) throw new HttpError(404, 'not_found', 'That invitation was not found');
    await audit(db, req, { type: 'invitation_revoked', organizationId: orgContext(req).organizationId, userId: orgContext(req).user.id, detail: { invitation: invitationId } });
    res.status(204).end();
  });

  // Public: what an invitation link offers, so its page can say who invited whom to what.
  router.get('/invitation-links/:token', async (req, res) => {
    const invitation = await usableInvitation(db, req.params['token']);
    const details = await db('invitations as i')
      .join('organizations as o', 'o.id', 'i.organization_id')
      .leftJoin('users as u', 'u.id', 'i.invited_by')
      .where('i.id', invitation.id)
      .first<{ organization_name: string; invited_by_name: string | null }>(
        'o.name as organization_name',
        'u.name as invited_by_name',
      );
    const accountExists = Boolean(await db('users').where({ email: invitation.email }).first('id'));
    const preview: InvitationPreview = {
      organizationName: details.organization_name,
      role: invitation.role,
      email: invitation.email,
      invitedByName: details.invited_by_name ?? 'A former member',
      expiresAt: invitation.expiresAt.toISOString(),
      accountExists,
    };
    res.json(preview);
  });

  /** A new account for the invited address (the link shows the address is the holder's), joined to the organisation. */
  router.post('/invitation-links/:token/account', async (req, res) => {
    const { name, password } = invitedAccountInputSchema.parse(req.body);
    await usableInvitation(db, req.params['token']);
    const passwordHash = await hashPassword(password);
    const created = await db
      .transaction(async (trx) => {
        const invitation = await usableInvitation(trx, req.params['token'], true);
        if (await users.emailExists(trx, invitation.email)) throw users.emailTaken();
        const user = await users.insert(trx, { email: invitation.email, name, passwordHash });
        await orgs.addMember(trx, invitation.organizationId, user.id, invitation.role);
        await trx('invitations').where({ id: invitation.id }).update({ accepted_at: trx.fn.now() });
        return { user, organizationId: invitation.organizationId, role: invitation.role };
      })
      .catch((err: unknown) => {
        throw users.isUniqueViolation(err) ? users.emailTaken() : err;
      });
    await startSession(req, created.user, created.organizationId);
    await audit(db, req, {
      type: 'member_joined',
      organizationId: created.organizationId,
      userId: created.user.id,
      actorEmail: created.user.email,
      detail: { role: created.role, newAccount: true },
    });
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.post('/invitation-links/:token/accept', requireUser, async (req, res) => {
    const user = currentUser(req);
    const organizationId = await db.transaction(async (trx) => {
      const invitation = await usableInvitation(trx, req.params['token'], true);
      if (invitation.email !== user.email) {
        throw new HttpError(403, 'wrong_account', `This invitation was sent to ${invitation.email}; sign in with that address`);
      }
      await orgs.addMember(trx, invitation.organizationId, user.id, invitation.role);
      await trx('invitations').where({ id: invitation.id }).update({ accepted_at: trx.fn.now() });
      return invitation.organizationId;
    });
    await audit(db, req, { type: 'member_joined', organizationId, userId: user.id, actorEmail: user.email, detail: { newAccount: false } });
    req.session.organizationId = organizationId;
    res.json(await sessionView(db, req, devOutbox));
  });

  return router;
}

async function usableInvitation(db: Knex, token: unknown, lock = false): Promise<invitations.InvitationRecord> {
  const parsed = linkTokenSchema.safeParse(token);
  const found = parsed.success ? await invitations.findByTokenHash(db, hashLinkToken(parsed.data), { lock }) : undefined;
  if (!found || found.status === 'revoked') {
    throw new HttpError(404, 'invitation_not_found', 'This invitation link is not valid');
  }
  if (found.status === 'accepted') throw new HttpError(410, 'invitation_used', 'This invitation has already been accepted');
  if (found.status === 'expired') {
    throw new HttpError(410, 'invitation_expired', 'This invitation has expired; ask for a new one');
  }
  return found;
}
