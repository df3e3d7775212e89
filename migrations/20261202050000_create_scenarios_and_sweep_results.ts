import type { Knex } from 'knex';

/**
 * Scenarios of a project, and the sweep result cache. A frozen scenario keeps the inputs and the
 * result it was frozen with (frozen_inputs, frozen_result); a trigger refuses any later change to them.
 * sweep_results holds computed sweeps by a hash of everything they depend on.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('scenarios', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.text('name').notNullable();
    t.uuid('climate_site_id').references('id').inTable('climate_sites').onDelete('SET NULL');
    t.uuid('equipment_list_id').references('id').inTable('equipment_lists').onDelete('SET NULL');
    t.jsonb('settings').notNullable();
    t.timestamp('frozen_at', { useTz: true });
    t.uuid('frozen_from_id').references('id').inTable('scenarios').onDelete('SET NULL');
    t.text('frozen_site_name');
    t.text('frozen_list_name');
    t.jsonb('frozen_inputs');
    t.jsonb('frozen_result');
    t.integer('version').notNullable().defaultTo(1);
    t.uuid('created_by').references('id').inTable('users').onDelete('SET NULL');
    t.uuid('updated_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamps(true, true);
    t.index(['project_id']);
  });
  await knex.raw(`
    ALTER TABLE scenarios ADD CONSTRAINT scenarios_frozen_complete
    CHECK ((frozen_at IS NULL) = (frozen_result IS NULL) AND (frozen_at IS NULL) = (frozen_inputs IS NULL))`);
  await knex.raw(`
    CREATE FUNCTION scenarios_keep_frozen() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.frozen_at IS NOT NULL AND (
        NEW.frozen_at IS DISTINCT FROM OLD.frozen_at OR NEW.frozen_inputs IS DISTINCT FROM OLD.frozen_inputs OR
        NEW.frozen_result IS DISTINCT FROM OLD.frozen_result OR NEW.settings IS DISTINCT FROM OLD.settings OR
        NEW.frozen_site_name IS DISTINCT FROM OLD.frozen_site_name OR NEW.frozen_list_name IS DISTINCT FROM OLD.frozen_list_name
      ) THEN
        RAISE EXCEPTION 'a frozen scenario cannot change' USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$`);
  await knex.raw(`
    CREATE TRIGGER scenarios_keep_frozen BEFORE UPDATE ON scenarios
    FOR EACH ROW EXECUTE FUNCTION scenarios_keep_frozen()`);

  await knex.schema.createTable('sweep_results', (t) => {
    t.text('input_hash').primary();
    t.jsonb('result').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('used_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['used_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sweep_results');
  await knex.schema.dropTable('scenarios');
  await knex.raw('DROP FUNCTION IF EXISTS scenarios_keep_frozen()');
}
