/**
 * Streaming reader for the generic hourly CSV: a header row that names the units, then one row per
 * observation. Columns (case-insensitive):
 *   time (ISO 8601; UTC when no offset), dry_bulb_c | dry_bulb_f (required),
 *   dew_point_c | dew_point_f, wind_speed_ms | wind_speed_mph | wind_speed_kn, station_pressure_kpa.
 * Other columns are ignored. An empty cell, `NA` or −9999 is a missing value. Quoted fields and a
 * UTF-8 byte-order mark are accepted; lines starting with `#` and blank lines are skipped.
 */
import { fahrenheitToCelsius, knotsToMs, mphToMs } from '../../units/units';
import { parseIsoDateTime } from './iso-time';
import { type LineParser, parseDecimal, ProblemList, type ParseResult } from './parse-result';
import { SeriesBuilder } from './series-builder';

export const csvFields = [
  'time',
  'dry_bulb_c',
  'dry_bulb_f',
  'dew_point_c',
  'dew_point_f',
  'wind_speed_ms',
  'wind_speed_mph',
  'wind_speed_kn',
  'station_pressure_kpa',
] as const;
export type CsvField = (typeof csvFields)[number];

/** Maps our field names to the file's own column names, e.g. `{ time: 'Date/Time', dry_bulb_c: 'Temp' }`. */
export type CsvMapping = Partial<Record<CsvField, string>>;

export interface CsvParserOptions {
  /** Columns of the file to read each field from; unmapped fields are looked up by their own names. */
  mapping?: CsvMapping;
}

/** Value used by many weather files for "missing". */
export const MISSING_SENTINEL = -9999;

const BOM = '\uFEFF';

function normaliseName(name: string): string {
  return name.replace(BOM, '').trim().toLowerCase();
}

function detectDelimiter(headerLine: string): string {
  if (headerLine.includes(',')) return ',';
  if (headerLine.includes(';')) return ';';
  if (headerLine.includes('\t')) return '\t';
  return ',';
}

/**
 * Splits one CSV line into fields (RFC 4180 quoting within the line: `"a, b"`, `"say ""hi"""`).
 * Returns undefined when a quoted field is not closed on the line.
 */
export function splitCsvLine(line: string, delimiter = ','): string[] | undefined {
  const fields: string[] = [];
  let i = 0;
  const n = line.length;
  for (;;) {
    let field = '';
    while (i < n && line[i] === ' ') i++;
    if (line[i] === '"') {
      i++;
      let closed = false;
      while (i < n) {
        const c = line.charAt(i);
        if (c === '"') {
          if (line[i + 1] === '"') {
            field += '"';
            i += 2;
          } else {
            i++;
            closed = true;
            break;
          }
        } else {
          field += c;
          i++;
        }
      }
      if (!closed) return undefined;
      while (i < n && line[i] !== delimiter) i++;
    } else {
      const next = line.indexOf(delimiter, i);
      const end = next === -1 ? n : next;
      field = line.slice(i, end);
      i = end;
    }
    fields.push(field.trim());
    if (i >= n) break;
    i++; // the delimiter
    if (i === n) {
      fields.push('');
      break;
    }
  }
  return fields;
}

/** A cell as a number: NaN for missing (empty, NA, −9999), undefined when it is not a number. */
function parseCell(text: string): number | undefined {
  if (text === '') return NaN;
  const v = parseDecimal(text);
  if (v === undefined) {
    const upper = text.toUpperCase();
    return upper === 'NA' || upper === 'N/A' ? NaN : undefined;
  }
  return v === MISSING_SENTINEL ? NaN : v;
}

/** A value cell of a row read in full: its number, or undefined after reporting it. */
function cellOf(
  p: ColumnPlan,
  fields: string[],
  index: number,
  lineNumber: number,
  problems: ProblemList,
): number | undefined {
  if (index < 0) return NaN;
  const text = fields[index] ?? '';
  const v = parseCell(text);
  if (v === undefined) problems.add(lineNumber, `Column "${p.names[index] ?? ''}": "${text}" is not a number`);
  return v;
}

