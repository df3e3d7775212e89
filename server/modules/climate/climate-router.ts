import { Router, type RequestHandler } from 'express';
import type { Knex } from 'knex';
import multer from 'multer';
import { safeRequestTextSchema } from '@shared/api/safe-text';
import { z } from 'zod';
import {
  CLIMATE_UPLOAD_MAX_BYTES,
  CLIMATE_UPLOAD_MAX_FILES,
  climateSiteInputSchema,
  climateSitePatchSchema,
  estimateInputSchema,
  uploadFieldsSchema,
  type ClimateUpload,
} from '@shared/climate/climate-schemas';
import { METHOD_VERSION } from '@shared/climate/design-conditions-schema';
import { csvFields, type CsvMapping } from '@shared/climate/readers/csv-reader';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import * as repo from './climate-repo';
import { estimateIsStale, estimateRecord, recentYears, recompute, refreshEstimatesFrom, storeRecord } from './climate-service';
import { decodeSeries } from './series-codec';
import type { UploadPool } from './upload-pool';
import { isdLiteStation } from './weather-files';

const siteParam = z.object({ siteId: z.uuid('Unknown climate site') });
const uploadParam = z.object({ uploadId: z.uuid('Unknown upload') });
const mappingSchema = z.partialRecord(z.enum(csvFields), z.string().min(1).max(200));
const UPLOAD_HOURS = 24;

const siteNotFound = () => new HttpError(404, 'not_found', 'That climate site was not found');

/** Multipart framing around the files: a request declaring more than this over the upload limit is refused before it is read. */
const MULTIPART_SLACK_BYTES = 1024 * 1024;

/** 413 at once for an upload whose declared length is over the limit (nothing of it is read or kept). */
const declaredSizeCheck: RequestHandler = (req, _res, next) => {
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > CLIMATE_UPLOAD_MAX_BYTES + MULTIPART_SLACK_BYTES) {
    next(new HttpError(413, 'file_too_large', `An upload can hold at most ${CLIMATE_UPLOAD_MAX_BYTES / 1024 / 1024} MB`));
    return;
  }
  next();
};

/**
 * The name of an uploaded file as shown back: its last path part only (whatever folders a client
 * claims, with / or \\), without control characters, at most 200 characters. Nothing is written to disk.
 */
export function baseName(claimed: string): string {
  const last = claimed.split(/[/\\]/).pop()?.replace(/[\u0000-\u001f\u007f]/g, '').trim() ?? '';
  const name = last === '.' || last === '..' ? '' : last.slice(0, 200);
  return name || 'upload';
}

const upload = multer({
  storage: multer.memoryStorage(),
  // File names are UTF-8 (as browsers send them): café.csv stays café.csv.
  defParamCharset: 'utf8',
  limits: { fileSize: CLIMATE_UPLOAD_MAX_BYTES, files: CLIMATE_UPLOAD_MAX_FILES, fields: 5, fieldSize: 8000 },
});

