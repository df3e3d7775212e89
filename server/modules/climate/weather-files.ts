import { StringDecoder } from 'node:string_decoder';
import { createGunzip } from 'node:zlib';
import { CLIMATE_UPLOAD_MAX_BYTES } from '@shared/climate/climate-schemas';
import type { HourlySeries } from '@shared/climate/hourly-series';
import {
  createParser,
  detectFormat,
  type CsvMapping,
  type LineParser,
  type WeatherFileFormat,
} from '@shared/climate/readers';
import type { FieldIssue } from '@shared/api/api-error';
import { HttpError } from '../../http/http-error';
import { concatSeries } from './series-codec';

export interface WeatherFile {
  name: string;
  content: Buffer;
}

/** A compressed file may unpack to no more than an uncompressed one may be (a "zip bomb" is refused early). */
export const MAX_UNPACKED_BYTES = CLIMATE_UPLOAD_MAX_BYTES;
/** All the files of one upload together, unpacked (30 years of ISD-Lite is about 16 MB). */
export const MAX_UNPACKED_TOTAL_BYTES = 4 * CLIMATE_UPLOAD_MAX_BYTES;
const MB = 1024 * 1024;
const MAX_LISTED_PROBLEMS = 10;

/** A set of yearly ISD-Lite files of one station, read from their names (`USAF-WBAN-YYYY`, optionally `.gz`). */
export interface IsdLiteStation {
  /** `USAF-WBAN`, e.g. `725090-14739`. */
  id: string;
  years: number[];
  /** Years between the first and the last with no file (docs/methods.md#isd-lite-in-bulk). */
  missingYears: number[];
}

const ISD_LITE_NAME = /^(\d{6})-(\d{5})-(\d{4})(?:\.gz)?$/i;

/** The station and years of an upload whose every file is named `USAF-WBAN-YYYY[.gz]` of one station; null otherwise. */
export function isdLiteStation(fileNames: readonly string[]): IsdLiteStation | null {
  let id: string | null = null;
  const years = new Set<number>();
  for (const name of fileNames) {
    const m = ISD_LITE_NAME.exec(name.trim());
    if (!m) return null;
    const station = `${m[1] ?? ''}-${m[2] ?? ''}`;
    if (id !== null && station !== id) return null;
    id = station;
    years.add(Number(m[3]));
  }
  if (id === null) return null;
  const sorted = [...years].sort((a, b) => a - b);
  const missingYears: number[] = [];
  for (let y = sorted[0] ?? 0; y <= (sorted[sorted.length - 1] ?? 0); y++) if (!years.has(y)) missingYears.push(y);
  return { id, years: sorted, missingYears };
}

const SAMPLE_BYTES = 64 * 1024;
const SAMPLE_CHARS = 4096;

/**
 * The bytes of an uploaded file as they come: gzip is unpacked as a stream (the unpacked file is
 * never held whole), and a file that unpacks past the limit is stopped there ("zip bomb").
 */
async function* fileChunks(file: WeatherFile): AsyncGenerator<Buffer> {
  const bytes = file.content;
  if (!(bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b)) {
    yield bytes;
    return;
  }
  const gunzip = createGunzip({ chunkSize: 256 * 1024 });
  gunzip.end(bytes);
  let unpacked = 0;
  try {
    for await (const chunk of gunzip as AsyncIterable<Buffer>) {
      unpacked += chunk.length;
      if (unpacked > MAX_UNPACKED_BYTES) {
        throw new HttpError(
          413,
          'file_too_large',
          `${file.name} unpacks to more than ${MAX_UNPACKED_BYTES / MB} MB; nothing was stored`,
        );
      }
      yield chunk;
    }
  } catch (err) {
    if (err instanceof HttpError) throw err;
    throw new HttpError(415, 'unsupported_file', `${file.name} looks compressed but could not be unpacked`);
  } finally {
    gunzip.destroy();
  }
}

/**
 * Reads one file line by line as its bytes arrive, refusing anything that is not text (checked from
 * the content, not the name). Lines end at \n (a \r before it is dropped); the first line picks the
 * format when it is not given. Returns the parser's result and the bytes read.
 */
