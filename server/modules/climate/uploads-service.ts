/**
 * Uploading a site's hourly record: the files are read and checked in the upload pool, the result is
 * parked for 24 h, and a confirmation stores it as the site's record in one transaction.
 */
import type { Knex } from 'knex';
import { CLIMATE_UPLOAD_MAX_BYTES, type ClimateSite, type ClimateUpload } from '@shared/climate/climate-schemas';
import type { CsvMapping } from '@shared/climate/readers/csv-reader';
import { HttpError } from '../../http/http-error';
import * as repo from './climate-repo';
import { refreshEstimatesFrom, requireSite, siteNotFound, storeRecord } from './climate-service';
import { decodeSeries } from './series-codec';
import type { UploadPool } from './upload-pool';
import * as uploadsRepo from './uploads-repo';
import { isdLiteStation } from './weather-files';

const UPLOAD_HOURS = 24;

/**
 * The name of an uploaded file as shown back: its last path part only (whatever folders a client
 * claims, with / or \\), without control characters, at most 200 characters. Nothing is written to disk.
 */
export function baseName(claimed: string): string {
  const last =
    claimed
      .split(/[/\\]/)
      .pop()
      ?.replace(/[\u0000-\u001f\u007f]/g, '')
      .trim() ?? '';
  const name = last === '.' || last === '..' ? '' : last.slice(0, 200);
  return name || 'upload';
}

/** Reads and checks the files in the upload pool and parks the result (400/413/422/503 with the reasons otherwise). */
export async function receiveUpload(
  db: Knex,
  uploads: UploadPool,
  who: { organizationId: string; userId: string },
  siteId: string,
  files: readonly { originalname: string; size: number; buffer: Buffer }[],
  options: { format: Parameters<UploadPool['parse']>[1]['format']; mapping: CsvMapping | undefined },
): Promise<ClimateUpload> {
  const { organizationId, userId } = who;
  const site = await requireSite(db, organizationId, siteId);
  if (site.sourceKind !== 'hourly') {
    throw new HttpError(422, 'not_hourly', 'This site holds published values; create a site for an hourly record');
  }
  const total = files.reduce((s, f) => s + f.size, 0);
  if (total > CLIMATE_UPLOAD_MAX_BYTES) {
    throw new HttpError(
      413,
      'file_too_large',
      `An upload can hold at most ${CLIMATE_UPLOAD_MAX_BYTES / 1024 / 1024} MB`,
    );
  }
  const names = files.map((f) => baseName(f.originalname));
  // Yearly ISD-Lite files name their station and year: the station becomes the record's source.
  const station = isdLiteStation(names);
  const stationSource = station
    ? `ISD-Lite station ${station.id}, ${String(station.years[0])}–${String(station.years[station.years.length - 1])} (${station.years.length} file${station.years.length === 1 ? '' : 's'})`
    : null;
  const fileName = stationSource ?? (files.length === 1 ? (names[0] ?? 'upload') : `${files.length} files`);
  // Reading, checking and the preview run in the upload pool; this thread only moves the bytes.
  const parsed = await uploads.parse(organizationId, {
    files: files.map((f) => ({ name: baseName(f.originalname), content: f.buffer })),
    format: options.format,
    mapping: options.mapping,
    elevationM: site.elevationM,
    fileName,
  });
  if (!parsed.ok) throw new HttpError(parsed.status, parsed.code, parsed.message, parsed.details);
  const { format, rowCount, quality: summary, computed } = parsed;
  const expiresAt = new Date(Date.now() + UPLOAD_HOURS * 3_600_000);
  const id = await uploadsRepo.insertUpload(db, {
    organizationId,
    siteId,
    userId,
    fileName,
    format,
    rowCount,
    series: Buffer.from(parsed.series.buffer, parsed.series.byteOffset, parsed.series.byteLength),
    quality: summary,
    analysis: computed,
    elevationM: site.elevationM,
    sweepIndex: parsed.sweepIndex
      ? {
          key: parsed.sweepIndex.key,
          bytes: Buffer.from(
            parsed.sweepIndex.bytes.buffer,
            parsed.sweepIndex.bytes.byteOffset,
            parsed.sweepIndex.bytes.byteLength,
          ),
        }
      : null,
    expiresAt,
  });
  return {
    id,
    siteId,
    fileName,
    format,
    rowCount,
    quality: summary,
    preview: parsed.preview,
    warnings: [
      ...(station && station.missingYears.length > 0
        ? [
            `No file for ${station.missingYears.join(', ')} of ISD-Lite station ${station.id}: ${station.missingYears.length === 1 ? 'that year is' : 'those years are'} missing from the record.`,
          ]
        : []),
      ...parsed.warnings,
    ],
    station,
    expiresAt: expiresAt.toISOString(),
  };
}

/** Stores a parked upload as its site's record, in one transaction (404 when it is gone or expired). */
export async function confirmUpload(
  db: Knex,
  organizationId: string,
  uploadId: string,
): Promise<ClimateSite | undefined> {
  const siteId = await db.transaction(async (trx) => {
    const up = await uploadsRepo.lockUpload(trx, organizationId, uploadId);
    if (!up) throw new HttpError(404, 'not_found', 'That upload was not found or has expired; upload the file again');
    const site = await repo.findSite(trx, organizationId, up.climate_site_id);
    if (!site) throw siteNotFound();
    // The analysis made at upload used the site's elevation of that moment; recompute if it changed since.
    const computed = site.elevationM === up.elevation_m ? up.analysis : null;
    await storeRecord(
      trx,
      up.climate_site_id,
      decodeSeries(up.series),
      site.elevationM,
      { fileName: up.file_name, rowCount: up.row_count },
      computed,
      up.sweep_index && up.sweep_index_key ? { key: up.sweep_index_key, bytes: up.sweep_index } : null,
    );
    await uploadsRepo.deleteUploadsOfSite(trx, up.climate_site_id);
    // Sites whose records are estimated from this one follow the new record.
    await refreshEstimatesFrom(trx, organizationId, up.climate_site_id);
    return up.climate_site_id;
  });
  return repo.findSite(db, organizationId, siteId);
}

export async function discardUpload(db: Knex, organizationId: string, uploadId: string): Promise<void> {
  if (!(await uploadsRepo.deleteUpload(db, organizationId, uploadId)))
    throw new HttpError(404, 'not_found', 'That upload was not found');
}
