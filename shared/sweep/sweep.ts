/**
 * Design-temperature sweep: for each outdoor design temperature from the 99 % value down to the
 * 50-year extreme (plus extra temperatures and a 0.5 °C grid), the heating unit that would be
 * installed, its price, and — with an hourly record — its running cost, run-hours, unmet hours and
 * degree-hours, backup hours and energy, the lowest indoor temperature and the life-cycle cost over one
 * study period (docs/methods.md#hourly, #indoor-temperature, #life-cycle-cost).
 *
 * Pure: no I/O. SI units (W, W/K, °C, K, h, kWh); money as decimal strings computed with decimal.js.
 *
 * `sweepNaive` loops hours × ladder rows × options and is the reference; `sweep` gives the same
 * figures faster: the hour-based figures depend only on the selected option, so each distinct option
 * is simulated once, over the record's hours grouped by outdoor temperature, and only the hours from
 * each unmet hour until the house is back at the set-point are walked in time order.
 */
import type { Building } from '../building/building-schemas';
import { heatLoss, timeConstantHours } from '../building/heat-loss';
import type { HourlySeries } from '../climate/hourly-series';
import { prepareSeries, type PreparedSeries } from '../climate/prepared-series';
import { capacityAt, type CapacityAt } from '../equipment/capacity';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import { pricePerKwhOfFuel, type EnergyPrices } from '../money/energy-prices';
import type { Decimal } from 'decimal.js';
import { MoneyDecimal, parseMoney, toMoneyString } from '../money/money';

// ---------------------------------------------------------------------------------------------
// Inputs and outputs

/** An equipment option with an identifier the sweep reports back. */
export type SweepOption = EquipmentOption & { id: string };

/**
 * How a heat pump is counted against the design load (docs/methods.md#heat-pump-sizing):
 * `compressor` (default) — the compressor alone at the design temperature must cover it, backup heat
 * serves colder hours and emergencies; `with-backup` — compressor and backup together cover it.
 */
export const heatPumpSizings = ['compressor', 'with-backup'] as const;
export type HeatPumpSizing = (typeof heatPumpSizings)[number];
export const DEFAULT_HEAT_PUMP_SIZING: HeatPumpSizing = 'compressor';

/** Equipment families: a scenario holds one by default (docs/methods.md#selection). */
export const equipmentFamilies = ['fuel-fired', 'heat-pump', 'electric'] as const;
export type EquipmentFamily = (typeof equipmentFamilies)[number];

export function familyOf(option: Pick<EquipmentOption, 'kind'>): EquipmentFamily {
  if (option.kind === 'heat-pump') return 'heat-pump';
  if (option.kind === 'electric') return 'electric';
  return 'fuel-fired';
}

/** How the installed unit is chosen among those that cover the design load (docs/methods.md#selection). */
export type SelectionRule = 'smallest-capacity' | 'lowest-life-cycle-cost' | 'lowest-installed-price';

/** Life-cycle cost settings (NIST Handbook 135; docs/methods.md#life-cycle-cost). */
export interface SweepEconomics {
  /** Real discount rate, % per year. */
  discountRatePct: number;
  /** One study period for every option, years (default 20). */
  studyPeriodYears?: number;
  /** Real escalation of energy prices, % per year (default 0). */
  energyEscalationPctPerYear?: number;
}
export const DEFAULT_STUDY_PERIOD_YEARS = 20;

/** The design values the ladder is built from: computed design conditions or a published subset. */
export interface SweepDesignValues {
  heating: { db99: number; db99_6: number };
  extremeMin?: {
    mean?: number | null;
    /** Sample standard deviation of the yearly minima, K (for the odds of a colder night). */
    sd?: number | null;
    returnPeriod?: { '5'?: number | null; '10'?: number | null; '20'?: number | null; '50'?: number | null };
  };
}

/**
 * An hourly record: a raw series or a prepared one, and the years to use. Without `qualifyingYears`
 * the years that meet the completeness rule of `prepareSeries` are used.
 */
export type SweepRecord =
  | { series: HourlySeries; qualifyingYears?: readonly number[] }
  | { prepared: PreparedSeries; qualifyingYears?: readonly number[] };

export interface SweepInput {
  building: Building;
  options: readonly SweepOption[];
  prices: EnergyPrices;
  economics: SweepEconomics;
  designConditions: SweepDesignValues;
  /** Design wind speed, m/s (used for the design load, and for every hour without a wind value). */
  designWindMs: number;
  /** An hourly record, or one indexed once with `indexSweepRecord` (faster when it is reused). */
  record?: SweepRecord | SweepRecordIndex | null;
  /** Extra design temperatures, °C. */
  extraDesignC?: readonly number[];
  /** Default `compressor`. */
  heatPumpSizing?: HeatPumpSizing;
}

