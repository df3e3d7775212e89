/**
 * An estimated hourly record for a site that has published design values only: a reference record
 * is shifted and stretched so that its 99.6 % heating value and heating degree-days equal the
 * target's published ones (docs/methods.md#shift-and-stretch).
 *
 * Pure: no I/O, no clock, no randomness.
 */
import { HDD_BASE_C, MIN_RECORD_YEARS, MIN_VALID_HOURS_PER_DAY } from './design-conditions';
import { daysInYear, MS_PER_HOUR, type HourlySeries } from './hourly-series';
import { quantileOfSorted } from './percentile';
import { prepareSeries, qualifyingYearMask, type PreparedSeries } from './prepared-series';

/** Bumped whenever the estimate of the same inputs would change. */
export const SHIFT_STRETCH_VERSION = 'shift-stretch-1.0.0';
/** A stretch larger than this in size means the reference climate is too far off to adjust sensibly. */
export const MAX_STRETCH = 0.5;

export interface ShiftStretchTarget {
  /** The target's published 99.6 % heating dry-bulb, °C. */
  db99_6: number;
  /** The target's published heating degree-days, °C·day (same base as the computed ones); absent: α = 0. */
  hdd18?: number | null;
}

export type ShiftStretchRefusal =
  'no-qualifying-years' | 'short-reference' | 'stretch-too-large' | 'degree-days-unreachable';

export type ShiftStretchResult =
  | {
      ok: true;
      methodVersion: string;
      /** Δ, K. */
      shiftK: number;
      /** α, dimensionless. */
      stretch: number;
      /** T̄: the reference's mean dry-bulb over its qualifying years, °C. */
      referenceMeanC: number;
      /** The reference's own 99.6 % value and degree-days, for the record. */
      referenceDb99_6: number;
      referenceHdd18: number;
      qualifyingYears: number[];
      /** The adjusted record: one row per distinct hour of the reference, station pressure left out. */
      series: HourlySeries;
    }
  | { ok: false; code: ShiftStretchRefusal; message: string; stretch?: number };

/** Per-day means of the qualifying years, as the degree-days use them (docs/methods.md#shift-and-stretch). */
interface DailyMeans {
  means: Float64Array;
  /** Index into `yearScale` of each day. */
  yearIndex: Int32Array;
  /** days-in-year / counted days, per qualifying year with counted days. */
  yearScale: Float64Array;
}

function dailyMeans(prepared: PreparedSeries, qualifying: readonly number[]): DailyMeans {
  const { firstYear, mask } = qualifyingYearMask(prepared);
  const means: number[] = [];
  const yearIndex: number[] = [];
  const counted = new Map<number, number>();
  let day = NaN;
  let dayYear = 0;
  let sum = 0;
  let count = 0;
  const flush = (): void => {
    if (count >= MIN_VALID_HOURS_PER_DAY) {
      means.push(sum / count);
      yearIndex.push(dayYear);
      counted.set(dayYear, (counted.get(dayYear) ?? 0) + 1);
    }
  };
  for (let i = 0; i < prepared.length; i++) {
    const y = prepared.year[i] ?? 0;
    if (mask[y - firstYear] !== 1) continue;
    const t = prepared.dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    const d = prepared.dayNumber[i] ?? 0;
    if (d !== day) {
      flush();
      day = d;
      dayYear = y;
      sum = 0;
      count = 0;
    }
    sum += t;
    count++;
  }
  flush();
  const years = qualifying.filter((y) => (counted.get(y) ?? 0) > 0);
  const slot = new Map(years.map((y, k) => [y, k]));
  return {
    means: Float64Array.from(means),
    yearIndex: Int32Array.from(yearIndex, (y) => slot.get(y) ?? 0),
    yearScale: Float64Array.from(years, (y) => daysInYear(y) / (counted.get(y) ?? 1)),
  };
}

/**
 * Mean annual heating degree-days after the map d → d + a + b·(d − P), computed as the design
 * conditions do: each counted day's mean, each year scaled to its full length, the mean over years.
 */
function degreeDaysAfter(days: DailyMeans, shift: number, slope: number, pivot: number): number {
  const perYear = new Float64Array(days.yearScale.length);
  for (let i = 0; i < days.means.length; i++) {
    const d = days.means[i] ?? 0;
    const adjusted = d + shift + slope * (d - pivot);
    const k = days.yearIndex[i] ?? 0;
    perYear[k] = (perYear[k] ?? 0) + Math.max(0, HDD_BASE_C - adjusted);
  }
  let total = 0;
  for (let k = 0; k < perYear.length; k++) total += (perYear[k] ?? 0) * (days.yearScale[k] ?? 0);
  return perYear.length > 0 ? total / perYear.length : 0;
}

/** α from which the search starts outward; beyond these the map is refused anyway. */
const SEARCH_LOW = -0.95;
const SEARCH_HIGH = 3;
const SEARCH_STEP = 0.05;

/**
 * Solves for α so that the degree-days after the map equal the target, with Δ tied to α so that
 * the 99.6 % value always equals the target's. Returns the root nearest α = 0, or null.
 */
