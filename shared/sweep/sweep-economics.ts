/**
 * Sweep step 5, economics: present-value factors (NIST Handbook 135), the cost of owning a unit over
 * one study period (replacements, residual value), and an option's annual and life-cycle cost from its
 * hour-based energy (docs/methods.md#life-cycle-cost). Money as decimal.js values. Pure: no I/O.
 */
import type { Decimal } from 'decimal.js';
import { pricePerKwhOfFuel } from '../money/energy-prices';
import { MoneyDecimal, parseMoney } from '../money/money';
import type { OptionHours } from './sweep-hourly';
import type { Common } from './sweep-prepare';
import type { SweepOption } from './sweep-types';

/**
 * Uniform present value factor, NIST Handbook 135 (1995 ed.): UPV = ((1 + d)^n − 1)/(d·(1 + d)^n),
 * d the real discount rate as a fraction, n years; n when d = 0 (docs/methods.md#life-cycle-cost).
 */
export function uniformPresentValue(d: number, n: number): number {
  if (d === 0) return n;
  const g = (1 + d) ** n;
  return (g - 1) / (d * g);
}

/** Single present value factor, NIST Handbook 135: SPV = 1/(1 + d)^t (docs/methods.md#life-cycle-cost). */
export function singlePresentValue(d: number, t: number): number {
  return 1 / (1 + d) ** t;
}

/**
 * Modified uniform present value factor for an annual amount escalating at e, NIST Handbook 135:
 * UPV* = ((1 + e)/(d − e))·(1 − ((1 + e)/(1 + d))^n); n when d = e (docs/methods.md#life-cycle-cost).
 */
export function modifiedUniformPresentValue(d: number, e: number, n: number): number {
  if (Math.abs(d - e) < 1e-12) return n;
  return ((1 + e) / (d - e)) * (1 - ((1 + e) / (1 + d)) ** n);
}

/**
 * Present value of owning a unit of price 1 over a study period: the purchase, a replacement at the
 * same real price at every multiple of the life inside the period, less the straight-line residual
 * value of the unit in service at the end (docs/methods.md#life-cycle-cost).
 */
export function ownershipFactor(
  d: number,
  lifeYears: number,
  studyPeriodYears: number,
): {
  replacements: number;
  residual: number;
  total: number;
} {
  let replacements = 0;
  let lastPurchase = 0;
  for (let t = lifeYears; t < studyPeriodYears; t += lifeYears) {
    replacements += singlePresentValue(d, t);
    lastPurchase = t;
  }
  const remaining = lastPurchase + lifeYears - studyPeriodYears;
  const residual = (remaining / lifeYears) * singlePresentValue(d, studyPeriodYears);
  return { replacements, residual, total: 1 + replacements - residual };
}

/** Annual cost and life-cycle cost of an option with its hour-based figures, or null without a price. */
export function costsOf(common: Common, option: SweepOption, h: OptionHours): { annual: Decimal; lcc: Decimal } | null {
  const perKwh = pricePerKwhOfFuel(option.fuel, common.prices);
  if (perKwh === null) return null;
  const annual = perKwh.times(new MoneyDecimal(h.energyKWhPerYear));
  const owning = ownershipFactor(common.discount, option.lifeYears, common.studyPeriodYears).total;
  const lcc = parseMoney(option.installedPrice)
    .times(new MoneyDecimal(owning))
    .plus(annual.times(new MoneyDecimal(common.energyFactor)));
  return { annual, lcc };
}
