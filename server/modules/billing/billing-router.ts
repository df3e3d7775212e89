/**
 * Plans and billing through the payment provider's SDK (`/api/v1/billing…`): checkout, the
 * provider's portal, cancellation at period end, and the webhook that alone changes a plan. The
 * webhook verifies the signature on the raw body, records each event id once, and applies the
 * subscription as the provider has it now, so that replayed or out-of-order events end in the
 * right state.
 */
import express, { Router } from 'express';
import type { Knex } from 'knex';
import Stripe from 'stripe';
import {
  billingSchema,
  checkoutInputSchema,
  planOfPrice,
  priceId,
  type Billing,
  type SubscriptionStatus,
} from '@shared/billing/billing-schemas';
import type { Config } from '../../config';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import { audit } from '../audit/audit';
import { usageOf } from './plan-limits';

interface AccountRow {
  organization_id: string;
  customer_id: string | null;
  subscription_id: string | null;
  plan: string;
  interval: string | null;
  status: SubscriptionStatus;
  current_period_end: Date | null;
  cancel_at_period_end: boolean;
}

export function stripeClient(config: Config): Stripe {
  const s = config.stripe;
  return new Stripe(s.secretKey, {
    ...(s.host ? { host: s.host } : {}),
    ...(s.port ? { port: s.port } : {}),
    ...(s.protocol ? { protocol: s.protocol } : {}),
    maxNetworkRetries: 1,
    timeout: 10_000,
  });
}

const providerDown = (err: unknown) =>
  new HttpError(502, 'provider_unavailable', `The payment provider could not be reached; try again in a moment (${err instanceof Error ? err.message : String(err)})`);

const statusOf = (s: string): SubscriptionStatus =>
  s === 'active' || s === 'trialing' || s === 'past_due' || s === 'canceled'
    ? s
    : s === 'unpaid'
      ? 'past_due'
      : s === 'incomplete_expired'
        ? 'canceled'
        : 'none';

