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
  /** An hourly record, or one indexed once with `indexSweepRecord` (faster when it is reused). */
  record?: SweepRecord | SweepRecordIndex | null;
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
function simulateNaive(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  tauH: number,
  designWindMs: number,
): OptionHours {
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
    const recorded = hours.windMs[i] ?? NaN;
    const w = Number.isNaN(recorded) ? designWindMs : recorded;
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
    hours: input.record ? ('kind' in input.record ? input.record.hours : recordHours(input.record)) : null,
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
  const rows = buildRows(input, common, (option, h) => simulateNaive(input.building, option, h, common.tauH, input.designWindMs));
  return { rows, years: common.hours?.years ?? [], timeConstantH: common.tauH };
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
  return { t, w, count, start, hourIdx };
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

/** Hour-based figures of one option: sums over the bins, then a time-ordered walk of the unmet hours only. */
function simulateBinned(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  loads: BinLoads,
  tauH: number,
): OptionHours {
  const { bins, load, ua } = loads;
  const nBins = bins.t.length;
  const isPump = option.kind === 'heat-pump';
  let c = capacityAt(option, 0);
  let lastT = NaN;
  let energyWh = 0;
  let run = 0;
  let unmetWh = 0;
  let degreeHours = 0;
  const unmetBins: number[] = [];
  let unmetCount = 0;
  const capByBin = new Float64Array(nBins);
  for (let b = 0; b < nBins; b++) {
    const t = bins.t[b] ?? 0;
    if (isPump && t !== lastT) {
      c = capacityAt(option, t);
      lastT = t;
    }
    const count = bins.count[b] ?? 0;
    const l = load[b] ?? 0;
    const cap = c.totalW;
    capByBin[b] = cap;
    const delivered = Math.min(l, cap);
    if (isPump) {
      const fromCompressor = Math.min(delivered, c.compressorW);
      energyWh += count * ((c.cop > 0 ? fromCompressor / c.cop : 0) + (delivered - fromCompressor));
    } else {
      energyWh += (count * delivered) / c.cop;
    }
    run += cap > 0 ? count * Math.min(1, l / cap) : 0;
    if (l > cap) {
      unmetWh += count * (l - cap);
      degreeHours += (count * (l - cap)) / (ua[b] ?? 1);
      unmetBins.push(b);
      unmetCount += count;
    }
  }

  // The unmet hours in time order: per-year counts and the single-capacitance sag (METHODS §5.1).
  // Keys hour × nBins + bin (exact in a double) sort into time order and keep each hour's bin.
  const unmetKeys = new Float64Array(unmetCount);
  let k = 0;
  for (const b of unmetBins) {
    for (let j = bins.start[b] ?? 0; j < (bins.start[b + 1] ?? 0); j++) unmetKeys[k++] = (bins.hourIdx[j] ?? 0) * nBins + b;
  }
  unmetKeys.sort();
  const unmetByYear = new Float64Array(hours.years.length);
  const set = building.indoorDesignC;
  const gains = building.internalGainsW;
  const decay = Math.exp(-1 / tauH);
  let worstSag = 0;
  let indoor = set;
  let previous = -2;
  for (const key of unmetKeys) {
    const b = key % nBins;
    const i = (key - b) / nBins;
    const yi = hours.yearIndex[i] ?? 0;
    unmetByYear[yi] = (unmetByYear[yi] ?? 0) + 1;
    if (!(i === previous + 1 && hours.follows[i] === 1)) indoor = set;
    previous = i;
    const u = ua[b] ?? 1;
    const steady = (hours.outdoorC[i] ?? 0) + ((capByBin[b] ?? 0) + gains) / u;
    indoor = steady + (indoor - steady) * decay;
    if (set - indoor > worstSag) worstSag = set - indoor;
  }
  return summarise(hours.years.length, energyWh, run, unmetByYear, unmetWh, degreeHours, worstSag);
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
      r = simulateBinned(input.building, option, h, loads, common.tauH);
      cache.set(option, r);
    }
    return r;
  });
  return { rows, years: common.hours?.years ?? [], timeConstantH: common.tauH };
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
