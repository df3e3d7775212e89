import type { Knex } from 'knex';
import { from as copyFrom } from 'pg-copy-streams';
import type pg from 'pg';
import type { ClimateSite, ClimateSiteSummary, SiteEstimate, SourceKind } from '@shared/climate-sites/climate-site-schemas';
import type { DesignConditions, PublishedDesignValues } from '@shared/climate/design-conditions-schema';
import type { HourlySeries } from '@shared/climate/hourly-series';
import type { DistributionBin, MonthlyStatistics } from '@shared/climate/quality-report';

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

/** PostgreSQL's epoch (2000-01-01T00:00Z) in hours since the Unix epoch. */
const PG_EPOCH_HOURS = 262_968;
const MICROSECONDS_PER_HOUR = 3_600_000_000;
const TWO_TO_32 = 4_294_967_296;

/**
 * The rows of a series in PostgreSQL's binary COPY format (faster for the server to read than
 * text: no number or date parsing). One tuple: 6 fields — uuid, timestamptz (int64 µs since
 * 2000-01-01), four float4 (length −1 for NULL).
 */
export function binaryCopyRows(siteId: string, series: HourlySeries): { buffer: Buffer; rows: number } {
  const uuid = Buffer.from(siteId.replace(/-/g, ''), 'hex');
  const n = series.time.length;
  const tupleBytes = 2 + (4 + 16) + (4 + 8) + 4 * (4 + 4);
  const out = Buffer.alloc(11 + 4 + 4 + n * tupleBytes + 2);
  let o = out.write('PGCOPY\n\xff\r\n\0', 0, 'latin1');
  o = out.writeInt32BE(0, o); // flags
  o = out.writeInt32BE(0, o); // header extension length
  const seen = new Set<number>();
  const columns = [series.dryBulbC, series.dewPointC, series.windSpeedMs, series.stationPressureKpa];
  let rows = 0;
  for (let i = 0; i < n; i++) {
    const t = series.time[i] ?? NaN;
    if (!Number.isFinite(t)) continue;
    const hour = Math.floor(t / 3_600_000);
    if (seen.has(hour)) continue; // a repeated hour keeps its first value
    seen.add(hour);
    rows++;
    o = out.writeInt16BE(6, o);
    o = out.writeInt32BE(16, o);
    o += uuid.copy(out, o);
    // int64 µs since 2000-01-01, written as two 32-bit halves (exact: |µs| < 2^53 for years 1715–2284).
    const us = (hour - PG_EPOCH_HOURS) * MICROSECONDS_PER_HOUR;
    const high = Math.floor(us / TWO_TO_32);
    o = out.writeInt32BE(8, o);
    o = out.writeInt32BE(high, o);
    o = out.writeUInt32BE(us - high * TWO_TO_32, o);
    for (const column of columns) {
      const v = column[i] ?? NaN;
      if (Number.isNaN(v)) {
        o = out.writeInt32BE(-1, o);
      } else {
        o = out.writeInt32BE(4, o);
        o = out.writeFloatBE(v, o);
      }
    }
  }
  o = out.writeInt16BE(-1, o); // trailer
  return { buffer: out.subarray(0, o), rows };
}

/**
 * Replaces a site's hourly observations with a series by one binary COPY. `trx` must be a
 * transaction: a failure leaves the old record in place. Repeated hours keep their first value,
 * as the engine does.
 */
export async function replaceObservations(trx: Knex.Transaction, siteId: string, series: HourlySeries): Promise<number> {
  // The site must exist and stay while its rows go in (hourly_observations has no foreign key).
  const site: unknown = await trx('climate_sites').where({ id: siteId }).forKeyShare().first('id');
  if (!site) throw new Error(`climate site ${siteId} does not exist`);
  await trx('hourly_observations').where({ climate_site_id: siteId }).delete();
  // Inside a transaction knex hands out the transaction's own connection.
  const client = trx.client as { acquireConnection(): Promise<pg.PoolClient> };
  const conn = await client.acquireConnection();
  const { buffer, rows } = binaryCopyRows(siteId, series);
  const copy = conn.query(
    copyFrom(
      'COPY hourly_observations (climate_site_id, observed_at, dry_bulb_c, dew_point_c, wind_speed_ms, station_pressure_kpa) FROM STDIN (FORMAT binary)',
    ),
  );
  await new Promise<void>((resolve, reject) => {
    copy.on('finish', resolve);
    copy.on('error', reject);
    copy.end(buffer);
  });
  return rows;
}

/** A site's stored hourly record, in time order. */
export async function loadObservations(db: Knex, siteId: string): Promise<HourlySeries> {
  const rows = await db('hourly_observations')
    .where({ climate_site_id: siteId })
    .orderBy('observed_at')
    .select<{ t: number; db: number | null; dp: number | null; ws: number | null; p: number | null }[]>(
      db.raw('(extract(epoch from observed_at) * 1000)::float8 as t'),
      'dry_bulb_c as db',
      'dew_point_c as dp',
      'wind_speed_ms as ws',
      'station_pressure_kpa as p',
    );
  const n = rows.length;
  const series = {
    time: new Float64Array(n),
    dryBulbC: new Float64Array(n),
    dewPointC: new Float64Array(n),
    windSpeedMs: new Float64Array(n),
    stationPressureKpa: new Float64Array(n),
  };
  // `real` arrives as its shortest decimal text; Math.fround gives back the exact stored
  // 32-bit value, so a recomputation matches what was computed at upload.
  const f = (v: number | null) => (v === null ? NaN : Math.fround(v));
  rows.forEach((r, i) => {
    series.time[i] = r.t;
    series.dryBulbC[i] = f(r.db);
    series.dewPointC[i] = f(r.dp);
    series.windSpeedMs[i] = f(r.ws);
    series.stationPressureKpa[i] = f(r.p);
  });
  return series;
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
