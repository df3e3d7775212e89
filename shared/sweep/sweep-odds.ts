/**
 * A sweep with its odds: every row gains the odds of a colder night, the price of comfort and (with
 * a record and draws) the uncertainty band (docs/methods.md#odds-of-a-colder-night,
 * #price-of-comfort, #uncertainty-band). Used by the sweep worker and the command line.
 */
import { monteCarloSweep, type RowBand } from './monte-carlo';
import {
  oddsOfRows,
  recordYearlyMinima,
  statsFromMinima,
  statsFromPublished,
  type ExtremeStats,
  type RowOdds,
} from './odds';
import { priceOfComfort, type RowComfortPrice } from './price-of-comfort';
import { indexSweepRecord, sweep, type SweepInput, type SweepResult, type SweepRow } from './sweep';
import type { Tolerances } from './tolerances';

export type SweepRowWithOdds = SweepRow & RowOdds & RowComfortPrice & { [K in keyof RowBand]: RowBand[K] | null };

export interface SweepWithOdds extends Omit<SweepResult, 'rows'> {
  rows: SweepRowWithOdds[];
  odds: ExtremeStats | null;
  uncertainty: { draws: number; seed: number; tolerances: Tolerances } | null;
}

export interface SweepOddsOptions {
  /** The Monte Carlo to run (null or 0 draws: none). Needs a record. */
  uncertainty: { tolerances: Tolerances; draws: number; seed: number } | null;
  /**
   * L for the lifetime odds and the price of comfort, years: the study period when given, otherwise
   * the selected unit's life.
   */
  periodYears?: number | null;
}

const NO_BAND: { [K in keyof RowBand]: null } = {
  unmetHoursPerYearP10: null,
  unmetHoursPerYearP90: null,
  unmetHoursWorstYearP10: null,
  unmetHoursWorstYearP90: null,
  lifeCycleCostP10: null,
  lifeCycleCostP90: null,
  selectionChangeShare: null,
};

/** L for a row: the study period, or the life of the row's unit; null without a unit. */
export function periodYearsFor(input: Pick<SweepInput, 'options'>, periodYears: number | null | undefined) {
  const life = new Map(input.options.map((o) => [o.id, o.lifeYears]));
  return (row: Pick<SweepRow, 'selectedOptionId'>): number | null =>
    row.selectedOptionId === null ? null : (periodYears ?? life.get(row.selectedOptionId) ?? null);
}

/** The odds' inputs: the record's own yearly minima, or the site's published mean and SD. */
export function extremeStatsOf(input: SweepInput, yearlyMinimaC: readonly number[]): ExtremeStats | null {
  if (yearlyMinimaC.length > 0) return statsFromMinima(yearlyMinimaC);
  const ex = input.designConditions.extremeMin;
  return statsFromPublished(ex?.mean, ex?.sd);
}

/** The sweep of `input` with the odds, the price of comfort and the band on every row. */
export function sweepWithOdds(input: SweepInput, options: SweepOddsOptions): SweepWithOdds {
  const record = input.record ? ('kind' in input.record ? input.record : indexSweepRecord(input.record)) : null;
  const base: SweepInput = { ...input, record };
  const nominal = sweep(base);
  const minima = record ? recordYearlyMinima(record) : [];
  const stats = extremeStatsOf(base, minima);
  // L: the study period of the life-cycle cost when there is one, otherwise the unit's life.
  const periodOf = periodYearsFor(input, options.periodYears ?? nominal.studyPeriodYears);
  const odds = oddsOfRows(nominal.rows, stats, minima, periodOf);
  const comfort = priceOfComfort(nominal.rows, periodOf);
  const mc =
    record && options.uncertainty && options.uncertainty.draws > 0
      ? monteCarloSweep(base, { ...options.uncertainty, nominal })
      : null;
  return {
    ...nominal,
    rows: nominal.rows.map((row, i) => ({
      ...row,
      ...(odds[i] ?? {
        annualExceedanceProbability: null,
        recordExceedanceShare: null,
        lifetimeExceedanceProbability: null,
        lifetimeYears: null,
      }),
      ...(comfort[i] ?? { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null }),
      ...(mc?.rows[i] ?? NO_BAND),
    })),
    odds: stats,
    uncertainty: mc ? { draws: mc.draws, seed: mc.seed, tolerances: mc.tolerances } : null,
  };
}
