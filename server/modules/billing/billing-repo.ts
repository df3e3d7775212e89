/** The tables of billing: each organisation's account with the payment provider, and the provider's events (each recorded once). */
import type { Knex } from 'knex';
import type { SubscriptionStatus } from '@shared/billing/billing-schemas';

export const TABLES = ['billing_accounts', 'billing_events'] as const;

export interface AccountRow {
  organization_id: string;
  customer_id: string | null;
  subscription_id: string | null;
  plan: string;
  interval: string | null;
  status: SubscriptionStatus;
  current_period_end: Date | null;
  cancel_at_period_end: boolean;
}

/** The organisation's billing account, made (on the free plan) if it has none yet. */
export async function ensureAccount(db: Knex, organizationId: string): Promise<AccountRow> {
  await db('billing_accounts').insert({ organization_id: organizationId }).onConflict('organization_id').ignore();
  return db('billing_accounts').where({ organization_id: organizationId }).first<AccountRow>('*');
}

/** The plan and status of the organisation's account, when it has one. */
export function findPlan(db: Knex, organizationId: string): Promise<{ plan: string; status: string } | undefined> {
  return db('billing_accounts')
    .where({ organization_id: organizationId })
    .first<{ plan: string; status: string } | undefined>('plan', 'status');
}

export async function setCustomer(db: Knex, organizationId: string, customerId: string): Promise<void> {
  await db('billing_accounts')
    .where({ organization_id: organizationId })
    .update({ customer_id: customerId, updated_at: db.fn.now() });
}

export async function organizationOfCustomer(db: Knex, customerId: string): Promise<string | null> {
  const row = await db('billing_accounts')
    .where({ customer_id: customerId })
    .first<{ organization_id: string } | undefined>('organization_id');
  return row?.organization_id ?? null;
}

/** The account's plan and status before a change, locked for the caller's transaction (made first if missing). */
export async function lockAccount(
  trx: Knex.Transaction,
  organizationId: string,
): Promise<{ plan: string; status: string }> {
  await trx('billing_accounts').insert({ organization_id: organizationId }).onConflict('organization_id').ignore();
  return trx('billing_accounts')
    .where({ organization_id: organizationId })
    .forUpdate()
    .first<{ plan: string; status: string }>('plan', 'status');
}

export async function updateSubscription(
  db: Knex,
  organizationId: string,
  values: {
    customerId: string;
    subscriptionId: string;
    plan: string;
    interval: string;
    status: SubscriptionStatus;
    currentPeriodEnd: Date | null;
    cancelAtPeriodEnd: boolean;
  },
): Promise<void> {
  await db('billing_accounts').where({ organization_id: organizationId }).update({
    customer_id: values.customerId,
    subscription_id: values.subscriptionId,
    plan: values.plan,
    interval: values.interval,
    status: values.status,
    current_period_end: values.currentPeriodEnd,
    cancel_at_period_end: values.cancelAtPeriodEnd,
    updated_at: db.fn.now(),
  });
}

/** The organisation's latest 20 provider events. */
export function recentEvents(
  db: Knex,
  organizationId: string,
): Promise<{ id: string; type: string; outcome: string; received_at: Date }[]> {
  return db('billing_events')
    .where({ organization_id: organizationId })
    .orderBy('received_at', 'desc')
    .limit(20)
    .select<{ id: string; type: string; outcome: string; received_at: Date }[]>('id', 'type', 'outcome', 'received_at');
}

/** Records an event the first time it arrives; false for one already recorded. */
export async function recordEvent(
  db: Knex,
  event: { id: string; type: string; created: number; payload: unknown },
): Promise<boolean> {
  const inserted = await db('billing_events')
    .insert({
      id: event.id,
      type: event.type,
      provider_created: event.created,
      outcome: 'received',
      payload: JSON.stringify(event.payload),
    })
    .onConflict('id')
    .ignore()
    .returning<{ id: string }[]>('id');
  return inserted.length > 0;
}

export async function setEventOutcome(
  db: Knex,
  id: string,
  outcome: string,
  organizationId: string | null,
): Promise<void> {
  await db('billing_events').where({ id }).update({ outcome, organization_id: organizationId });
}
