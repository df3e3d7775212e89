/**
 * Design-temperature sweep: for each outdoor design temperature from the 99 % value down to the
 * 50-year extreme (plus extra temperatures and a 0.5 °C grid), the heating unit that would be
 * installed, its price, and — with an hourly record — its running cost, run-hours, unmet hours and
 * degree-hours, indoor temperature sag and life-cycle cost (METHODS §5, §5.1, §6).
 *
 * Pure: no I/O. SI units (W, W/K, °C, K, h, kWh); money as decimal strings computed with decimal.js.
 *
 * `sweepNaive` loops hours × ladder rows × options and is the reference; `sweep` gives the same
 * figures faster: the hour-based figures depend only on the selected option, so each distinct option
 * is simulated once, in one pass over the hours (flat-capacity units with a wind-independent
 * conductance use per-year sorted loads with cumulative sums and walk only their unmet hours).
 */
import type { Building } from '../building/building-schemas';
import { heatLoss, timeConstantHours } from '../building/heat-loss';
import type { HourlySeries } from '../climate/hourly-series';
import { prepareSeries, type PreparedSeries } from '../climate/prepared-series';
import { capacityAt } from '../equipment/capacity';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import { pricePerKwhOfFuel, type EnergyPrices } from '../money/energy-prices';
import { MoneyDecimal, parseMoney, toMoneyString } from '../money/money';

// ---------------------------------------------------------------------------------------------
// Inputs and outputs

/** An equipment option with an identifier the sweep reports back. */
export type SweepOption = EquipmentOption & { id: string };

