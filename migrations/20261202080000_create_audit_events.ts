import type { Knex } from 'knex';

/** Security-relevant events (sign-ins, role changes, invitations, plan changes, report links) for owners to review. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id');
    t.uuid('organization_id').references('id').inTable('organizations').onDelete('CASCADE');
    t.uuid('user_id').references('id').inTable('users').onDelete('SET NULL');
    t.text('actor_email');
    t.text('type').notNullable();
    t.jsonb('detail').notNullable().defaultTo('{}');
    t.text('ip');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organization_id', 'created_at']);
    t.index(['user_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_events');
}
