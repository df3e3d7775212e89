/**
 * Plans and billing (`/api/v1/billing…`): checkout, the provider's portal, cancellation at period
 * end, and the provider's webhook (`billing-service.ts` has the rules).
 */
import express, { Router } from 'express';
import type { Knex } from 'knex';
import { checkoutInputSchema } from '@shared/billing/billing-schemas';
import type { Config } from '../../config';
import { authorize, orgContext } from '../../http/authorize';
import { billingService } from './billing-service';

export function billingRouter(db: Knex, config: Config): { router: Router; webhook: express.RequestHandler[] } {
  const billing = billingService(db, config);
  const router = Router();

  router.get('/billing/usage', authorize(db, 'org:read'), async (req, res) => {
    res.json(await billing.usage(orgContext(req).organizationId));
  });

  router.get('/billing', authorize(db, 'billing:manage'), async (req, res) => {
    res.json(await billing.billingOf(orgContext(req).organizationId));
  });

  router.post('/billing/checkout', authorize(db, 'billing:manage'), async (req, res) => {
    const { plan, interval } = checkoutInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.status(201).json(await billing.checkout(organizationId, user.email, plan, interval));
  });

  router.post('/billing/portal', authorize(db, 'billing:manage'), async (req, res) => {
    res.status(201).json(await billing.portal(orgContext(req).organizationId));
  });

  /** Asks the provider to end the subscription at the end of the paid period; the plan changes when it confirms. */
  router.post('/billing/cancel', authorize(db, 'billing:manage'), async (req, res) => {
    await billing.cancel(orgContext(req).organizationId);
    res.status(202).json({ requested: true });
  });

  const webhook: express.RequestHandler[] = [
    express.raw({ type: 'application/json', limit: '1mb' }),
    async (req, res) => {
      const outcome = await billing.receiveWebhook(req.body, req.headers['stripe-signature']);
      res.json({ received: true, outcome });
    },
  ];

  return { router, webhook };
}
