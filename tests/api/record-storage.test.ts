/**
 * Hourly records stored as columns (climate_records): the migration that moves records out of the
 * former one-row-per-hour table and back, value for value; the packing of a series (whole hours,
 * time order, a repeated hour keeping its first value, float32 values as PostgreSQL's `real`); and
 * the sweep index stored with the record, which must sweep to the same figures as the record itself.
 */
import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import { after, before, describe, it } from 'node:test';
import type { Knex } from 'knex';
import { DEMO_SITES, generateDemoSeries } from '../../shared/climate/demo-weather';
import { sweep } from '../../shared/sweep/sweep';
import { buildSweepIndex, packSweepIndex, sweepIndexKey, unpackSweepIndex } from '../../shared/sweep/sweep-index';
import { createDb } from '../../server/db';
import { copyOutFirstRow, firstRowOfBinaryCopy } from '../../server/db-copy';
import { migrationConfig } from '../../server/migrate';
import { loadRecord, loadRecordForSweep, packRecord, unpackRecord } from '../../server/modules/climate/climate-repo';
import { storeRecord } from '../../server/modules/climate/climate-service';
import { atStoragePrecision } from '../../server/modules/climate/series-codec';
import { benchScenarioInput } from '../../scripts/bench-sweep';

const COLUMNS_MIGRATION = '20261202101000_store_climate_records_as_columns.ts';
const MS_PER_HOUR = 3_600_000;
const HOUR_2021 = Date.UTC(2021, 0, 1) / MS_PER_HOUR;

let admin: Knex;
let db: Knex;
let databaseName = '';

/** Migrates a fresh database up to (not including) `name`. */
async function migrateUpTo(k: Knex, name: string): Promise<void> {
  for (;;) {
    const [, pending] = (await k.migrate.list(migrationConfig)) as [unknown[], { file: string }[]];
    const next = pending[0];
    if (!next) throw new Error(`${name} is not among the migrations`);
    if (next.file === name) return;
    await k.migrate.up(migrationConfig);
  }
}

before(async () => {
  const url = process.env['DATABASE_URL'];
  if (!url) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
  admin = createDb(url, 1);
  databaseName = `records_${randomBytes(6).toString('hex')}`;
  await admin.raw('CREATE DATABASE ??', [databaseName]);
  const own = new URL(url);
  own.pathname = `/${databaseName}`;
  db = createDb(own.toString(), 2);
});

after(async () => {
  await db.destroy();
  await admin.raw('DROP DATABASE IF EXISTS ??', [databaseName]);
  await admin.destroy();
});

interface Row {
  hour: number;
  dry_bulb_c: number | null;
  dew_point_c: number | null;
  wind_speed_ms: number | null;
  station_pressure_kpa: number | null;
}

