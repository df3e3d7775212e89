import type { Knex } from 'knex';
import type { ClimateSite, ClimateSiteSummary, SiteEstimate, SourceKind } from '@shared/climate/climate-schemas';
import type { DesignConditions, PublishedDesignValues } from '@shared/climate/design-conditions-schema';
import type { HourlySeries } from '@shared/climate/hourly-series';
import type { DistributionBin, MonthlyStatistics } from '@shared/climate/quality-report';
import { copyOutFirstRow } from '../../db-copy';

interface SiteRow {
  id: string;
  organization_id: string;
  name: string;
  latitude: number | null;
  longitude: number | null;
  elevation_m: number | null;
  utc_offset_hours: number | null;
  notes: string;
  source_kind: SourceKind;
  published_source: string | null;
  published_values: PublishedDesignValues | null;
  is_demo: boolean;
  estimate: SiteEstimate | null;
  estimate_reference_id: string | null;
  created_at: Date;
  updated_at: Date;
  // joined from design_conditions
  conditions: DesignConditions | null;
  method_version: string | null;
  computed_at: Date | null;
  file_name: string | null;
  row_count: number | null;
}

function toSummary(r: SiteRow): ClimateSiteSummary {
  // A published site keeps the table's values even when it holds an estimated record.
  const heating = r.published_values?.heating ?? r.conditions?.heating ?? null;
  const period = r.conditions?.period;
  return {
    id: r.id,
    name: r.name,
    latitude: r.latitude,
    longitude: r.longitude,
    elevationM: r.elevation_m,
    utcOffsetHours: r.utc_offset_hours,
    sourceKind: r.source_kind,
    isDemo: r.is_demo,
    heatingDb99_6: heating?.db99_6 ?? null,
    heatingDb99: heating?.db99 ?? null,
    firstYear: period?.firstYear ?? r.published_values?.period?.firstYear ?? null,
    lastYear: period?.lastYear ?? r.published_values?.period?.lastYear ?? null,
    qualifyingYearCount: period ? period.qualifyingYears.length : null,
    updatedAt: r.updated_at.toISOString(),
  };
}

function toSite(r: SiteRow): ClimateSite {
  return {
    ...toSummary(r),
    notes: r.notes,
    createdAt: r.created_at.toISOString(),
    publishedValues: r.published_values,
    computed:
      r.conditions && r.method_version && r.computed_at
        ? {
            conditions: r.conditions,
            methodVersion: r.method_version,
            computedAt: r.computed_at.toISOString(),
            fileName: r.file_name,
            rowCount: r.row_count ?? 0,
          }
        : null,
    estimate: r.estimate ? { ...r.estimate, referenceSiteId: r.estimate_reference_id } : null,
  };
}

function siteQuery(db: Knex, organizationId: string) {
  return db('climate_sites as s')
    .leftJoin('design_conditions as d', 'd.climate_site_id', 's.id')
    .where('s.organization_id', organizationId)
    .select<SiteRow[]>('s.*', 'd.conditions', 'd.method_version', 'd.computed_at', 'd.file_name', 'd.row_count');
}

export async function listSites(db: Knex, organizationId: string): Promise<ClimateSiteSummary[]> {
  const rows = await siteQuery(db, organizationId).orderBy([{ column: 's.name' }, { column: 's.id' }]);
  return rows.map(toSummary);
}

export async function findSite(db: Knex, organizationId: string, id: string): Promise<ClimateSite | undefined> {
  const rows = await siteQuery(db, organizationId).andWhere('s.id', id);
  return rows[0] && toSite(rows[0]);
}

export interface SiteWrite {
  name?: string;
  latitude?: number | null;
  longitude?: number | null;
  elevationM?: number | null;
  utcOffsetHours?: number | null;
  notes?: string;
  publishedValues?: PublishedDesignValues;
}

function toRow(input: SiteWrite): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (input.name !== undefined) row['name'] = input.name;
  if (input.latitude !== undefined) row['latitude'] = input.latitude;
  if (input.longitude !== undefined) row['longitude'] = input.longitude;
  if (input.elevationM !== undefined) row['elevation_m'] = input.elevationM;
  if (input.utcOffsetHours !== undefined) row['utc_offset_hours'] = input.utcOffsetHours;
  if (input.notes !== undefined) row['notes'] = input.notes;
  if (input.publishedValues !== undefined) {
    row['published_values'] = JSON.stringify(input.publishedValues);
    row['published_source'] = input.publishedValues.source;
  }
  return row;
}

