import type { Knex } from 'knex';

/**
 * Rate-limit counters (failed sign-ins, password resets, sign-ups, invitations, report e-mails),
 * shared by every server process on this database: one row per limit and key, reset when its
 * window ends.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limit_hits', (t) => {
    t.text('key').primary();
    t.integer('hits').notNullable();
    t.timestamp('reset_at', { useTz: true }).notNullable();
    t.index(['reset_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limit_hits');
}
