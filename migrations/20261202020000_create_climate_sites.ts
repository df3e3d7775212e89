import type { Knex } from 'knex';

/**
 * Climate sites: published design values typed in by hand, or an hourly record
 * (observations bulk-loaded, design conditions computed and stored with the
 * method version). Uploads wait in climate_uploads until the user confirms them.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('climate_sites', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.text('name').notNullable();
    t.double('latitude');
    t.double('longitude');
    t.double('elevation_m');
    t.double('utc_offset_hours');
    t.text('notes').notNullable().defaultTo('');
    t.text('source_kind').notNullable(); // 'published' | 'hourly'
    t.text('published_source'); // free text: where typed-in values come from
    t.jsonb('published_values');
    t.boolean('is_demo').notNullable().defaultTo(false);
    t.uuid('created_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamps(true, true);
    t.index(['organization_id']);
  });
  await knex.raw(
    `ALTER TABLE climate_sites ADD CONSTRAINT climate_sites_source_kind_check CHECK (source_kind IN ('published', 'hourly'))`,
  );

  // No foreign key here: checking one per row made a 30-year COPY three times slower. The
  // store locks its site row (FOR KEY SHARE) and a trigger removes a deleted site's rows.
  await knex.schema.createTable('hourly_observations', (t) => {
    t.uuid('climate_site_id').notNullable();
    t.timestamp('observed_at', { useTz: true }).notNullable();
    t.specificType('dry_bulb_c', 'real');
    t.specificType('dew_point_c', 'real');
    t.specificType('wind_speed_ms', 'real');
    t.specificType('station_pressure_kpa', 'real');
    t.primary(['climate_site_id', 'observed_at']);
  });

  await knex.raw(`
    CREATE FUNCTION delete_site_observations() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      DELETE FROM hourly_observations WHERE climate_site_id = OLD.id;
      RETURN OLD;
    END $$`);
  await knex.raw(`
    CREATE TRIGGER climate_sites_delete_observations AFTER DELETE ON climate_sites
    FOR EACH ROW EXECUTE FUNCTION delete_site_observations()`);

  await knex.schema.createTable('design_conditions', (t) => {
    t.uuid('climate_site_id').primary().references('id').inTable('climate_sites').onDelete('CASCADE');
    t.text('method_version').notNullable();
    t.jsonb('conditions').notNullable();
    t.jsonb('quality').notNullable();
    t.jsonb('distribution').notNullable();
    t.jsonb('monthly').notNullable();
    t.text('file_name');
    t.integer('row_count').notNullable();
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('climate_uploads', (t) => {
    t.uuid('id').primary().defaultTo(knex.fn.uuid());
    t.uuid('organization_id').notNullable().references('id').inTable('organizations').onDelete('CASCADE');
    t.uuid('climate_site_id').notNullable().references('id').inTable('climate_sites').onDelete('CASCADE');
    t.uuid('uploaded_by').references('id').inTable('users').onDelete('SET NULL');
    t.text('file_name').notNullable();
    t.text('format').notNullable();
    t.integer('row_count').notNullable();
    t.binary('series').notNullable(); // the parsed columns, packed (see climate-series-codec.ts)
    t.jsonb('quality').notNullable();
    t.jsonb('analysis'); // the computed result (StoredComputation) when a year qualified
    t.double('elevation_m'); // the site elevation the analysis used
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.index(['climate_site_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('climate_uploads');
  await knex.schema.dropTable('design_conditions');
  await knex.raw('DROP TRIGGER climate_sites_delete_observations ON climate_sites');
  await knex.raw('DROP FUNCTION delete_site_observations()');
  await knex.schema.dropTable('hourly_observations');
  await knex.schema.dropTable('climate_sites');
}
