/**
 * The sweep's index of an hourly record, built once when the record is stored and kept with it as
 * bytes, so that the first sweep of a stored record reads it back instead of re-deriving it from the
 * hours (docs/architecture.md#stored-records-and-the-sweep-index).
 *
 * The index is what `sweep` prepares from a record: the valid hours of the qualifying years in time
 * order (`Hours`) and those hours grouped by outdoor temperature (`Bins`). The grouping by
 * temperature and wind (air leakage by the ELA method only) is still built on first use.
 *
 * Packed layout (platform byte order, little-endian on every machine the product runs on):
 * a 4-byte length, a JSON header naming each array with its stored type and length, then the
 * arrays, each starting on an 8-byte boundary. Arrays whose values are exact in a narrower type are
 * stored narrow and widened on reading: small whole numbers as bytes, whole hours as 32-bit integers,
 * readings on a 0.1 grid (every record read from text) as 16-bit tenths — exact tenths, or tenths
 * as float32 holds them (the stored record's precision) — others as float32 where exact. Each bin list's bin-of-hour array is not stored: it is the inverse of `hourIdx` and is
 * rebuilt in one pass. A smaller index is read from the database faster, which is most of the time
 * of the first sweep of a stored record.
 */
import { buildBins, indexSweepRecord, type Bins, type SweepRecordIndex } from './sweep-bins';
import type { Hours } from './sweep-prepare';
import type { SweepRecord } from './sweep-types';

/** Changes whenever the packed layout or the meaning of `Hours`/`Bins` changes: a stored index of another format is rebuilt. */
export const SWEEP_INDEX_FORMAT = 'sweep-index-3';

/** What a stored index is valid for: its format and the years it covers. */
export function sweepIndexKey(qualifyingYears: readonly number[]): string {
  return `${SWEEP_INDEX_FORMAT}:${[...qualifyingYears].sort((a, b) => a - b).join(',')}`;
}

/** The index of a record with its temperature bins already built (all a first sweep would otherwise do over the hours). */
export function buildSweepIndex(record: SweepRecord): SweepRecordIndex {
  const index = indexSweepRecord(record);
  index.byTemperature = buildBins(index.hours, false);
  return index;
}

type StoredType = 'f64' | 'f32' | 'i32' | 'u8' | 'd16' | 'e16';
type Column = Float64Array | Int32Array | Uint8Array;

interface Header {
  format: string;
  n: number;
  years: number[];
  arrays: { name: string; type: StoredType; length: number }[];
}

const BYTES: Record<StoredType, number> = { f64: 8, f32: 4, i32: 4, u8: 1, d16: 2, e16: 2 };
/** A missing reading (NaN) among 16-bit tenths. */
const D16_MISSING = -32768;

type Packed = Column | Float32Array | Int16Array;

function narrowest(a: Column): { type: StoredType; data: Packed } {
  if (a instanceof Uint8Array) return { type: 'u8', data: a };
  let bytes = true;
  let ints = true;
  let tenths = true;
  let tenths32 = true;
  let floats = !(a instanceof Int32Array);
  for (let i = 0; i < a.length && (bytes || ints || tenths || tenths32 || floats); i++) {
    const v = a[i] ?? 0;
    if (Number.isNaN(v)) {
      bytes = false;
      ints = false;
      continue;
    }
    const isInt = Number.isInteger(v);
    if (bytes && !(isInt && v >= 0 && v <= 255)) bytes = false;
    if (ints && !(isInt && v >= -2_147_483_648 && v <= 2_147_483_647)) ints = false;
    if (tenths || tenths32) {
      const k = Math.round(v * 10);
      const inRange = k > D16_MISSING && k <= 32_767;
      if (tenths && !(inRange && k / 10 === v)) tenths = false;
      if (tenths32 && !(inRange && Math.fround(k / 10) === v)) tenths32 = false;
    }
    if (floats && Math.fround(v) !== v) floats = false;
  }
  if (bytes) return { type: 'u8', data: Uint8Array.from(a) };
  if (a instanceof Int32Array) return { type: 'i32', data: a };
  if (ints) return { type: 'i32', data: Int32Array.from(a) };
  if (tenths || tenths32) {
    const out = new Int16Array(a.length);
    for (let i = 0; i < a.length; i++) {
      const v = a[i] ?? NaN;
      out[i] = Number.isNaN(v) ? D16_MISSING : Math.round(v * 10);
    }
    return { type: tenths ? 'd16' : 'e16', data: out };
  }
  if (floats) return { type: 'f32', data: Float32Array.from(a) };
  return { type: 'f64', data: a };
}

/** 16-bit tenths read back as numbers (NaN where missing), rounded to float32 for `e16`. */
function fromTenths(a: Int16Array, float32: boolean): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) {
    const k = a[i] ?? D16_MISSING;
    out[i] = k === D16_MISSING ? NaN : float32 ? Math.fround(k / 10) : k / 10;
  }
  return out;
}

/** The bin of every hour, from the hours of every bin. */
function binOfHourFrom(start: Int32Array, hourIdx: Int32Array, n: number): Int32Array {
  const binOfHour = new Int32Array(n);
  for (let r = 0; r + 1 < start.length; r++) {
    const end = start[r + 1] ?? 0;
    for (let j = start[r] ?? 0; j < end; j++) binOfHour[hourIdx[j] ?? 0] = r;
  }
  return binOfHour;
}

