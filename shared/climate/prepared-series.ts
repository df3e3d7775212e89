/**
 * Normalises an hourly series for analysis: orders it by UTC hour, keeps the first value of a
 * repeated hour, flags values outside physical ranges and tallies completeness per calendar year.
 * Used by the design-condition and data-quality calculations; pure and allocation-light.
 */
import {
  civilFromDays,
  formatUtcHour,
  HOURS_PER_DAY,
  hoursInYear,
  MS_PER_HOUR,
  type HourlySeries,
} from './hourly-series';

/** Physical ranges outside which a value is treated as missing and reported as out of range. */
export const VALID_RANGES = {
  /** °C; the rule for a valid hour. */
  dryBulbC: { min: -90, max: 60 },
  /** °C; same physical range as the dry-bulb (our convention). */
  dewPointC: { min: -90, max: 60 },
  /** m/s (our convention, common practice for 10 m anemometer data). */
  windSpeedMs: { min: 0, max: 75 },
  /** kPa (our convention: covers every inhabited elevation and weather). */
  stationPressureKpa: { min: 30, max: 110 },
} as const;

export type SeriesField = keyof typeof VALID_RANGES;

/** Fraction of a year's hours that must be valid for the year to qualify. */
export const QUALIFYING_COMPLETENESS = 0.85;

/** How many out-of-range examples are kept for display. */
export const OUT_OF_RANGE_EXAMPLES = 10;

export interface OutOfRangeValue {
  field: SeriesField;
  /** ISO 8601 UTC hour, e.g. `2020-01-15T06:00Z`. */
  time: string;
  value: number;
}

export interface YearTally {
  year: number;
  /** Distinct hours present in the data (after removing duplicates). */
  hoursPresent: number;
  /** Hours with a valid dry-bulb. */
  validHours: number;
  /** 8760 or 8784. */
  hoursInYear: number;
  /** validHours / hoursInYear. */
  completeness: number;
  qualifies: boolean;
}

/** A series ordered by hour, one row per distinct UTC hour, with derived calendar columns. */
export interface PreparedSeries {
  /** Distinct hours. */
  readonly length: number;
  /** Hour number since 1970-01-01T00Z (floor of time / 1 h). */
  readonly hour: Float64Array;
  /** UTC calendar year, month (1–12) and day number (days since 1970-01-01) of each row. */
  readonly year: Int32Array;
  readonly month: Uint8Array;
  readonly dayNumber: Int32Array;
  /** Values with out-of-range and non-finite entries replaced by NaN. */
  readonly dryBulbC: Float64Array;
  readonly dewPointC: Float64Array;
  readonly windSpeedMs: Float64Array;
  readonly stationPressureKpa: Float64Array;
  /** Rows of the input that repeated an hour already seen (the first value was kept). */
  readonly duplicates: number;
  /** Input rows whose time was not a finite number (dropped). */
  readonly invalidTimes: number;
  readonly outOfRangeCount: number;
  readonly outOfRangeByField: Readonly<Record<SeriesField, number>>;
  readonly outOfRangeExamples: readonly OutOfRangeValue[];
  /** Per calendar year present in the data, ascending. */
  readonly years: readonly YearTally[];
}

