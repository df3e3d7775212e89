import type { Knex } from 'knex';

/**
 * The first step of a new account: the address, name and organisation name, until the e-mailed link
 * is followed and the password chosen. Only a SHA-256 hash of each token is stored.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sign_up_requests', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('organization_name');
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['email']);
    t.index(['expires_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_up_requests');
}
