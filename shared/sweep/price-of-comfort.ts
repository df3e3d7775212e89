/**
 * The price of comfort: between neighbouring design temperatures whose units differ, the extra
 * life-cycle cost divided by the cold hours the larger unit avoids over the period
 * (docs/methods.md#price-of-comfort). Pure; money with decimal.js.
 */
import { parseMoney } from '../money/money';

export interface ComfortRow {
  selectedOptionId: string | null;
  lifeCycleCost: string | null;
  unmetHoursPerYear: number | null;
  unmetHoursWorstYear: number | null;
}

/** The price of comfort of one design temperature against its milder neighbour. */
export interface RowComfortPrice {
  /** ΔLCC / (avoided unmet hours per average year × L), money per hour; null where not defined. */
  costPerAvoidedUnmetHour: number | null;
  /** ΔLCC / (avoided unmet hours of the worst year × L): as if every year were the worst one. */
  costPerAvoidedWorstYearHour: number | null;
}

const NONE: RowComfortPrice = { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null };

/**
 * For each row (mildest first), the price of comfort against the row before it: defined where the two
 * select different units, both have a life-cycle cost, and the colder row's unit avoids unmet hours.
 * `periodYearsOf` gives L for the colder row (its unit's life, or the study period).
 */
export function priceOfComfort<R extends ComfortRow>(
  rows: readonly R[],
  periodYearsOf: (row: R) => number | null,
): RowComfortPrice[] {
  return rows.map((row, i) => {
    const milder = i > 0 ? rows[i - 1] : undefined;
    if (
      milder === undefined ||
      row.selectedOptionId === null ||
      milder.selectedOptionId === null ||
      row.selectedOptionId === milder.selectedOptionId ||
      row.lifeCycleCost === null ||
      milder.lifeCycleCost === null
    ) {
      return NONE;
    }
    const years = periodYearsOf(row);
    if (years === null || !(years > 0)) return NONE;
    const extra = parseMoney(row.lifeCycleCost).minus(parseMoney(milder.lifeCycleCost));
    const per = (avoidedPerYear: number | null): number | null =>
      avoidedPerYear !== null && avoidedPerYear > 0 ? extra.div(avoidedPerYear * years).toNumber() : null;
    const avoided = (a: number | null, b: number | null): number | null => (a === null || b === null ? null : a - b);
    return {
      costPerAvoidedUnmetHour: per(avoided(milder.unmetHoursPerYear, row.unmetHoursPerYear)),
      costPerAvoidedWorstYearHour: per(avoided(milder.unmetHoursWorstYear, row.unmetHoursWorstYear)),
    };
  });
}
