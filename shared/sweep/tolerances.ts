/**
 * The designer's tolerances on the estimated inputs and the size of the Monte Carlo behind the
 * uncertainty band (docs/methods.md#uncertainty-band).
 */

/** Tolerances of the estimated inputs, ± % of the entered value. */
export interface Tolerances {
  uaPct: number;
  airLeakagePct: number;
  pricesPct: number;
}

/** Common-practice starting points, no source: the designer sets the project's own. */
export const DEFAULT_TOLERANCES: Tolerances = { uaPct: 10, airLeakagePct: 25, pricesPct: 15 };
export const DEFAULT_DRAWS = 300;
export const DEFAULT_SEED = 1;
export const MAX_DRAWS = 2000;
