/**
 * The odds of a night colder than a design temperature: per year from the extreme-value fit of the
 * site's yearly minima (Gumbel, method of moments), per year from the record itself, and over the
 * years a unit is in service (docs/methods.md#odds-of-a-colder-night).
 *
 * Pure; no I/O.
 */
import { EULER_GAMMA_HANDBOOK, meanAndSampleSd } from '../climate/extremes';
import type { SweepRecordIndex } from './sweep';

/** Fewer counted years than this and the odds are shown with a note that they mean little. */
export const SHORT_RECORD_YEARS = 10;

/** The yearly minima the odds are computed from, and where they come from. */
export interface ExtremeStats {
  /** Mean of the yearly minima, °C. */
  meanC: number;
  /** Sample standard deviation of the yearly minima, K. */
  sdK: number;
  /** 'record': from the hourly record; 'published': typed-in values of the site. */
  source: 'record' | 'published';
  /** Counted years behind the mean and SD (null for published values, whose years are not known). */
  years: number | null;
  /** True when the record has fewer than `SHORT_RECORD_YEARS` counted years. */
  shortRecord: boolean;
}

/**
 * Annual exceedance probability of a design temperature, from the Gumbel distribution of the yearly
 * minima fitted by the method of moments (docs/methods.md#odds-of-a-colder-night):
 * y = 0.5772 + (π/√6)·(M − T_d)/s, p = 1 − exp(−exp(−y)). At T_d = the n-year value, p = 1/n.
 * Null when the spread is not a positive number.
 */
export function annualExceedanceProbability(designC: number, meanC: number, sdK: number): number | null {
  if (!(sdK > 0) || !Number.isFinite(meanC) || !Number.isFinite(designC)) return null;
  const y = EULER_GAMMA_HANDBOOK + (Math.PI / Math.sqrt(6)) * ((meanC - designC) / sdK);
  // −expm1(−x) = 1 − e^(−x), exact for the small x of very cold design temperatures.
  return -Math.expm1(-Math.exp(-y));
}

/** Share of the counted years whose coldest hour was below the design temperature (null without years). */
export function recordExceedanceShare(designC: number, yearlyMinimaC: readonly number[]): number | null {
  if (yearlyMinimaC.length === 0) return null;
  let below = 0;
  for (const m of yearlyMinimaC) if (m < designC) below++;
  return below / yearlyMinimaC.length;
}

/**
 * Chance of at least one year colder than the design temperature in L years, years independent:
 * 1 − (1 − p)^L (docs/methods.md#odds-of-a-colder-night).
 */
export function lifetimeExceedanceProbability(annualProbability: number, years: number): number {
  if (annualProbability >= 1) return years > 0 ? 1 : 0;
  // 1 − (1 − p)^L as −expm1(L·log1p(−p)), so that small p keeps its digits.
  return -Math.expm1(years * Math.log1p(-annualProbability));
}

/** The coldest valid hour of every counted year of an indexed record, °C, in year order. */
export function recordYearlyMinima(index: SweepRecordIndex): number[] {
  // A kept index (the sweep worker keeps a record's index for its next sweeps) is worked out once.
  let minima = minimaOf.get(index.hours);
  if (minima === undefined) {
    minima = yearlyMinima(index);
    minimaOf.set(index.hours, minima);
  }
  return [...minima];
}

const minimaOf = new WeakMap<SweepRecordIndex['hours'], readonly number[]>();

function yearlyMinima(index: SweepRecordIndex): number[] {
  const { hours } = index;
  const minima = new Array<number>(hours.years.length).fill(Infinity);
  for (let i = 0; i < hours.n; i++) {
    const y = hours.yearIndex[i] ?? 0;
    const t = hours.outdoorC[i] ?? Infinity;
    if (t < (minima[y] ?? Infinity)) minima[y] = t;
  }
  return minima.filter((m) => Number.isFinite(m));
}

/** The fit's inputs from a record's yearly minima (null for fewer than two years). */
export function statsFromMinima(minimaC: readonly number[]): ExtremeStats | null {
  if (minimaC.length < 2) return null;
  const { mean, sd } = meanAndSampleSd(minimaC);
  if (!Number.isFinite(mean) || !Number.isFinite(sd)) return null;
  return {
    meanC: mean,
    sdK: sd,
    source: 'record',
    years: minimaC.length,
    shortRecord: minimaC.length < SHORT_RECORD_YEARS,
  };
}

/** The fit's inputs from a site's published extreme mean and SD (null when either is missing). */
export function statsFromPublished(
  meanC: number | null | undefined,
  sdK: number | null | undefined,
): ExtremeStats | null {
  if (typeof meanC !== 'number' || typeof sdK !== 'number' || !(sdK > 0)) return null;
  return { meanC, sdK, source: 'published', years: null, shortRecord: false };
}

/** The odds of one design temperature. */
export interface RowOdds {
  annualExceedanceProbability: number | null;
  recordExceedanceShare: number | null;
  lifetimeExceedanceProbability: number | null;
  /** The L of the lifetime odds, years (null when there is no unit or no annual probability). */
  lifetimeYears: number | null;
}

/**
 * The odds of every design temperature. `lifetimeYearsOf` gives L for a row's selected unit (its life,
 * or the study period), or null where no unit is selected.
 */
export function oddsOfRows<R extends { designC: number; selectedOptionId: string | null }>(
  rows: readonly R[],
  stats: ExtremeStats | null,
  yearlyMinimaC: readonly number[],
  lifetimeYearsOf: (row: R) => number | null,
): RowOdds[] {
  return rows.map((row) => {
    const p = stats ? annualExceedanceProbability(row.designC, stats.meanC, stats.sdK) : null;
    const years = p === null ? null : lifetimeYearsOf(row);
    return {
      annualExceedanceProbability: p,
      recordExceedanceShare: recordExceedanceShare(row.designC, yearlyMinimaC),
      lifetimeExceedanceProbability: p !== null && years !== null ? lifetimeExceedanceProbability(p, years) : null,
      lifetimeYears: years,
    };
  });
}

/**
 * A probability as plain odds: "about a 1-in-4 chance", "about a 7-in-10 chance", "less than a
 * 1-in-100 chance", "a near-certain chance".
 */
export function plainOdds(probability: number): string {
  if (!(probability > 0)) return 'no chance on this record';
  if (probability < 0.01) return 'less than a 1-in-100 chance';
  if (probability >= 0.95) return 'a near-certain chance';
  if (probability <= 0.5) return `about a 1-in-${Math.round(1 / probability)} chance`;
  return `about a ${Math.round(probability * 10)}-in-10 chance`;
}

/**
 * The homeowner's sentence for the odds over the study period: "about a 1-in-4 chance of at least one
 * night colder than this in the next 20 years, the period over which the costs are compared".
 */
export function lifetimeOddsSentence(probability: number, years: number): string {
  const span = Math.round(years) === 1 ? 'year' : `${Math.round(years)} years`;
  return `There is ${plainOdds(probability)} of at least one night colder than this in the next ${span}, the period over which the costs are compared.`;
}