export function billingRouter(db: Knex, config: Config): { router: Router; webhook: express.RequestHandler[] } {
  const stripe = stripeClient(config);
  const router = Router();

  async function account(organizationId: string): Promise<AccountRow> {
    await db('billing_accounts').insert({ organization_id: organizationId }).onConflict('organization_id').ignore();
    return db('billing_accounts').where({ organization_id: organizationId }).first<AccountRow>('*');
  }

  async function billingOf(organizationId: string): Promise<Billing> {
    const a = await account(organizationId);
    const events = await db('billing_events')
      .where({ organization_id: organizationId })
      .orderBy('received_at', 'desc')
      .limit(20)
      .select<{ id: string; type: string; outcome: string; received_at: Date }[]>('id', 'type', 'outcome', 'received_at');
    return billingSchema.parse({
      usage: await usageOf(db, organizationId),
      status: a.status,
      interval: a.interval,
      currentPeriodEnd: a.current_period_end ? a.current_period_end.toISOString() : null,
      cancelAtPeriodEnd: a.cancel_at_period_end,
      hasCustomer: a.customer_id !== null,
      events: events.map((e) => ({ id: e.id, type: e.type, outcome: e.outcome, receivedAt: e.received_at.toISOString() })),
    });
  }

  router.get('/billing/usage', authorize(db, 'org:read'), async (req, res) => {
    res.json(await usageOf(db, orgContext(req).organizationId));
  });

  router.get('/billing', authorize(db, 'billing:manage'), async (req, res) => {
    res.json(await billingOf(orgContext(req).organizationId));
  });

  router.post('/billing/checkout', authorize(db, 'billing:manage'), async (req, res) => {
    const { plan, interval } = checkoutInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const a = await account(organizationId);
    if (a.subscription_id && (a.status === 'active' || a.status === 'trialing' || a.status === 'past_due')) {
      throw new HttpError(409, 'already_subscribed', 'This organisation already has a subscription; change or cancel it through Manage billing');
    }
    let customerId = a.customer_id;
    try {
      if (!customerId) {
        const org = await db('organizations').where({ id: organizationId }).first<{ name: string }>('name');
        const customer = await stripe.customers.create({ email: user.email, name: org.name, metadata: { organization_id: organizationId } });
        customerId = customer.id;
        await db('billing_accounts').where({ organization_id: organizationId }).update({ customer_id: customerId, updated_at: db.fn.now() });
      }
      const session = await stripe.checkout.sessions.create({
        mode: 'subscription',
        customer: customerId,
        client_reference_id: organizationId,
        line_items: [{ price: priceId(plan, interval), quantity: 1 }],
        subscription_data: { metadata: { organization_id: organizationId } },
        success_url: `${config.publicUrl}/billing?checkout=success`,
        cancel_url: `${config.publicUrl}/billing?checkout=cancelled`,
      });
      if (!session.url) throw new Error('the checkout session has no address');
      res.status(201).json({ url: session.url });
    } catch (err) {
      if (err instanceof HttpError) throw err;
      throw providerDown(err);
    }
  });

  router.post('/billing/portal', authorize(db, 'billing:manage'), async (req, res) => {
    const a = await account(orgContext(req).organizationId);
    if (!a.customer_id) throw new HttpError(409, 'no_customer', 'There is no billing account yet: choose a plan first');
    try {
      const portal = await stripe.billingPortal.sessions.create({ customer: a.customer_id, return_url: `${config.publicUrl}/billing` });
      res.status(201).json({ url: portal.url });
    } catch (err) {
      throw providerDown(err);
    }
  });

  /** Asks the provider to end the subscription at the end of the paid period; the plan changes when it confirms. */
  router.post('/billing/cancel', authorize(db, 'billing:manage'), async (req, res) => {
    const a = await account(orgContext(req).organizationId);
    if (!a.subscription_id || a.status === 'canceled' || a.status === 'none') throw new HttpError(409, 'no_subscription', 'There is no subscription to cancel');
    try {
      await stripe.subscriptions.update(a.subscription_id, { cancel_at_period_end: true });
    } catch (err) {
      throw providerDown(err);
    }
    res.status(202).json({ requested: true });
  });

  // --- Webhook -----------------------------------------------------------------------------

  async function applySubscription(trx: Knex.Transaction, sub: Stripe.Subscription): Promise<{ organizationId: string | null; outcome: string }> {
    const customerId = typeof sub.customer === 'string' ? sub.customer : sub.customer.id;
    let organizationId = sub.metadata['organization_id'] ?? null;
    if (!organizationId) {
      const row = await trx('billing_accounts').where({ customer_id: customerId }).first<{ organization_id: string } | undefined>('organization_id');
      organizationId = row?.organization_id ?? null;
    }
    if (!organizationId) return { organizationId: null, outcome: 'ignored: no organisation for this customer' };
    const exists: unknown = await trx('organizations').where({ id: organizationId }).first('id');
    if (!exists) return { organizationId: null, outcome: 'ignored: unknown organisation' };
    const item = sub.items.data[0];
    const priced = item ? planOfPrice(item.price.id) : null;
    if (!priced) return { organizationId, outcome: `ignored: unknown price ${item?.price.id ?? ''}` };
    const status = statusOf(sub.status);
    await trx('billing_accounts').insert({ organization_id: organizationId }).onConflict('organization_id').ignore();
    const before = await trx('billing_accounts').where({ organization_id: organizationId }).forUpdate().first<{ plan: string; status: string }>('plan', 'status');
    await trx('billing_accounts')
      .where({ organization_id: organizationId })
      .update({
        customer_id: customerId,
        subscription_id: sub.id,
        plan: status === 'canceled' ? 'starter' : priced.plan,
        interval: priced.interval,
        status,
        current_period_end: item ? new Date(item.current_period_end * 1000) : null,
        cancel_at_period_end: sub.cancel_at_period_end,
        updated_at: trx.fn.now(),
      });
    const plan = status === 'canceled' ? 'starter' : priced.plan;
    if (before.plan !== plan || before.status !== status) {
      await audit(trx, null, { type: 'plan_changed', organizationId, detail: { from: `${before.plan} ${before.status}`, to: `${plan} ${status}` } });
    }
    return { organizationId, outcome: `applied: ${priced.plan} ${status}${sub.cancel_at_period_end ? ', ends at period end' : ''}` };
  }

  /** The subscription as the provider has it now (the event's copy when the provider no longer knows it). */
  async function latest(sub: Stripe.Subscription): Promise<Stripe.Subscription> {
    try {
      return await stripe.subscriptions.retrieve(sub.id);
    } catch (err) {
      if (err instanceof Stripe.errors.StripeInvalidRequestError && err.statusCode === 404) return sub;
      throw err;
    }
  }

  async function subscriptionOfEvent(event: Stripe.Event): Promise<Stripe.Subscription | null> {
    switch (event.type) {
      case 'customer.subscription.created':
      case 'customer.subscription.updated':
      case 'customer.subscription.deleted':
        return latest(event.data.object);
      case 'checkout.session.completed': {
        const s = event.data.object;
        const id = typeof s.subscription === 'string' ? s.subscription : s.subscription?.id;
        return id ? stripe.subscriptions.retrieve(id) : null;
      }
      default:
        return null;
    }
  }

  const webhook: express.RequestHandler[] = [
    express.raw({ type: 'application/json', limit: '1mb' }),
    async (req, res) => {
      const signature = req.headers['stripe-signature'];
      let event: Stripe.Event;
      try {
        if (typeof signature !== 'string' || !Buffer.isBuffer(req.body)) throw new Error('missing signature or body');
        event = stripe.webhooks.constructEvent(req.body, signature, config.stripe.webhookSecret);
      } catch {
        throw new HttpError(400, 'bad_signature', 'The webhook signature does not verify');
      }
      // Fetched before the transaction: a provider call must not hold database locks.
      let sub: Stripe.Subscription | null;
      try {
        sub = await subscriptionOfEvent(event);
      } catch (err) {
        throw providerDown(err);
      }
      const outcome = await db.transaction(async (trx) => {
        const inserted = await trx('billing_events')
          .insert({ id: event.id, type: event.type, provider_created: event.created, outcome: 'received', payload: JSON.stringify(event) })
          .onConflict('id')
          .ignore()
          .returning<{ id: string }[]>('id');
        if (inserted.length === 0) return 'duplicate: already recorded';
        const applied = sub ? await applySubscription(trx, sub) : { organizationId: null, outcome: `ignored: ${event.type} is not used` };
        await trx('billing_events').where({ id: event.id }).update({ outcome: applied.outcome, organization_id: applied.organizationId });
        return applied.outcome;
      });
      res.json({ received: true, outcome });
    },
  ];

  return { router, webhook };
}
