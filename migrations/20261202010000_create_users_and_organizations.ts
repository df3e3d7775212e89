import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.text('email').notNullable().unique(); // stored trimmed and lower-cased
    t.text('name').notNullable();
    t.text('password_hash').notNullable();
    t.text('unit_system').notNullable().defaultTo('SI');
    t.timestamps(true, true);
  });
  await knex.raw(`ALTER TABLE users ADD CONSTRAINT users_unit_system_check CHECK (unit_system IN ('SI', 'IP'))`);

  await knex.schema.createTable('organizations', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.text('name').notNullable();
    t.timestamps(true, true);
  });

  await knex.schema.createTable('memberships', (t) => {
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.text('role').notNullable();
    t.timestamps(true, true);
    t.primary(['organization_id', 'user_id']);
    t.index(['user_id']);
  });
  await knex.raw(
    `ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('owner', 'designer', 'viewer'))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('memberships');
  await knex.schema.dropTable('organizations');
  await knex.schema.dropTable('users');
}
