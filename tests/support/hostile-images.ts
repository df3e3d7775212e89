/** Images that pass a magic-byte check but are not what they claim, and small real ones to compare. */
import { crc32, deflateSync } from 'node:zlib';
import jpeg from 'jpeg-js';
import { PNG } from 'pngjs';

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typed));
  return Buffer.concat([length, typed, crc]);
}

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function header(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 6, 0, 0, 0], 8); // 8-bit RGBA, deflate, no filter method, no interlace
  return chunk('IHDR', ihdr);
}

/** A PNG whose signature, header and chunk checksums are all valid, but whose image data is not a zlib stream. */
export function corruptPng(): Buffer {
  const notZlib = Buffer.concat([Buffer.from([0x78, 0x9c]), Buffer.alloc(64, 0xff)]);
  return Buffer.concat([SIGNATURE, header(16, 16), chunk('IDAT', notZlib), chunk('IEND', Buffer.alloc(0))]);
}

/** A PNG that declares 100 000 × 100 000 pixels (a decompression bomb's header). */
export function hugePng(): Buffer {
  return Buffer.concat([
    SIGNATURE,
    header(100_000, 100_000),
    chunk('IDAT', deflateSync(Buffer.alloc(1000))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A JPEG start-of-image marker followed by a web page. */
export function junkJpeg(): Buffer {
  return Buffer.concat([
    Buffer.from([0xff, 0xd8, 0xff, 0xe0]),
    Buffer.from('<!doctype html><html><body>Not an image</body></html>'),
  ]);
}

/** An SVG sized 1e308 in both directions. */
export function hugeSvg(): Buffer {
  return Buffer.from(
    '<svg xmlns="http://www.w3.org/2000/svg" width="1e308" height="1e308" viewBox="0 0 1e308 1e308"><rect width="1e308" height="10" fill="#1D4E5F"/></svg>',
  );
}

function pixels(width: number, height: number): Buffer {
  const data = Buffer.alloc(width * height * 4);
  for (let i = 0; i < width * height; i++) data.set([(i * 7) % 256, 80, 95, 255], i * 4);
  return data;
}

/** A real 24 × 12 PNG, with an extra text chunk (which the stored copy drops). */
export function realPng(): Buffer {
  const png = new PNG({ width: 24, height: 12 });
  pixels(24, 12).copy(png.data);
  const plain = PNG.sync.write(png);
  const end = plain.length - 12; // before IEND
  return Buffer.concat([
    plain.subarray(0, end),
    chunk('tEXt', Buffer.from('Comment\0invented firm logo', 'latin1')),
    plain.subarray(end),
  ]);
}

/** A real 24 × 12 JPEG. */
export function realJpeg(): Buffer {
  return jpeg.encode({ width: 24, height: 12, data: pixels(24, 12) }, 90).data;
}
