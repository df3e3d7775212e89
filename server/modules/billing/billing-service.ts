/**
 * Plans and billing through the payment provider's SDK: checkout, the provider's portal,
 * cancellation at period end, and the webhook that alone changes a plan. The webhook verifies the
 * signature on the raw body, records each event id once, and applies the subscription as the
 * provider has it now, so that replayed or out-of-order events end in the right state.
 */
import type { Knex } from 'knex';
import Stripe from 'stripe';
import {
  billingSchema,
  planOfPrice,
  priceId,
  type Billing,
  type SubscriptionStatus,
} from '@shared/billing/billing-schemas';
import type { Config } from '../../config';
import { HttpError } from '../../http/http-error';
import { audit } from '../audit/audit-service';
import { existingOrganizations, organizationName } from '../orgs/orgs-repo';
import * as repo from './billing-repo';
import { usageOf } from './plan-limits';

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
  new HttpError(
    502,
    'provider_unavailable',
    `The payment provider could not be reached; try again in a moment (${err instanceof Error ? err.message : String(err)})`,
  );

const statusOf = (s: string): SubscriptionStatus =>
  s === 'active' || s === 'trialing' || s === 'past_due' || s === 'canceled'
    ? s
    : s === 'unpaid'
      ? 'past_due'
      : s === 'incomplete_expired'
        ? 'canceled'
        : 'none';

export type BillingService = ReturnType<typeof billingService>;

export function billingService(db: Knex, config: Config) {
  const stripe = stripeClient(config);

  async function billingOf(organizationId: string): Promise<Billing> {
    const a = await repo.ensureAccount(db, organizationId);
    const events = await repo.recentEvents(db, organizationId);
    return billingSchema.parse({
      usage: await usageOf(db, organizationId),
      status: a.status,
      interval: a.interval,
      currentPeriodEnd: a.current_period_end ? a.current_period_end.toISOString() : null,
      cancelAtPeriodEnd: a.cancel_at_period_end,
      hasCustomer: a.customer_id !== null,
      events: events.map((e) => ({
        id: e.id,
        type: e.type,
        outcome: e.outcome,
        receivedAt: e.received_at.toISOString(),
      })),
    });
  }

  /** The provider's checkout page for a plan (409 when the organisation already pays for one). */
  async function checkout(
    organizationId: string,
    email: string,
    plan: Parameters<typeof priceId>[0],
    interval: Parameters<typeof priceId>[1],
  ): Promise<{ url: string }> {
    const a = await repo.ensureAccount(db, organizationId);
    if (a.subscription_id && (a.status === 'active' || a.status === 'trialing' || a.status === 'past_due')) {
      throw new HttpError(
        409,
        'already_subscribed',
        'This organisation already has a subscription; change or cancel it through Manage billing',
      );
    }
    let customerId = a.customer_id;
    try {
      if (!customerId) {
        const name = await organizationName(db, organizationId);
        const customer = await stripe.customers.create({ email, name, metadata: { organization_id: organizationId } });
        customerId = customer.id;
        await repo.setCustomer(db, organizationId, customerId);
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
      return { url: session.url };
    } catch (err) {
      if (err instanceof HttpError) throw err;
      throw providerDown(err);
    }
  }

  async function portal(organizationId: string): Promise<{ url: string }> {
    const a = await repo.ensureAccount(db, organizationId);
    if (!a.customer_id) throw new HttpError(409, 'no_customer', 'There is no billing account yet: choose a plan first');
    try {
      const session = await stripe.billingPortal.sessions.create({
        customer: a.customer_id,
        return_url: `${config.publicUrl}/billing`,
      });
      return { url: session.url };
    } catch (err) {
      throw providerDown(err);
    }
  }

  /** Asks the provider to end the subscription at the end of the paid period; the plan changes when it confirms. */
  async function cancel(organizationId: string): Promise<void> {
    const a = await repo.ensureAccount(db, organizationId);
    if (!a.subscription_id || a.status === 'canceled' || a.status === 'none')
      throw new HttpError(409, 'no_subscription', 'There is no subscription to cancel');
    try {
      await stripe.subscriptions.update(a.subscription_id, { cancel_at_period_end: true });
    } catch (err) {
      throw providerDown(err);
    }
  }

  // --- Webhook -----------------------------------------------------------------------------

  async function applySubscription(
    trx: Knex.Transaction,
    sub: Stripe.Subscription,
  ): Promise<{ organizationId: string | null; outcome: string }> {
    const customerId = typeof sub.customer === 'string' ? sub.customer : sub.customer.id;
    let organizationId = sub.metadata['organization_id'] ?? null;
    organizationId ??= await repo.organizationOfCustomer(trx, customerId);
    if (!organizationId) return { organizationId: null, outcome: 'ignored: no organisation for this customer' };
    if (!(await existingOrganizations(trx, [organizationId])).has(organizationId))
      return { organizationId: null, outcome: 'ignored: unknown organisation' };
    const item = sub.items.data[0];
    const priced = item ? planOfPrice(item.price.id) : null;
    if (!priced) return { organizationId, outcome: `ignored: unknown price ${item?.price.id ?? ''}` };
    const status = statusOf(sub.status);
    const before = await repo.lockAccount(trx, organizationId);
    const plan = status === 'canceled' ? 'starter' : priced.plan;
    await repo.updateSubscription(trx, organizationId, {
      customerId,
      subscriptionId: sub.id,
      plan,
      interval: priced.interval,
      status,
      currentPeriodEnd: item ? new Date(item.current_period_end * 1000) : null,
      cancelAtPeriodEnd: sub.cancel_at_period_end,
    });
    if (before.plan !== plan || before.status !== status) {
      await audit(trx, null, {
        type: 'plan_changed',
        organizationId,
        detail: { from: `${before.plan} ${before.status}`, to: `${plan} ${status}` },
      });
    }
    return {
      organizationId,
      outcome: `applied: ${priced.plan} ${status}${sub.cancel_at_period_end ? ', ends at period end' : ''}`,
    };
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

  /** Verifies and applies one webhook delivery; what was done with it. */
  async function receiveWebhook(body: unknown, signature: unknown): Promise<string> {
    let event: Stripe.Event;
    try {
      if (typeof signature !== 'string' || !Buffer.isBuffer(body)) throw new Error('missing signature or body');
      event = stripe.webhooks.constructEvent(body, signature, config.stripe.webhookSecret);
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
    return db.transaction(async (trx) => {
      if (!(await repo.recordEvent(trx, { id: event.id, type: event.type, created: event.created, payload: event })))
        return 'duplicate: already recorded';
      const applied = sub
        ? await applySubscription(trx, sub)
        : { organizationId: null, outcome: `ignored: ${event.type} is not used` };
      await repo.setEventOutcome(trx, event.id, applied.outcome, applied.organizationId);
      return applied.outcome;
    });
  }

  return {
    usage: (organizationId: string) => usageOf(db, organizationId),
    billingOf,
    checkout,
    portal,
    cancel,
    receiveWebhook,
  };
}