export interface SweepRow {
  /** '99 %', '99.6 %', 'Extreme mean', '5-year' … '50-year', or the temperature ('-23.5 °C'). */
  label: string;
  designC: number;
  /** D = L(design T, design wind) × (1 + safety), W (docs/methods.md#design-load). */
  designLoadW: number;
  selectedOptionId: string | null;
  /** Why no option was selected (null when one was). */
  selectionReason: string | null;
  /** Total capacity of the selected option at the design temperature (backup included), W. */
  capacityAtDesignW: number | null;
  /** Heat pumps: the compressor's capacity at the design temperature, W (null for other kinds). */
  compressorAtDesignW: number | null;
  installedPrice: string | null;
  /** Purchased energy per average qualifying year, with cycling losses, kWh. */
  annualEnergyKWh: number | null;
  /** annualEnergy × price per kWh of the fuel, per average year, rounded to cents. */
  annualCost: string | null;
  /** Equivalent full-load hours per average year: Σ min(1, L/Q) with Q the compressor for a heat pump. */
  runHoursPerYear: number | null;
  /** Heat pumps: hours per average year in which the compressor alone falls short and backup runs. */
  backupHoursPerYear: number | null;
  /** Heat pumps: heat (= electricity) from backup per average year, kWh. */
  backupEnergyKWh: number | null;
  /** Hours per average year in which the whole unit (backup included) falls short. */
  unmetHoursPerYear: number | null;
  unmetHoursWorstYear: number | null;
  /** Σ max(0, L − capacity) × 1 h per average year, kWh. */
  unmetEnergyKWhPerYear: number | null;
  /**
   * Σ max(0, L − capacity)/UA per average year, K·h, with UA the hour's load conductance including
   * duct loss (docs/methods.md#degree-hours).
   */
  unmetDegreeHoursPerYear: number | null;
  /** The lowest indoor temperature over the record, °C (docs/methods.md#indoor-temperature). */
  lowestIndoorC: number | null;
  /** Set-point minus `lowestIndoorC`, K. */
  worstDropK: number | null;
  /** Deprecated (see the README): the same as `worstDropK`, kept for one release. */
  worstSagC: number | null;
  /**
   * Installed price + replacements − residual value + annual cost × UPV*(d, e, N) over the study
   * period, rounded to cents (docs/methods.md#life-cycle-cost).
   */
  lifeCycleCost: string | null;
  isGrid: boolean;
  /** Why the hour-based figures are null (no record, no option selected). */
  unavailableReason: string | null;
  /** Why the cost figures are null (no price for the fuel). */
  costUnavailableReason: string | null;
  /** Set on return-period rows from a short record: how far to trust the design temperature. */
  reliabilityNote: string | null;
}

/** Something the user should know about a sweep's figures. */
export interface SweepWarning {
  code: 'short-record' | 'return-periods-unreliable' | 'fifty-year-short-record' | 'no-return-periods' | 'mixed-families';
  message: string;
}

export interface SweepResult {
  rows: SweepRow[];
  /** Qualifying years simulated (empty without a record). */
  years: number[];
  /** Thermal time constant used by the indoor-temperature model, h. */
  timeConstantH: number;
  heatPumpSizing: HeatPumpSizing;
  selectionRule: SelectionRule;
  studyPeriodYears: number;
  energyEscalationPctPerYear: number;
  warnings: SweepWarning[];
}