export async function insertSite(
  db: Knex,
  organizationId: string,
  userId: string | null,
  input: SiteWrite & { name: string; sourceKind: SourceKind; isDemo?: boolean },
): Promise<string> {
  const [row] = await db('climate_sites')
    .insert({
      ...toRow(input),
      organization_id: organizationId,
      source_kind: input.sourceKind,
      is_demo: input.isDemo ?? false,
      created_by: userId,
    })
    .returning<{ id: string }[]>('id');
  if (!row) throw new Error('insert returned no row');
  return row.id;
}

export async function updateSite(db: Knex, organizationId: string, id: string, input: SiteWrite): Promise<boolean> {
  const n = await db('climate_sites')
    .where({ id, organization_id: organizationId })
    .update({ ...toRow(input), updated_at: db.fn.now() });
  return n > 0;
}

/** Records (or clears) the provenance of a site's estimated record. */
export async function saveEstimate(db: Knex, siteId: string, estimate: SiteEstimate | null): Promise<void> {
  await db('climate_sites')
    .where({ id: siteId })
    .update({
      estimate: estimate === null ? null : JSON.stringify(estimate),
      estimate_reference_id: estimate?.referenceSiteId ?? null,
      updated_at: db.fn.now(),
    });
}

/** Sites of the organisation whose estimated record was made from this reference. */
export async function sitesEstimatedFrom(db: Knex, organizationId: string, referenceSiteId: string): Promise<string[]> {
  const rows = await db('climate_sites')
    .where({ organization_id: organizationId, estimate_reference_id: referenceSiteId })
    .select<{ id: string }[]>('id');
  return rows.map((r) => r.id);
}

export async function deleteSite(db: Knex, organizationId: string, id: string): Promise<boolean> {
  return (await db('climate_sites').where({ id, organization_id: organizationId }).delete()) > 0;
}

const MS_PER_HOUR = 3_600_000;
const VALUE_COLUMNS = ['dry_bulb_c', 'dew_point_c', 'wind_speed_ms', 'station_pressure_kpa'] as const;
type ValueColumn = (typeof VALUE_COLUMNS)[number];

/** A record as climate_records stores it: whole hours since 1970 (int32) and float32 values, little-endian. */
export interface PackedRecord {
  hourCount: number;
  hours: Buffer;
  values: Record<ValueColumn, Buffer>;
}

const bytesOf = (a: Int32Array | Float32Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

/**
 * Packs a series into the stored columns: times to whole hours, hours without a finite time left
 * out, a repeated hour keeping its first value, in time order (docs/architecture.md#stored-records-and-the-sweep-index).
 */
export function packRecord(series: HourlySeries): PackedRecord {
  const n = series.time.length;
  const hourOf = new Float64Array(n);
  let valid = 0;
  let sorted = true;
  let last = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = series.time[i] ?? NaN;
    const h = Number.isFinite(t) ? Math.floor(t / MS_PER_HOUR) : NaN;
    hourOf[i] = h;
    if (Number.isNaN(h)) continue;
    valid++;
    if (h <= last) sorted = false;
    last = h;
  }
  const sources: Record<ValueColumn, Float64Array> = {
    dry_bulb_c: series.dryBulbC,
    dew_point_c: series.dewPointC,
    wind_speed_ms: series.windSpeedMs,
    station_pressure_kpa: series.stationPressureKpa,
  };
  const values = {} as Record<ValueColumn, Buffer>;
  if (sorted && valid === n) {
    // Already in time order, every hour once (as every record read from a file is): no reordering.
    for (const column of VALUE_COLUMNS) values[column] = bytesOf(Float32Array.from(sources[column]));
    return { hourCount: n, hours: bytesOf(Int32Array.from(hourOf)), values };
  }
  // Stable sort by hour keeps the first of a repeated hour in front; later repeats are dropped.
  const idx: number[] = [];
  for (let i = 0; i < n; i++) if (!Number.isNaN(hourOf[i] ?? NaN)) idx.push(i);
  idx.sort((a, b) => (hourOf[a] ?? 0) - (hourOf[b] ?? 0));
  const order = idx.filter((i, k) => k === 0 || hourOf[i] !== hourOf[idx[k - 1] ?? 0]);
  const m = order.length;
  const hours = new Int32Array(m);
  for (let k = 0; k < m; k++) hours[k] = hourOf[order[k] ?? 0] ?? 0;
  for (const column of VALUE_COLUMNS) {
    const from = sources[column];
    const to = new Float32Array(m);
    for (let k = 0; k < m; k++) to[k] = from[order[k] ?? 0] ?? NaN;
    values[column] = bytesOf(to);
  }
  return { hourCount: m, hours: bytesOf(hours), values };
}

