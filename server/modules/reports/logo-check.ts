/**
 * A logo is read in full before it is kept and again before it is printed: a PNG is decoded
 * (pngjs) and stored re-encoded as a clean PNG, a JPEG is decoded (jpeg-js) and kept as sent, and an
 * SVG's size and numbers are bounded. A file that passes its magic bytes but does not decode (a
 * corrupt compressed stream, HTML after a JPEG header, an SVG sized 1e308) is refused here.
 */
import jpeg from 'jpeg-js';
import { JSDOM } from 'jsdom';
import { PNG } from 'pngjs';
import { inflateSync } from 'node:zlib';

export type LogoType = 'image/png' | 'image/jpeg' | 'image/svg+xml';

/** A logo larger than this many pixels a side is refused (a report prints it 140 × 48 points). */
export const LOGO_MAX_PIXELS_A_SIDE = 4000;
/** An SVG number (size, coordinate) beyond this is refused: no drawing needs it and PDF writers cannot print it. */
export const SVG_MAX_NUMBER = 1e6;

export type LogoCheck = { ok: true; content: Buffer } | { ok: false; reason: string };

const fail = (reason: string): LogoCheck => ({ ok: false, reason });

function sizeReason(width: number, height: number): string | null {
  if (!(width > 0 && height > 0)) return 'the image has no size';
  if (width > LOGO_MAX_PIXELS_A_SIDE || height > LOGO_MAX_PIXELS_A_SIDE) {
    return `the image is ${width} × ${height} pixels; at most ${LOGO_MAX_PIXELS_A_SIDE} a side is accepted`;
  }
  return null;
}

function checkPng(content: Buffer): LogoCheck {
  // The size sits in the header chunk: read it before inflating anything.
  if (content.length < 33 || content.toString('latin1', 12, 16) !== 'IHDR') return fail('the PNG has no header chunk');
  const tooBig = sizeReason(content.readUInt32BE(16), content.readUInt32BE(20));
  if (tooBig) return fail(tooBig);
  try {
    // pngjs does not report every broken zlib stream (it can return uninitialised pixels), so the
    // image data is inflated here first, where a corrupt stream throws.
    const idat: Buffer[] = [];
    for (let at = 8; at + 12 <= content.length;) {
      const length = content.readUInt32BE(at);
      if (content.toString('latin1', at + 4, at + 8) === 'IDAT') idat.push(content.subarray(at + 8, at + 8 + length));
      at += 12 + length;
    }
    const width = content.readUInt32BE(16);
    inflateSync(Buffer.concat(idat), { maxOutputLength: (width * 8 + 1) * content.readUInt32BE(20) });
    const image = PNG.sync.read(content);
    const clean = new PNG({ width: image.width, height: image.height });
    image.data.copy(clean.data);
    return { ok: true, content: PNG.sync.write(clean, { colorType: 6 }) };
  } catch (err) {
    return fail(`the PNG could not be decoded (${err instanceof Error ? err.message : String(err)})`);
  }
}

function checkJpeg(content: Buffer): LogoCheck {
  try {
    const image = jpeg.decode(content, {
      useTArray: true,
      tolerantDecoding: false,
      maxResolutionInMP: 16,
      maxMemoryUsageInMB: 128,
    });
    const tooBig = sizeReason(image.width, image.height);
    return tooBig ? fail(tooBig) : { ok: true, content };
  } catch (err) {
    return fail(`the JPEG could not be decoded (${err instanceof Error ? err.message : String(err)})`);
  }
}

const NUMBER = /[-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?/gi;

function checkSvg(content: Buffer): LogoCheck {
  const window = new JSDOM('').window;
  try {
    const doc = new window.DOMParser().parseFromString(content.toString('utf8'), 'image/svg+xml');
    const root = doc.documentElement;
    if (root.nodeName.toLowerCase() !== 'svg' || doc.getElementsByTagName('parsererror').length > 0)
      return fail('the SVG is not well-formed');
    for (const el of [root, ...Array.from(root.getElementsByTagName('*'))]) {
      for (const attr of Array.from(el.attributes)) {
        if (attr.name === 'id' || attr.name === 'class' || attr.name.startsWith('xmlns')) continue;
        for (const n of attr.value.match(NUMBER) ?? []) {
          const value = Number(n);
          if (!Number.isFinite(value) || Math.abs(value) > SVG_MAX_NUMBER) {
            return fail(`the SVG's ${attr.name}="${attr.value.slice(0, 40)}" on <${el.nodeName}> is out of range`);
          }
        }
      }
    }
    return { ok: true, content };
  } finally {
    window.close();
  }
}

/** Reads the whole image; the content to keep (a PNG re-encoded) or why it cannot be used. */
export function checkLogo(type: LogoType, content: Buffer): LogoCheck {
  if (type === 'image/png') return checkPng(content);
  if (type === 'image/jpeg') return checkJpeg(content);
  return checkSvg(content);
}
