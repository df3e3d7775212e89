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
export function createIsdLiteParser(): LineParser {
  const builder = new SeriesBuilder();
  const problems = new ProblemList();
  let lineCounter = 0;
  let lastLine = 0;
  let rows = 0;

  return {
    push(rawLine: string, lineNumber?: number): void {
      lineCounter++;
      const ln = lineNumber ?? lineCounter;
      lastLine = ln;
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
      const time = utcMillis(year, month, day, hour);
      if (time === undefined) {
        problems.add(ln, `Not a valid date and hour: ${fields.slice(0, 4).join(' ')}`);
        return;
      }
      const scaled = (v: number): number => (v === ISD_MISSING ? NaN : v / ISD_SCALE);
      builder.push(time, scaled(temperature), scaled(dewPoint), scaled(windSpeed), NaN);
      rows++;
    },
    finish(): ParseResult {
      if (rows === 0 && problems.count === 0) problems.add(Math.max(1, lastLine), 'The file is empty');
      if (problems.count > 0) return { ok: false, problems: problems.listed, problemCount: problems.count };
      return { ok: true, series: builder.build(), rowCount: rows };
    },
  };
}
