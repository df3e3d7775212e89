import type { Knex } from 'knex';

/**
 * A site with published values may hold an hourly record estimated from another site's record
 * (shift and stretch); `estimate` keeps its provenance: the reference site, Δ, α, T̄, the method
 * version and the values it was matched to.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('climate_sites', (t) => {
    t.jsonb('estimate');
    t.uuid('estimate_reference_id').references('id').inTable('climate_sites').onDelete('SET NULL');
    t.index(['estimate_reference_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('climate_sites', (t) => {
    t.dropColumn('estimate_reference_id');
    t.dropColumn('estimate');
  });
}