function binsColumns(prefix: string, b: Bins): [string, Column][] {
  return [
    [`${prefix}.t`, b.t],
    [`${prefix}.w`, b.w],
    [`${prefix}.count`, b.count],
    [`${prefix}.start`, b.start],
    [`${prefix}.hourIdx`, b.hourIdx],
  ];
}

const pad8 = (n: number) => (n + 7) & ~7;

/** The index as bytes, for storing beside its record. */
export function packSweepIndex(index: SweepRecordIndex): Uint8Array {
  const h = index.hours;
  const columns: [string, Column][] = [
    ['hours.hourNumber', h.hourNumber],
    ['hours.outdoorC', h.outdoorC],
    ['hours.windMs', h.windMs],
    ['hours.yearIndex', h.yearIndex],
    ['hours.follows', h.follows],
    ...(index.byTemperature ? binsColumns('t', index.byTemperature) : []),
    ...(index.byTemperatureAndWind ? binsColumns('tw', index.byTemperatureAndWind) : []),
  ];
  const stored = columns.map(([name, a]) => ({ name, ...narrowest(a) }));
  const header: Header = {
    format: SWEEP_INDEX_FORMAT,
    n: h.n,
    years: h.years,
    arrays: stored.map((s) => ({ name: s.name, type: s.type, length: s.data.length })),
  };
  const headerBytes = new TextEncoder().encode(JSON.stringify(header));
  let size = pad8(4 + headerBytes.length);
  for (const s of stored) size = pad8(size + s.data.length * BYTES[s.type]);
  const out = new Uint8Array(size);
  new DataView(out.buffer).setUint32(0, headerBytes.length, true);
  out.set(headerBytes, 4);
  let at = pad8(4 + headerBytes.length);
  for (const s of stored) {
    out.set(new Uint8Array(s.data.buffer, s.data.byteOffset, s.data.length * BYTES[s.type]), at);
    at = pad8(at + s.data.length * BYTES[s.type]);
  }
  return out;
}

/** A packed index read back; throws on bytes of another format (the caller rebuilds the index then). */
export function unpackSweepIndex(bytes: Uint8Array): SweepRecordIndex {
  // Typed-array views need aligned offsets: copy only when the bytes do not start on an 8-byte boundary.
  const buf = bytes.byteOffset % 8 === 0 ? bytes : new Uint8Array(bytes);
  const headerLength = new DataView(buf.buffer, buf.byteOffset, 4).getUint32(0, true);
  const header = JSON.parse(new TextDecoder().decode(buf.subarray(4, 4 + headerLength))) as Header;
  if (header.format !== SWEEP_INDEX_FORMAT) throw new Error(`sweep index of format ${header.format}`);
  const arrays = new Map<
    string,
    { type: StoredType; view: Float64Array | Float32Array | Int32Array | Uint8Array | Int16Array }
  >();
  let at = pad8(4 + headerLength);
  for (const a of header.arrays) {
    const offset = buf.byteOffset + at;
    const view =
      a.type === 'f64'
        ? new Float64Array(buf.buffer, offset, a.length)
        : a.type === 'f32'
          ? new Float32Array(buf.buffer, offset, a.length)
          : a.type === 'i32'
            ? new Int32Array(buf.buffer, offset, a.length)
            : a.type === 'd16' || a.type === 'e16'
              ? new Int16Array(buf.buffer, offset, a.length)
              : new Uint8Array(buf.buffer, offset, a.length);
    arrays.set(a.name, { type: a.type, view });
    at = pad8(at + a.length * BYTES[a.type]);
  }
  const get = (name: string) => {
    const a = arrays.get(name);
    if (!a) throw new Error(`sweep index without ${name}`);
    return a.view;
  };
  const f64 = (name: string) => {
    const a = arrays.get(name);
    const v = get(name);
    if (v instanceof Int16Array) return fromTenths(v, a?.type === 'e16');
    return v instanceof Float64Array ? v : Float64Array.from(v);
  };
  const i32 = (name: string) => {
    const v = get(name);
    return v instanceof Int32Array ? v : Int32Array.from(v);
  };
  const u8 = (name: string) => {
    const v = get(name);
    return v instanceof Uint8Array ? v : Uint8Array.from(v);
  };
  const bins = (prefix: string): Bins | null => {
    if (!arrays.has(`${prefix}.t`)) return null;
    const start = i32(`${prefix}.start`);
    const hourIdx = i32(`${prefix}.hourIdx`);
    return {
      t: f64(`${prefix}.t`),
      w: f64(`${prefix}.w`),
      count: f64(`${prefix}.count`),
      start,
      hourIdx,
      binOfHour: binOfHourFrom(start, hourIdx, header.n),
    };
  };
  const hours: Hours = {
    n: header.n,
    hourNumber: f64('hours.hourNumber'),
    outdoorC: f64('hours.outdoorC'),
    windMs: f64('hours.windMs'),
    yearIndex: i32('hours.yearIndex'),
    follows: u8('hours.follows'),
    years: header.years,
  };
  return { kind: 'sweep-record-index', hours, byTemperature: bins('t'), byTemperatureAndWind: bins('tw') };
}