/** The design values the ladder is built from: computed design conditions or a published subset. */
export interface SweepDesignValues {
  heating: { db99: number; db99_6: number };
  extremeMin?: {
    mean?: number | null;
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
  economics: { discountRatePct: number };
  designConditions: SweepDesignValues;
  /** Design wind speed, m/s (used for the design load, and for every hour without a wind value). */
  designWindMs: number;
  record?: SweepRecord | null;
  /** Extra design temperatures, °C. */
  extraDesignC?: readonly number[];
}

export interface SweepRow {
  /** '99 %', '99.6 %', 'Extreme mean', '5-year' … '50-year', or the temperature ('-23.5 °C'). */
  label: string;
  designC: number;
  /** D = L(design T, design wind) × (1 + safety), W. */
  designLoadW: number;
  selectedOptionId: string | null;
  /** Why no option was selected (null when one was). */
  selectionReason: string | null;
  /** Total capacity of the selected option at the design temperature (backup included), W. */
  capacityAtDesignW: number | null;
  installedPrice: string | null;
  /** Purchased energy per average qualifying year, kWh. */
  annualEnergyKWh: number | null;
  /** annualEnergy × price per kWh of the fuel, per average year, rounded to cents. */
  annualCost: string | null;
  runHoursPerYear: number | null;
  unmetHoursPerYear: number | null;
  unmetHoursWorstYear: number | null;
  /** Σ max(0, L − capacity) × 1 h per average year, kWh. */
  unmetEnergyKWhPerYear: number | null;
  /**
   * Σ max(0, L − capacity)/UA per average year, K·h (METHODS §5), with UA the hour's load
   * conductance including duct loss (UA·(1 + duct)), so that L = UA·ΔT − gains.
   */
  unmetDegreeHoursPerYear: number | null;
  /**
   * Largest drop of the indoor temperature below the set-point over the record, K: single-node
   * model of METHODS §5.1 with the same UA; the set-point holds while capacity suffices, the indoor
   * temperature recovers to it in the first hour capacity does, and restarts at it after a gap.
   */
  worstSagC: number | null;
  /** Installed price + UPV(d, life) × annual cost, rounded to cents. */
  lifeCycleCost: string | null;
  isGrid: boolean;
  /** Why the hour-based figures are null (no record, no option selected). */
  unavailableReason: string | null;
  /** Why the cost figures are null (no price for the fuel). */
  costUnavailableReason: string | null;
}

export interface SweepResult {
  rows: SweepRow[];
  /** Qualifying years simulated (empty without a record). */
  years: number[];
  /** Thermal time constant used by the sag model, h. */
  timeConstantH: number;
}

// ---------------------------------------------------------------------------------------------
// Formulas

/**
 * Uniform present value factor, NIST Handbook 135 (1995 ed.): UPV = ((1 + d)^n − 1)/(d·(1 + d)^n),
 * d the real discount rate as a fraction, n years; n when d = 0.
 */
export function uniformPresentValue(d: number, n: number): number {
  if (d === 0) return n;
  const g = (1 + d) ** n;
  return (g - 1) / (d * g);
}

/** Steady indoor temperature with capacity Q and gains G against conductance UA: T_out + (Q + G)/UA (METHODS §5.1). */
export function steadyIndoorC(outdoorC: number, capacityW: number, gainsW: number, uaWPerK: number): number {
  return outdoorC + (capacityW + gainsW) / uaWPerK;
}

/** One step of the single-capacitance model: T_ss + (T − T_ss)·e^(−Δt/τ) (METHODS §5.1). */
export function droopStep(indoorC: number, steadyC: number, tauH: number, dtH = 1): number {
  return steadyC + (indoorC - steadyC) * Math.exp(-dtH / tauH);
}

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

/**
 * The option installed for a design load: the smallest total capacity at the design temperature
 * that is at least the load (heat pumps: compressor + backup); ties go to the lower price, then to
 * the earlier option.
 */
export function selectOption(
  options: readonly SweepOption[],
  designC: number,
  designLoadW: number,
): { option: SweepOption; capacityW: number } | null {
  let best: { option: SweepOption; capacityW: number } | null = null;
  for (const option of options) {
    const capacityW = capacityAt(option, designC).totalW;
    if (!(capacityW >= designLoadW)) continue;
    if (
      best === null ||
      capacityW < best.capacityW ||
      (capacityW === best.capacityW && parseMoney(option.installedPrice).lt(parseMoney(best.option.installedPrice)))
    ) {
      best = { option, capacityW };
    }
  }
  return best;
}

// ---------------------------------------------------------------------------------------------
// Hours

/** The valid hours of the qualifying years, in time order. */
interface Hours {
  n: number;
  hourNumber: Float64Array;
  outdoorC: Float64Array;
  windMs: Float64Array;
  /** Index into `years`. */
  yearIndex: Int32Array;
  years: number[];
}

function recordHours(record: SweepRecord, designWindMs: number): Hours {
  const prepared = 'prepared' in record ? record.prepared : prepareSeries(record.series);
  const years = [...(record.qualifyingYears ?? prepared.years.filter((y) => y.qualifies).map((y) => y.year))].sort(
    (a, b) => a - b,
  );
  const index = new Map(years.map((y, i) => [y, i]));
  const hourNumber: number[] = [];
  const outdoorC: number[] = [];
  const windMs: number[] = [];
  const yearIndex: number[] = [];
  for (let i = 0; i < prepared.length; i++) {
    const t = prepared.dryBulbC[i] ?? NaN;
    const yi = index.get(prepared.year[i] ?? 0);
    if (Number.isNaN(t) || yi === undefined) continue;
    const w = prepared.windSpeedMs[i] ?? NaN;
    hourNumber.push(prepared.hour[i] ?? 0);
    outdoorC.push(t);
    windMs.push(Number.isNaN(w) ? designWindMs : w);
    yearIndex.push(yi);
  }
  return {
    n: outdoorC.length,
    hourNumber: Float64Array.from(hourNumber),
    outdoorC: Float64Array.from(outdoorC),
    windMs: Float64Array.from(windMs),
    yearIndex: Int32Array.from(yearIndex),
    years,
  };
}

/** Hour-based results of one option over the record. */
interface OptionHours {
  energyKWhPerYear: number;
  runHoursPerYear: number;
  unmetHoursPerYear: number;
  unmetHoursWorstYear: number;
  unmetEnergyKWhPerYear: number;
  unmetDegreeHoursPerYear: number;
  worstSagC: number;
}

/** Load conductance of an hour including duct loss, W/K (so that L = UA_eff·ΔT − G). */
function effectiveUa(building: Building, outdoorC: number, windMs: number): number {
  const h = heatLoss(building, outdoorC, windMs);
  return h.conductanceWPerK.total * (1 + h.ductLossFraction);
}

/** Purchased energy of an hour delivering `deliveredW`, Wh. */
function inputWh(option: EquipmentOption, outdoorC: number, deliveredW: number): number {
  const c = capacityAt(option, outdoorC);
  if (option.kind !== 'heat-pump') return deliveredW / c.cop;
  const fromCompressor = Math.min(deliveredW, c.compressorW);
  const fromBackup = deliveredW - fromCompressor;
  return (c.cop > 0 ? fromCompressor / c.cop : 0) + fromBackup;
}

function summarise(
  nYears: number,
  energyWh: number,
  run: number,
  unmetByYear: Float64Array,
  unmetWh: number,
  degreeHours: number,
  worstSag: number,
): OptionHours {
  let unmet = 0;
  let worst = 0;
  for (const u of unmetByYear) {
    unmet += u;
    if (u > worst) worst = u;
  }
  const y = Math.max(1, nYears);
  return {
    energyKWhPerYear: energyWh / 1000 / y,
    runHoursPerYear: run / y,
    unmetHoursPerYear: unmet / y,
    unmetHoursWorstYear: worst,
    unmetEnergyKWhPerYear: unmetWh / 1000 / y,
    unmetDegreeHoursPerYear: degreeHours / y,
    worstSagC: worstSag,
  };
}

/**
 * Reference simulation of one option: every hour with `heatLoss` and `capacityAt` called afresh.
 * An hour that does not follow the previous valid hour restarts the indoor temperature at the set-point.
 */
function simulateNaive(building: Building, option: EquipmentOption, hours: Hours, tauH: number): OptionHours {
  const set = building.indoorDesignC;
  const unmetByYear = new Float64Array(hours.years.length);
  let energyWh = 0;
  let run = 0;
  let unmetWh = 0;
  let degreeHours = 0;
  let worstSag = 0;
  let indoor = set;
  let previousHour = -Infinity;
  for (let i = 0; i < hours.n; i++) {
    const t = hours.outdoorC[i] ?? 0;
    const w = hours.windMs[i] ?? 0;
    const hour = hours.hourNumber[i] ?? 0;
    if (hour !== previousHour + 1) indoor = set;
    previousHour = hour;
    const load = heatLoss(building, t, w).loadW;
    const cap = capacityAt(option, t).totalW;
    const delivered = Math.min(load, cap);
    energyWh += inputWh(option, t, delivered);
    run += cap > 0 ? Math.min(1, load / cap) : 0;
    if (load > cap) {
      const ua = effectiveUa(building, t, w);
      unmetByYear[hours.yearIndex[i] ?? 0] = (unmetByYear[hours.yearIndex[i] ?? 0] ?? 0) + 1;
      unmetWh += load - cap;
      degreeHours += (load - cap) / ua;
      indoor = droopStep(indoor, steadyIndoorC(t, cap, building.internalGainsW, ua), tauH);
      worstSag = Math.max(worstSag, set - indoor);
    } else {
      indoor = set;
    }
  }
  return summarise(hours.years.length, energyWh, run, unmetByYear, unmetWh, degreeHours, worstSag);
}

// ---------------------------------------------------------------------------------------------
// Rows

interface Common {
  building: Building;
  hours: Hours | null;
  tauH: number;
  upvFor: (lifeYears: number) => number;
  prices: EnergyPrices;
}

function commonOf(input: SweepInput): Common {
  const { building } = input;
  const referenceUa = heatLoss(building, input.designConditions.heating.db99, input.designWindMs).conductanceWPerK
    .total;
  const tauH = timeConstantHours(building.thermalMass, referenceUa);
  const d = input.economics.discountRatePct / 100;
  return {
    building,
    hours: input.record ? recordHours(input.record, input.designWindMs) : null,
    tauH,
    upvFor: (n) => uniformPresentValue(d, n),
    prices: input.prices,
  };
}

function buildRows(
  input: SweepInput,
  common: Common,
  hourly: (option: SweepOption, hours: Hours) => OptionHours,
): SweepRow[] {
  return designLadder(input.designConditions, input.extraDesignC).map((rung) => {
    const designLoadW = heatLoss(input.building, rung.designC, input.designWindMs).designLoadW;
    const chosen = selectOption(input.options, rung.designC, designLoadW);
    const row: SweepRow = {
      label: rung.label,
      designC: rung.designC,
      designLoadW,
      selectedOptionId: null,
      selectionReason: null,
      capacityAtDesignW: null,
      installedPrice: null,
      annualEnergyKWh: null,
      annualCost: null,
      runHoursPerYear: null,
      unmetHoursPerYear: null,
      unmetHoursWorstYear: null,
      unmetEnergyKWhPerYear: null,
      unmetDegreeHoursPerYear: null,
      worstSagC: null,
      lifeCycleCost: null,
      isGrid: rung.isGrid,
      unavailableReason: null,
      costUnavailableReason: null,
    };
    if (chosen === null) {
      row.selectionReason =
        input.options.length === 0
          ? 'No equipment options to choose from'
          : `No option delivers the design load of ${Math.round(designLoadW)} W at ${fmtC(rung.designC)}`;
      row.unavailableReason = 'No option selected';
      return row;
    }
    const { option, capacityW } = chosen;
    row.selectedOptionId = option.id;
    row.capacityAtDesignW = capacityW;
    row.installedPrice = toMoneyString(option.installedPrice);
    if (common.hours === null) {
      row.unavailableReason = 'No hourly record: hour-based figures need one';
      return row;
    }
    const h = hourly(option, common.hours);
    row.annualEnergyKWh = h.energyKWhPerYear;
    row.runHoursPerYear = h.runHoursPerYear;
    row.unmetHoursPerYear = h.unmetHoursPerYear;
    row.unmetHoursWorstYear = h.unmetHoursWorstYear;
    row.unmetEnergyKWhPerYear = h.unmetEnergyKWhPerYear;
    row.unmetDegreeHoursPerYear = h.unmetDegreeHoursPerYear;
    row.worstSagC = h.worstSagC;
    const perKwh = pricePerKwhOfFuel(option.fuel, common.prices);
    if (perKwh === null) {
      row.costUnavailableReason = `No ${option.fuel} price`;
      return row;
    }
    const annual = perKwh.times(new MoneyDecimal(h.energyKWhPerYear));
    row.annualCost = toMoneyString(annual);
    row.lifeCycleCost = toMoneyString(
      parseMoney(option.installedPrice).plus(annual.times(new MoneyDecimal(common.upvFor(option.lifeYears)))),
    );
    return row;
  });
}

/** Reference sweep: for every ladder row, selection over the options and a full pass over the hours. */
export function sweepNaive(input: SweepInput): SweepResult {
  const common = commonOf(input);
  const rows = buildRows(input, common, (option, h) => simulateNaive(input.building, option, h, common.tauH));
  return { rows, years: common.hours?.years ?? [], timeConstantH: common.tauH };
}

// ---------------------------------------------------------------------------------------------
// Fast path

/** Loads and conductances of every hour, computed once for all options. */
interface HourLoads {
  load: Float64Array;
  ua: Float64Array;
  /** 1 when the hour directly follows the previous valid hour. */
  follows: Uint8Array;
  /** Whether the conductance is the same every hour (ACH, ACH50 modes). */
  uaConstant: boolean;
  /** Per year: loads sorted ascending and their cumulative sums (length + 1); built on first use. */
  sortedByYear: { loads: Float64Array; prefix: Float64Array }[] | null;
}

function hourLoads(building: Building, hours: Hours): HourLoads {
  const load = new Float64Array(hours.n);
  const ua = new Float64Array(hours.n);
  const follows = new Uint8Array(hours.n);
  for (let i = 0; i < hours.n; i++) {
    const t = hours.outdoorC[i] ?? 0;
    const w = hours.windMs[i] ?? 0;
    const h = heatLoss(building, t, w);
    load[i] = h.loadW;
    ua[i] = h.conductanceWPerK.total * (1 + h.ductLossFraction);
    follows[i] = i > 0 && (hours.hourNumber[i] ?? 0) === (hours.hourNumber[i - 1] ?? 0) + 1 ? 1 : 0;
  }
  return {
    load,
    ua,
    follows,
    uaConstant: building.airLeakage.mode !== 'ela',
    sortedByYear: null,
  };
}

function ensureSorted(loads: HourLoads, hours: Hours): void {
  if (loads.sortedByYear !== null) return;
  const perYear: number[][] = hours.years.map(() => []);
  for (let i = 0; i < hours.n; i++) perYear[hours.yearIndex[i] ?? 0]?.push(loads.load[i] ?? 0);
  loads.sortedByYear = perYear.map((values) => {
    const sorted = Float64Array.from(values).sort();
    const prefix = new Float64Array(sorted.length + 1);
    for (let k = 0; k < sorted.length; k++) prefix[k + 1] = (prefix[k] ?? 0) + (sorted[k] ?? 0);
    return { loads: sorted, prefix };
  });
}

/** First index whose value is greater than x in an ascending array. */
function upperBound(a: Float64Array, x: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const m = (lo + hi) >>> 1;
    if ((a[m] ?? 0) > x) hi = m;
    else lo = m + 1;
  }
  return lo;
}

