/**
 * The organisation's logo for reports: PNG, JPEG or SVG up to 1 MB, the type read from the content
 * (never the name); an SVG is cleaned with DOMPurify (SVG profile, no scripts, event handlers,
 * foreign objects or external references) before it is stored. Every logo is then read in full
 * (`logo-check.ts`): one that does not decode is refused at upload.
 */
import createDOMPurify from 'dompurify';
import { JSDOM } from 'jsdom';
import type { Knex } from 'knex';
import { HttpError } from '../../http/http-error';
import { checkLogo } from '../reports/logo-check';
import * as logos from './logos-repo';

export type { StoredLogo } from './logos-repo';

/** The organisation's stored logo, or null. */
export function loadLogo(db: Knex, organizationId: string): Promise<logos.StoredLogo | null> {
  return logos.findLogo(db, organizationId);
}

export function hasLogo(db: Knex, organizationId: string): Promise<boolean> {
  return logos.hasLogo(db, organizationId);
}

export function removeLogo(db: Knex, organizationId: string): Promise<void> {
  return logos.deleteLogo(db, organizationId);
}

const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const JPEG = Buffer.from([0xff, 0xd8, 0xff]);

/** The image type of the bytes (PNG and JPEG by their signatures, SVG by its root element), or null. */
export function sniffImage(content: Buffer): 'image/png' | 'image/jpeg' | 'image/svg+xml' | null {
  if (content.subarray(0, PNG.length).equals(PNG)) return 'image/png';
  if (content.subarray(0, JPEG.length).equals(JPEG)) return 'image/jpeg';
  const head = content
    .subarray(0, 2048)
    .toString('utf8')
    .replace(/^\uFEFF/, '');
  if (/^\s*(<\?xml[^>]*\?>\s*)?(<!--[\s\S]*?-->\s*)*(<!DOCTYPE svg[^>]*>\s*)?<svg[\s>]/i.test(head))
    return 'image/svg+xml';
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

/** Checks an uploaded file (400 with the reason otherwise), then stores it as the organisation's logo. */
export async function storeLogo(
  db: Knex,
  organizationId: string,
  file: { buffer: Buffer; originalname: string } | undefined,
): Promise<{ contentType: string; bytes: number }> {
  if (!file)
    throw new HttpError(400, 'invalid_file', 'Choose a PNG, JPEG or SVG file', [
      { path: 'logo', message: 'Choose a file' },
    ]);
  const type = sniffImage(file.buffer);
  if (!type) {
    throw new HttpError(400, 'invalid_file', 'The logo must be a PNG, JPEG or SVG image; this file is none of those', [
      { path: 'logo', message: `“${file.originalname}” is not a PNG, JPEG or SVG image` },
    ]);
  }
  let content = file.buffer;
  if (type === 'image/svg+xml') {
    const clean = sanitizeSvg(file.buffer.toString('utf8'));
    if (!clean)
      throw new HttpError(
        400,
        'invalid_file',
        'Nothing drawable is left in this SVG once scripts and links are removed',
        [{ path: 'logo', message: 'Not a usable SVG' }],
      );
    content = Buffer.from(clean, 'utf8');
  }
  // Decoded in full now, so that a file that only looks like an image is refused here, not when a PDF is made.
  const checked = checkLogo(type, content);
  if (!checked.ok) {
    throw new HttpError(
      400,
      'invalid_file',
      'This image could not be read; export it again as a PNG, JPEG or SVG and upload that',
      [{ path: 'logo', message: checked.reason }],
    );
  }
  content = checked.content;
  await logos.saveLogo(db, organizationId, { contentType: type, content });
  return { contentType: type, bytes: content.length };
}