/** A value cell of a row read quickly: NaN for an empty cell or the missing-value sentinel, undefined for anything to read in full. */
function quickCell(line: string, starts: Int32Array, ends: Int32Array, index: number): number | undefined {
  if (index < 0) return NaN;
  const start = starts[index] ?? 0;
  const end = ends[index] ?? 0;
  if (start === end) return NaN;
  const v = quickDecimal(line, start, end);
  return v === MISSING_SENTINEL ? NaN : v;
}

const POWERS_OF_TEN = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * `line[start, end)` as a plain decimal (sign, digits, optional fraction; at most 15 digits, no
 * exponent), or undefined for any other text. Exact: the digits make an integer below 2⁵³ and the
 * power of ten is exact, so their quotient is the correctly rounded value, as `Number` gives.
 */
function quickDecimal(line: string, start: number, end: number): number | undefined {
  let i = start;
  let c = line.charCodeAt(i);
  let negative = false;
  if (c === 45 || c === 43) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = -1;
  for (; i < end; i++) {
    c = line.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (fraction >= 0) fraction++;
    } else if (c === 46 && fraction < 0) fraction = 0;
    else return undefined;
  }
  if (digits === 0 || digits > 15) return undefined;
  const value = fraction > 0 ? mantissa / (POWERS_OF_TEN[fraction] ?? NaN) : mantissa;
  return negative ? -value : value;
}

export interface CsvHeaderInspection {
  /** Column names as written (quotes, spaces and byte-order mark removed). */
  columns: string[];
  /** A guess of which column holds each field; check it with the user before use. */
  suggestedMapping: CsvMapping;
  /** Required fields no column could be matched to. */
  missingRequired: ('time' | 'dry_bulb')[];
}

function unitTokens(name: string): Set<string> {
  return new Set(
    name
      .toLowerCase()
      .replace('°', 'deg')
      .split(/[^a-z0-9]+/)
      .filter((t) => t.length > 0),
  );
}

/** Reads a header line and suggests which column holds each field. */
export function inspectCsvHeader(line: string): CsvHeaderInspection {
  const stripped = line.replace(BOM, '');
  const columns = (splitCsvLine(stripped, detectDelimiter(stripped)) ?? stripped.split(',')).map((c) => c.trim());
  const suggestedMapping: CsvMapping = {};
  const taken = new Set<string>();
  const assign = (field: CsvField, column: string): void => {
    if (suggestedMapping[field] === undefined && !taken.has(column)) {
      suggestedMapping[field] = column;
      taken.add(column);
    }
  };
  // Exact names first.
  for (const column of columns) {
    const name = normaliseName(column);
    for (const field of csvFields) if (name === field) assign(field, column);
  }
  const hasAny = (...fields: CsvField[]): boolean => fields.some((f) => suggestedMapping[f] !== undefined);
  for (const column of columns) {
    if (taken.has(column)) continue;
    const name = normaliseName(column);
    const tokens = unitTokens(column);
    const fahrenheit = tokens.has('f') || tokens.has('degf') || tokens.has('fahrenheit');
    if (!hasAny('time') && /time|date|utc/.test(name)) {
      assign('time', column);
    } else if (!hasAny('dew_point_c', 'dew_point_f') && /dew|tdp/.test(name)) {
      assign(fahrenheit ? 'dew_point_f' : 'dew_point_c', column);
    } else if (
      !hasAny('dry_bulb_c', 'dry_bulb_f') &&
      (/dry.?bulb|temp|tdb|t2m/.test(name) || name === 't') &&
      !/wet|dew|soil|water/.test(name)
    ) {
      assign(fahrenheit ? 'dry_bulb_f' : 'dry_bulb_c', column);
    } else if (
      !hasAny('wind_speed_ms', 'wind_speed_mph', 'wind_speed_kn') &&
      (/wind.?(speed|spd)|^ws$|^wspd$/.test(name) || (name.includes('wind') && !/dir|gust/.test(name)))
    ) {
      const knots = tokens.has('kn') || tokens.has('kt') || tokens.has('kts') || tokens.has('knots');
      assign(tokens.has('mph') ? 'wind_speed_mph' : knots ? 'wind_speed_kn' : 'wind_speed_ms', column);
    } else if (!hasAny('station_pressure_kpa') && tokens.has('kpa') && !name.includes('sea')) {
      assign('station_pressure_kpa', column);
    }
  }
  const missingRequired: ('time' | 'dry_bulb')[] = [];
  if (!hasAny('time')) missingRequired.push('time');
  if (!hasAny('dry_bulb_c', 'dry_bulb_f')) missingRequired.push('dry_bulb');
  return { columns, suggestedMapping, missingRequired };
}