/** One pass over the precomputed hours for any option. */
function simulateOnePass(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  loads: HourLoads,
  tauH: number,
): OptionHours {
  const set = building.indoorDesignC;
  const gains = building.internalGainsW;
  const decay = Math.exp(-1 / tauH);
  const unmetByYear = new Float64Array(hours.years.length);
  const isPump = option.kind === 'heat-pump';
  const flat = isPump ? null : capacityAt(option, 0);
  let energyWh = 0;
  let run = 0;
  let unmetWh = 0;
  let degreeHours = 0;
  let worstSag = 0;
  let indoor = set;
  let lastT = NaN;
  let c = flat ?? capacityAt(option, 0);
  for (let i = 0; i < hours.n; i++) {
    const t = hours.outdoorC[i] ?? 0;
    const load = loads.load[i] ?? 0;
    if (loads.follows[i] === 0) indoor = set;
    if (isPump && t !== lastT) {
      c = capacityAt(option, t);
      lastT = t;
    }
    const cap = c.totalW;
    const delivered = Math.min(load, cap);
    if (isPump) {
      const fromCompressor = Math.min(delivered, c.compressorW);
      energyWh += (c.cop > 0 ? fromCompressor / c.cop : 0) + (delivered - fromCompressor);
    } else {
      energyWh += delivered / c.cop;
    }
    run += cap > 0 ? Math.min(1, load / cap) : 0;
    if (load > cap) {
      const ua = loads.ua[i] ?? 1;
      const yi = hours.yearIndex[i] ?? 0;
      unmetByYear[yi] = (unmetByYear[yi] ?? 0) + 1;
      unmetWh += load - cap;
      degreeHours += (load - cap) / ua;
      const steady = t + (cap + gains) / ua;
      indoor = steady + (indoor - steady) * decay;
      if (set - indoor > worstSag) worstSag = set - indoor;
    } else {
      indoor = set;
    }
  }
  return summarise(hours.years.length, energyWh, run, unmetByYear, unmetWh, degreeHours, worstSag);
}