/** The stored columns back as a series (float64 copies of the float32 values, as a recomputation needs). */
export function unpackRecord(hourCount: number, hours: Buffer, values: Record<ValueColumn, Buffer>): HourlySeries {
  const view = <T>(buf: Buffer, make: (b: ArrayBuffer, offset: number, n: number) => T): T => {
    const aligned = buf.byteOffset % 4 === 0 ? buf : Buffer.from(new Uint8Array(buf));
    return make(aligned.buffer as ArrayBuffer, aligned.byteOffset, hourCount);
  };
  const h = view(hours, (b, o, n) => new Int32Array(b, o, n));
  const time = new Float64Array(hourCount);
  for (let i = 0; i < hourCount; i++) time[i] = (h[i] ?? 0) * MS_PER_HOUR;
  const column = (c: ValueColumn) => Float64Array.from(view(values[c], (b, o, n) => new Float32Array(b, o, n)));
  return {
    time,
    dryBulbC: column('dry_bulb_c'),
    dewPointC: column('dew_point_c'),
    windSpeedMs: column('wind_speed_ms'),
    stationPressureKpa: column('station_pressure_kpa'),
  };
}

/** A stored sweep index and the key it was built for (shared/sweep/sweep-index.ts). */
export interface StoredSweepIndex {
  key: string;
  bytes: Uint8Array;
}

/**
 * Stores a series as a site's record, replacing the one before, in one statement (one row per
 * site). `trx` should be the transaction the rest of the upload is written in. Returns the number
 * of hours stored.
 */
export async function writeRecord(
  trx: Knex.Transaction,
  siteId: string,
  series: HourlySeries,
  sweepIndex: StoredSweepIndex | null,
): Promise<number> {
  const packed = packRecord(series);
  await trx('climate_records')
    .insert({
      climate_site_id: siteId,
      hour_count: packed.hourCount,
      hours: packed.hours,
      ...packed.values,
      sweep_index: sweepIndex
        ? Buffer.from(sweepIndex.bytes.buffer, sweepIndex.bytes.byteOffset, sweepIndex.bytes.byteLength)
        : null,
      sweep_index_key: sweepIndex?.key ?? null,
      stored_at: trx.fn.now(),
    })
    .onConflict('climate_site_id')
    .merge();
  return packed.hourCount;
}

/** A site's record as stored, read with a binary COPY (server/db-copy.ts); undefined when it has none. */
async function loadRecordColumns(db: Knex, siteId: string): Promise<HourlySeries | undefined> {
  const row = await copyOutFirstRow(
    db,
    `SELECT hour_count, hours, ${VALUE_COLUMNS.join(', ')} FROM climate_records WHERE climate_site_id = $1`,
    [siteId],
  );
  if (!row) return undefined;
  const [hourCount, hours, dry_bulb_c, dew_point_c, wind_speed_ms, station_pressure_kpa] = row;
  if (!hourCount || !hours || !dry_bulb_c || !dew_point_c || !wind_speed_ms || !station_pressure_kpa)
    throw new Error('climate record without columns');
  // hour_count is an integer, in the binary format a 4-byte big-endian number.
  return unpackRecord(hourCount.readInt32BE(0), hours, {
    dry_bulb_c,
    dew_point_c,
    wind_speed_ms,
    station_pressure_kpa,
  });
}

/** A site's stored hourly record, in time order (an empty series when it has none). */
export async function loadRecord(db: Knex, siteId: string): Promise<HourlySeries> {
  return (
    (await loadRecordColumns(db, siteId)) ??
    unpackRecord(0, Buffer.alloc(0), {
      dry_bulb_c: Buffer.alloc(0),
      dew_point_c: Buffer.alloc(0),
      wind_speed_ms: Buffer.alloc(0),
      station_pressure_kpa: Buffer.alloc(0),
    })
  );
}

