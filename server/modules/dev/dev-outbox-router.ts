import { Router } from 'express';
import { outboxMessageListSchema } from '@shared/orgs/org-schemas';
import { HttpError } from '../../http/http-error';

/**
 * Development only: the messages the local SMTP sink has kept. Mounted only when
 * DEV_OUTBOX_URL is configured, which config refuses in production.
 */
export function devOutboxRouter(outboxUrl: string): Router {
  const router = Router();
  router.get('/outbox', async (_req, res) => {
    let body: unknown;
    try {
      const answer = await fetch(`${outboxUrl}/messages`);
      body = await answer.json();
    } catch {
      throw new HttpError(503, 'outbox_unavailable', 'The local e-mail sink is not running');
    }
    res.json(outboxMessageListSchema.parse(body));
  });
  return router;
}
