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
} from '@shared/climate/climate-schemas';
import { csvFields, type CsvMapping } from '@shared/climate/readers/csv-reader';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import * as climate from './climate-service';
import type { UploadPool } from './upload-pool';
import * as uploadsService from './uploads-service';

const siteParam = z.object({ siteId: z.uuid('Unknown climate site') });
const uploadParam = z.object({ uploadId: z.uuid('Unknown upload') });
const mappingSchema = z.partialRecord(z.enum(csvFields), z.string().min(1).max(200));

/** Multipart framing around the files: a request declaring more than this over the upload limit is refused before it is read. */
const MULTIPART_SLACK_BYTES = 1024 * 1024;

/** 413 at once for an upload whose declared length is over the limit (nothing of it is read or kept). */
const declaredSizeCheck: RequestHandler = (req, _res, next) => {
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > CLIMATE_UPLOAD_MAX_BYTES + MULTIPART_SLACK_BYTES) {
    next(
      new HttpError(413, 'file_too_large', `An upload can hold at most ${CLIMATE_UPLOAD_MAX_BYTES / 1024 / 1024} MB`),
    );
    return;
  }
  next();
};

const upload = multer({
  storage: multer.memoryStorage(),
  // File names are UTF-8 (as browsers send them): café.csv stays café.csv.
  defParamCharset: 'utf8',
  limits: { fileSize: CLIMATE_UPLOAD_MAX_BYTES, files: CLIMATE_UPLOAD_MAX_FILES, fields: 5, fieldSize: 8000 },
});

export function climateRouter(db: Knex, uploads: UploadPool): Router {
  const router = Router();

  router.get('/climate-sites', authorize(db, 'org:read'), async (req, res) => {
    res.json(await climate.listSites(db, orgContext(req).organizationId));
  });

  router.post('/climate-sites', authorize(db, 'project:write'), async (req, res) => {
    const input = climateSiteInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const { id, site } = await climate.createSite(db, organizationId, user.id, input);
    res.status(201).location(`/api/v1/climate-sites/${id}`).json(site);
  });

  router.get('/climate-sites/:siteId', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    res.json(await climate.currentSite(db, orgContext(req).organizationId, siteId));
  });

  router.post('/climate-sites/:siteId/estimate', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const { referenceSiteId } = estimateInputSchema.parse(req.body);
    res.json(await climate.estimateSite(db, orgContext(req).organizationId, siteId, referenceSiteId));
  });

  router.get('/climate-sites/:siteId/recent-years', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    res.json(await climate.siteRecentYears(db, orgContext(req).organizationId, siteId));
  });

  router.patch('/climate-sites/:siteId', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    const patch = climateSitePatchSchema.parse(req.body);
    res.json(await climate.patchSite(db, orgContext(req).organizationId, siteId, patch));
  });

  router.delete('/climate-sites/:siteId', authorize(db, 'project:write'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    await climate.deleteSite(db, orgContext(req).organizationId, siteId);
    res.status(204).end();
  });

  router.get('/climate-sites/:siteId/chart-data', authorize(db, 'org:read'), async (req, res) => {
    const { siteId } = siteParam.parse(req.params);
    res.json(await climate.siteChartData(db, orgContext(req).organizationId, siteId));
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
          throw new HttpError(400, 'invalid_input', 'The column mapping is not valid JSON', [
            { path: 'mapping', message: 'Not valid JSON' },
          ]);
        }
        // JSON escapes (\u0000, \ud800) reach the text only now: check it again, under the field's name.
        safeRequestTextSchema.parse({ mapping: raw });
        mapping = mappingSchema.parse(raw);
      }
      const { organizationId, user } = orgContext(req);
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      const answer = await uploadsService.receiveUpload(
        db,
        uploads,
        { organizationId, userId: user.id },
        siteId,
        files,
        { format: fields.format, mapping },
      );
      res.status(201).location(`/api/v1/climate-uploads/${answer.id}`).json(answer);
    },
  );

  // The organisation's uploads being read and waiting their turn: the upload screen shows it while it waits.
  router.get('/climate-upload-queue', authorize(db, 'org:read'), (req, res) => {
    res.json(uploads.pendingFor(orgContext(req).organizationId));
  });

  router.post('/climate-uploads/:uploadId/confirm', authorize(db, 'project:write'), async (req, res) => {
    const { uploadId } = uploadParam.parse(req.params);
    res.json(await uploadsService.confirmUpload(db, orgContext(req).organizationId, uploadId));
  });

  router.delete('/climate-uploads/:uploadId', authorize(db, 'project:write'), async (req, res) => {
    const { uploadId } = uploadParam.parse(req.params);
    await uploadsService.discardUpload(db, orgContext(req).organizationId, uploadId);
    res.status(204).end();
  });

  return router;
}