// ---------------------------------------------------------------------------------------------
// Formulas

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
export function ownershipFactor(d: number, lifeYears: number, studyPeriodYears: number): {
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

/** Default cycling degradation coefficient of a single-stage heat pump (docs/methods.md#cycling). */
export const DEFAULT_HEAT_PUMP_CYCLING_DEGRADATION = 0.25;

/** The option's C_d: its own, or 0.25 for a heat pump and 0 for other kinds (docs/methods.md#cycling). */
export function cyclingDegradationOf(option: Pick<EquipmentOption, 'kind' | 'cyclingDegradation'>): number {
  return option.cyclingDegradation ?? (option.kind === 'heat-pump' ? DEFAULT_HEAT_PUMP_CYCLING_DEGRADATION : 0);
}

/**
 * Part-load factor PLF = 1 − C_d·(1 − PLR) (docs/methods.md#cycling). A variable-capacity unit with
 * minimum output fraction m modulates without cycling loss above m, and cycles at its minimum output
 * below it: PLF = 1 − C_d·(1 − PLR/m). A single-stage unit has m = 1.
 */
export function partLoadFactor(plr: number, cd: number, minOutputFraction = 1): number {
  if (!(plr < minOutputFraction)) return 1;
  return 1 - cd * (1 - plr / minOutputFraction);
}

/** Steady indoor temperature with capacity Q and gains G against conductance UA: T_out + (Q + G)/UA (docs/methods.md#indoor-temperature). */
export function steadyIndoorC(outdoorC: number, capacityW: number, gainsW: number, uaWPerK: number): number {
  return outdoorC + (capacityW + gainsW) / uaWPerK;
}

/** One step of the single-capacitance model: T_ss + (T − T_ss)·e^(−Δt/τ) (docs/methods.md#indoor-temperature). */
export function droopStep(indoorC: number, steadyC: number, tauH: number, dtH = 1): number {
  return steadyC + (indoorC - steadyC) * Math.exp(-dtH / tauH);
}

/** Longest gap in a record, hours, across which the indoor temperature carries on (docs/methods.md#indoor-temperature). */
export const MAX_BRIDGED_GAP_H = 6;

/** The grid step of the ladder, K. */
export const GRID_STEP_C = 0.5;

export interface LadderRung {
  label: string;
  designC: number;
  isGrid: boolean;
}

const fmtC = (t: number): string => `${Number(t.toFixed(2))} °C`;

/** The ladder of design temperatures, mildest first (named values, extras, then the 0.5 °C grid). */
export function designLadder(values: SweepDesignValues, extraDesignC: readonly number[] = []): LadderRung[] {
  const named: LadderRung[] = [
    { label: '99 %', designC: values.heating.db99, isGrid: false },
    { label: '99.6 %', designC: values.heating.db99_6, isGrid: false },
  ];
  const ex = values.extremeMin;
  if (typeof ex?.mean === 'number') named.push({ label: 'Extreme mean', designC: ex.mean, isGrid: false });
  for (const n of ['5', '10', '20', '50'] as const) {
    const v = ex?.returnPeriod?.[n];
    if (typeof v === 'number') named.push({ label: `${n}-year`, designC: v, isGrid: false });
  }
  for (const t of extraDesignC) if (Number.isFinite(t)) named.push({ label: fmtC(t), designC: t, isGrid: false });
  const temps = named.map((r) => r.designC);
  const mildest = Math.max(...temps);
  const coldest = Math.min(...temps);
  const grid: LadderRung[] = [];
  const top = Math.floor(mildest / GRID_STEP_C);
  const bottom = Math.ceil(coldest / GRID_STEP_C);
  if (top - bottom <= 1000) {
    for (let k = top; k >= bottom; k--) {
      const t = k * GRID_STEP_C;
      if (!temps.includes(t)) grid.push({ label: fmtC(t), designC: t, isGrid: true });
    }
  }
  const all = [...named, ...grid];
  return all
    .map((r, i) => ({ r, i }))
    .sort((a, b) => b.r.designC - a.r.designC || a.i - b.i)
    .map((x) => x.r);
}

/** The capacity counted against the design load: a heat pump's compressor alone under the `compressor` rule. */
export function sizingCapacityW(option: EquipmentOption, designC: number, rule: HeatPumpSizing = DEFAULT_HEAT_PUMP_SIZING): number {
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
    const cost = rule === 'lowest-life-cycle-cost' ? lifeCycleCostOf(option) : rule === 'lowest-installed-price' ? price : null;
    let better: boolean;
    if (best === null) better = true;
    else if (rule === 'smallest-capacity') {
      better = capacityW < best.capacityW || (capacityW === best.capacityW && price.lt(parseMoney(best.option.installedPrice)));
    } else if (cost === null || best.cost === null) {
      better = best.cost === null && (cost !== null || capacityW < best.capacityW);
    } else {
      better = cost.lt(best.cost) || (cost.eq(best.cost) && capacityW < best.capacityW);
    }
    if (better) best = { option, capacityW, cost };
  }
  return best && { option: best.option, capacityW: best.capacityW };
}

// ---------------------------------------------------------------------------------------------
// Hours

/** The valid hours of the qualifying years, in time order. */
export interface Hours {
  n: number;
  hourNumber: Float64Array;
  outdoorC: Float64Array;
  /** m/s; NaN where the record has no wind value (the design wind is used there). */
  windMs: Float64Array;
  /** Index into `years`. */
  yearIndex: Int32Array;
  /** 1 when the hour directly follows the previous valid hour. */
  follows: Uint8Array;
  years: number[];
}

