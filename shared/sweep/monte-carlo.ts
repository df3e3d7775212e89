/**
 * How sure the sweep is: a Monte Carlo over the designer's tolerances on the inputs that are
 * estimates (conduction UA, air leakage, energy prices). Each draw scales those inputs by factors
 * drawn uniformly within the tolerances and sweeps again on the same indexed record; per design
 * temperature the 10th and 90th percentiles of the unmet hours and the life-cycle cost, and how often
 * the selected unit differs from the nominal one (docs/methods.md#uncertainty-band).
 *
 * Deterministic: the random numbers come from a generator seeded by the caller.
 */
import type { Building } from '../building/building-schemas';
import { mulberry32 } from '../climate/demo-weather';
import { quantileOfSorted } from '../climate/percentile';
import type { EnergyPrices } from '../money/energy-prices';
import { MoneyDecimal, parseMoney, toMoneyString } from '../money/money';
import { indexSweepRecord, sweep, type SweepInput, type SweepResult } from './sweep';
import { MAX_DRAWS, type Tolerances } from './tolerances';

export { DEFAULT_DRAWS, DEFAULT_SEED, DEFAULT_TOLERANCES, MAX_DRAWS, type Tolerances } from './tolerances';

/**
 * A seeded generator of uniform numbers in [0, 1): mulberry32 (public-domain algorithm), the one the
 * demo weather uses. Statistical quality is ample for a few hundred draws.
 */
export const seededUniform: (seed: number) => () => number = mulberry32;

/** The building with its conduction UA scaled by `uaFactor` and its air leakage by `leakageFactor`. */
export function scaleBuilding(building: Building, uaFactor: number, leakageFactor: number): Building {
  const c = building.conduction;
  const conduction: Building['conduction'] =
    uaFactor === 1
      ? c
      : c.mode === 'ua'
        ? { ...c, uaWPerK: c.uaWPerK * uaFactor }
        : {
            ...c,
            components: c.components.map((e) =>
              e.uValue !== undefined
                ? { ...e, uValue: e.uValue * uaFactor }
                : { ...e, rValue: (e.rValue ?? 1) / uaFactor },
            ),
          };
  const l = building.airLeakage;
  const airLeakage: Building['airLeakage'] =
    leakageFactor === 1
      ? l
      : l.mode === 'ach'
        ? { ...l, ach: l.ach * leakageFactor }
        : l.mode === 'ach50'
          ? { ...l, ach50: l.ach50 * leakageFactor }
          : { ...l, elaCm2: l.elaCm2 * leakageFactor };
  return { ...building, conduction, airLeakage };
}

const scalePrice = (price: string, factor: number): string =>
  factor === 1 ? price : parseMoney(price).times(factor).toDecimalPlaces(6).toFixed();

/** Every energy price scaled by `factor` (one factor for all fuels: the price level turns out higher or lower). */
export function scalePrices(prices: EnergyPrices, factor: number): EnergyPrices {
  if (factor === 1) return prices;
  return {
    ...prices,
    electricityPerKwh: scalePrice(prices.electricityPerKwh, factor),
    ...(prices.gas ? { gas: { ...prices.gas, price: scalePrice(prices.gas.price, factor) } } : {}),
    ...(prices.oilPerLitre !== undefined ? { oilPerLitre: scalePrice(prices.oilPerLitre, factor) } : {}),
    ...(prices.propanePerLitre !== undefined ? { propanePerLitre: scalePrice(prices.propanePerLitre, factor) } : {}),
  };
}

/** The band of one design temperature (null where no draw gave a value). */
export interface RowBand {
  unmetHoursPerYearP10: number | null;
  unmetHoursPerYearP90: number | null;
  unmetHoursWorstYearP10: number | null;
  unmetHoursWorstYearP90: number | null;
  lifeCycleCostP10: string | null;
  lifeCycleCostP90: string | null;
  /** Share of the draws whose selected unit (or lack of one) differs from the nominal sweep's. */
  selectionChangeShare: number;
}

export interface MonteCarloResult {
  draws: number;
  seed: number;
  tolerances: Tolerances;
  rows: RowBand[];
}

function band(values: number[]): [number, number] | null {
  if (values.length === 0) return null;
  const sorted = Float64Array.from(values).sort();
  return [quantileOfSorted(sorted, 0.1), quantileOfSorted(sorted, 0.9)];
}

/**
 * The Monte Carlo of a sweep. `nominal` is the sweep of `input` itself (computed when not given). The
 * record is indexed once and reused by every draw. With zero tolerances every draw is the nominal
 * sweep, so P10 and P90 equal the nominal figures.
 */
export function monteCarloSweep(
  input: SweepInput,
  options: { tolerances: Tolerances; draws: number; seed: number; nominal?: SweepResult },
): MonteCarloResult {
  const { tolerances, seed } = options;
  const draws = Math.max(1, Math.min(MAX_DRAWS, Math.floor(options.draws)));
  const record = input.record ? ('kind' in input.record ? input.record : indexSweepRecord(input.record)) : null;
  const base: SweepInput = { ...input, record };
  const nominal = options.nominal ?? sweep(base);
  const n = nominal.rows.length;
  const unmet: number[][] = Array.from({ length: n }, () => []);
  const worst: number[][] = Array.from({ length: n }, () => []);
  const lcc: number[][] = Array.from({ length: n }, () => []);
  const changed = new Array<number>(n).fill(0);
  const next = seededUniform(seed);
  const factor = (pct: number) => 1 + (pct / 100) * (2 * next() - 1);
  for (let d = 0; d < draws; d++) {
    const ua = factor(tolerances.uaPct);
    const leak = factor(tolerances.airLeakagePct);
    const price = factor(tolerances.pricesPct);
    const result = sweep({
      ...base,
      building: scaleBuilding(input.building, ua, leak),
      prices: scalePrices(input.prices, price),
    });
    result.rows.forEach((row, i) => {
      if (row.selectedOptionId !== (nominal.rows[i]?.selectedOptionId ?? null)) changed[i] = (changed[i] ?? 0) + 1;
      if (row.unmetHoursPerYear !== null) unmet[i]?.push(row.unmetHoursPerYear);
      if (row.unmetHoursWorstYear !== null) worst[i]?.push(row.unmetHoursWorstYear);
      if (row.lifeCycleCost !== null) lcc[i]?.push(Number(row.lifeCycleCost));
    });
  }
  const rows = nominal.rows.map((_, i): RowBand => {
    const u = band(unmet[i] ?? []);
    const w = band(worst[i] ?? []);
    const c = band(lcc[i] ?? []);
    return {
      unmetHoursPerYearP10: u?.[0] ?? null,
      unmetHoursPerYearP90: u?.[1] ?? null,
      unmetHoursWorstYearP10: w?.[0] ?? null,
      unmetHoursWorstYearP90: w?.[1] ?? null,
      lifeCycleCostP10: c ? toMoneyString(new MoneyDecimal(c[0])) : null,
      lifeCycleCostP90: c ? toMoneyString(new MoneyDecimal(c[1])) : null,
      selectionChangeShare: (changed[i] ?? 0) / draws,
    };
  });
  return { draws, seed, tolerances, rows };
}
