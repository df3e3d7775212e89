/**
 * The columnar hourly weather series every part of the climate engine works on.
 *
 * All columns have the same length; row i is one observation. Missing values are NaN.
 * Times are UTC instants in epoch milliseconds; an observation belongs to the UTC hour that
 * contains it (`Math.floor(time / MS_PER_HOUR)`).
 */
export interface HourlySeries {
  /** Observation time, epoch milliseconds (UTC). */
  readonly time: Float64Array;
  /** Dry-bulb temperature, °C (NaN = missing). */
  readonly dryBulbC: Float64Array;
  /** Dew-point temperature, °C (NaN = missing). */
  readonly dewPointC: Float64Array;
  /** Wind speed, m/s (NaN = missing). */
  readonly windSpeedMs: Float64Array;
  /** Station (not sea-level) pressure, kPa (NaN = missing). */
  readonly stationPressureKpa: Float64Array;
}

/** Plain-array form of a series, convenient for tests and small hand-made inputs. */
export interface HourlyRowsInput {
  time: readonly number[];
  dryBulbC: readonly number[];
  dewPointC?: readonly number[];
  windSpeedMs?: readonly number[];
  stationPressureKpa?: readonly number[];
}

export const MS_PER_HOUR = 3_600_000;
export const MS_PER_DAY = 86_400_000;
export const HOURS_PER_DAY = 24;

/** A series of `length` rows, every value missing (NaN) and every time 0. */
export function createEmptySeries(length: number): HourlySeries {
  return {
    time: new Float64Array(length),
    dryBulbC: new Float64Array(length).fill(NaN),
    dewPointC: new Float64Array(length).fill(NaN),
    windSpeedMs: new Float64Array(length).fill(NaN),
    stationPressureKpa: new Float64Array(length).fill(NaN),
  };
}

/** Builds a columnar series from plain arrays; absent optional columns become all-missing. */
export function seriesFromRows(rows: HourlyRowsInput): HourlySeries {
  const n = rows.time.length;
  if (rows.dryBulbC.length !== n) throw new RangeError('time and dryBulbC must have the same length');
  const column = (values: readonly number[] | undefined, name: string): Float64Array => {
    if (values === undefined) return new Float64Array(n).fill(NaN);
    if (values.length !== n) throw new RangeError(`${name} must have the same length as time`);
    return Float64Array.from(values);
  };
  return {
    time: Float64Array.from(rows.time),
    dryBulbC: Float64Array.from(rows.dryBulbC),
    dewPointC: column(rows.dewPointC, 'dewPointC'),
    windSpeedMs: column(rows.windSpeedMs, 'windSpeedMs'),
    stationPressureKpa: column(rows.stationPressureKpa, 'stationPressureKpa'),
  };
}

/** Number of rows of a series. */
export function seriesLength(series: HourlySeries): number {
  return series.time.length;
}

/** Whether the calendar year is a leap year (proleptic Gregorian). */
export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** Hours in a calendar year: 8760, or 8784 in a leap year. */
export function hoursInYear(year: number): number {
  return isLeapYear(year) ? 8784 : 8760;
}

/** Days in a calendar year: 365 or 366. */
export function daysInYear(year: number): number {
  return isLeapYear(year) ? 366 : 365;
}

/** Civil date of a day count since 1970-01-01 (UTC). */
export interface CivilDate {
  year: number;
  /** 1–12 */
  month: number;
  /** 1–31 */
  day: number;
}

/**
 * Converts a day number (days since 1970-01-01) to a proleptic Gregorian date without
 * allocating a Date (H. Hinnant's `civil_from_days` algorithm, public domain).
 */
export function civilFromDays(dayNumber: number): CivilDate {
  const z = dayNumber + 719_468;
  const era = Math.floor(z / 146_097);
  const doe = z - era * 146_097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36_524) - Math.floor(doe / 146_096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  const year = yoe + era * 400 + (month <= 2 ? 1 : 0);
  return { year, month, day };
}

/** ISO 8601 text (UTC, minute precision) of an epoch-millisecond time, e.g. `2020-01-15T06:00Z`. */
export function formatUtcHour(timeMs: number): string {
  return new Date(timeMs).toISOString().slice(0, 16) + 'Z';
}