/**
 * Flat capacity (furnace, boiler, electric) with a constant conductance: energy, run-hours, unmet
 * hours, energy and degree-hours from per-year sorted loads and cumulative sums (a binary search
 * per year); the sag model walks only the unmet hours (the indoor temperature is back at the
 * set-point after every met hour).
 */
function simulateFlat(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  loads: HourLoads,
  tauH: number,
): OptionHours {
  ensureSorted(loads, hours);
  const c = capacityAt(option, 0);
  const cap = c.totalW;
  const ua = loads.ua[0] ?? 1;
  const unmetByYear = new Float64Array(hours.years.length);
  let energyWh = 0;
  let run = 0;
  let unmetWh = 0;
  for (const [y, { loads: sorted, prefix }] of (loads.sortedByYear ?? []).entries()) {
    const n = sorted.length;
    const k = upperBound(sorted, cap);
    const met = prefix[k] ?? 0;
    const over = (prefix[n] ?? 0) - met;
    const nUnmet = n - k;
    unmetByYear[y] = nUnmet;
    energyWh += (met + nUnmet * cap) / c.cop;
    run += met / cap + nUnmet;
    unmetWh += over - nUnmet * cap;
  }
  const degreeHours = unmetWh / ua;

  const unmetIdx: number[] = [];
  const load = loads.load;
  for (let i = 0; i < load.length; i++) if ((load[i] ?? 0) > cap) unmetIdx.push(i);
  const set = building.indoorDesignC;
  const decay = Math.exp(-1 / tauH);
  let worstSag = 0;
  let indoor = set;
  let previous = -2;
  for (const i of unmetIdx) {
    if (!(i === previous + 1 && loads.follows[i] === 1)) indoor = set;
    previous = i;
    const t = hours.outdoorC[i] ?? 0;
    const steady = t + (cap + building.internalGainsW) / ua;
    indoor = steady + (indoor - steady) * decay;
    if (set - indoor > worstSag) worstSag = set - indoor;
  }
  return summarise(hours.years.length, energyWh, run, unmetByYear, unmetWh, degreeHours, worstSag);
}

/** The sweep, with each distinct selected option simulated once. Same figures as `sweepNaive`. */
export function sweep(input: SweepInput): SweepResult {
  const common = commonOf(input);
  const hours = common.hours;
  const loads = hours ? hourLoads(input.building, hours) : null;
  const cache = new Map<SweepOption, OptionHours>();
  const rows = buildRows(input, common, (option, h) => {
    let r = cache.get(option);
    if (r === undefined) {
      const l = loads ?? hourLoads(input.building, h);
      r =
        option.kind !== 'heat-pump' && l.uaConstant
          ? simulateFlat(input.building, option, h, l, common.tauH)
          : simulateOnePass(input.building, option, h, l, common.tauH);
      cache.set(option, r);
    }
    return r;
  });
  return { rows, years: hours?.years ?? [], timeConstantH: common.tauH };
}
