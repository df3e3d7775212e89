import type { Knex } from 'knex';

/**
 * The design point chosen on a scenario's trade-off screen (°C; null until one is chosen), kept
 * with the scenario and carried into its frozen copies; the phone number a report shows beside the
 * sending designer's name and e-mail; and the report figure once keyed `sag`, now `lowestIndoor`.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('scenarios', (t) => {
    t.double('chosen_design_c');
  });
  await knex.schema.alterTable('reports', (t) => {
    t.text('contact_phone').notNullable().defaultTo('');
  });
  // A report that already shows the lowest indoor temperature just loses the old key.
  await knex.raw(`UPDATE reports SET figures = figures - 'sag' WHERE figures @> '["sag", "lowestIndoor"]'::jsonb`);
  await knex.raw(
    `UPDATE reports SET figures = (
       SELECT jsonb_agg(CASE WHEN f = '"sag"'::jsonb THEN '"lowestIndoor"'::jsonb ELSE f END ORDER BY n)
       FROM jsonb_array_elements(figures) WITH ORDINALITY AS e(f, n)
     ) WHERE figures @> '["sag"]'::jsonb`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    `UPDATE reports SET figures = (
       SELECT jsonb_agg(CASE WHEN f = '"lowestIndoor"'::jsonb THEN '"sag"'::jsonb ELSE f END ORDER BY n)
       FROM jsonb_array_elements(figures) WITH ORDINALITY AS e(f, n)
     ) WHERE figures @> '["lowestIndoor"]'::jsonb`,
  );
  await knex.schema.alterTable('reports', (t) => {
    t.dropColumn('contact_phone');
  });
  await knex.schema.alterTable('scenarios', (t) => {
    t.dropColumn('chosen_design_c');
  });
}
