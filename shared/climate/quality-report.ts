/**
 * Data-quality summary of an uploaded hourly record, for the upload screen: which years are there
 * and which qualify, completeness, gaps, repeated hours, out-of-range values, the cumulative
 * distribution of the hourly dry-bulb (for charts) and monthly statistics.
 */
import { formatUtcHour, MS_PER_HOUR, type HourlySeries } from './hourly-series';
import {
  prepareSeries,
  qualifyingYearMask,
  type OutOfRangeValue,
  type PreparedSeries,
  type SeriesField,
  type YearTally,
} from './prepared-series';

/** A run of at least this many consecutive hours without a valid dry-bulb counts as a gap. */
export const GAP_MIN_HOURS = 6;
/** Default width of the dry-bulb bins of the cumulative distribution, K. */
export const DEFAULT_BIN_WIDTH_K = 0.5;

export interface Gap {
  /** First missing hour, ISO 8601 UTC. */
  start: string;
  hours: number;
}

export interface DistributionBin {
  /** Upper edge of the bin, °C (a multiple of the bin width). */
  upperC: number;
  /** Hours whose dry-bulb is in (upperC − width, upperC]. */
  hours: number;
  /** Fraction of all hours with a dry-bulb at or below `upperC`. */
  cumulativeFraction: number;
}

export interface MonthlyStatistics {
  /** Calendar month 1–12. */
  month: number;
  /** Valid hours; min/mean/max are null when there are none. */
  hours: number;
  minC: number | null;
  meanC: number | null;
  maxC: number | null;
}

export interface QualityReport {
  /** Rows after removing repeated hours. */
  distinctHours: number;
  firstHour: string | null;
  lastHour: string | null;
  yearsFound: number[];
  qualifyingYears: number[];
  /** Per year: valid hours / hours in the year and whether the year qualifies (≥ 85 %). */
  completeness: YearTally[];
  gaps: {
    /** Runs of ≥ 6 consecutive hours without a valid dry-bulb between the first and the last hour. */
    count: number;
    longest: Gap | null;
    /** The first few gaps in time order. */
    first: Gap[];
  };
  duplicates: number;
  outOfRange: {
    count: number;
    byField: Record<SeriesField, number>;
    /** The first few, in time order. */
    first: OutOfRangeValue[];
  };
  /** Which hours the distribution and the monthly statistics describe. */
  statisticsBasis: 'qualifying-years' | 'all-years';
  distribution: { binWidthK: number; hours: number; bins: DistributionBin[] };
  monthly: MonthlyStatistics[];
}

export interface QualityReportOptions {
  /** Width of the dry-bulb bins, K (default 0.5). */
  binWidthK?: number;
  /** How many gaps to list (default 10). */
  gapExamples?: number;
}

/** Computes the data-quality report of a series. */
export function computeQualityReport(series: HourlySeries, options: QualityReportOptions = {}): QualityReport {
  return qualityReportFromPrepared(prepareSeries(series), options);
}

/** As `computeQualityReport`, for a series already passed through `prepareSeries`. */
export function qualityReportFromPrepared(prepared: PreparedSeries, options: QualityReportOptions = {}): QualityReport {
  const binWidth = options.binWidthK ?? DEFAULT_BIN_WIDTH_K;
  if (!(binWidth > 0)) throw new RangeError('binWidthK must be positive');
  const gapExamples = options.gapExamples ?? 10;
  const { length: n, hour, dryBulbC, month, year } = prepared;

  // Gaps: missing hours are hours absent from the record or present without a valid dry-bulb.
  const gaps: Gap[] = [];
  let gapCount = 0;
  let longest: Gap | null = null;
  let runStart = NaN;
  let runLength = 0;
  const closeRun = (): void => {
    if (runLength >= GAP_MIN_HOURS) {
      const gap = { start: formatUtcHour(runStart * MS_PER_HOUR), hours: runLength };
      gapCount++;
      if (gaps.length < gapExamples) gaps.push(gap);
      if (longest === null || runLength > longest.hours) longest = gap;
    }
    runLength = 0;
  };
  let previousHour = NaN;
  for (let i = 0; i < n; i++) {
    const h = hour[i] ?? 0;
    if (i > 0) {
      const absent = h - previousHour - 1;
      if (absent > 0) {
        if (runLength === 0) runStart = previousHour + 1;
        runLength += absent;
      }
    }
    previousHour = h;
    if (Number.isNaN(dryBulbC[i] ?? NaN)) {
      if (runLength === 0) runStart = h;
      runLength++;
    } else {
      closeRun();
    }
  }
  closeRun();

  // Distribution and monthly statistics over the qualifying years (all years when none qualifies).
  const { firstYear, mask } = qualifyingYearMask(prepared);
  const qualifyingYears = prepared.years.filter((y) => y.qualifies).map((y) => y.year);
  const basis = qualifyingYears.length > 0 ? 'qualifying-years' : 'all-years';
  const counts = new Map<number, number>();
  const mMin = new Float64Array(13).fill(Infinity);
  const mMax = new Float64Array(13).fill(-Infinity);
  const mSum = new Float64Array(13);
  const mCount = new Float64Array(13);
  let total = 0;
  for (let i = 0; i < n; i++) {
    if (basis === 'qualifying-years' && mask[(year[i] ?? 0) - firstYear] !== 1) continue;
    const t = dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    total++;
    const k = Math.ceil(t / binWidth);
    counts.set(k, (counts.get(k) ?? 0) + 1);
    const m = month[i] ?? 0;
    if (t < (mMin[m] ?? Infinity)) mMin[m] = t;
    if (t > (mMax[m] ?? -Infinity)) mMax[m] = t;
    mSum[m] = (mSum[m] ?? 0) + t;
    mCount[m] = (mCount[m] ?? 0) + 1;
  }
  const bins: DistributionBin[] = [];
  if (counts.size > 0) {
    const keys = [...counts.keys()];
    const lo = Math.min(...keys);
    const hi = Math.max(...keys);
    let cumulative = 0;
    for (let k = lo; k <= hi; k++) {
      const hours = counts.get(k) ?? 0;
      cumulative += hours;
      bins.push({ upperC: k * binWidth, hours, cumulativeFraction: cumulative / total });
    }
  }
  const monthly: MonthlyStatistics[] = [];
  for (let m = 1; m <= 12; m++) {
    const c = mCount[m] ?? 0;
    monthly.push({
      month: m,
      hours: c,
      minC: c > 0 ? (mMin[m] ?? null) : null,
      meanC: c > 0 ? (mSum[m] ?? 0) / c : null,
      maxC: c > 0 ? (mMax[m] ?? null) : null,
    });
  }

  const firstHour = n > 0 ? formatUtcHour((hour[0] ?? 0) * MS_PER_HOUR) : null;
  const lastHour = n > 0 ? formatUtcHour((hour[n - 1] ?? 0) * MS_PER_HOUR) : null;
  return {
    distinctHours: n,
    firstHour,
    lastHour,
    yearsFound: prepared.years.map((y) => y.year),
    qualifyingYears,
    completeness: prepared.years.map((y) => ({ ...y })),
    gaps: { count: gapCount, longest, first: gaps },
    duplicates: prepared.duplicates,
    outOfRange: {
      count: prepared.outOfRangeCount,
      byField: { ...prepared.outOfRangeByField },
      first: [...prepared.outOfRangeExamples],
    },
    statisticsBasis: basis,
    distribution: { binWidthK: binWidth, hours: total, bins },
    monthly,
  };
}
