import type { Knex } from 'knex';

/**
 * A random id for each audit event, the only one the API shows: the table's own sequence is shared
 * by every organisation, so its numbers would tell one organisation how much the others do.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('audit_events', (t) => {
    t.uuid('public_id').notNullable().defaultTo(knex.raw('gen_random_uuid()')).unique();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('audit_events', (t) => {
    t.dropColumn('public_id');
  });
}