async function readFile(
  file: WeatherFile,
  options: { format: 'auto' | WeatherFileFormat; mapping?: CsvMapping },
  unpackedBefore: number,
): Promise<{ result: ReturnType<LineParser['finish']>; format: WeatherFileFormat; bytes: number }> {
  const decoder = new StringDecoder('utf8');
  let bytes = 0;
  let sampled = 0;
  let head = '';
  let pending = '';
  let line = 0;
  let parser: LineParser | undefined;
  let format: WeatherFileFormat | undefined;
  const push = (raw: string) => {
    line++;
    const text = raw.endsWith('\r') ? raw.slice(0, -1) : raw;
    if (parser === undefined) {
      format = options.format === 'auto' ? detectFormat(raw.trim()) : options.format;
      parser = createParser(format, { mapping: options.mapping });
    }
    parser.push(text, line);
  };
  const checkHead = (final: boolean) => {
    if (head.length >= SAMPLE_CHARS || final) {
      if (head.slice(0, SAMPLE_CHARS).includes('\uFFFD'))
        throw new HttpError(415, 'unsupported_file', `${file.name} is not UTF-8 text`);
      head = '';
      sampled = Infinity;
    }
  };
  for await (const chunk of fileChunks(file)) {
    bytes += chunk.length;
    if (unpackedBefore + bytes > MAX_UNPACKED_TOTAL_BYTES) {
      throw new HttpError(
        413,
        'file_too_large',
        `The files of one upload may hold at most ${MAX_UNPACKED_TOTAL_BYTES / MB} MB of text unpacked; nothing was stored`,
      );
    }
    if (sampled < SAMPLE_BYTES && chunk.subarray(0, SAMPLE_BYTES - sampled).includes(0)) {
      throw new HttpError(
        415,
        'unsupported_file',
        `${file.name} is not a text file: upload a CSV or NOAA ISD-Lite text file`,
      );
    }
    const text = decoder.write(chunk);
    if (sampled !== Infinity) {
      sampled += chunk.length;
      head += text;
      checkHead(false);
    }
    let start = 0;
    let end = text.indexOf('\n');
    while (end !== -1) {
      push(pending + text.slice(start, end));
      pending = '';
      start = end + 1;
      end = text.indexOf('\n', start);
    }
    pending += text.slice(start);
  }
  const rest = decoder.end();
  if (sampled !== Infinity) {
    head += rest;
    if (bytes > 0) checkHead(true);
  }
  push(pending + rest);
  if (!parser || !format) throw new Error('no line was read');
  return { result: parser.finish(), format, bytes };
}

/**
 * Reads one or more files with the streaming line parsers, each as it is unpacked (no file is
 * held whole as text). A bad file refuses the whole upload.
 */
export async function readWeatherFiles(
  files: WeatherFile[],
  options: { format: 'auto' | WeatherFileFormat; mapping?: CsvMapping },
): Promise<{ series: HourlySeries; format: WeatherFileFormat; rowCount: number }> {
  if (files.length === 0)
    throw new HttpError(400, 'invalid_input', 'Choose a file to upload', [{ path: 'files', message: 'Choose a file' }]);
  const parts: HourlySeries[] = [];
  const problems: FieldIssue[] = [];
  let format: WeatherFileFormat | undefined;
  let rowCount = 0;
  let problemCount = 0;
  let unpacked = 0;
  for (const file of files) {
    const read = await readFile(file, options, unpacked);
    unpacked += read.bytes;
    if (format && read.format !== format) {
      throw new HttpError(400, 'invalid_file', 'All files of one upload must have the same format', [
        { path: file.name, message: `This file looks like ${read.format}, the first one like ${format}` },
      ]);
    }
    format = read.format;
    const result = read.result;
    if (result.ok) {
      parts.push(result.series);
      rowCount += result.rowCount;
    } else {
      problemCount += result.problemCount;
      const label = files.length > 1 ? `${file.name} line` : 'line';
      for (const p of result.problems) {
        if (problems.length < MAX_LISTED_PROBLEMS) problems.push({ path: `${label} ${p.line}`, message: p.message });
      }
    }
  }
  if (problems.length > 0 || !format) {
    throw new HttpError(
      400,
      'invalid_file',
      `The file was refused: ${problemCount} problem${problemCount === 1 ? '' : 's'} found (the first are listed). Nothing was stored.`,
      problems,
    );
  }
  return { series: concatSeries(parts), format, rowCount };
}