/** A record's stored sweep index when it is of the given key, read with a binary COPY (server/db-copy.ts). */
async function loadSweepIndexBytes(db: Knex, siteId: string, indexKey: string): Promise<Buffer | undefined> {
  const row = await copyOutFirstRow(
    db,
    'SELECT sweep_index FROM climate_records WHERE climate_site_id = $1 AND sweep_index_key = $2 AND sweep_index IS NOT NULL',
    [siteId, indexKey],
  );
  return row?.[0] ?? undefined;
}

/**
 * What a sweep needs of a site's record: the stored sweep index when it was built for `indexKey`
 * (one query), otherwise the record's columns (to index them again; a second query).
 */
export async function loadRecordForSweep(
  db: Knex,
  siteId: string,
  indexKey: string,
): Promise<{ index: Buffer } | { series: HourlySeries } | undefined> {
  const index = await loadSweepIndexBytes(db, siteId, indexKey);
  if (index) return { index };
  const series = await loadRecordColumns(db, siteId);
  return series ? { series } : undefined;
}

export interface StoredComputation {
  methodVersion: string;
  conditions: DesignConditions;
  quality: unknown;
  distribution: { binWidthK: number; hours: number; bins: DistributionBin[] };
  monthly: MonthlyStatistics[];
  fileName: string | null;
  rowCount: number;
}

export async function saveComputation(db: Knex, siteId: string, c: StoredComputation): Promise<void> {
  await db('design_conditions')
    .insert({
      climate_site_id: siteId,
      method_version: c.methodVersion,
      conditions: JSON.stringify(c.conditions),
      quality: JSON.stringify(c.quality),
      distribution: JSON.stringify(c.distribution),
      monthly: JSON.stringify(c.monthly),
      file_name: c.fileName,
      row_count: c.rowCount,
      computed_at: db.fn.now(),
    })
    .onConflict('climate_site_id')
    .merge();
  await db('climate_sites').where({ id: siteId }).update({ updated_at: db.fn.now() });
}

export async function chartData(
  db: Knex,
  organizationId: string,
  siteId: string,
): Promise<{ distribution: StoredComputation['distribution']; monthly: MonthlyStatistics[] } | undefined> {
  const row = await db('design_conditions as d')
    .join('climate_sites as s', 's.id', 'd.climate_site_id')
    .where({ 's.id': siteId, 's.organization_id': organizationId })
    .first<{ distribution: StoredComputation['distribution']; monthly: MonthlyStatistics[] } | undefined>(
      'd.distribution',
      'd.monthly',
    );
  return row;
}

/** Whether the site is the organisation's (a project or scenario may name only its own). */
export async function siteBelongsTo(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const row: unknown = await db('climate_sites').where({ id, organization_id: organizationId }).first('id');
  return Boolean(row);
}

/** The file name and row count of the record a site's stored conditions were computed from. */
export function computationSource(
  db: Knex,
  siteId: string,
): Promise<{ file_name: string | null; row_count: number } | undefined> {
  return db('design_conditions')
    .where({ climate_site_id: siteId })
    .first<{ file_name: string | null; row_count: number } | undefined>('file_name', 'row_count');
}

/** The tables this area owns: no other area names them (tests/api/module-tables.test.ts). */
export const TABLES = ['climate_sites', 'climate_records', 'design_conditions'] as const;

/**
 * Read-only view for other areas (docs/architecture.md#read-only-views-of-another-areas-tables):
 * every site as a subquery with the columns `id`, `name`, `updated_at` and `computed_at` (when its design
 * conditions were last computed; null before), to be joined under an alias of the caller's choosing: the
 * name is shown beside a project or scenario, and the two times move whenever the site's record or design
 * values change. PostgreSQL folds it into the caller's statement (and drops the design conditions'
 * join when `computed_at` is not read).
 */
export const sitesView = (db: Knex) =>
  db('climate_sites as cs')
    .leftJoin('design_conditions as dc', 'dc.climate_site_id', 'cs.id')
    .select('cs.id', 'cs.name', 'cs.updated_at', 'dc.computed_at');