function recordHours(record: SweepRecord): Hours {
  const prepared = 'prepared' in record ? record.prepared : prepareSeries(record.series);
  const years = [...(record.qualifyingYears ?? prepared.years.filter((y) => y.qualifies).map((y) => y.year))].sort(
    (a, b) => a - b,
  );
  const index = new Map(years.map((y, i) => [y, i]));
  const hourNumber = new Float64Array(prepared.length);
  const outdoorC = new Float64Array(prepared.length);
  const windMs = new Float64Array(prepared.length);
  const yearIndex = new Int32Array(prepared.length);
  const follows = new Uint8Array(prepared.length);
  let n = 0;
  let lastYear = NaN;
  let lastIndex: number | undefined;
  for (let i = 0; i < prepared.length; i++) {
    const t = prepared.dryBulbC[i] ?? NaN;
    const year = prepared.year[i] ?? 0;
    if (year !== lastYear) {
      lastYear = year;
      lastIndex = index.get(year);
    }
    if (Number.isNaN(t) || lastIndex === undefined) continue;
    const hour = prepared.hour[i] ?? 0;
    hourNumber[n] = hour;
    outdoorC[n] = t;
    windMs[n] = prepared.windSpeedMs[i] ?? NaN;
    yearIndex[n] = lastIndex;
    follows[n] = n > 0 && hour === (hourNumber[n - 1] ?? NaN) + 1 ? 1 : 0;
    n++;
  }
  return {
    n,
    hourNumber: hourNumber.subarray(0, n),
    outdoorC: outdoorC.subarray(0, n),
    windMs: windMs.subarray(0, n),
    yearIndex: yearIndex.subarray(0, n),
    follows: follows.subarray(0, n),
    years,
  };
}

/** Hour-based results of one option over the record. */
interface OptionHours {
  energyKWhPerYear: number;
  runHoursPerYear: number;
  backupHoursPerYear: number;
  backupEnergyKWh: number;
  unmetHoursPerYear: number;
  unmetHoursWorstYear: number;
  unmetEnergyKWhPerYear: number;
  unmetDegreeHoursPerYear: number;
  lowestIndoorC: number;
}

/** Sums over hours (each hour, or a bin of `count` equal hours). */
interface Sums {
  energyWh: number;
  run: number;
  backupHours: number;
  backupWh: number;
  unmetWh: number;
  degreeHours: number;
}

const newSums = (): Sums => ({ energyWh: 0, run: 0, backupHours: 0, backupWh: 0, unmetWh: 0, degreeHours: 0 });

/** What the sweep needs of an option besides its capacity. */
interface OptionTraits {
  isPump: boolean;
  cd: number;
  minOutput: number;
}

const traitsOf = (option: EquipmentOption): OptionTraits => ({
  isPump: option.kind === 'heat-pump',
  cd: cyclingDegradationOf(option),
  minOutput: option.minOutputFraction ?? 1,
});

/**
 * Adds `count` hours of load `l` (W) met by capacity `c` to the sums (docs/methods.md#hourly):
 * equivalent full-load hours of the main source, purchased energy with the part-load factor, backup
 * hours and heat, and the shortfall of the whole unit.
 */
function addHours(sums: Sums, traits: OptionTraits, l: number, c: CapacityAt, ua: number, count: number): void {
  const main = traits.isPump ? c.compressorW : c.totalW;
  if (main > 0 && l > 0) {
    const plr = Math.min(1, l / main);
    sums.run += count * plr;
    sums.energyWh += (count * Math.min(l, main)) / (c.cop * partLoadFactor(plr, traits.cd, traits.minOutput));
  }
  if (traits.isPump && l > main && c.backupW > 0) {
    const fromBackup = Math.min(l - main, c.backupW);
    sums.backupHours += count;
    sums.backupWh += count * fromBackup;
    sums.energyWh += count * fromBackup;
  }
  if (l > c.totalW) {
    sums.unmetWh += count * (l - c.totalW);
    sums.degreeHours += (count * (l - c.totalW)) / ua;
  }
}

function summarise(nYears: number, sums: Sums, unmetByYear: Float64Array, lowestIndoorC: number): OptionHours {
  let unmet = 0;
  let worst = 0;
  for (const u of unmetByYear) {
    unmet += u;
    if (u > worst) worst = u;
  }
  const y = Math.max(1, nYears);
  return {
    energyKWhPerYear: sums.energyWh / 1000 / y,
    runHoursPerYear: sums.run / y,
    backupHoursPerYear: sums.backupHours / y,
    backupEnergyKWh: sums.backupWh / 1000 / y,
    unmetHoursPerYear: unmet / y,
    unmetHoursWorstYear: worst,
    unmetEnergyKWhPerYear: sums.unmetWh / 1000 / y,
    unmetDegreeHoursPerYear: sums.degreeHours / y,
    lowestIndoorC,
  };
}

/** Load conductance of an hour including duct loss, W/K (so that L = UA_eff·ΔT − G). */
function effectiveUa(building: Building, outdoorC: number, windMs: number): number {
  const h = heatLoss(building, outdoorC, windMs);
  return h.conductanceWPerK.total * (1 + h.ductLossFraction);
}

/** The indoor temperature while it is below the set-point, and the lowest it has been. */
interface IndoorState {
  c: number;
  lowest: number;
}