describe('moving hourly records into columns', () => {
  it('moves a stored record into one row and back again, every value unchanged', async () => {
    await migrateUpTo(db, COLUMNS_MIGRATION);
    const [org] = await db('organizations')
      .insert({ name: 'Migration test (invented)' })
      .returning<{ id: string }[]>('id');
    const [site] = await db('climate_sites')
      .insert({ organization_id: org?.id, name: 'Migrated site (invented)', source_kind: 'hourly' })
      .returning<{ id: string }[]>('id');
    const siteId = site?.id ?? '';
    const demo = DEMO_SITES[0];
    if (!demo) throw new Error('no demo site');
    const series = generateDemoSeries(demo, { years: 1, endYear: 2021 });
    // Rows as the former table held them: a gap of hours, missing values, and values that a
    // float32 cannot hold exactly (stored as `real`, they come back rounded the same way).
    // The former store wrote a missing value as NULL, never as NaN.
    const orNull = (v: number | undefined) => (v === undefined || Number.isNaN(v) ? null : v);
    const rows: Row[] = [];
    for (let i = 0; i < series.time.length; i++) {
      if (i >= 100 && i < 130) continue;
      rows.push({
        hour: (series.time[i] ?? 0) / MS_PER_HOUR,
        dry_bulb_c: orNull(series.dryBulbC[i]),
        dew_point_c: i % 17 === 0 ? null : orNull((series.dewPointC[i] ?? NaN) + 0.01),
        wind_speed_ms: i % 5 === 0 ? null : orNull(series.windSpeedMs[i]),
        station_pressure_kpa: i % 3 === 0 ? null : 101.325 - i / 1e5,
      });
    }
    await db.raw(
      `INSERT INTO hourly_observations (climate_site_id, observed_at, dry_bulb_c, dew_point_c, wind_speed_ms, station_pressure_kpa)
       SELECT ?::uuid, to_timestamp(h * 3600), a, b, c, d FROM unnest(?::int[], ?::real[], ?::real[], ?::real[], ?::real[]) AS u(h, a, b, c, d)`,
      [
        siteId,
        rows.map((r) => r.hour),
        rows.map((r) => r.dry_bulb_c),
        rows.map((r) => r.dew_point_c),
        rows.map((r) => r.wind_speed_ms),
        rows.map((r) => r.station_pressure_kpa),
      ] as Knex.RawBinding[],
    );
    const readRows = () =>
      db('hourly_observations')
        .where({ climate_site_id: siteId })
        .orderBy('observed_at')
        .select<Row[]>(
          db.raw('(extract(epoch from observed_at) / 3600)::float8 as hour'),
          'dry_bulb_c',
          'dew_point_c',
          'wind_speed_ms',
          'station_pressure_kpa',
        );
    const before = await readRows();
    assert.equal(before.length, series.time.length - 30);

    await db.migrate.up(migrationConfig);
    const records = await db('climate_records').where({ climate_site_id: siteId }).select('hour_count', 'sweep_index');
    assert.equal(records.length, 1, 'one row per site');
    assert.equal(records[0]?.hour_count, before.length);
    assert.equal(records[0]?.sweep_index, null, 'a moved record is indexed on its first sweep');
    const moved = await loadRecord(db, siteId);
    assert.equal(moved.time.length, before.length);
    const value = (v: number | null) => (v === null ? NaN : Math.fround(v));
    before.forEach((r, i) => {
      assert.equal(moved.time[i], r.hour * MS_PER_HOUR, `time of row ${i}`);
      assert.equal(moved.dryBulbC[i], value(r.dry_bulb_c), `dry bulb of row ${i}`);
      assert.equal(moved.dewPointC[i], value(r.dew_point_c), `dew point of row ${i}`);
      assert.equal(moved.windSpeedMs[i], value(r.wind_speed_ms), `wind of row ${i}`);
      assert.equal(moved.stationPressureKpa[i], value(r.station_pressure_kpa), `pressure of row ${i}`);
    });

    await db.migrate.down(migrationConfig);
    assert.equal(
      (await db.raw<{ rows: unknown[] }>(`SELECT 1 FROM pg_tables WHERE tablename = 'climate_records'`)).rows.length,
      0,
    );
    const back = await readRows();
    assert.deepEqual(back, before, 'rolling back gives the same rows');

    // The trigger of the former table still removes a deleted site's rows.
    await db('climate_sites').where({ id: siteId }).delete();
    assert.equal((await readRows()).length, 0);
  });

  it('stores a record in one row and reads it back as its sweep index, in one query', async () => {
    await db.migrate.latest(migrationConfig);
    const [org] = await db('organizations').insert({ name: 'Index test (invented)' }).returning<{ id: string }[]>('id');
    const [site] = await db('climate_sites')
      .insert({ organization_id: org?.id, name: 'Indexed site (invented)', source_kind: 'hourly', elevation_m: 300 })
      .returning<{ id: string }[]>('id');
    const siteId = site?.id ?? '';
    const demo = DEMO_SITES[0];
    if (!demo) throw new Error('no demo site');
    const series = atStoragePrecision(generateDemoSeries(demo, { years: 3 }));
    await db.transaction((trx) =>
      storeRecord(trx, siteId, series, 300, { fileName: 'gen', rowCount: series.time.length }),
    );
    const years = (
      await db('design_conditions')
        .where({ climate_site_id: siteId })
        .first<{ conditions: { period: { qualifyingYears: number[] } } }>('conditions')
    ).conditions.period.qualifyingYears;
    const stored = await loadRecordForSweep(db, siteId, sweepIndexKey(years));
    assert.ok(stored && 'index' in stored, 'the index built at upload is read back');
    const asText = await db('climate_records')
      .where({ climate_site_id: siteId })
      .first<{ sweep_index: Buffer }>('sweep_index');
    assert.ok(stored.index.equals(asText.sweep_index), 'the binary COPY gives the bytes the ordinary query gives');
    const other = await loadRecordForSweep(db, siteId, sweepIndexKey([1901]));
    assert.ok(other && 'series' in other, 'an index for other years is not used: the columns come instead');
    assert.deepEqual(other.series, await loadRecord(db, siteId));

    // The stored index sweeps to exactly the figures of the record it was built from.
    const input = benchScenarioInput({
      heating: { db99_6: -20, db99: -17 },
      extremeMin: { mean: -27, returnPeriod: { '50': -34 } },
    });
    const fromSeries = sweep({ ...input, record: { series, qualifyingYears: years } });
    const fromStored = sweep({ ...input, record: unpackSweepIndex(stored.index) });
    assert.deepEqual(fromStored, fromSeries);
    assert.ok(
      fromSeries.rows.some((r) => r.unmetHoursPerYear !== null && r.unmetHoursPerYear > 0),
      'the check covers unmet hours',
    );
  });
});

