import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { invitedAccountInputSchema } from '@shared/auth/auth-schemas';
import { invitationInputSchema, organizationInputSchema, roleChangeSchema } from '@shared/orgs/org-schemas';
import type { Config } from '../../config';
import { authorize, currentUser, orgContext, requireUser } from '../../http/authorize';
import type { Mailer } from '../../mail/mailer';
import { audit } from '../audit/audit-service';
import { sessionView, startSession } from '../auth/session-view';
import * as orgs from './orgs-service';

const userIdParam = z.object({ userId: z.uuid('Unknown member') });
const invitationIdParam = z.object({ invitationId: z.uuid('Unknown invitation') });

export function orgsRouter(db: Knex, config: Config, mailer: Mailer): Router {
  const router = Router();
  const devOutbox = Boolean(config.devOutboxUrl);

  router.post('/organizations', requireUser, async (req, res) => {
    const { name } = organizationInputSchema.parse(req.body);
    req.session.organizationId = await orgs.createOrganization(db, name, currentUser(req).id);
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.get('/members', authorize(db, 'org:read'), async (req, res) => {
    res.json(await orgs.listMembers(db, orgContext(req).organizationId));
  });

  router.patch('/members/:userId', authorize(db, 'member:manage'), async (req, res) => {
    const { userId } = userIdParam.parse(req.params);
    const { role } = roleChangeSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await orgs.changeRole(db, req, user.id, organizationId, userId, role));
  });

  router.delete('/members/:userId', authorize(db, 'member:manage'), async (req, res) => {
    const { userId } = userIdParam.parse(req.params);
    const { organizationId, user } = orgContext(req);
    await orgs.removeMember(db, req, user.id, organizationId, userId);
    res.status(204).end();
  });

  router.get('/invitations', authorize(db, 'member:manage'), async (req, res) => {
    res.json(await orgs.listInvitations(db, orgContext(req).organizationId));
  });

  router.post('/invitations', authorize(db, 'member:manage'), async (req, res) => {
    const input = invitationInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await orgs.invite(
      { db, config, mailer },
      req,
      { organizationId, id: user.id, name: user.name },
      input,
    );
    res.status(201).location(`/api/v1/invitations/${created.id}`).json(created);
  });

  router.delete('/invitations/:invitationId', authorize(db, 'member:manage'), async (req, res) => {
    const { invitationId } = invitationIdParam.parse(req.params);
    const { organizationId, user } = orgContext(req);
    await orgs.revokeInvitation(db, req, user.id, organizationId, invitationId);
    res.status(204).end();
  });

  // Public: what an invitation link offers, so its page can say who invited whom to what.
  router.get('/invitation-links/:token', async (req, res) => {
    res.json(await orgs.invitationPreview(db, req.params['token']));
  });

  /** A new account for the invited address (the link shows the address is the holder's), joined to the organisation. */
  router.post('/invitation-links/:token/account', async (req, res) => {
    const input = invitedAccountInputSchema.parse(req.body);
    const created = await orgs.acceptWithNewAccount(db, req.params['token'], input);
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
    const organizationId = await orgs.acceptAsUser(db, req.params['token'], user);
    await audit(db, req, {
      type: 'member_joined',
      organizationId,
      userId: user.id,
      actorEmail: user.email,
      detail: { newAccount: false },
    });
    req.session.organizationId = organizationId;
    res.json(await sessionView(db, req, devOutbox));
  });

  return router;
}
