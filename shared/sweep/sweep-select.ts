/**
 * Sweep step 3, select: the unit installed at each design temperature among those whose sizing
 * capacity covers the design load (a heat pump by its compressor alone under the `compressor` rule):
 * the smallest capacity within one family, the lowest life-cycle cost across families (or the lowest
 * installed price without a record) (docs/methods.md#selection, #heat-pump-sizing). Pure: no I/O.
 */
import type { Decimal } from 'decimal.js';
import { capacityAt } from '../equipment/capacity';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import { parseMoney } from '../money/money';
import {
  DEFAULT_HEAT_PUMP_SIZING,
  type EquipmentFamily,
  type HeatPumpSizing,
  type SelectionRule,
  type SweepOption,
} from './sweep-types';

export function familyOf(option: Pick<EquipmentOption, 'kind'>): EquipmentFamily {
  if (option.kind === 'heat-pump') return 'heat-pump';
  if (option.kind === 'electric') return 'electric';
  return 'fuel-fired';
}

/** The capacity counted against the design load: a heat pump's compressor alone under the `compressor` rule. */
export function sizingCapacityW(
  option: EquipmentOption,
  designC: number,
  rule: HeatPumpSizing = DEFAULT_HEAT_PUMP_SIZING,
): number {
  const c = capacityAt(option, designC);
  return option.kind === 'heat-pump' && rule === 'compressor' ? c.compressorW : c.totalW;
}

/** The selection rule of an option list: the smallest capacity within one family, the lowest cost across families. */
export function selectionRuleOf(options: readonly Pick<EquipmentOption, 'kind'>[], hasRecord: boolean): SelectionRule {
  const families = new Set(options.map(familyOf));
  if (families.size <= 1) return 'smallest-capacity';
  return hasRecord ? 'lowest-life-cycle-cost' : 'lowest-installed-price';
}

/**
 * The option installed for a design load (docs/methods.md#selection): among the options whose
 * sizing capacity at the design temperature is at least the load, the smallest capacity (one family;
 * ties to the lower price, then the earlier option), or the lowest life-cycle cost (mixed families;
 * an option without one ranks last; ties to the smaller capacity), or the lowest installed price
 * (mixed families without a record).
 */
export function selectOption(
  options: readonly SweepOption[],
  designC: number,
  designLoadW: number,
  rule: SelectionRule = 'smallest-capacity',
  heatPumpSizing: HeatPumpSizing = DEFAULT_HEAT_PUMP_SIZING,
  lifeCycleCostOf: (option: SweepOption) => Decimal | null = () => null,
): { option: SweepOption; capacityW: number } | null {
  let best: { option: SweepOption; capacityW: number; cost: Decimal | null } | null = null;
  for (const option of options) {
    const capacityW = sizingCapacityW(option, designC, heatPumpSizing);
    if (!(capacityW >= designLoadW)) continue;
    const price = parseMoney(option.installedPrice);
    const cost =
      rule === 'lowest-life-cycle-cost' ? lifeCycleCostOf(option) : rule === 'lowest-installed-price' ? price : null;
    let better: boolean;
    if (best === null) better = true;
    else if (rule === 'smallest-capacity') {
      better =
        capacityW < best.capacityW ||
        (capacityW === best.capacityW && price.lt(parseMoney(best.option.installedPrice)));
    } else if (cost === null || best.cost === null) {
      better = best.cost === null && (cost !== null || capacityW < best.capacityW);
    } else {
      better = cost.lt(best.cost) || (cost.eq(best.cost) && capacityW < best.capacityW);
    }
    if (better) best = { option, capacityW, cost };
  }
  return best && { option: best.option, capacityW: best.capacityW };
}
