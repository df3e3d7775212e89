/** The upload waiting room (`climate_uploads`): a read and checked record parked for 24 h until it is confirmed. */
import type { Knex } from 'knex';
import type { StoredComputation } from './climate-repo';

export const TABLES = ['climate_uploads'] as const;

export interface ParkedUpload {
  climate_site_id: string;
  series: Buffer;
  file_name: string;
  row_count: number;
  analysis: StoredComputation | null;
  elevation_m: number | null;
  sweep_index: Buffer | null;
  sweep_index_key: string | null;
}

export async function insertUpload(
  db: Knex,
  values: {
    organizationId: string;
    siteId: string;
    userId: string;
    fileName: string;
    format: string;
    rowCount: number;
    series: Buffer;
    quality: unknown;
    analysis: unknown;
    elevationM: number | null;
    sweepIndex: { key: string; bytes: Buffer } | null;
    expiresAt: Date;
  },
): Promise<string> {
  const [row] = await db('climate_uploads')
    .insert({
      organization_id: values.organizationId,
      climate_site_id: values.siteId,
      uploaded_by: values.userId,
      file_name: values.fileName,
      format: values.format,
      row_count: values.rowCount,
      series: values.series,
      quality: JSON.stringify(values.quality),
      analysis: values.analysis ? JSON.stringify(values.analysis) : null,
      elevation_m: values.elevationM,
      sweep_index: values.sweepIndex?.bytes ?? null,
      sweep_index_key: values.sweepIndex?.key ?? null,
      expires_at: values.expiresAt,
    })
    .returning<{ id: string }[]>('id');
  if (!row) throw new Error('insert returned no row');
  return row.id;
}

/** A parked upload that has not expired, locked for the caller's transaction. */
export function lockUpload(
  trx: Knex.Transaction,
  organizationId: string,
  uploadId: string,
): Promise<ParkedUpload | undefined> {
  return trx('climate_uploads')
    .where({ id: uploadId, organization_id: organizationId })
    .where('expires_at', '>', trx.fn.now())
    .forUpdate()
    .first<ParkedUpload | undefined>(
      'climate_site_id',
      'series',
      'file_name',
      'row_count',
      'analysis',
      'elevation_m',
      'sweep_index',
      'sweep_index_key',
    );
}

export async function deleteUploadsOfSite(db: Knex, siteId: string): Promise<void> {
  await db('climate_uploads').where({ climate_site_id: siteId }).delete();
}

export async function deleteUpload(db: Knex, organizationId: string, uploadId: string): Promise<boolean> {
  const n = await db('climate_uploads').where({ id: uploadId, organization_id: organizationId }).delete();
  return n > 0;
}