function solveStretch(days: DailyMeans, p: number, target: ShiftStretchTarget & { hdd18: number }): number | null {
  const f = (alpha: number): number => degreeDaysAfter(days, target.db99_6 - p, alpha, p) - target.hdd18;
  const grid: number[] = [];
  for (let a = SEARCH_LOW; a <= SEARCH_HIGH + 1e-9; a += SEARCH_STEP) grid.push(Math.round(a * 100) / 100);
  let best: [number, number] | null = null;
  let previous = grid[0] ?? 0;
  let fPrevious = f(previous);
  if (fPrevious === 0) return previous;
  for (const a of grid.slice(1)) {
    const fa = f(a);
    if (fa === 0 || Math.sign(fa) !== Math.sign(fPrevious)) {
      const bracket: [number, number] = fa === 0 ? [a, a] : [previous, a];
      const distance = Math.min(Math.abs(bracket[0]), Math.abs(bracket[1]));
      if (best === null || distance < Math.min(Math.abs(best[0]), Math.abs(best[1]))) best = bracket;
    }
    previous = a;
    fPrevious = fa;
  }
  if (best === null) return null;
  let [lo, hi] = best;
  let fLo = f(lo);
  for (let i = 0; i < 80 && hi - lo > 1e-12; i++) {
    const mid = (lo + hi) / 2;
    const fMid = f(mid);
    if (fMid === 0) return mid;
    if (Math.sign(fMid) === Math.sign(fLo)) {
      lo = mid;
      fLo = fMid;
    } else {
      hi = mid;
    }
  }
  return (lo + hi) / 2;
}

/**
 * Adjusts a reference record to a target's published values: T' = T + Δ + α·(T − T̄); the dew point
 * is shifted by Δ and capped at the adjusted dry-bulb; wind is kept; station pressure is left out
 * (the target's elevation gives it). Refuses a reference with fewer than 8 qualifying years, and a
 * stretch larger than 0.5 in size.
 */
export function shiftAndStretch(reference: HourlySeries, target: ShiftStretchTarget): ShiftStretchResult {
  const prepared = prepareSeries(reference);
  const qualifying = prepared.years.filter((y) => y.qualifies).map((y) => y.year);
  if (qualifying.length === 0) {
    return {
      ok: false,
      code: 'no-qualifying-years',
      message: 'The reference record has no year with enough valid hours (85 %).',
    };
  }
  if (qualifying.length < MIN_RECORD_YEARS) {
    return {
      ok: false,
      code: 'short-reference',
      message: `The reference record has only ${qualifying.length} qualifying year(s); at least ${MIN_RECORD_YEARS} are needed to estimate another site's hours from it.`,
    };
  }
  const { firstYear, mask } = qualifyingYearMask(prepared);
  const valid: number[] = [];
  let sum = 0;
  for (let i = 0; i < prepared.length; i++) {
    if (mask[(prepared.year[i] ?? 0) - firstYear] !== 1) continue;
    const t = prepared.dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    valid.push(t);
    sum += t;
  }
  const meanC = sum / valid.length;
  const sorted = Float64Array.from(valid).sort();
  const p = quantileOfSorted(sorted, 0.004);
  const days = dailyMeans(prepared, qualifying);
  const referenceHdd = degreeDaysAfter(days, 0, 0, p);

  let stretch = 0;
  const hdd = target.hdd18;
  if (hdd !== undefined && hdd !== null) {
    const solved = solveStretch(days, p, { ...target, hdd18: hdd });
    if (solved === null) {
      return {
        ok: false,
        code: 'degree-days-unreachable',
        message: `No stretch of this reference gives ${Math.round(hdd)} °C·day together with a 99.6 % value of ${target.db99_6} °C: its climate is too far off. Choose a reference record closer to the site.`,
      };
    }
    stretch = solved;
  }
  if (Math.abs(stretch) > MAX_STRETCH) {
    return {
      ok: false,
      code: 'stretch-too-large',
      stretch,
      message: `Matching the site's published values would stretch the reference's temperatures by ${(stretch * 100).toFixed(0)} % (at most ±${MAX_STRETCH * 100} % is accepted): its climate is too far off. Choose a reference record closer to the site.`,
    };
  }
  // Δ from the 99.6 % value: P' = P + Δ + α·(P − T̄) must equal the target (the map is monotonic for α > −1).
  const shiftK = target.db99_6 - p - stretch * (p - meanC);

  const n = prepared.length;
  const out: HourlySeries = {
    time: new Float64Array(n),
    dryBulbC: new Float64Array(n),
    dewPointC: new Float64Array(n),
    windSpeedMs: new Float64Array(n),
    stationPressureKpa: new Float64Array(n).fill(NaN),
  };
  for (let i = 0; i < n; i++) {
    out.time[i] = (prepared.hour[i] ?? 0) * MS_PER_HOUR;
    const t = prepared.dryBulbC[i] ?? NaN;
    const adjusted = t + shiftK + stretch * (t - meanC);
    out.dryBulbC[i] = adjusted;
    const dp = (prepared.dewPointC[i] ?? NaN) + shiftK;
    out.dewPointC[i] = Number.isNaN(adjusted) ? dp : Math.min(dp, adjusted);
    out.windSpeedMs[i] = prepared.windSpeedMs[i] ?? NaN;
  }
  return {
    ok: true,
    methodVersion: SHIFT_STRETCH_VERSION,
    shiftK,
    stretch,
    referenceMeanC: meanC,
    referenceDb99_6: p,
    referenceHdd18: referenceHdd,
    qualifyingYears: qualifying,
    series: out,
  };
}