export function climateRouter(db: Knex, uploads: UploadPool): Router {
  const router = Router();

  router.get('/climate-sites', authorize(db, 'org:read'), async (req, res) => {
    res.json(await repo.listSites(db, orgContext(req).organizationId));
  });

  router.post('/climate-sites', authorize(db, 'project:write'), async (req, res) => {
    const input = climateSiteInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const id = await repo.insertSite(db, organizationId, user.id, input);
    const site = await repo.findSite(db, organizationId, id);
    res.status(201).location(`/api/v1/climate-sites/${id}`).json(site);
  });

  router.get('/climate-sites/:siteId', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const { organizationId } = orgContext(req);
    let site = await repo.findSite(db, organizationId, siteId);
    if (!site) throw siteNotFound();
    if (site.computed && site.computed.methodVersion !== METHOD_VERSION) {
      // Stored with an older method: recompute from the stored record.
      const elevation = site.elevationM;
      await db.transaction((trx) => recompute(trx, siteId, elevation));
      site = await repo.findSite(db, organizationId, siteId);
    }
    const referenceId = site?.estimate?.referenceSiteId;
    if (site && referenceId && estimateIsStale(site, await repo.findSite(db, organizationId, referenceId))) {
      // The reference's record or the method changed since: estimate again (a refusal keeps the stored estimate).
      try {
        await db.transaction((trx) => estimateRecord(trx, organizationId, siteId, referenceId));
        site = await repo.findSite(db, organizationId, siteId);
      } catch (err) {
        if (!(err instanceof HttpError)) throw err;
      }
    }
    res.json(site);
  });

  router.post('/climate-sites/:siteId/estimate', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const { referenceSiteId } = estimateInputSchema.parse(req.body);
    const { organizationId } = orgContext(req);
    if (!(await repo.findSite(db, organizationId, siteId))) throw siteNotFound();
    await db.transaction((trx) => estimateRecord(trx, organizationId, siteId, referenceSiteId));
    res.json(await repo.findSite(db, organizationId, siteId));
  });

  router.get('/climate-sites/:siteId/recent-years', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const site = await repo.findSite(db, orgContext(req).organizationId, siteId);
    if (!site) throw siteNotFound();
    const answer = await recentYears(db, site);
    if (!answer) throw new HttpError(404, 'no_record', 'This site has no hourly record yet');
    res.json(answer);
  });

  router.patch('/climate-sites/:siteId', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const patch = climateSitePatchSchema.parse(req.body);
    const { organizationId } = orgContext(req);
    await db.transaction(async (trx) => {
      const before = await repo.findSite(trx, organizationId, siteId);
      if (!before) throw siteNotFound();
      if (patch.publishedValues && before.sourceKind !== 'published') {
        throw new HttpError(422, 'not_published', 'This site computes its values from an hourly record', [
          { path: 'publishedValues', message: 'Only sites with published values take typed-in values' },
        ]);
      }
      await repo.updateSite(trx, organizationId, siteId, patch);
      // The station pressure, and so the humidity ratios, follow the elevation.
      if (patch.elevationM !== undefined && patch.elevationM !== before.elevationM && before.computed) {
        await recompute(trx, siteId, patch.elevationM);
      }
      // An estimated record follows the published values it was matched to (a refusal undoes the change).
      const after = await repo.findSite(trx, organizationId, siteId);
      const referenceId = after?.estimate?.referenceSiteId;
      if (after && referenceId && estimateIsStale(after, undefined)) {
        await estimateRecord(trx, organizationId, siteId, referenceId);
      }
      // Sites estimated from this one follow its record.
      if (patch.elevationM !== undefined && patch.elevationM !== before.elevationM && before.computed) {
        await refreshEstimatesFrom(trx, organizationId, siteId);
      }
    });
    res.json(await repo.findSite(db, organizationId, siteId));
  });

  router.delete('/climate-sites/:siteId', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    if (!(await repo.deleteSite(db, orgContext(req).organizationId, siteId))) throw siteNotFound();
    res.status(204).end();
  });

  router.get('/climate-sites/:siteId/chart-data', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const { organizationId } = orgContext(req);
    const data = await repo.chartData(db, organizationId, siteId);
    if (!data) {
      if (!(await repo.findSite(db, organizationId, siteId))) throw siteNotFound();
      throw new HttpError(404, 'no_record', 'This site has no hourly record yet');
    }
    res.json(data);
  });

  router.post(
    '/climate-sites/:siteId/uploads',
    authorize(db, 'project:write'),
    declaredSizeCheck,
    upload.array('files', CLIMATE_UPLOAD_MAX_FILES),
    async (req, res) => {
      const { siteId } = siteParam.parse(req.params);
      // Multipart fields arrive after the JSON-body text check ran: they pass the same check here.
      const fields = uploadFieldsSchema.parse(safeRequestTextSchema.parse(req.body ?? {}));
      let mapping: CsvMapping | undefined;
      if (fields.mapping) {
        let raw: unknown;
        try {
          raw = JSON.parse(fields.mapping);
        } catch {
          throw new HttpError(400, 'invalid_input', 'The column mapping is not valid JSON', [{ path: 'mapping', message: 'Not valid JSON' }]);
        }
        // JSON escapes (\u0000, \ud800) reach the text only now: check it again, under the field's name.
        safeRequestTextSchema.parse({ mapping: raw });
        mapping = mappingSchema.parse(raw);
      }
      const { organizationId, user } = orgContext(req);
      const site = await repo.findSite(db, organizationId, siteId);
      if (!site) throw siteNotFound();
      if (site.sourceKind !== 'hourly') {
        throw new HttpError(422, 'not_hourly', 'This site holds published values; create a site for an hourly record');
      }
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      const total = files.reduce((s, f) => s + f.size, 0);
      if (total > CLIMATE_UPLOAD_MAX_BYTES) {
        throw new HttpError(413, 'file_too_large', `An upload can hold at most ${CLIMATE_UPLOAD_MAX_BYTES / 1024 / 1024} MB`);
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
        format: fields.format,
        mapping,
        elevationM: site.elevationM,
        fileName,
      });
      if (!parsed.ok) throw new HttpError(parsed.status, parsed.code, parsed.message, parsed.details);
      const { format, rowCount, quality: summary, computed } = parsed;
      const expiresAt = new Date(Date.now() + UPLOAD_HOURS * 3_600_000);
      const [row] = await db('climate_uploads')
        .insert({
          organization_id: organizationId,
          climate_site_id: siteId,
          uploaded_by: user.id,
          file_name: fileName,
          format,
          row_count: rowCount,
          series: Buffer.from(parsed.series.buffer, parsed.series.byteOffset, parsed.series.byteLength),
          quality: JSON.stringify(summary),
          analysis: computed ? JSON.stringify(computed) : null,
          elevation_m: site.elevationM,
          sweep_index: parsed.sweepIndex ? Buffer.from(parsed.sweepIndex.bytes.buffer, parsed.sweepIndex.bytes.byteOffset, parsed.sweepIndex.bytes.byteLength) : null,
          sweep_index_key: parsed.sweepIndex?.key ?? null,
          expires_at: expiresAt,
        })
        .returning<{ id: string }[]>('id');
      if (!row) throw new Error('insert returned no row');
      const answer: ClimateUpload = {
        id: row.id,
        siteId,
        fileName,
        format,
        rowCount,
        quality: summary,
        preview: parsed.preview,
        warnings: [
          ...(station && station.missingYears.length > 0
            ? [`No file for ${station.missingYears.join(', ')} of ISD-Lite station ${station.id}: ${station.missingYears.length === 1 ? 'that year is' : 'those years are'} missing from the record.`]
            : []),
          ...parsed.warnings,
        ],
        station,
        expiresAt: expiresAt.toISOString(),
      };
      res.status(201).location(`/api/v1/climate-uploads/${row.id}`).json(answer);
    },
  );

  // The organisation's uploads being read and waiting their turn: the upload screen shows it while it waits.
  router.get('/climate-upload-queue', authorize(db, 'org:read'), (req, res) => {
    res.json(uploads.pendingFor(orgContext(req).organizationId));
  });

  router.post('/climate-uploads/:uploadId/confirm', authorize(db, 'project:write'), async (req, res) => {
    const { uploadId } = uploadParam.parse(req.params);
    const { organizationId } = orgContext(req);
    const siteId = await db.transaction(async (trx) => {
      const up = await trx('climate_uploads')
        .where({ id: uploadId, organization_id: organizationId })
        .where('expires_at', '>', trx.fn.now())
        .forUpdate()
        .first<
          | {
              climate_site_id: string;
              series: Buffer;
              file_name: string;
              row_count: number;
              analysis: repo.StoredComputation | null;
              elevation_m: number | null;
              sweep_index: Buffer | null;
              sweep_index_key: string | null;
            }
          | undefined
        >('climate_site_id', 'series', 'file_name', 'row_count', 'analysis', 'elevation_m', 'sweep_index', 'sweep_index_key');
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
      await trx('climate_uploads').where({ climate_site_id: up.climate_site_id }).delete();
      // Sites whose records are estimated from this one follow the new record.
      await refreshEstimatesFrom(trx, organizationId, up.climate_site_id);
      return up.climate_site_id;
    });
    res.json(await repo.findSite(db, organizationId, siteId));
  });

  router.delete('/climate-uploads/:uploadId', authorize(db, 'project:write'), async (req, res) => {
    const { uploadId } = uploadParam.parse(req.params);
    const n = await db('climate_uploads').where({ id: uploadId, organization_id: orgContext(req).organizationId }).delete();
    if (!n) throw new HttpError(404, 'not_found', 'That upload was not found');
    res.status(204).end();
  });

  return router;
}
