/**
 * The climate basis of a job: the whole record, or its latest N qualifying years
 * (docs/methods.md#recent-years).
 *
 * Pure: no I/O, no clock, no randomness.
 */
import {
  computeDesignConditions,
  MIN_RECORD_YEARS,
  type DesignConditionsOptions,
  type DesignConditionsResult,
} from './design-conditions';
import { civilFromDays, HOURS_PER_DAY, MS_PER_HOUR, type HourlySeries } from './hourly-series';
import { prepareSeries, type PreparedSeries } from './prepared-series';

/** The fewest years a "latest N years" basis may hold. */
export const MIN_BASIS_YEARS = MIN_RECORD_YEARS;
/** The windows the site page shows beside the whole record. */
export const RECENT_WINDOWS = [10, 15] as const;

/** The latest `n` qualifying years of a record, ascending (all of them when it has fewer). */
export function latestQualifyingYears(prepared: PreparedSeries, n: number): number[] {
  const qualifying = prepared.years.filter((y) => y.qualifies).map((y) => y.year);
  return qualifying.slice(Math.max(0, qualifying.length - n));
}

/** The rows of a series whose UTC year is `fromYear` or later (the record as if it began that year). */
export function seriesFromYear(series: HourlySeries, fromYear: number): HourlySeries {
  const keep: number[] = [];
  let cachedDay = NaN;
  let cachedYear = 0;
  for (let i = 0; i < series.time.length; i++) {
    const t = series.time[i] ?? NaN;
    if (!Number.isFinite(t)) continue;
    const day = Math.floor(Math.floor(t / MS_PER_HOUR) / HOURS_PER_DAY);
    if (day !== cachedDay) {
      cachedDay = day;
      cachedYear = civilFromDays(day).year;
    }
    if (cachedYear >= fromYear) keep.push(i);
  }
  const pick = (column: Float64Array): Float64Array => Float64Array.from(keep, (i) => column[i] ?? NaN);
  return {
    time: pick(series.time),
    dryBulbC: pick(series.dryBulbC),
    dewPointC: pick(series.dewPointC),
    windSpeedMs: pick(series.windSpeedMs),
    stationPressureKpa: pick(series.stationPressureKpa),
  };
}

/**
 * The series cut to its latest `n` qualifying years: the rows from the first of those years on
 * (a year in between that does not qualify stays out of the computations, as in the whole record).
 */
export function latestYearsSeries(
  series: HourlySeries,
  n: number,
  prepared: PreparedSeries = prepareSeries(series),
): HourlySeries {
  const years = latestQualifyingYears(prepared, n);
  const from = years[0];
  return from === undefined ? series : seriesFromYear(series, from);
}

/** Design conditions over the latest `n` qualifying years only (`period` shows the window). */
export function designConditionsOfLatestYears(
  series: HourlySeries,
  n: number,
  options: DesignConditionsOptions = {},
): DesignConditionsResult {
  return computeDesignConditions(latestYearsSeries(series, n), options);
}
