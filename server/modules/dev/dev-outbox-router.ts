import { timingSafeEqual } from 'node:crypto';
import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { DEV_OUTBOX_TOKEN_HEADER } from '@shared/api/dev-outbox';
import { HttpError } from '../../http/http-error';
import { currentUser } from '../../http/authorize';
import * as outbox from './dev-outbox-service';

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
      throw new HttpError(
        401,
        'unauthenticated',
        'Sign in, or open the outbox with the development token printed when the server started',
      );
    }
    const messages = await outbox.allMessages(outboxUrl);
    if (everything || !userId || !organizationId) {
      res.json(messages);
      return;
    }
    res.json(await outbox.organizationMessages(db, messages, organizationId, userId));
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