/** Orders, de-duplicates and range-checks a series. O(n) when the input is already in time order. */
export function prepareSeries(series: HourlySeries): PreparedSeries {
  const rows = series.time.length;
  const msPerHour = MS_PER_HOUR; // local copies keep the hot loops free of module-binding lookups
  const hoursPerDay = HOURS_PER_DAY;
  const times = series.time;
  const keyOf = (i: number): number => Math.floor((times[i] ?? NaN) / msPerHour);

  // Order of the rows by hour; a stable order keeps the first of repeated hours first.
  let inOrder = true;
  let invalidTimes = 0;
  let previous = -Infinity;
  for (let i = 0; i < rows; i++) {
    const k = keyOf(i);
    if (!Number.isFinite(k)) {
      invalidTimes++;
      continue;
    }
    if (k < previous) inOrder = false;
    previous = k;
  }
  let order: Uint32Array;
  if (inOrder && invalidTimes === 0) {
    order = new Uint32Array(rows);
    for (let i = 0; i < rows; i++) order[i] = i;
  } else {
    const keys = new Float64Array(rows);
    const finite: number[] = [];
    for (let i = 0; i < rows; i++) {
      const k = keyOf(i);
      keys[i] = k;
      if (Number.isFinite(k)) finite.push(i);
    }
    order = Uint32Array.from(finite).sort((a, b) => (keys[a] ?? 0) - (keys[b] ?? 0) || a - b);
  }

  const n0 = order.length;
  const hour = new Float64Array(n0);
  const year = new Int32Array(n0);
  const month = new Uint8Array(n0);
  const dayNumber = new Int32Array(n0);
  const dryBulbC = new Float64Array(n0);
  const dewPointC = new Float64Array(n0);
  const windSpeedMs = new Float64Array(n0);
  const stationPressureKpa = new Float64Array(n0);
  const outOfRangeByField: Record<SeriesField, number> = {
    dryBulbC: 0,
    dewPointC: 0,
    windSpeedMs: 0,
    stationPressureKpa: 0,
  };
  const outOfRangeExamples: OutOfRangeValue[] = [];

  const check = (field: SeriesField, value: number, hourNumber: number): number => {
    if (!Number.isFinite(value)) return NaN;
    const range = VALID_RANGES[field];
    if (value >= range.min && value <= range.max) return value;
    outOfRangeByField[field]++;
    if (outOfRangeExamples.length < OUT_OF_RANGE_EXAMPLES) {
      outOfRangeExamples.push({ field, time: formatUtcHour(hourNumber * MS_PER_HOUR), value });
    }
    return NaN;
  };

  const tallies = new Map<number, { hoursPresent: number; validHours: number }>();
  let duplicates = 0;
  let n = 0;
  let lastKey = NaN;
  let cachedDay = NaN;
  let cachedYear = 0;
  let cachedMonth = 0;
  let tally = { hoursPresent: 0, validHours: 0 };
  for (let j = 0; j < n0; j++) {
    const i = order[j] ?? 0;
    const k = keyOf(i);
    if (k === lastKey) {
      duplicates++;
      continue;
    }
    lastKey = k;
    const d = Math.floor(k / hoursPerDay);
    if (d !== cachedDay) {
      const c = civilFromDays(d);
      cachedDay = d;
      let t = tallies.get(c.year);
      if (t === undefined) {
        t = { hoursPresent: 0, validHours: 0 };
        tallies.set(c.year, t);
      }
      tally = t;
      cachedYear = c.year;
      cachedMonth = c.month;
    }
    hour[n] = k;
    year[n] = cachedYear;
    month[n] = cachedMonth;
    dayNumber[n] = d;
    const db = check('dryBulbC', series.dryBulbC[i] ?? NaN, k);
    dryBulbC[n] = db;
    dewPointC[n] = check('dewPointC', series.dewPointC[i] ?? NaN, k);
    windSpeedMs[n] = check('windSpeedMs', series.windSpeedMs[i] ?? NaN, k);
    stationPressureKpa[n] = check('stationPressureKpa', series.stationPressureKpa[i] ?? NaN, k);
    tally.hoursPresent++;
    if (!Number.isNaN(db)) tally.validHours++;
    n++;
  }

  const years: YearTally[] = [...tallies.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([y, t]) => {
      const h = hoursInYear(y);
      const completeness = t.validHours / h;
      return {
        year: y,
        hoursPresent: t.hoursPresent,
        validHours: t.validHours,
        hoursInYear: h,
        completeness,
        qualifies: completeness >= QUALIFYING_COMPLETENESS,
      };
    });

  return {
    length: n,
    hour: hour.subarray(0, n),
    year: year.subarray(0, n),
    month: month.subarray(0, n),
    dayNumber: dayNumber.subarray(0, n),
    dryBulbC: dryBulbC.subarray(0, n),
    dewPointC: dewPointC.subarray(0, n),
    windSpeedMs: windSpeedMs.subarray(0, n),
    stationPressureKpa: stationPressureKpa.subarray(0, n),
    duplicates,
    invalidTimes,
    outOfRangeCount:
      outOfRangeByField.dryBulbC +
      outOfRangeByField.dewPointC +
      outOfRangeByField.windSpeedMs +
      outOfRangeByField.stationPressureKpa,
    outOfRangeByField,
    outOfRangeExamples,
    years,
  };
}

/** A lookup of qualifying years: `mask[year − firstYear]` is 1 for a qualifying year. */
export interface YearMask {
  firstYear: number;
  mask: Uint8Array;
}

export function qualifyingYearMask(prepared: PreparedSeries): YearMask {
  const first = prepared.years[0]?.year ?? 0;
  const last = prepared.years[prepared.years.length - 1]?.year ?? first;
  const mask = new Uint8Array(last - first + 1);
  for (const y of prepared.years) if (y.qualifies) mask[y.year - first] = 1;
  return { firstYear: first, mask };
}
