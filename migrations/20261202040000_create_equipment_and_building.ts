import type { Knex } from 'knex';

/** Equipment lists with their options, energy prices per organisation, and a project's building. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('equipment_lists', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.text('name').notNullable();
    t.integer('version').notNullable().defaultTo(1);
    t.uuid('updated_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamps(true, true);
    t.index(['organization_id']);
  });
  await knex.schema.createTable('equipment_options', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('equipment_list_id').notNullable().references('id').inTable('equipment_lists').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.text('kind').notNullable();
    t.text('label').notNullable();
    t.decimal('installed_price', 14, 2).notNullable(); // money: exact decimal, never float
    t.jsonb('option').notNullable(); // the whole validated option (shared/equipment/equipment-schemas)
    t.unique(['equipment_list_id', 'position']);
  });
  await knex.schema.createTable('energy_prices', (t) => {
    t.uuid('organization_id').primary().references('id').inTable('organizations').onDelete('CASCADE');
    t.jsonb('prices').notNullable(); // money as decimal strings
    t.integer('version').notNullable().defaultTo(1);
    t.uuid('updated_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.alterTable('projects', (t) => {
    t.uuid('equipment_list_id').references('id').inTable('equipment_lists').onDelete('SET NULL');
    t.jsonb('building'); // shared/building/building-schemas, SI
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('building');
    t.dropColumn('equipment_list_id');
  });
  await knex.schema.dropTable('energy_prices');
  await knex.schema.dropTable('equipment_options');
  await knex.schema.dropTable('equipment_lists');
}
