/**
 * The trend of each year's coldest hour: Theil–Sen slope and the Mann–Kendall test
 * (docs/methods.md#trend-of-the-coldest-hour).
 *
 * Pure: no I/O, no clock, no randomness.
 */
import { prepareSeries, type PreparedSeries } from './prepared-series';
import { quantileOfSorted } from './percentile';
import type { HourlySeries } from './hourly-series';

/** Below this many qualifying years the trend is not stated. */
export const MIN_TREND_YEARS = 10;

export interface AnnualExtreme {
  year: number;
  /** The year's coldest valid hour, °C. */
  minC: number;
  /** The year's own 99.6 % value (0.4 % of its valid hours are colder), °C. */
  db99_6C: number;
}

export interface MannKendall {
  s: number;
  /** Var(S) with the correction for tied values. */
  varS: number;
  /** Z with the continuity correction. */
  z: number;
  /** Two-sided p-value from the normal approximation. */
  p: number;
}

export interface ColdestHourTrend {
  annual: AnnualExtreme[];
  /** Theil–Sen slope of the yearly minima, K per decade (null below two years). */
  senSlopeKPerDecade: number | null;
  /** Null below two years. */
  mannKendall: MannKendall | null;
  /** Whether there are enough years (10) to state a trend. */
  enough: boolean;
  /** A plain sentence for the site page. */
  sentence: string;
}

/** Each qualifying year's coldest hour and 99.6 % value, in year order. */
export function annualExtremes(prepared: PreparedSeries): AnnualExtreme[] {
  const qualifying = new Set(prepared.years.filter((y) => y.qualifies).map((y) => y.year));
  const byYear = new Map<number, number[]>();
  for (let i = 0; i < prepared.length; i++) {
    const y = prepared.year[i] ?? 0;
    if (!qualifying.has(y)) continue;
    const t = prepared.dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    let list = byYear.get(y);
    if (list === undefined) byYear.set(y, (list = []));
    list.push(t);
  }
  return [...byYear.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([year, values]) => {
      const sorted = Float64Array.from(values).sort();
      return { year, minC: sorted[0] ?? NaN, db99_6C: quantileOfSorted(sorted, 0.004) };
    });
}

/** Theil–Sen slope: the median of all pairwise slopes (y_j − y_i)/(x_j − x_i) with x_i ≠ x_j (Sen, 1968). */
export function theilSenSlope(x: readonly number[], y: readonly number[]): number | null {
  if (x.length !== y.length) throw new RangeError('x and y must have the same length');
  const slopes: number[] = [];
  for (let i = 0; i < x.length; i++) {
    for (let j = i + 1; j < x.length; j++) {
      const dx = (x[j] ?? 0) - (x[i] ?? 0);
      if (dx !== 0) slopes.push(((y[j] ?? 0) - (y[i] ?? 0)) / dx);
    }
  }
  if (slopes.length === 0) return null;
  slopes.sort((a, b) => a - b);
  const mid = slopes.length >> 1;
  return slopes.length % 2 === 1 ? (slopes[mid] ?? 0) : ((slopes[mid - 1] ?? 0) + (slopes[mid] ?? 0)) / 2;
}

/**
 * Complementary error function, |relative error| < 1.2e-7 everywhere (the Chebyshev fit of
 * Numerical Recipes' erfcc).
 */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t *
                      (-0.18628806 +
                        t *
                          (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? r : 2 - r;
}

/** Mann–Kendall test of a series in time order (Mann, 1945; Kendall, 1975). Null below two values. */
export function mannKendall(values: readonly number[]): MannKendall | null {
  const n = values.length;
  if (n < 2) return null;
  let s = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) s += Math.sign((values[j] ?? 0) - (values[i] ?? 0));
  }
  const ties = new Map<number, number>();
  for (const v of values) ties.set(v, (ties.get(v) ?? 0) + 1);
  let tieTerm = 0;
  for (const t of ties.values()) if (t > 1) tieTerm += t * (t - 1) * (2 * t + 5);
  const varS = (n * (n - 1) * (2 * n + 5) - tieTerm) / 18;
  const z = varS <= 0 ? 0 : s > 0 ? (s - 1) / Math.sqrt(varS) : s < 0 ? (s + 1) / Math.sqrt(varS) : 0;
  return { s, varS, z, p: erfc(Math.abs(z) / Math.SQRT2) };
}

/** "about 1 time in 20", "less than 1 time in 1000", "about 4 times in 10". */
export function chanceInWords(p: number): string {
  if (p < 0.001) return 'less than 1 time in 1000';
  if (p >= 0.5) return `about ${Math.round(p * 10)} times in 10`;
  const oneIn = 1 / p;
  const rounded =
    oneIn < 10 ? Math.round(oneIn) : oneIn < 100 ? Math.round(oneIn / 5) * 5 : Math.round(oneIn / 50) * 50;
  return `about 1 time in ${rounded}`;
}

/** The trend of the coldest hour of each qualifying year, with its sentence. */
export function coldestHourTrend(source: HourlySeries | PreparedSeries): ColdestHourTrend {
  const prepared = 'hour' in source ? source : prepareSeries(source);
  const annual = annualExtremes(prepared);
  const years = annual.map((a) => a.year);
  const minima = annual.map((a) => a.minC);
  const slope = theilSenSlope(years, minima);
  const senSlopeKPerDecade = slope === null ? null : slope * 10;
  const mk = mannKendall(minima);
  const enough = annual.length >= MIN_TREND_YEARS;
  const first = years[0];
  const last = years[years.length - 1];
  let sentence: string;
  if (!enough || senSlopeKPerDecade === null || mk === null) {
    sentence = `Only ${annual.length} qualifying year(s): at least ${MIN_TREND_YEARS} are needed to say whether the coldest hour of the year has moved.`;
  } else {
    const size = Math.abs(senSlopeKPerDecade);
    const amount =
      size < 0.05
        ? 'hardly changed'
        : `${senSlopeKPerDecade > 0 ? 'warmed' : 'cooled'} by about ${size.toFixed(1)} K per decade`;
    sentence =
      `Over ${String(first)}–${String(last)} the coldest hour of the year has ${amount}; ` +
      `a trend this strong would arise by chance ${chanceInWords(mk.p)}.`;
  }
  return { annual, senSlopeKPerDecade, mannKendall: mk, enough, sentence };
}
