/**
 * Design-temperature sweep: for each outdoor design temperature from the 99 % value down to the
 * 50-year extreme (plus extra temperatures and a 0.5 °C grid), the heating unit that would be
 * installed, its price, and — with an hourly record — its running cost, run-hours, unmet hours and
 * degree-hours, backup hours and energy, the lowest indoor temperature and the life-cycle cost over one
 * study period (docs/methods.md#hourly, #indoor-temperature, #life-cycle-cost).
 *
 * This file composes the steps, one file each: prepare (`sweep-prepare.ts`: ladder, hours, shared
 * settings), index (`sweep-bins.ts`: hours grouped by temperature), select (`sweep-select.ts`),
 * hourly consequences (`sweep-hourly.ts`), economics (`sweep-economics.ts`) and summary
 * (`sweep-summary.ts`: warnings, reliability notes); the types are in `sweep-types.ts`. Callers import
 * from here.
 *
 * `sweepNaive` loops hours × ladder rows × options and is the reference; `sweep` gives the same
 * figures faster: the hour-based figures depend only on the selected option, so each distinct option
 * is simulated once, over the record's hours grouped by outdoor temperature, and only the hours from
 * each unmet hour until the house is back at the set-point are walked in time order.
 *
 * Pure: no I/O. SI units (W, W/K, °C, K, h, kWh); money as decimal strings computed with decimal.js.
 */
import type { Decimal } from 'decimal.js';
import { heatLoss } from '../building/heat-loss';
import { capacityAt } from '../equipment/capacity';
import { toMoneyString } from '../money/money';
import { indexSweepRecord, binLoads } from './sweep-bins';
import { costsOf } from './sweep-economics';
import { simulateBinned, simulateNaive, type OptionHours } from './sweep-hourly';
import { commonOf, designLadder, fmtC, type Common, type Hours } from './sweep-prepare';
import { selectOption } from './sweep-select';
import { reliabilityNoteOf, warningsOf } from './sweep-summary';
import type { SweepInput, SweepOption, SweepResult, SweepRow } from './sweep-types';

export {
  DEFAULT_HEAT_PUMP_SIZING,
  DEFAULT_STUDY_PERIOD_YEARS,
  equipmentFamilies,
  heatPumpSizings,
  NAMED_ROW_LABELS,
  RETURN_PERIOD_KINDS,
  rowKindOfLabel,
  rowKinds,
  type EquipmentFamily,
  type RowKind,
  type HeatPumpSizing,
  type SelectionRule,
  type SweepDesignValues,
  type SweepEconomics,
  type SweepInput,
  type SweepOption,
  type SweepRecord,
  type SweepResult,
  type SweepRow,
  type SweepWarning,
} from './sweep-types';
export { designLadder, GRID_STEP_C, type Hours, type LadderRung } from './sweep-prepare';
export {
  buildBins,
  indexSweepRecord,
  loadDuration,
  sweepRecordSize,
  type Bins,
  type LoadDurationPoint,
  type SweepRecordIndex,
} from './sweep-bins';
export { familyOf, selectionRuleOf, selectOption, sizingCapacityW } from './sweep-select';
export {
  cyclingDegradationOf,
  DEFAULT_HEAT_PUMP_CYCLING_DEGRADATION,
  droopStep,
  MAX_BRIDGED_GAP_H,
  partLoadFactor,
  steadyIndoorC,
} from './sweep-hourly';
export {
  modifiedUniformPresentValue,
  ownershipFactor,
  singlePresentValue,
  uniformPresentValue,
} from './sweep-economics';

