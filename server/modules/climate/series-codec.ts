import type { HourlySeries } from '@shared/climate/hourly-series';

/**
 * Packs a series into one buffer for the upload waiting room (climate_uploads.series):
 * a 4-byte row count, the times as float64, then the four value columns as float32 —
 * the precision of the `real` columns of hourly_observations, so that a preview and
 * the stored record give the same results.
 */
export function encodeSeries(series: HourlySeries): Buffer {
  const n = series.time.length;
  const buf = Buffer.alloc(4 + n * 8 + 4 * n * 4);
  buf.writeUInt32LE(n, 0);
  let offset = 4;
  Buffer.from(series.time.buffer, series.time.byteOffset, n * 8).copy(buf, offset);
  offset += n * 8;
  for (const column of [series.dryBulbC, series.dewPointC, series.windSpeedMs, series.stationPressureKpa]) {
    const f32 = Float32Array.from(column);
    Buffer.from(f32.buffer).copy(buf, offset);
    offset += n * 4;
  }
  return buf;
}

export function decodeSeries(buf: Buffer): HourlySeries {
  const n = buf.readUInt32LE(0);
  const copy = new Uint8Array(buf.subarray(4)); // aligned copy
  const time = new Float64Array(copy.buffer, 0, n);
  const columns = [0, 1, 2, 3].map((k) => Float64Array.from(new Float32Array(copy.buffer, n * 8 + k * n * 4, n)));
  const [dryBulbC, dewPointC, windSpeedMs, stationPressureKpa] = columns as [
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
  ];
  return { time: Float64Array.from(time), dryBulbC, dewPointC, windSpeedMs, stationPressureKpa };
}

/** The series at storage precision (float32 values), as it will read back from the database. */
export function atStoragePrecision(series: HourlySeries): HourlySeries {
  const f = (c: Float64Array) => Float64Array.from(Float32Array.from(c));
  return {
    time: series.time,
    dryBulbC: f(series.dryBulbC),
    dewPointC: f(series.dewPointC),
    windSpeedMs: f(series.windSpeedMs),
    stationPressureKpa: f(series.stationPressureKpa),
  };
}

/** Concatenates several series (several yearly files of one upload). */
export function concatSeries(parts: HourlySeries[]): HourlySeries {
  if (parts.length === 1 && parts[0]) return parts[0];
  const n = parts.reduce((s, p) => s + p.time.length, 0);
  const join = (pick: (s: HourlySeries) => Float64Array) => {
    const out = new Float64Array(n);
    let at = 0;
    for (const p of parts) {
      out.set(pick(p), at);
      at += p.time.length;
    }
    return out;
  };
  return {
    time: join((s) => s.time),
    dryBulbC: join((s) => s.dryBulbC),
    dewPointC: join((s) => s.dewPointC),
    windSpeedMs: join((s) => s.windSpeedMs),
    stationPressureKpa: join((s) => s.stationPressureKpa),
  };
}
