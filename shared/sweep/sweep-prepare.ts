/**
 * Sweep step 1, prepare: the ladder of design temperatures (named values, extra temperatures and the
 * 0.5 °C grid, mildest first), the valid hours of the qualifying years in time order, and the settings
 * every row shares (time constant, discount and escalation, study period, selection rule).
 * Pure: no I/O (docs/methods.md#hourly, #indoor-temperature, #life-cycle-cost, #selection).
 */
import type { Building } from '../building/building-schemas';
import { heatLoss, timeConstantHours } from '../building/heat-loss';
import { prepareSeries } from '../climate/prepared-series';
import type { EnergyPrices } from '../money/energy-prices';
import { modifiedUniformPresentValue } from './sweep-economics';
import { selectionRuleOf } from './sweep-select';
import {
  DEFAULT_HEAT_PUMP_SIZING,
  DEFAULT_STUDY_PERIOD_YEARS,
  NAMED_ROW_LABELS,
  type HeatPumpSizing,
  type RowKind,
  type SelectionRule,
  type SweepDesignValues,
  type SweepInput,
  type SweepRecord,
} from './sweep-types';

/** The grid step of the ladder, K. */
export const GRID_STEP_C = 0.5;

export interface LadderRung {
  kind: RowKind;
  label: string;
  designC: number;
  isGrid: boolean;
}

export const fmtC = (t: number): string => `${Number(t.toFixed(2))} °C`;

/** The ladder of design temperatures, mildest first (named values, extras, then the 0.5 °C grid). */
export function designLadder(values: SweepDesignValues, extraDesignC: readonly number[] = []): LadderRung[] {
  const named: LadderRung[] = [
    { kind: 'p99', label: NAMED_ROW_LABELS.p99, designC: values.heating.db99, isGrid: false },
    { kind: 'p996', label: NAMED_ROW_LABELS.p996, designC: values.heating.db99_6, isGrid: false },
  ];
  const ex = values.extremeMin;
  if (typeof ex?.mean === 'number')
    named.push({ kind: 'annualMin', label: NAMED_ROW_LABELS.annualMin, designC: ex.mean, isGrid: false });
  for (const n of ['5', '10', '20', '50'] as const) {
    const v = ex?.returnPeriod?.[n];
    const kind = `rp${n}` as const;
    if (typeof v === 'number') named.push({ kind, label: NAMED_ROW_LABELS[kind], designC: v, isGrid: false });
  }
  for (const t of extraDesignC)
    if (Number.isFinite(t)) named.push({ kind: 'extra', label: fmtC(t), designC: t, isGrid: false });
  const temps = named.map((r) => r.designC);
  const mildest = Math.max(...temps);
  const coldest = Math.min(...temps);
  const grid: LadderRung[] = [];
  const top = Math.floor(mildest / GRID_STEP_C);
  const bottom = Math.ceil(coldest / GRID_STEP_C);
  if (top - bottom <= 1000) {
    for (let k = top; k >= bottom; k--) {
      const t = k * GRID_STEP_C;
      if (!temps.includes(t)) grid.push({ kind: 'grid', label: fmtC(t), designC: t, isGrid: true });
    }
  }
  const all = [...named, ...grid];
  return all
    .map((r, i) => ({ r, i }))
    .sort((a, b) => b.r.designC - a.r.designC || a.i - b.i)
    .map((x) => x.r);
}

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

export function recordHours(record: SweepRecord): Hours {
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

export interface Common {
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

export function commonOf(input: SweepInput): Common {
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
