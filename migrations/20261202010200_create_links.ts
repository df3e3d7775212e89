import type { Knex } from 'knex';

/** Password-reset and invitation links. Only a SHA-256 hash of each token is stored. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('password_resets', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id']);
  });

  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.text('email').notNullable();
    t.text('role').notNullable();
    t.text('token_hash').notNullable().unique();
    t.uuid('invited_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organization_id']);
  });
  await knex.raw(
    `ALTER TABLE invitations ADD CONSTRAINT invitations_role_check CHECK (role IN ('owner', 'designer', 'viewer'))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invitations');
  await knex.schema.dropTable('password_resets');
}
