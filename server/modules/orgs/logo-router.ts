/** The organisation's logo for reports (`/api/v1/organization/logo`); the checks are in `logo-service.ts`. */
import { Router, type Response } from 'express';
import type { Knex } from 'knex';
import multer from 'multer';
import { LOGO_MAX_BYTES } from '@shared/reports/report-schemas';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import * as logos from './logo-service';

const upload = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  limits: { fileSize: LOGO_MAX_BYTES, files: 1, fields: 0 },
});

export function logoRouter(db: Knex): Router {
  const router = Router();

  router.get('/organization/logo', authorize(db, 'org:read'), async (req, res) => {
    const logo = await logos.loadLogo(db, orgContext(req).organizationId);
    if (!logo) throw new HttpError(404, 'not_found', 'This organisation has no logo');
    sendLogo(res, logo);
  });

  /** Whether the organisation has a logo, always 200, so a page without one asks without a failed request. */
  router.get('/organization/logo-status', authorize(db, 'org:read'), async (req, res) => {
    res.json({ hasLogo: await logos.hasLogo(db, orgContext(req).organizationId) });
  });

  router.put('/organization/logo', authorize(db, 'member:manage'), upload.single('logo'), async (req, res) => {
    res.json(await logos.storeLogo(db, orgContext(req).organizationId, req.file));
  });

  router.delete('/organization/logo', authorize(db, 'member:manage'), async (req, res) => {
    await logos.removeLogo(db, orgContext(req).organizationId);
    res.status(204).end();
  });

  return router;
}

/** A stored logo, with headers that keep an SVG from running anything even if opened directly. */
export function sendLogo(res: Response, logo: logos.StoredLogo): void {
  res
    .type(logo.contentType)
    .set('X-Content-Type-Options', 'nosniff')
    .set('Content-Security-Policy', "default-src 'none'; style-src 'unsafe-inline'; sandbox")
    .set('Cache-Control', 'private, max-age=300')
    .send(logo.content);
}