/** One hour of the single-capacitance model at full output; back at the set-point it stays there. */
function stepIndoor(s: IndoorState, set: number, outdoorC: number, capacityW: number, gainsW: number, ua: number, decay: number): void {
  const steady = outdoorC + (capacityW + gainsW) / ua;
  const next = steady + (s.c - steady) * decay;
  if (next < s.lowest) s.lowest = next;
  s.c = next >= set ? set : next;
}

/**
 * Carries the indoor temperature across `missing` hours absent from the record, the outdoor
 * temperature interpolated linearly and the wind at its design value; a gap longer than
 * `MAX_BRIDGED_GAP_H` resets it to the set-point (docs/methods.md#indoor-temperature).
 */
function bridgeGap(
  s: IndoorState,
  set: number,
  missing: number,
  fromC: number,
  toC: number,
  building: Building,
  option: EquipmentOption,
  designWindMs: number,
  decay: number,
): void {
  if (missing > MAX_BRIDGED_GAP_H || missing < 0) {
    s.c = set;
    return;
  }
  for (let k = 1; k <= missing && s.c < set; k++) {
    const t = fromC + ((toC - fromC) * k) / (missing + 1);
    stepIndoor(s, set, t, capacityAt(option, t).totalW, building.internalGainsW, effectiveUa(building, t, designWindMs), decay);
  }
}

/**
 * Reference simulation of one option: every hour with `heatLoss` and `capacityAt` called afresh,
 * and the indoor temperature stepped in every hour that is unmet or still recovering.
 */
function simulateNaive(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  tauH: number,
  designWindMs: number,
): OptionHours {
  const set = building.indoorDesignC;
  const traits = traitsOf(option);
  const decay = Math.exp(-1 / tauH);
  const unmetByYear = new Float64Array(hours.years.length);
  const sums = newSums();
  const indoor: IndoorState = { c: set, lowest: set };
  for (let i = 0; i < hours.n; i++) {
    const t = hours.outdoorC[i] ?? 0;
    const recorded = hours.windMs[i] ?? NaN;
    const w = Number.isNaN(recorded) ? designWindMs : recorded;
    if (i > 0 && indoor.c < set) {
      const missing = (hours.hourNumber[i] ?? 0) - (hours.hourNumber[i - 1] ?? 0) - 1;
      if (missing !== 0) bridgeGap(indoor, set, missing, hours.outdoorC[i - 1] ?? 0, t, building, option, designWindMs, decay);
    }
    const h = heatLoss(building, t, w);
    const ua = h.conductanceWPerK.total * (1 + h.ductLossFraction);
    const c = capacityAt(option, t);
    addHours(sums, traits, h.loadW, c, ua, 1);
    const unmet = h.loadW > c.totalW;
    if (unmet) unmetByYear[hours.yearIndex[i] ?? 0] = (unmetByYear[hours.yearIndex[i] ?? 0] ?? 0) + 1;
    if (unmet || indoor.c < set) stepIndoor(indoor, set, t, c.totalW, building.internalGainsW, ua, decay);
  }
  return summarise(hours.years.length, sums, unmetByYear, indoor.lowest);
}

// ---------------------------------------------------------------------------------------------
// Rows

interface Common {
  building: Building;
  hours: Hours | null;
  tauH: number;
  prices: EnergyPrices;
  discount: number;
  escalation: number;
  studyPeriodYears: number;
  energyFactor: number;
  heatPumpSizing: HeatPumpSizing;
  rule: SelectionRule;
}

function commonOf(input: SweepInput): Common {
  const { building } = input;
  const referenceUa = heatLoss(building, input.designConditions.heating.db99, input.designWindMs).conductanceWPerK
    .total;
  const tauH = timeConstantHours(building.thermalMass, referenceUa);
  const discount = input.economics.discountRatePct / 100;
  const escalation = (input.economics.energyEscalationPctPerYear ?? 0) / 100;
  const studyPeriodYears = input.economics.studyPeriodYears ?? DEFAULT_STUDY_PERIOD_YEARS;
  const hours = input.record ? ('kind' in input.record ? input.record.hours : recordHours(input.record)) : null;
  return {
    building,
    hours,
    tauH,
    prices: input.prices,
    discount,
    escalation,
    studyPeriodYears,
    energyFactor: modifiedUniformPresentValue(discount, escalation, studyPeriodYears),
    heatPumpSizing: input.heatPumpSizing ?? DEFAULT_HEAT_PUMP_SIZING,
    rule: selectionRuleOf(input.options, hours !== null),
  };
}