interface ColumnPlan {
  delimiter: string;
  width: number;
  time: number;
  dryBulb: number;
  dryBulbFahrenheit: boolean;
  dewPoint: number;
  dewPointFahrenheit: boolean;
  wind: number;
  windToMs: (v: number) => number;
  pressure: number;
  names: string[];
  /** Where each field of the row being read quickly starts and ends (one pair per column). */
  starts: Int32Array;
  ends: Int32Array;
}

/** Creates an incremental parser for the generic hourly CSV. */
export function createCsvParser(options: CsvParserOptions = {}): LineParser {
  const builder = new SeriesBuilder();
  const problems = new ProblemList();
  let lineCounter = 0;
  let plan: ColumnPlan | undefined;
  let headerFailed = false;
  let headerLine = 0;
  let lastLine = 0;
  let rows = 0;

  const readHeader = (line: string, lineNumber: number): void => {
    const delimiter = detectDelimiter(line);
    const fields = splitCsvLine(line, delimiter);
    if (fields === undefined) {
      problems.add(lineNumber, 'The header has a quoted name that is not closed');
      headerFailed = true;
      return;
    }
    const names = fields.map(normaliseName);
    const mapping = options.mapping ?? {};
    const headerProblems: string[] = [];
    const indexOf = (field: CsvField): number => {
      const mapped = mapping[field];
      if (mapped !== undefined) {
        const index = names.indexOf(normaliseName(mapped));
        if (index === -1) headerProblems.push(`Column "${mapped}" given for ${field} is not in the header`);
        return index;
      }
      return names.indexOf(field);
    };
    const found = Object.fromEntries(csvFields.map((f) => [f, indexOf(f)])) as Record<CsvField, number>;
    const pickOne = (label: string, candidates: CsvField[], required: boolean): CsvField | undefined => {
      const present = candidates.filter((f) => found[f] >= 0);
      if (present.length > 1) {
        headerProblems.push(`Give only one ${label} column (found ${present.join(', ')})`);
        return undefined;
      }
      if (present.length === 0 && required && !candidates.some((f) => mapping[f] !== undefined)) {
        headerProblems.push(`Missing required column: ${candidates.join(' or ')}`);
      }
      return present[0];
    };
    if (found.time < 0 && mapping.time === undefined) headerProblems.push('Missing required column: time');
    const dryBulb = pickOne('dry-bulb', ['dry_bulb_c', 'dry_bulb_f'], true);
    const dewPoint = pickOne('dew-point', ['dew_point_c', 'dew_point_f'], false);
    const wind = pickOne('wind-speed', ['wind_speed_ms', 'wind_speed_mph', 'wind_speed_kn'], false);
    if (headerProblems.length > 0 || dryBulb === undefined) {
      for (const message of headerProblems) problems.add(lineNumber, message);
      headerFailed = true;
      return;
    }
    plan = {
      delimiter,
      width: names.length,
      time: found.time,
      dryBulb: found[dryBulb],
      dryBulbFahrenheit: dryBulb === 'dry_bulb_f',
      dewPoint: dewPoint === undefined ? -1 : found[dewPoint],
      dewPointFahrenheit: dewPoint === 'dew_point_f',
      wind: wind === undefined ? -1 : found[wind],
      windToMs: wind === 'wind_speed_mph' ? mphToMs : wind === 'wind_speed_kn' ? knotsToMs : (v: number) => v,
      pressure: found.station_pressure_kpa,
      names: fields,
      starts: new Int32Array(names.length),
      ends: new Int32Array(names.length),
    };
  };

  const readRow = (p: ColumnPlan, line: string, lineNumber: number): void => {
    const fields = splitCsvLine(line, p.delimiter);
    if (fields === undefined) {
      problems.add(lineNumber, 'A quoted field is not closed');
      return;
    }
    if (fields.length !== p.width) {
      problems.add(lineNumber, `Expected ${p.width} columns, found ${fields.length}`);
      return;
    }
    const timeText = fields[p.time] ?? '';
    const time = parseIsoDateTime(timeText);
    if (time === undefined) {
      problems.add(lineNumber, timeText === '' ? 'The time is missing' : `Cannot read the time "${timeText}"`);
      return;
    }
    const db = cellOf(p, fields, p.dryBulb, lineNumber, problems);
    if (db === undefined) return;
    const dp = cellOf(p, fields, p.dewPoint, lineNumber, problems);
    if (dp === undefined) return;
    const ws = cellOf(p, fields, p.wind, lineNumber, problems);
    if (ws === undefined) return;
    const pressure = cellOf(p, fields, p.pressure, lineNumber, problems);
    if (pressure === undefined) return;
    accept(p, time, db, dp, ws, pressure);
  };

  const accept = (p: ColumnPlan, time: number, db: number, dp: number, ws: number, pressure: number): void => {
    builder.push(
      time,
      p.dryBulbFahrenheit ? fahrenheitToCelsius(db) : db,
      p.dewPointFahrenheit ? fahrenheitToCelsius(dp) : dp,
      p.windToMs(ws),
      pressure,
    );
    rows++;
  };

  /**
   * A row of the usual form (no quotes, no spaces around values, plain decimals, a time of the common
   * form) read without splitting it into strings; false for anything else, which `readRow` then reads
   * in full and reports on. The same values as `readRow` (quickDecimal is exact).
   */
  const readRowQuick = (p: ColumnPlan, line: string): boolean => {
    if (line.includes('"')) return false;
    const { starts, ends } = p;
    let start = 0;
    for (let k = 0; k < p.width; k++) {
      const next = line.indexOf(p.delimiter, start);
      const last = k === p.width - 1;
      if (last ? next !== -1 : next === -1) return false;
      starts[k] = start;
      ends[k] = last ? line.length : next;
      start = next + 1;
    }
    const time = parseIsoDateTime(line.slice(starts[p.time] ?? 0, ends[p.time] ?? 0));
    if (time === undefined) return false;
    const db = quickCell(line, starts, ends, p.dryBulb);
    const dp = quickCell(line, starts, ends, p.dewPoint);
    const ws = quickCell(line, starts, ends, p.wind);
    const pressure = quickCell(line, starts, ends, p.pressure);
    if (db === undefined || dp === undefined || ws === undefined || pressure === undefined) return false;
    accept(p, time, db, dp, ws, pressure);
    return true;
  };

  return {
    push(rawLine: string, lineNumber?: number): void {
      lineCounter++;
      const ln = lineNumber ?? lineCounter;
      lastLine = ln;
      let line = lineCounter === 1 ? rawLine.replace(BOM, '') : rawLine;
      if (line.charCodeAt(line.length - 1) === 13) line = line.slice(0, -1); // \r
      // Blank lines and comments are skipped; a data row starts with a digit and needs no trimming to tell.
      const first = line.charCodeAt(0);
      if (!(first >= 48 && first <= 57) && (line.trim() === '' || line.trimStart().startsWith('#'))) return;
      if (headerFailed) return;
      if (plan === undefined) {
        headerLine = ln;
        readHeader(line, ln);
        return;
      }
      if (!readRowQuick(plan, line)) readRow(plan, line, ln);
    },
    finish(): ParseResult {
      if (plan === undefined && !headerFailed) problems.add(Math.max(1, lastLine), 'The file is empty');
      else if (plan !== undefined && rows === 0 && problems.count === 0) {
        problems.add(headerLine, 'The file has a header but no data rows');
      }
      if (problems.count > 0) return { ok: false, problems: problems.listed, problemCount: problems.count };
      return { ok: true, series: builder.build(), rowCount: rows };
    },
  };
}
