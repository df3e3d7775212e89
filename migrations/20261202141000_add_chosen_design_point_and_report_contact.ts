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
  await knex.raw(
    `UPDATE reports SET figures = (
       SELECT jsonb_agg(CASE WHEN f = '"sag"'::jsonb THEN '"lowestIndoor"'::jsonb ELSE f END)
       FROM jsonb_array_elements(figures) AS f
     ) WHERE figures @> '["sag"]'::jsonb`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    `UPDATE reports SET figures = (
       SELECT jsonb_agg(CASE WHEN f = '"lowestIndoor"'::jsonb THEN '"sag"'::jsonb ELSE f END)
       FROM jsonb_array_elements(figures) AS f
     ) WHERE figures @> '["lowestIndoor"]'::jsonb`,
  );
  await knex.schema.alterTable('reports', (t) => {
    t.dropColumn('contact_phone');
  });
  await knex.schema.alterTable('scenarios', (t) => {
    t.dropColumn('chosen_design_c');
  });
}
