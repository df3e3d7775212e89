/**
 * Extreme annual temperatures and n-year return periods (Gumbel distribution fitted by the method
 * of moments), ASHRAE Handbook—Fundamentals, Ch. 14 (Climatic Design Information).
 */

/** Euler–Mascheroni constant to the four decimals used in the handbook formula. */
export const EULER_GAMMA_HANDBOOK = 0.5772;

/** Return periods, years, reported with every set of design conditions. */
export const RETURN_PERIODS = [5, 10, 20, 50] as const;
export type ReturnPeriod = (typeof RETURN_PERIODS)[number];

/** F(n) = −(√6/π)·(0.5772 + ln(ln(n/(n−1)))), for a return period n > 1 years. */
export function gumbelFactor(returnPeriodYears: number): number {
  const n = returnPeriodYears;
  return -(Math.sqrt(6) / Math.PI) * (EULER_GAMMA_HANDBOOK + Math.log(Math.log(n / (n - 1))));
}

/** n-year return-period minimum: T_n = M − F(n)·s (M mean, s sample SD of the annual minima). */
export function returnPeriodMinimum(mean: number, sd: number, returnPeriodYears: number): number {
  return mean - gumbelFactor(returnPeriodYears) * sd;
}

/** n-year return-period maximum: T_n = M + F(n)·s (M mean, s sample SD of the annual maxima). */
export function returnPeriodMaximum(mean: number, sd: number, returnPeriodYears: number): number {
  return mean + gumbelFactor(returnPeriodYears) * sd;
}

/**
 * Probability that the n-year value is passed at least once in L years: 1 − (1 − 1/n)^L
 * (independent years, annual probability 1/n).
 */
export function exceedanceRisk(returnPeriodYears: number, years: number): number {
  return 1 - Math.pow(1 - 1 / returnPeriodYears, years);
}

/** Mean and sample standard deviation (n − 1); sd is NaN for fewer than two values. */
export function meanAndSampleSd(values: ArrayLike<number>): { mean: number; sd: number } {
  const n = values.length;
  if (n === 0) return { mean: NaN, sd: NaN };
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i] ?? NaN;
  const mean = sum / n;
  if (n < 2) return { mean, sd: NaN };
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = (values[i] ?? NaN) - mean;
    ss += d * d;
  }
  return { mean, sd: Math.sqrt(ss / (n - 1)) };
}
