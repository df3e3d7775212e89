import { timingSafeEqual } from 'node:crypto';
import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { outboxMessageListSchema, type OutboxMessage } from '@shared/orgs/org-schemas';
import { DEV_OUTBOX_TOKEN_HEADER } from '@shared/api/dev-outbox';
import { HttpError } from '../../http/http-error';
import { currentUser } from '../../http/authorize';

/**
 * Development only: the messages the local SMTP sink has kept. Mounted only when DEV_OUTBOX_URL is
 * configured, which config refuses in production. Not open to anyone who can reach the port: the
 * development token printed at start (header or `?token=`) shows every message; a signed-in user
 * sees the messages to their organisation's members, its invitations and its report recipients.
 */
export function devOutboxRouter(db: Knex, outboxUrl: string, token: string): Router {
  const router = Router();
  router.get('/outbox', async (req, res) => {
    const everything = hasToken(req, token);
    const userId = req.user ? currentUser(req).id : undefined;
    const organizationId = req.session.organizationId;
    if (!everything && (!userId || !organizationId)) {
      throw new HttpError(401, 'unauthenticated', 'Sign in, or open the outbox with the development token printed when the server started');
    }
    let body: unknown;
    try {
      const answer = await fetch(`${outboxUrl}/messages`);
      body = await answer.json();
    } catch {
      throw new HttpError(503, 'outbox_unavailable', 'The local e-mail sink is not running');
    }
    const messages = outboxMessageListSchema.parse(body);
    if (everything || !userId || !organizationId) {
      res.json(messages);
      return;
    }
    const addresses = await organizationAddresses(db, organizationId, userId);
    res.json(messages.filter((m: OutboxMessage) => m.to.some((to) => addresses.has(to.trim().toLowerCase()))));
  });
  return router;
}

function hasToken(req: Request, token: string): boolean {
  const header = req.headers[DEV_OUTBOX_TOKEN_HEADER.toLowerCase()];
  const given = typeof header === 'string' ? header : typeof req.query['token'] === 'string' ? req.query['token'] : '';
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** The addresses an organisation's mail goes to: its members, its invitations and its report recipients (only if the user still belongs to it). */
async function organizationAddresses(db: Knex, organizationId: string, userId: string): Promise<Set<string>> {
  const member: unknown = await db('memberships').where({ organization_id: organizationId, user_id: userId }).first('user_id');
  if (!member) return new Set();
  const rows = await db
    .select<{ address: string }[]>(db.raw('lower(u.email) as address'))
    .from('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.organization_id', organizationId)
    .union((q) => void q.select(db.raw('lower(email)')).from('invitations').where({ organization_id: organizationId }))
    .union((q) => void q.select(db.raw('lower(rs.recipient)')).from('report_sends as rs').join('reports as r', 'r.id', 'rs.report_id').where('r.organization_id', organizationId));
  return new Set(rows.map((r) => r.address));
}
