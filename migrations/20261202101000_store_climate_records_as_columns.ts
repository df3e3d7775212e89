import type { Knex } from 'knex';

/**
 * Hourly records as columns: one row per site in climate_records holding the hours and each
 * variable as a packed array (bytea, little-endian), instead of one row per hour in
 * hourly_observations. A 30-year record is read back in one row rather than 263,000.
 *
 * - hours: int32 hours since 1970-01-01T00:00Z, strictly increasing;
 * - dry_bulb_c, dew_point_c, wind_speed_ms, station_pressure_kpa: float32, NaN where missing
 *   (the precision of the former `real` columns);
 * - sweep_index / sweep_index_key: the record grouped for the sweep (shared/sweep/sweep-index.ts),
 *   built at upload; empty for records moved here, which are indexed on their first sweep. An upload
 *   waiting in climate_uploads keeps its index in the same two columns.
 *
 * The arrays are stored uncompressed (STORAGE EXTERNAL): floats barely compress and reading them
 * back must not pay for decompression. Nothing else reads hourly_observations, so it is dropped;
 * `down` puts it back and moves every record into it again.
 */
const VALUE_COLUMNS = ['dry_bulb_c', 'dew_point_c', 'wind_speed_ms', 'station_pressure_kpa'] as const;
const MS_PER_HOUR = 3_600_000;

interface ObservationRow {
  hour: number;
  dry_bulb_c: number | null;
  dew_point_c: number | null;
  wind_speed_ms: number | null;
  station_pressure_kpa: number | null;
}

function packRows(rows: ObservationRow[]): Record<string, Buffer | number> {
  const n = rows.length;
  const hours = new Int32Array(n);
  rows.forEach((r, i) => (hours[i] = r.hour));
  const out: Record<string, Buffer | number> = { hour_count: n, hours: Buffer.from(hours.buffer) };
  for (const column of VALUE_COLUMNS) {
    const values = new Float32Array(n);
    rows.forEach((r, i) => (values[i] = r[column] ?? NaN));
    out[column] = Buffer.from(values.buffer);
  }
  return out;
}

function unpackColumn(buf: Buffer, n: number): (number | null)[] {
  const values = new Float32Array(new Uint8Array(buf).buffer, 0, n);
  return Array.from(values, (v) => (Number.isNaN(v) ? null : v));
}

async function createObservationsTable(knex: Knex): Promise<void> {
  await knex.schema.createTable('hourly_observations', (t) => {
    t.uuid('climate_site_id').notNullable();
    t.timestamp('observed_at', { useTz: true }).notNullable();
    for (const column of VALUE_COLUMNS) t.specificType(column, 'real');
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
}

async function dropObservationsTable(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER climate_sites_delete_observations ON climate_sites');
  await knex.raw('DROP FUNCTION delete_site_observations()');
  await knex.schema.dropTable('hourly_observations');
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('climate_records', (t) => {
    t.uuid('climate_site_id').primary().references('id').inTable('climate_sites').onDelete('CASCADE');
    t.integer('hour_count').notNullable();
    t.binary('hours').notNullable();
    for (const column of VALUE_COLUMNS) t.binary(column).notNullable();
    t.binary('sweep_index');
    t.text('sweep_index_key');
    t.timestamp('stored_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  for (const column of ['hours', ...VALUE_COLUMNS, 'sweep_index']) {
    await knex.raw('ALTER TABLE climate_records ALTER COLUMN ?? SET STORAGE EXTERNAL', [column]);
  }
  // An upload waiting for confirmation keeps the index built when it was read.
  await knex.schema.alterTable('climate_uploads', (t) => {
    t.binary('sweep_index');
    t.text('sweep_index_key');
  });

  const sites = await knex('hourly_observations').distinct<{ climate_site_id: string }[]>('climate_site_id');
  for (const { climate_site_id: siteId } of sites) {
    const rows = await knex('hourly_observations')
      .where({ climate_site_id: siteId })
      .orderBy('observed_at')
      .select<ObservationRow[]>(
        knex.raw('floor(extract(epoch from observed_at) / 3600)::int as hour'),
        ...VALUE_COLUMNS,
      );
    await knex('climate_records').insert({ climate_site_id: siteId, ...packRows(rows) });
  }
  await dropObservationsTable(knex);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('climate_uploads', (t) => {
    t.dropColumn('sweep_index');
    t.dropColumn('sweep_index_key');
  });
  await createObservationsTable(knex);
  const records = await knex('climate_records').select<
    ({ climate_site_id: string; hour_count: number; hours: Buffer } & Record<(typeof VALUE_COLUMNS)[number], Buffer>)[]
  >('climate_site_id', 'hour_count', 'hours', ...VALUE_COLUMNS);
  for (const r of records) {
    const n = r.hour_count;
    const hours = new Int32Array(new Uint8Array(r.hours).buffer, 0, n);
    const times = Array.from(hours, (h) => new Date(h * MS_PER_HOUR).toISOString());
    await knex.raw(
      `INSERT INTO hourly_observations (climate_site_id, observed_at, ${VALUE_COLUMNS.join(', ')})
       SELECT ?::uuid, * FROM unnest(?::timestamptz[], ?::real[], ?::real[], ?::real[], ?::real[])`,
      [r.climate_site_id, times, ...VALUE_COLUMNS.map((c) => unpackColumn(r[c], n))] as Knex.RawBinding[],
    );
  }
  await knex.schema.dropTable('climate_records');
}