describe('packing a record into columns', () => {
  it('keeps whole hours in time order, the first of a repeated hour, and drops hours without a time', () => {
    const h = (k: number) => (HOUR_2021 + k) * MS_PER_HOUR;
    const series = {
      time: Float64Array.from([h(2), h(0) + 59 * 60_000, h(1), h(1), NaN, h(3)]),
      dryBulbC: Float64Array.from([2, 0, 1, 99, 5, 3]),
      dewPointC: Float64Array.from([NaN, -1, -2, -3, -4, -5]),
      windSpeedMs: Float64Array.from([0.1, 0.2, 0.3, 0.4, 0.5, 0.6]),
      stationPressureKpa: Float64Array.from([100, 100, 100, 100, 100, NaN]),
    };
    const p = packRecord(series);
    assert.equal(p.hourCount, 4);
    const back = unpackRecord(p.hourCount, p.hours, p.values);
    assert.deepEqual(Array.from(back.time), [h(0), h(1), h(2), h(3)]);
    assert.deepEqual(Array.from(back.dryBulbC), [0, 1, 2, 3]);
    assert.deepEqual(Array.from(back.dewPointC), [-1, -2, NaN, -5]);
    // float32, as PostgreSQL's `real` held them: 0.1 comes back as 0.10000000149011612.
    assert.deepEqual(Array.from(back.windSpeedMs), [0.2, 0.3, 0.1, 0.6].map(Math.fround));
    assert.deepEqual(Array.from(back.stationPressureKpa), [100, 100, 100, NaN]);
  });

  it('packs and unpacks a sweep index to the same index', () => {
    const demo = DEMO_SITES[0];
    if (!demo) throw new Error('no demo site');
    const series = atStoragePrecision(generateDemoSeries(demo, { years: 2 }));
    const index = buildSweepIndex({ series, qualifyingYears: [2023, 2024] });
    const back = unpackSweepIndex(packSweepIndex(index));
    assert.deepEqual(back, index);
    // Bytes that are not an index of this format are refused (the worker then rebuilds it).
    const bytes = packSweepIndex(index);
    bytes.set(new TextEncoder().encode('"format":"sweep-index-0"'), 5);
    assert.throws(() => unpackSweepIndex(bytes));
  });
});

describe('reading bytes with a binary COPY (server/db-copy.ts)', () => {
  it('keeps bytes, NULLs and integers as PostgreSQL sends them', async () => {
    const bytes = randomBytes(70_000); // spans several chunks of the stream
    const row = await copyOutFirstRow(db, "SELECT decode($1, 'hex'), NULL::bytea, 1234567::int4", [
      bytes.toString('hex'),
    ]);
    assert.ok(row);
    assert.ok(row[0]?.equals(bytes));
    assert.equal(row[1], null);
    assert.equal(row[2]?.readInt32BE(0), 1_234_567);
  });

  it('answers undefined for no row, and quotes values so that none can change the query', async () => {
    assert.equal(await copyOutFirstRow(db, 'SELECT 1 WHERE false', []), undefined);
    const hostile = "x'); DROP TABLE climate_records; --";
    const row = await copyOutFirstRow(db, 'SELECT $1::text', [hostile]);
    assert.equal(row?.[0]?.toString('utf8'), hostile);
    assert.ok(await db.schema.hasTable('climate_records'));
  });

  it('refuses a stream that is not a binary COPY or is cut short', () => {
    assert.throws(() => firstRowOfBinaryCopy(Buffer.from('not a copy stream at all')), /not a binary COPY/);
    const header = Buffer.concat([Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1'), Buffer.alloc(8)]);
    const cut = Buffer.concat([header, Buffer.from([0, 1, 0, 0, 0, 10, 1, 2])]);
    assert.throws(() => firstRowOfBinaryCopy(cut), /cut short/);
    assert.equal(firstRowOfBinaryCopy(Buffer.concat([header, Buffer.from([0xff, 0xff])])), undefined);
  });
});