/** Annual cost and life-cycle cost of an option with its hour-based figures, or null without a price. */
function costsOf(common: Common, option: SweepOption, h: OptionHours): { annual: Decimal; lcc: Decimal } | null {
  const perKwh = pricePerKwhOfFuel(option.fuel, common.prices);
  if (perKwh === null) return null;
  const annual = perKwh.times(new MoneyDecimal(h.energyKWhPerYear));
  const owning = ownershipFactor(common.discount, option.lifeYears, common.studyPeriodYears).total;
  const lcc = parseMoney(option.installedPrice)
    .times(new MoneyDecimal(owning))
    .plus(annual.times(new MoneyDecimal(common.energyFactor)));
  return { annual, lcc };
}

const RETURN_PERIOD_LABELS = new Set(['5-year', '10-year', '20-year', '50-year']);

/** Warnings about the record's length and the option list (docs/methods.md#warnings). */
function warningsOf(input: SweepInput, common: Common): SweepWarning[] {
  const warnings: SweepWarning[] = [];
  const years = common.hours?.years.length ?? null;
  const rp = input.designConditions.extremeMin?.returnPeriod;
  const hasReturnPeriods = rp !== undefined && Object.values(rp).some((v) => typeof v === 'number');
  if (years !== null) {
    if (years < 8) {
      warnings.push({
        code: 'short-record',
        message: `The record has ${years} qualifying year${years === 1 ? '' : 's'}; design values from fewer than 8 years are uncertain, and hour-based figures describe those years only.`,
      });
    }
    if (!hasReturnPeriods) {
      warnings.push({
        code: 'no-return-periods',
        message: 'The record is too short for return-period temperatures (5- to 50-year); the design temperatures stop at the coldest value it has.',
      });
    } else if (years < 10) {
      warnings.push({
        code: 'return-periods-unreliable',
        message: `Return-period temperatures from ${years} years of record (fewer than 10) are unreliable; the rows are marked.`,
      });
    }
    if (hasReturnPeriods && typeof rp['50'] === 'number' && years < 20) {
      warnings.push({
        code: 'fifty-year-short-record',
        message: `The 50-year temperature is extrapolated from ${years} years of record (fewer than 20); treat it as a rough estimate.`,
      });
    }
  }
  if (common.rule !== 'smallest-capacity') {
    warnings.push({
      code: 'mixed-families',
      message:
        common.rule === 'lowest-life-cycle-cost'
          ? 'The options are of more than one family (fuel-fired, heat pump, electric); among those that cover the design load, the one with the lowest life-cycle cost is selected.'
          : 'The options are of more than one family (fuel-fired, heat pump, electric) and there is no hourly record for life-cycle costs; among those that cover the design load, the one with the lowest installed price is selected.',
    });
  }
  return warnings;
}

function reliabilityNoteOf(label: string, years: number | null): string | null {
  if (years === null || !RETURN_PERIOD_LABELS.has(label)) return null;
  if (label === '50-year' && years < 20) return `Extrapolated from ${years} years of record (fewer than 20): a rough estimate`;
  if (years < 10) return `From ${years} years of record (fewer than 10): unreliable`;
  return null;
}

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
      reliabilityNote: reliabilityNoteOf(rung.label, years),
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
  const rows = buildRows(input, common, (option, h) => simulateNaive(input.building, option, h, common.tauH, input.designWindMs));
  return resultOf(input, common, rows);
}

// ---------------------------------------------------------------------------------------------
// Fast path

/**
 * The hours of a record grouped by outdoor temperature ("bins"), and, for air leakage that follows
 * the wind, by temperature and wind. Every hour-based quantity of an option is a function of the
 * hour's load and capacity, which depend only on the bin; so a sum over the hours is a sum over the
 * bins weighted by their hour counts, and only the hours of bins the option cannot meet are walked
 * in time order (for the worst year and the sag). A record of 30 years at 0.1 °C resolution has
 * some 600 temperature bins instead of 263,000 hours.
 */
export interface Bins {
  t: Float64Array;
  /** NaN in temperature-only bins, and where the record has no wind value. */
  w: Float64Array;
  count: Float64Array;
  /** Hours of bin b: hourIdx[start[b] .. start[b + 1]), in time order. */
  start: Int32Array;
  hourIdx: Int32Array;
  /** Bin of every hour. */
  binOfHour: Int32Array;
}

/** A record ready for sweeps; build it once with `indexSweepRecord` and reuse it for any building and options. */
export interface SweepRecordIndex {
  readonly kind: 'sweep-record-index';
  readonly hours: Hours;
  /** Built on first use. */
  byTemperature: Bins | null;
  byTemperatureAndWind: Bins | null;
}

export function indexSweepRecord(record: SweepRecord): SweepRecordIndex {
  return { kind: 'sweep-record-index', hours: recordHours(record), byTemperature: null, byTemperatureAndWind: null };
}

