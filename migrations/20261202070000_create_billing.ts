import type { Knex } from 'knex';

/**
 * Each organisation's subscription as the payment provider last confirmed it, and every provider
 * event received (by its id, once), with what was done with it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('billing_accounts', (t) => {
    t.uuid('organization_id').primary().references('id').inTable('organizations').onDelete('CASCADE');
    t.text('customer_id').unique();
    t.text('subscription_id');
    t.text('plan').notNullable().defaultTo('starter');
    t.text('interval');
    t.text('status').notNullable().defaultTo('none');
    t.timestamp('current_period_end', { useTz: true });
    t.boolean('cancel_at_period_end').notNullable().defaultTo(false);
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('billing_events', (t) => {
    t.text('id').primary(); // the provider's event id: a replayed event is recorded once
    t.text('type').notNullable();
    t.uuid('organization_id').references('id').inTable('organizations').onDelete('CASCADE');
    t.bigInteger('provider_created').notNullable();
    t.text('outcome').notNullable(); // applied | ignored (…)
    t.jsonb('payload').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organization_id', 'received_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('billing_events');
  await knex.schema.dropTable('billing_accounts');
}
