import type { Knex } from 'knex';

/**
 * Client reports of a scenario, their share links (token stored only as a SHA-256 hash; expiry and
 * revocation), the e-mails sent with them, and each organisation's logo (checked and sanitised).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('reports', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.uuid('scenario_id').notNullable().references('id').inTable('scenarios').onDelete('CASCADE');
    t.text('title').notNullable();
    t.text('note').notNullable().defaultTo('');
    t.jsonb('points').notNullable();
    t.jsonb('figures').notNullable();
    t.text('unit_system').notNullable();
    t.uuid('created_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['project_id']);
  });
  await knex.schema.createTable('report_links', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('report_id').notNullable().references('id').inTable('reports').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('revoked_at', { useTz: true });
    t.uuid('created_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['report_id']);
  });
  await knex.schema.createTable('report_sends', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('report_id').notNullable().references('id').inTable('reports').onDelete('CASCADE');
    t.uuid('link_id').references('id').inTable('report_links').onDelete('SET NULL');
    t.text('recipient').notNullable();
    t.text('message').notNullable().defaultTo('');
    t.text('status').notNullable(); // 'sent' | 'failed'
    t.text('error');
    t.uuid('sent_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('sent_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['report_id']);
  });
  await knex.schema.createTable('organization_logos', (t) => {
    t.uuid('organization_id').primary().references('id').inTable('organizations').onDelete('CASCADE');
    t.text('content_type').notNullable(); // image/png | image/jpeg | image/svg+xml
    t.binary('content').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('organization_logos');
  await knex.schema.dropTable('report_sends');
  await knex.schema.dropTable('report_links');
  await knex.schema.dropTable('reports');
}