/** Number of years and valid hours of an indexed record. */
export function sweepRecordSize(index: SweepRecordIndex): { years: number; hours: number } {
  return { years: index.hours.years.length, hours: index.hours.n };
}

/**
 * Bin of every hour, and the bins' keys, in order of first appearance. Temperatures on a 0.1 K grid
 * (as every record read from text is) are binned through an array; others through a map.
 */
function binKeys(hours: Hours, withWind: boolean): { binOfHour: Int32Array; keys: { t: number; w: number }[] } {
  const { n, outdoorC, windMs } = hours;
  const binOfHour = new Int32Array(n);
  const keys: { t: number; w: number }[] = [];
  if (!withWind) {
    let lo = Infinity;
    let hi = -Infinity;
    let onGrid = true;
    for (let i = 0; i < n && onGrid; i++) {
      const t = outdoorC[i] ?? 0;
      const k = Math.round(t * 10);
      if (k / 10 !== t) onGrid = false;
      if (k < lo) lo = k;
      if (k > hi) hi = k;
    }
    if (onGrid && n > 0 && hi - lo < 100_000) {
      const slot = new Int32Array(hi - lo + 1).fill(-1);
      for (let i = 0; i < n; i++) {
        const k = Math.round((outdoorC[i] ?? 0) * 10) - lo;
        let b = slot[k] ?? -1;
        if (b < 0) {
          b = keys.length;
          slot[k] = b;
          keys.push({ t: outdoorC[i] ?? 0, w: NaN });
        }
        binOfHour[i] = b;
      }
      return { binOfHour, keys };
    }
  }
  const byT = new Map<number, number>();
  const byTW = new Map<number, Map<number, number>>();
  for (let i = 0; i < n; i++) {
    const t = outdoorC[i] ?? 0;
    let b: number | undefined;
    if (withWind) {
      const w = windMs[i] ?? NaN;
      let inner = byTW.get(t);
      if (inner === undefined) {
        inner = new Map();
        byTW.set(t, inner);
      }
      b = inner.get(w);
      if (b === undefined) {
        b = keys.length;
        keys.push({ t, w });
        inner.set(w, b);
      }
    } else {
      b = byT.get(t);
      if (b === undefined) {
        b = keys.length;
        keys.push({ t, w: NaN });
        byT.set(t, b);
      }
    }
    binOfHour[i] = b;
  }
  return { binOfHour, keys };
}

export function buildBins(hours: Hours, withWind: boolean): Bins {
  const { n } = hours;
  const { binOfHour, keys } = binKeys(hours, withWind);
  // Bins in ascending temperature (then wind) so that consecutive bins share a capacity evaluation.
  const order = keys.map((_, b) => b).sort((a, b) => {
    const ka = keys[a] ?? { t: 0, w: 0 };
    const kb = keys[b] ?? { t: 0, w: 0 };
    return ka.t - kb.t || (ka.w || 0) - (kb.w || 0);
  });
  const rank = new Int32Array(keys.length);
  order.forEach((b, r) => (rank[b] = r));
  const nBins = keys.length;
  const t = new Float64Array(nBins);
  const w = new Float64Array(nBins);
  const count = new Float64Array(nBins);
  order.forEach((b, r) => {
    t[r] = keys[b]?.t ?? 0;
    w[r] = keys[b]?.w ?? NaN;
  });
  for (let i = 0; i < n; i++) {
    const r = rank[binOfHour[i] ?? 0] ?? 0;
    binOfHour[i] = r;
    count[r] = (count[r] ?? 0) + 1;
  }
  const start = new Int32Array(nBins + 1);
  for (let r = 0; r < nBins; r++) start[r + 1] = (start[r] ?? 0) + (count[r] ?? 0);
  const fill = start.slice(0, nBins);
  const hourIdx = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const r = binOfHour[i] ?? 0;
    hourIdx[fill[r] ?? 0] = i;
    fill[r] = (fill[r] ?? 0) + 1;
  }
  return { t, w, count, start, hourIdx, binOfHour };
}

function binsFor(index: SweepRecordIndex, withWind: boolean): Bins {
  if (withWind) return (index.byTemperatureAndWind ??= buildBins(index.hours, true));
  return (index.byTemperature ??= buildBins(index.hours, false));
}

/** The building's load and load conductance (with duct loss) in each bin. */
interface BinLoads {
  bins: Bins;
  load: Float64Array;
  ua: Float64Array;
}

function binLoads(building: Building, index: SweepRecordIndex, designWindMs: number): BinLoads {
  const bins = binsFor(index, building.airLeakage.mode === 'ela');
  const nBins = bins.t.length;
  const load = new Float64Array(nBins);
  const ua = new Float64Array(nBins);
  for (let b = 0; b < nBins; b++) {
    const recorded = bins.w[b] ?? NaN;
    const h = heatLoss(building, bins.t[b] ?? 0, Number.isNaN(recorded) ? designWindMs : recorded);
    load[b] = h.loadW;
    ua[b] = h.conductanceWPerK.total * (1 + h.ductLossFraction);
  }
  return { bins, load, ua };
}

