/**
 * The organisation's logo for reports (`/api/v1/organization/logo`): PNG, JPEG or SVG up to 1 MB,
 * the type read from the content (never the name); an SVG is cleaned with DOMPurify (SVG profile, no
 * scripts, event handlers, foreign objects or external references) before it is stored. Every logo
 * is then read in full (`logo-check.ts`): one that does not decode is refused at upload.
 */
import createDOMPurify from 'dompurify';
import { Router, type Response } from 'express';
import { JSDOM } from 'jsdom';
import type { Knex } from 'knex';
import multer from 'multer';
import { LOGO_MAX_BYTES } from '@shared/reports/report-schemas';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import { checkLogo } from './logo-check';

const upload = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: LOGO_MAX_BYTES, files: 1, fields: 0 } });

export async function loadLogo(db: Knex, organizationId: string): Promise<{ contentType: string; content: Buffer } | null> {
  const row = await db('organization_logos')
    .where({ organization_id: organizationId })
    .first<{ content_type: string; content: Buffer } | undefined>('content_type', 'content');
  return row ? { contentType: row.content_type, content: row.content } : null;
}

const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const JPEG = Buffer.from([0xff, 0xd8, 0xff]);

/** The image type of the bytes (PNG and JPEG by their signatures, SVG by its root element), or null. */
export function sniffImage(content: Buffer): 'image/png' | 'image/jpeg' | 'image/svg+xml' | null {
  if (content.subarray(0, PNG.length).equals(PNG)) return 'image/png';
  if (content.subarray(0, JPEG.length).equals(JPEG)) return 'image/jpeg';
  const head = content.subarray(0, 2048).toString('utf8').replace(/^\uFEFF/, '');
  if (/^\s*(<\?xml[^>]*\?>\s*)?(<!--[\s\S]*?-->\s*)*(<!DOCTYPE svg[^>]*>\s*)?<svg[\s>]/i.test(head)) return 'image/svg+xml';
  return null;
}

/** The SVG with everything that could run or fetch removed; null when nothing drawable is left. */
export function sanitizeSvg(svg: string): string | null {
  const window = new JSDOM('').window;
  const purify = createDOMPurify(window);
  const clean = purify.sanitize(svg, {
    USE_PROFILES: { svg: true, svgFilters: true },
    FORBID_TAGS: ['script', 'foreignObject', 'use', 'image', 'style', 'a'],
    FORBID_ATTR: ['href', 'xlink:href', 'style'],
  });
  window.close();
  return /<svg[\s>]/i.test(clean) ? clean : null;
}

export function logoRouter(db: Knex): Router {
  const router = Router();

  router.get('/organization/logo', authorize(db, 'org:read'), async (req, res) => {
    const logo = await loadLogo(db, orgContext(req).organizationId);
    if (!logo) throw new HttpError(404, 'not_found', 'This organisation has no logo');
    sendLogo(res, logo);
  });

  /** Whether the organisation has a logo, always 200, so a page without one asks without a failed request. */
  router.get('/organization/logo-status', authorize(db, 'org:read'), async (req, res) => {
    const row: unknown = await db('organization_logos').where({ organization_id: orgContext(req).organizationId }).first('organization_id');
    res.json({ hasLogo: Boolean(row) });
  });

  router.put('/organization/logo', authorize(db, 'member:manage'), upload.single('logo'), async (req, res) => {
    const file = req.file;
    if (!file) throw new HttpError(400, 'invalid_file', 'Choose a PNG, JPEG or SVG file', [{ path: 'logo', message: 'Choose a file' }]);
    const type = sniffImage(file.buffer);
    if (!type) {
      throw new HttpError(400, 'invalid_file', 'The logo must be a PNG, JPEG or SVG image; this file is none of those', [
        { path: 'logo', message: `“${file.originalname}” is not a PNG, JPEG or SVG image` },
      ]);
    }
    let content = file.buffer;
    if (type === 'image/svg+xml') {
      const clean = sanitizeSvg(file.buffer.toString('utf8'));
      if (!clean) throw new HttpError(400, 'invalid_file', 'Nothing drawable is left in this SVG once scripts and links are removed', [{ path: 'logo', message: 'Not a usable SVG' }]);
      content = Buffer.from(clean, 'utf8');
    }
    // Decoded in full now, so that a file that only looks like an image is refused here, not when a PDF is made.
    const checked = checkLogo(type, content);
    if (!checked.ok) {
      throw new HttpError(400, 'invalid_file', 'This image could not be read; export it again as a PNG, JPEG or SVG and upload that', [
        { path: 'logo', message: checked.reason },
      ]);
    }
    content = checked.content;
    await db('organization_logos')
      .insert({ organization_id: orgContext(req).organizationId, content_type: type, content, updated_at: db.fn.now() })
      .onConflict('organization_id')
      .merge();
    res.json({ contentType: type, bytes: content.length });
  });

  router.delete('/organization/logo', authorize(db, 'member:manage'), async (req, res) => {
    await db('organization_logos').where({ organization_id: orgContext(req).organizationId }).delete();
    res.status(204).end();
  });

  return router;
}

/** A stored logo, with headers that keep an SVG from running anything even if opened directly. */
export function sendLogo(res: Response, logo: { contentType: string; content: Buffer }): void {
  res
    .type(logo.contentType)
    .set('X-Content-Type-Options', 'nosniff')
    .set('Content-Security-Policy', "default-src 'none'; style-src 'unsafe-inline'; sandbox")
    .set('Cache-Control', 'private, max-age=300')
    .send(logo.content);
}