function buildRows(
  input: SweepInput,
  common: Common,
  hourly: (option: SweepOption, hours: Hours) => OptionHours,
): SweepRow[] {
  const years = common.hours?.years.length ?? null;
  return designLadder(input.designConditions, input.extraDesignC).map((rung) => {
    const designLoadW = heatLoss(input.building, rung.designC, input.designWindMs).designLoadW;
    const hours = common.hours;
    const lcc = (option: SweepOption): Decimal | null =>
      hours === null ? null : (costsOf(common, option, hourly(option, hours))?.lcc ?? null);
    const chosen = selectOption(input.options, rung.designC, designLoadW, common.rule, common.heatPumpSizing, lcc);
    const row: SweepRow = {
      kind: rung.kind,
      label: rung.label,
      designC: rung.designC,
      designLoadW,
      selectedOptionId: null,
      selectionReason: null,
      capacityAtDesignW: null,
      compressorAtDesignW: null,
      installedPrice: null,
      annualEnergyKWh: null,
      annualCost: null,
      runHoursPerYear: null,
      backupHoursPerYear: null,
      backupEnergyKWh: null,
      unmetHoursPerYear: null,
      unmetHoursWorstYear: null,
      unmetEnergyKWhPerYear: null,
      unmetDegreeHoursPerYear: null,
      lowestIndoorC: null,
      worstDropK: null,
      worstSagC: null,
      lifeCycleCost: null,
      isGrid: rung.isGrid,
      unavailableReason: null,
      costUnavailableReason: null,
      reliabilityNote: reliabilityNoteOf(rung.kind, years),
    };
    if (chosen === null) {
      row.selectionReason =
        input.options.length === 0
          ? 'No equipment options to choose from'
          : common.heatPumpSizing === 'compressor' && input.options.some((o) => o.kind === 'heat-pump')
            ? `No option delivers the design load of ${Math.round(designLoadW)} W at ${fmtC(rung.designC)} (heat pumps by their compressor alone)`
            : `No option delivers the design load of ${Math.round(designLoadW)} W at ${fmtC(rung.designC)}`;
      row.unavailableReason = 'No option selected';
      return row;
    }
    const { option } = chosen;
    const c = capacityAt(option, rung.designC);
    row.selectedOptionId = option.id;
    row.capacityAtDesignW = c.totalW;
    row.compressorAtDesignW = option.kind === 'heat-pump' ? c.compressorW : null;
    row.installedPrice = toMoneyString(option.installedPrice);
    if (hours === null) {
      row.unavailableReason = 'No hourly record: hour-based figures need one';
      return row;
    }
    const h = hourly(option, hours);
    const set = input.building.indoorDesignC;
    row.annualEnergyKWh = h.energyKWhPerYear;
    row.runHoursPerYear = h.runHoursPerYear;
    row.backupHoursPerYear = h.backupHoursPerYear;
    row.backupEnergyKWh = h.backupEnergyKWh;
    row.unmetHoursPerYear = h.unmetHoursPerYear;
    row.unmetHoursWorstYear = h.unmetHoursWorstYear;
    row.unmetEnergyKWhPerYear = h.unmetEnergyKWhPerYear;
    row.unmetDegreeHoursPerYear = h.unmetDegreeHoursPerYear;
    row.lowestIndoorC = h.lowestIndoorC;
    row.worstDropK = set - h.lowestIndoorC;
    row.worstSagC = row.worstDropK;
    const costs = costsOf(common, option, h);
    if (costs === null) {
      row.costUnavailableReason = `No ${option.fuel} price`;
      return row;
    }
    row.annualCost = toMoneyString(costs.annual);
    row.lifeCycleCost = toMoneyString(costs.lcc);
    return row;
  });
}

function resultOf(input: SweepInput, common: Common, rows: SweepRow[]): SweepResult {
  return {
    rows,
    years: common.hours?.years ?? [],
    timeConstantH: common.tauH,
    heatPumpSizing: common.heatPumpSizing,
    selectionRule: common.rule,
    studyPeriodYears: common.studyPeriodYears,
    energyEscalationPctPerYear: common.escalation * 100,
    warnings: warningsOf(input, common),
  };
}

/** Reference sweep: for every ladder row, selection over the options and a full pass over the hours of each option it weighs. */
export function sweepNaive(input: SweepInput): SweepResult {
  const common = commonOf(input);
  const rows = buildRows(input, common, (option, h) =>
    simulateNaive(input.building, option, h, common.tauH, input.designWindMs),
  );
  return resultOf(input, common, rows);
}

/**
 * The sweep, with the same figures as `sweepNaive` (to rounding of sums): each distinct selected
 * option is simulated once, over the record's temperature bins. Pass a `SweepRecordIndex` as the
 * record to reuse the grouping across sweeps.
 */
export function sweep(input: SweepInput): SweepResult {
  const record = input.record;
  const index = record ? ('kind' in record ? record : indexSweepRecord(record)) : null;
  const common = commonOf({ ...input, record: index });
  const loads = index ? binLoads(input.building, index, input.designWindMs) : null;
  const cache = new Map<SweepOption, OptionHours>();
  const rows = buildRows(input, common, (option, h) => {
    let r = cache.get(option);
    if (r === undefined) {
      if (loads === null) throw new Error('The sweep has hours but no bins');
      r = simulateBinned(input.building, option, h, loads, common.tauH, input.designWindMs);
      cache.set(option, r);
    }
    return r;
  });
  return resultOf(input, common, rows);
}
