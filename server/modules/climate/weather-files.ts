import { gunzipSync } from 'node:zlib';
import { CLIMATE_UPLOAD_MAX_BYTES } from '@shared/climate-sites/climate-site-schemas';
import type { HourlySeries } from '@shared/climate/hourly-series';
import { createParser, detectFormat, type CsvMapping, type WeatherFileFormat } from '@shared/climate/readers';
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

/** Text of an uploaded file: gzip is unpacked; anything that is not text is refused (checked from the content, not the name). */
export function fileText(file: WeatherFile): string {
  let bytes = file.content;
  if (bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b) {
    try {
      bytes = gunzipSync(bytes, { maxOutputLength: MAX_UNPACKED_BYTES });
    } catch (err) {
      if ((err as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') {
        throw new HttpError(413, 'file_too_large', `${file.name} unpacks to more than ${MAX_UNPACKED_BYTES / MB} MB; nothing was stored`);
      }
      throw new HttpError(415, 'unsupported_file', `${file.name} looks compressed but could not be unpacked`);
    }
  }
  const sample = bytes.subarray(0, 64 * 1024);
  if (sample.includes(0)) {
    throw new HttpError(415, 'unsupported_file', `${file.name} is not a text file: upload a CSV or NOAA ISD-Lite text file`);
  }
  const text = bytes.toString('utf8');
  if (sample.length > 0 && text.slice(0, 4096).includes('\uFFFD')) {
    throw new HttpError(415, 'unsupported_file', `${file.name} is not UTF-8 text`);
  }
  return text;
}

/**
 * Reads one or more files with the streaming line parsers (line by line, without
 * splitting the whole text into an array). A bad file refuses the whole upload.
 */
export function readWeatherFiles(
  files: WeatherFile[],
  options: { format: 'auto' | WeatherFileFormat; mapping?: CsvMapping },
): { series: HourlySeries; format: WeatherFileFormat; rowCount: number } {
  if (files.length === 0) throw new HttpError(400, 'invalid_input', 'Choose a file to upload', [{ path: 'files', message: 'Choose a file' }]);
  const parts: HourlySeries[] = [];
  const problems: FieldIssue[] = [];
  let format: WeatherFileFormat | undefined;
  let rowCount = 0;
  let problemCount = 0;
  let unpacked = 0;
  for (const file of files) {
    const text = fileText(file);
    unpacked += text.length;
    if (unpacked > MAX_UNPACKED_TOTAL_BYTES) {
      throw new HttpError(413, 'file_too_large', `The files of one upload may hold at most ${MAX_UNPACKED_TOTAL_BYTES / MB} MB of text unpacked; nothing was stored`);
    }
    const firstLine = text.slice(0, !text.includes('\n') ? text.length : text.indexOf('\n')).trim();
    const fileFormat = options.format === 'auto' ? detectFormat(firstLine) : options.format;
    if (format && fileFormat !== format) {
      throw new HttpError(400, 'invalid_file', 'All files of one upload must have the same format', [
        { path: file.name, message: `This file looks like ${fileFormat}, the first one like ${format}` },
      ]);
    }
    format = fileFormat;
    const parser = createParser(fileFormat, { mapping: options.mapping });
    let start = 0;
    let line = 0;
    while (start <= text.length) {
      let end = text.indexOf('\n', start);
      if (end === -1) end = text.length;
      line++;
      const raw = text.slice(start, end);
      parser.push(raw.endsWith('\r') ? raw.slice(0, -1) : raw, line);
      start = end + 1;
    }
    const result = parser.finish();
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
