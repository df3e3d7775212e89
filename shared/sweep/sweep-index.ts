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
 * arrays, each starting on an 8-byte boundary. Float arrays whose values are exact in a narrower
 * type (whole hours, float32 readings) are stored narrow and widened on reading.
 */
import { buildBins, indexSweepRecord, type Bins, type SweepRecordIndex } from './sweep-bins';
import type { Hours } from './sweep-prepare';
import type { SweepRecord } from './sweep-types';

/** Changes whenever the packed layout or the meaning of `Hours`/`Bins` changes: a stored index of another format is rebuilt. */
export const SWEEP_INDEX_FORMAT = 'sweep-index-2';

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

type StoredType = 'f64' | 'f32' | 'i32' | 'u8';
type Column = Float64Array | Int32Array | Uint8Array;

interface Header {
  format: string;
  n: number;
  years: number[];
  arrays: { name: string; type: StoredType; length: number }[];
}

const BYTES: Record<StoredType, number> = { f64: 8, f32: 4, i32: 4, u8: 1 };

function narrowest(a: Column): { type: StoredType; data: Column | Float32Array } {
  if (a instanceof Uint8Array) return { type: 'u8', data: a };
  if (a instanceof Int32Array) return { type: 'i32', data: a };
  let ints = true;
  let floats = true;
  for (let i = 0; i < a.length && (ints || floats); i++) {
    const v = a[i] ?? 0;
    if (ints && !(Number.isInteger(v) && v >= -2_147_483_648 && v <= 2_147_483_647)) ints = false;
    if (floats && Math.fround(v) !== v && !Number.isNaN(v)) floats = false;
  }
  if (ints) return { type: 'i32', data: Int32Array.from(a) };
  if (floats) return { type: 'f32', data: Float32Array.from(a) };
  return { type: 'f64', data: a };
}

function binsColumns(prefix: string, b: Bins): [string, Column][] {
  return [
    [`${prefix}.t`, b.t],
    [`${prefix}.w`, b.w],
    [`${prefix}.count`, b.count],
    [`${prefix}.start`, b.start],
    [`${prefix}.hourIdx`, b.hourIdx],
    [`${prefix}.binOfHour`, b.binOfHour],
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
  const arrays = new Map<string, { type: StoredType; view: Float64Array | Float32Array | Int32Array | Uint8Array }>();
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
    const v = get(name);
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
  const bins = (prefix: string): Bins | null =>
    arrays.has(`${prefix}.t`)
      ? { t: f64(`${prefix}.t`), w: f64(`${prefix}.w`), count: f64(`${prefix}.count`), start: i32(`${prefix}.start`), hourIdx: i32(`${prefix}.hourIdx`), binOfHour: i32(`${prefix}.binOfHour`) }
      : null;
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
