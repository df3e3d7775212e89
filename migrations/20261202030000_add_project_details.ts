import type { Knex } from 'knex';

/** Project details, archiving and a version number for optimistic concurrency. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.text('client_name').notNullable().defaultTo('');
    t.text('site_address').notNullable().defaultTo('');
    t.uuid('climate_site_id').references('id').inTable('climate_sites').onDelete('SET NULL');
    t.text('notes').notNullable().defaultTo('');
    t.timestamp('archived_at', { useTz: true });
    t.uuid('updated_by').references('id').inTable('users').onDelete('SET NULL');
    t.integer('version').notNullable().defaultTo(1);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('client_name');
    t.dropColumn('site_address');
    t.dropColumn('climate_site_id');
    t.dropColumn('notes');
    t.dropColumn('archived_at');
    t.dropColumn('updated_by');
    t.dropColumn('version');
  });
}
