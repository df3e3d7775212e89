/**
 * Tailroom's plans (names and prices are the product's own) and the billing API's shapes. Limits are
 * enforced on the server; the client shows them before they are reached.
 */
import { z } from 'zod';

export const planIds = ['starter', 'crew', 'firm'] as const;
export type PlanId = (typeof planIds)[number];
export const billingIntervals = ['month', 'year'] as const;
export type BillingInterval = (typeof billingIntervals)[number];

export interface Plan {
  id: PlanId;
  name: string;
  /** Active (not archived) projects; null: no limit. */
  maxProjects: number | null;
  /** Members and open invitations. */
  maxMembers: number;
  /** Prices in USD as decimal strings (null for the free plan). */
  prices: Record<BillingInterval, string> | null;
}

export const PLANS: Readonly<Record<PlanId, Plan>> = {
  starter: { id: 'starter', name: 'Starter', maxProjects: 3, maxMembers: 3, prices: null },
  crew: { id: 'crew', name: 'Crew', maxProjects: 25, maxMembers: 10, prices: { month: '39.00', year: '390.00' } },
  firm: { id: 'firm', name: 'Firm', maxProjects: null, maxMembers: 50, prices: { month: '119.00', year: '1190.00' } },
};

/** The provider's price id of a paid plan and interval (the same ids are configured in the provider). */
export const priceId = (plan: Exclude<PlanId, 'starter'>, interval: BillingInterval): string =>
  `price_tailroom_${plan}_${interval}`;

/** The plan and interval of a provider price id, or null. */
export function planOfPrice(id: string): { plan: Exclude<PlanId, 'starter'>; interval: BillingInterval } | null {
  const m = /^price_tailroom_(crew|firm)_(month|year)$/.exec(id);
  return m ? { plan: m[1] as 'crew' | 'firm', interval: m[2] as BillingInterval } : null;
}

export const subscriptionStatuses = ['none', 'trialing', 'active', 'past_due', 'canceled'] as const;
export type SubscriptionStatus = (typeof subscriptionStatuses)[number];

/** POST /api/v1/billing/checkout */
export const checkoutInputSchema = z.strictObject({
  plan: z.enum(['crew', 'firm'], { error: 'Choose the Crew or the Firm plan' }),
  interval: z.enum(billingIntervals, { error: 'Choose monthly or yearly billing' }),
});

/** POST /api/v1/billing/checkout and /billing/portal: the provider's page to go to. */
export const providerPageSchema = z.object({ url: z.string() });
export type ProviderPage = z.infer<typeof providerPageSchema>;

/** POST /api/v1/billing/webhook: the answer to the payment provider, with what the event did. */
export const webhookAnswerSchema = z.object({ received: z.literal(true), outcome: z.string() });
export type WebhookAnswer = z.infer<typeof webhookAnswerSchema>;

export const usageSchema = z.object({
  plan: z.enum(planIds),
  planName: z.string(),
  projects: z.object({ used: z.int(), limit: z.int().nullable() }),
  members: z.object({ used: z.int(), limit: z.int() }),
});
export type Usage = z.infer<typeof usageSchema>;

export const billingEventSchema = z.object({
  id: z.string(),
  type: z.string(),
  outcome: z.string(),
  receivedAt: z.string(),
});

/** GET /api/v1/billing (owners) */
export const billingSchema = z.object({
  usage: usageSchema,
  status: z.enum(subscriptionStatuses),
  interval: z.enum(billingIntervals).nullable(),
  /** End of the paid period (renewal, or the end after a cancellation at period end). */
  currentPeriodEnd: z.string().nullable(),
  cancelAtPeriodEnd: z.boolean(),
  hasCustomer: z.boolean(),
  events: z.array(billingEventSchema),
});
export type Billing = z.infer<typeof billingSchema>;
