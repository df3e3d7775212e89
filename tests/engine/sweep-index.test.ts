/**
 * The stored sweep index (docs/architecture.md#stored-records-and-the-sweep-index): packed narrow and
 * read back exactly, whatever grid the readings are on.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { buildSweepIndex, packSweepIndex, unpackSweepIndex } from '../../shared/sweep/sweep-index';
import type { HourlySeries } from '../../shared/climate/hourly-series';

const MS_PER_HOUR = 3_600_000;
const START = Date.UTC(2020, 0, 1);

/** Two years of hours with readings from `value(i)`, some missing wind. */
function series(value: (i: number) => number): HourlySeries {
  const n = 2 * 8784;
  const time = new Float64Array(n);
  const dryBulbC = new Float64Array(n);
  const windSpeedMs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    time[i] = START + i * MS_PER_HOUR;
    dryBulbC[i] = value(i);
    windSpeedMs[i] = i % 97 === 0 ? NaN : Math.abs(value(i + 5));
  }
  return {
    time,
    dryBulbC,
    dewPointC: dryBulbC.map((t) => t - 3),
    windSpeedMs,
    stationPressureKpa: new Float64Array(n).fill(100),
  };
}

/** The index with every −0 in its arrays made 0. */
function withoutNegativeZero<T>(value: T): T {
  if (value instanceof Float64Array) return value.map((v) => (Object.is(v, -0) ? 0 : v)) as T;
  if (Array.isArray(value) || ArrayBuffer.isView(value) || value === null || typeof value !== 'object') return value;
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, withoutNegativeZero(v)])) as T;
}

const cases: [string, (i: number) => number][] = [
  ['readings on a 0.1 K grid', (i) => Math.round(100 * Math.sin(i / 500) - 50 * Math.cos(i / 24)) / 10],
  [
    'the same readings as float32 holds them',
    (i) => Math.fround(Math.round(100 * Math.sin(i / 500) - 50 * Math.cos(i / 24)) / 10),
  ],
  ['readings off any grid', (i) => 10 * Math.sin(i / 500) - 5 * Math.cos(i / 24) + 1e-7 * i],
];

describe('packing the sweep index', () => {
  for (const [name, value] of cases) {
    it(`reads back exactly: ${name}`, () => {
      const index = buildSweepIndex({ series: series(value), qualifyingYears: [2020, 2021] });
      // −0 comes back as 0 (the same temperature to every sum and comparison of the sweep).
      assert.deepEqual(unpackSweepIndex(packSweepIndex(index)), withoutNegativeZero(index));
    });
  }

  it('keeps readings on a 0.1 grid in two bytes: at most 15 bytes an hour in all', () => {
    const index = buildSweepIndex({ series: series(cases[1]?.[1] ?? Math.sin), qualifyingYears: [2020, 2021] });
    // hour number 4, outdoor 2, wind 2, year 1, follows 1, the hours of the temperature bins 4 (bytes).
    const perHour = packSweepIndex(index).length / index.hours.n;
    assert.ok(perHour <= 15, `${perHour.toFixed(1)} bytes an hour`);
  });
});