/**
 * Hour-based figures of one option: sums over the bins, then a time-ordered walk from each unmet hour
 * until the house is back at the set-point (docs/methods.md#indoor-temperature).
 */
function simulateBinned(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  loads: BinLoads,
  tauH: number,
  designWindMs: number,
): OptionHours {
  const { bins, load, ua } = loads;
  const nBins = bins.t.length;
  const traits = traitsOf(option);
  let c = capacityAt(option, 0);
  let lastT = NaN;
  const sums = newSums();
  const unmetBins: number[] = [];
  let unmetCount = 0;
  const capByBin = new Float64Array(nBins);
  for (let b = 0; b < nBins; b++) {
    const t = bins.t[b] ?? 0;
    if (traits.isPump && t !== lastT) {
      c = capacityAt(option, t);
      lastT = t;
    }
    const count = bins.count[b] ?? 0;
    const l = load[b] ?? 0;
    capByBin[b] = c.totalW;
    addHours(sums, traits, l, c, ua[b] ?? 1, count);
    if (l > c.totalW) {
      unmetBins.push(b);
      unmetCount += count;
    }
  }

  // The unmet hours in time order (hour indices, exact in a double), for the per-year counts and
  // the starts of the indoor-temperature walks.
  const unmetHours = new Float64Array(unmetCount);
  let k = 0;
  for (const b of unmetBins) {
    for (let j = bins.start[b] ?? 0; j < (bins.start[b + 1] ?? 0); j++) unmetHours[k++] = bins.hourIdx[j] ?? 0;
  }
  unmetHours.sort();
  const unmetByYear = new Float64Array(hours.years.length);
  const set = building.indoorDesignC;
  const gains = building.internalGainsW;
  const decay = Math.exp(-1 / tauH);
  const indoor: IndoorState = { c: set, lowest: set };
  let walkedTo = -1;
  for (const i of unmetHours) {
    const yi = hours.yearIndex[i] ?? 0;
    unmetByYear[yi] = (unmetByYear[yi] ?? 0) + 1;
    if (i <= walkedTo) continue;
    // A walk starts at the set-point: the previous one ended there (or at a long gap).
    indoor.c = set;
    let j = i;
    for (;;) {
      const b = bins.binOfHour[j] ?? 0;
      stepIndoor(indoor, set, hours.outdoorC[j] ?? 0, capByBin[b] ?? 0, gains, ua[b] ?? 1, decay);
      walkedTo = j;
      if (indoor.c >= set || j + 1 >= hours.n) break;
      const missing = (hours.hourNumber[j + 1] ?? 0) - (hours.hourNumber[j] ?? 0) - 1;
      if (missing !== 0) {
        bridgeGap(indoor, set, missing, hours.outdoorC[j] ?? 0, hours.outdoorC[j + 1] ?? 0, building, option, designWindMs, decay);
        if (indoor.c >= set) break;
      }
      j++;
    }
  }
  return summarise(hours.years.length, sums, unmetByYear, indoor.lowest);
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


export interface LoadDurationPoint {
  /** Hours per average qualifying year with a load at or above `loadW`. */
  hoursPerYear: number;
  loadW: number;
  /** Outdoor temperature of that load (the warmest bin at this load), °C. */
  outdoorC: number;
}

/**
 * The record's load-duration curve for a building: hourly loads in descending order against the
 * hours per average year at or above them, thinned to at most `maxPoints` points (the first and the
 * last always kept). Hours without load are left out.
 */
export function loadDuration(
  building: Building,
  index: SweepRecordIndex,
  designWindMs: number,
  maxPoints = 300,
): LoadDurationPoint[] {
  const { bins, load } = binLoads(building, index, designWindMs);
  const years = Math.max(1, index.hours.years.length);
  const order = Array.from(load.keys())
    .filter((b) => (load[b] ?? 0) > 0)
    .sort((a, b) => (load[b] ?? 0) - (load[a] ?? 0));
  const all: LoadDurationPoint[] = [];
  let hours = 0;
  for (const b of order) {
    hours += bins.count[b] ?? 0;
    all.push({ hoursPerYear: hours / years, loadW: load[b] ?? 0, outdoorC: bins.t[b] ?? 0 });
  }
  if (all.length <= maxPoints) return all;
  const step = (all.length - 1) / (maxPoints - 1);
  const thinned: LoadDurationPoint[] = [];
  for (let k = 0; k < maxPoints; k++) {
    const p = all[Math.round(k * step)];
    if (p) thinned.push(p);
  }
  return thinned;
}
