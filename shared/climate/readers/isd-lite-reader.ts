/**
 * Streaming reader for NOAA ISD-Lite hourly files: no header, 12 whitespace-separated integer
 * fields per line — year, month, day, hour (UTC), air temperature (°C ×10), dew point (°C ×10),
 * sea-level pressure (hPa ×10), wind direction (°), wind speed (m/s ×10), sky cover code,
 * 1-h and 6-h precipitation (mm ×10); −9999 = missing (NOAA NCEI ISD-Lite format document).
 * Several yearly files may be concatenated in one upload. Station pressure is not part of the
 * format, so it is left missing (use the site elevation).
 */
import { utcMillis } from './iso-time';
import { type LineParser, parseDecimal, ProblemList, type ParseResult } from './parse-result';
import { SeriesBuilder } from './series-builder';

export const ISD_LITE_FIELDS = 12;
const ISD_MISSING = -9999;
const ISD_SCALE = 10;
const INTEGER = /^[+-]?\d+$/;

const FIELD_NAMES = [
  'year',
  'month',
  'day',
  'hour',
  'air temperature',
  'dew point',
  'sea-level pressure',
  'wind direction',
  'wind speed',
  'sky cover',
  '1-hour precipitation',
  '6-hour precipitation',
] as const;

/** Whether a line looks like ISD-Lite (12 integer fields starting with a plausible date). */
export function looksLikeIsdLite(line: string): boolean {
  const fields = line.trim().split(/\s+/);
  return fields.length === ISD_LITE_FIELDS && fields.every((f) => INTEGER.test(f)) && /^\d{4}$/.test(fields[0] ?? '');
}

/** Creates an incremental parser for ISD-Lite text. */
const isBlank = (c: number): boolean => c === 32 || c === 9 || c === 13;

/**
 * The twelve whole numbers of a line of the usual form (spaces or tabs between signed digits), read
 * without splitting the line; false for anything else, which the full reading then reports on. The
 * same values as the full reading (at most 15 digits a number, so that each is exact).
 */
function readIsdFields(line: string, out: Float64Array): boolean {
  const n = line.length;
  let i = 0;
  let k = 0;
  for (;;) {
    while (i < n && isBlank(line.charCodeAt(i))) i++;
    if (i >= n) break;
    if (k === ISD_LITE_FIELDS) return false;
    let c = line.charCodeAt(i);
    let sign = 1;
    if (c === 45) {
      sign = -1;
      i++;
    } else if (c === 43) i++;
    let v = 0;
    let digits = 0;
    while (i < n && (c = line.charCodeAt(i)) >= 48 && c <= 57) {
      v = v * 10 + (c - 48);
      i++;
      digits++;
    }
    if (digits === 0 || digits > 15 || (i < n && !isBlank(line.charCodeAt(i)))) return false;
    out[k++] = sign * v;
  }
  return k === ISD_LITE_FIELDS;
}

export function createIsdLiteParser(): LineParser {
  const builder = new SeriesBuilder();
  const problems = new ProblemList();
  let lineCounter = 0;
  let lastLine = 0;
  let rows = 0;
  const quick = new Float64Array(ISD_LITE_FIELDS);
  const scaled = (v: number): number => (v === ISD_MISSING ? NaN : v / ISD_SCALE);
  const accept = (
    ln: number,
    year: number,
    month: number,
    day: number,
    hour: number,
    temperature: number,
    dewPoint: number,
    windSpeed: number,
    line: string,
  ): void => {
    const time = utcMillis(year, month, day, hour);
    if (time === undefined) {
      problems.add(ln, `Not a valid date and hour: ${line.trim().split(/\s+/).slice(0, 4).join(' ')}`);
      return;
    }
    builder.push(time, scaled(temperature), scaled(dewPoint), scaled(windSpeed), NaN);
    rows++;
  };

  return {
    push(rawLine: string, lineNumber?: number): void {
      lineCounter++;
      const ln = lineNumber ?? lineCounter;
      lastLine = ln;
      if (readIsdFields(rawLine, quick)) {
        accept(
          ln,
          quick[0] ?? 0,
          quick[1] ?? 0,
          quick[2] ?? 0,
          quick[3] ?? 0,
          quick[4] ?? 0,
          quick[5] ?? 0,
          quick[8] ?? 0,
          rawLine,
        );
        return;
      }
      const line = rawLine.replace(/^\uFEFF/, '').trim();
      if (line === '') return;
      const fields = line.split(/\s+/);
      if (fields.length !== ISD_LITE_FIELDS) {
        problems.add(ln, `Expected ${ISD_LITE_FIELDS} fields, found ${fields.length}`);
        return;
      }
      const values: number[] = [];
      for (let k = 0; k < ISD_LITE_FIELDS; k++) {
        const text = fields[k] ?? '';
        const v = INTEGER.test(text) ? parseDecimal(text) : undefined;
        if (v === undefined) {
          problems.add(ln, `Field ${k + 1} (${FIELD_NAMES[k] ?? ''}): "${text}" is not a whole number`);
          return;
        }
        values.push(v);
      }
      const [year = 0, month = 0, day = 0, hour = 0, temperature = 0, dewPoint = 0, , , windSpeed = 0] = values;
      accept(ln, year, month, day, hour, temperature, dewPoint, windSpeed, line);
    },
    finish(): ParseResult {
      if (rows === 0 && problems.count === 0) problems.add(Math.max(1, lastLine), 'The file is empty');
      if (problems.count > 0) return { ok: false, problems: problems.listed, problemCount: problems.count };
      return { ok: true, series: builder.build(), rowCount: rows };
    },
  };
}
