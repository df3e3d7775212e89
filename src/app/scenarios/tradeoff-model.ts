/**
 * What the trade-off screen shows of a sweep answer, in the user's units: design temperatures as text, the
 * chosen point's figures and sentence, and the chart options. Pure functions, tested on their own.
 */
import type { LineSeriesOption, BarSeriesOption } from 'echarts/charts';
import type {
  GridComponentOption,
  LegendComponentOption,
  MarkLineComponentOption,
  TooltipComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';
import type { UnitSystem } from '@shared/auth/auth-schemas';
import { designValueTag, term } from '@shared/glossary/glossary';
import { formatMoneyWhole } from '@shared/money/money';
import type { SweepAnswer, SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { defaultRowIndex, lowestIndoorC, nearestRowIndex, tradeoffSentence } from '@shared/sweep/tradeoff-summary';
import { formatQuantity, unitLabel } from '@shared/units/units';
import { formatPower, groupDigits, powerChartUnit, powerInChartUnit, temperatureForChart } from '../building/building-units';

export type ChartOption = ComposeOption<
  LineSeriesOption | BarSeriesOption | GridComponentOption | TooltipComponentOption | LegendComponentOption | MarkLineComponentOption
>;

export const EMBER = '#C9583A';
export const COLD = '#4F8FBF';
export const INK = '#1D4E5F';
export const TEXT = '#2A3A40';
const FONT = '"Source Sans 3", system-ui, sans-serif';
const SPLIT = { lineStyle: { color: '#E3E8E6' } };

export interface DesignRowText {
  index: number;
  label: string;
  /** The short tag of a named design value ("99 %", "Annual min.", "50-yr"). */
  tag: string;
  isGrid: boolean;
  temperature: string;
  designLoad: string;
  unit: string;
  capacity: string;
  installedPrice: string;
  annualCost: string;
  lifeCycleCost: string;
  runHours: string;
  unmetHours: string;
  unmetWorst: string;
  degreeHours: string;
  lowestIndoor: string;
}

export function optionLabelOf(answer: SweepAnswer): (id: string) => string {
  const labels = new Map(answer.options.map((o) => [o.id, o.label]));
  return (id) => labels.get(id) ?? `Option ${id}`;
}

/** Unmet hours in one format everywhere: one decimal below 10, whole hours from 10 up. */
export const hours = (h: number | null): string => (h === null ? '—' : h < 10 && h > 0 ? groupDigits(h, 1) : groupDigits(h));

/** The design temperatures as the table shows them (money to whole units: a summary). */
export function designRows(answer: SweepAnswer, system: UnitSystem): DesignRowText[] {
  const label = optionLabelOf(answer);
  const money = (v: string | null) => (v === null ? '—' : formatMoneyWhole(v, answer.currency));
  return answer.rows.map((r, index) => ({
    index,
    label: r.label,
    tag: designValueTag(r.label),
    isGrid: r.isGrid,
    temperature: formatQuantity('temperature', r.designC, system),
    designLoad: formatPower(r.designLoadW, system),
    unit: r.selectedOptionId ? label(r.selectedOptionId) : 'None large enough',
    capacity: r.capacityAtDesignW === null ? '—' : formatPower(r.capacityAtDesignW, system),
    installedPrice: money(r.installedPrice),
    annualCost: money(r.annualCost),
    lifeCycleCost: money(r.lifeCycleCost),
    runHours: hours(r.runHoursPerYear),
    unmetHours: hours(r.unmetHoursPerYear),
    unmetWorst: hours(r.unmetHoursWorstYear),
    degreeHours: formatQuantity('degreeHours', r.unmetDegreeHoursPerYear, system),
    lowestIndoor: formatQuantity('temperature', lowestIndoorC(r, answer.indoorDesignC), system),
  }));
}

export { defaultRowIndex as defaultIndex, nearestRowIndex as nearestIndex };

/** The plain sentence for the chosen row. */
export function sentenceFor(answer: SweepAnswer, index: number, system: UnitSystem): string {
  const row = answer.rows[index];
  if (!row) return '';
  return tradeoffSentence(row, {
    rows: answer.rows,
    optionLabel: optionLabelOf(answer),
    currency: answer.currency,
    unitSystem: system,
    hasRecord: answer.hasRecord,
    years: answer.years.length,
    indoorC: answer.indoorDesignC,
  });
}

const moneyNumber = (v: string | null) => (v === null ? null : Number(v));

/**
 * Design temperature across; installed price and life-cycle cost on the left axis, unmet hours per
 * average year on the right (money from zero); named values marked; the chosen point drawn as a vertical line.
 */
export function tradeoffChart(answer: SweepAnswer, index: number, system: UnitSystem, compact: boolean): ChartOption {
  const x = (c: number) => temperatureForChart(c, system);
  const rows = answer.rows;
  const chosen = rows[index];
  const tUnit = unitLabel('temperature', system);
  const money = (v: number) => formatMoneyWhole(v.toFixed(2), answer.currency);
  const named = rows.filter((r) => !r.isGrid);
  const xs = rows.map((r) => x(r.designC));
  const series: (LineSeriesOption | BarSeriesOption)[] = [
    {
      name: term('installedPrice'),
      type: 'line',
      step: 'middle',
      yAxisIndex: 0,
      data: rows.map((r) => [x(r.designC), moneyNumber(r.installedPrice)]),
      showSymbol: false,
      lineStyle: { color: INK, width: 2.5 },
      itemStyle: { color: INK },
      markLine: {
        symbol: 'none',
        silent: true,
        animation: false,
        data: [
          ...named.map((r) => ({
            xAxis: x(r.designC),
            lineStyle: { color: '#9AA7AB', type: 'dotted' as const, width: 1 },
            label: { formatter: designValueTag(r.label), color: TEXT, fontSize: compact ? 9 : 11, position: 'insideEndTop' as const, rotate: 90 },
          })),
          ...(chosen
            ? [
                {
                  xAxis: x(chosen.designC),
                  lineStyle: { color: EMBER, type: 'solid' as const, width: 2.5 },
                  label: { show: false },
                },
              ]
            : []),
        ],
      },
    },
    {
      name: term('lifeCycleCost'),
      type: 'line',
      yAxisIndex: 0,
      data: rows.map((r) => [x(r.designC), moneyNumber(r.lifeCycleCost)]),
      showSymbol: false,
      lineStyle: { color: '#6F8F3A', width: 2 },
      itemStyle: { color: '#6F8F3A' },
    },
  ];
  if (answer.hasRecord) {
    series.push({
      name: term('unmetHours'),
      type: 'line',
      yAxisIndex: 1,
      data: rows.map((r) => [x(r.designC), r.unmetHoursPerYear]),
      showSymbol: false,
      areaStyle: { color: 'rgba(79, 143, 191, 0.18)' },
      lineStyle: { color: COLD, width: 2 },
      itemStyle: { color: COLD },
    });
  }
  return {
    animation: false,
    textStyle: { fontFamily: FONT, color: TEXT },
    grid: { left: compact ? 58 : 80, right: answer.hasRecord ? (compact ? 44 : 64) : 16, top: compact ? 64 : 48, bottom: compact ? 44 : 52 },
    legend: { top: 0, left: 'center', type: compact ? 'scroll' : 'plain', textStyle: { fontSize: compact ? 11 : 13 } },
    tooltip: {
      trigger: 'axis',
      axisPointer: { type: 'line' },
      formatter: (params: unknown) => {
        const list = Array.isArray(params) ? (params as { seriesName: string; value: [number, number | null] }[]) : [];
        const t = list[0]?.value[0];
        const lines = list.map((p) =>
          p.value[1] === null ? `${p.seriesName}: —` : `${p.seriesName}: ${p.seriesName.startsWith('Unmet') ? groupDigits(p.value[1], 1) : money(p.value[1])}`,
        );
        return [`${t === undefined ? '' : groupDigits(t, 1)} ${tUnit}`, ...lines].join('<br>');
      },
    },
    xAxis: {
      type: 'value',
      inverse: true,
      min: Math.floor(Math.min(...xs)),
      max: Math.ceil(Math.max(...xs)),
      name: `Design temperature (${tUnit}), milder to colder`,
      nameLocation: 'middle',
      nameGap: compact ? 26 : 32,
      axisLabel: { fontSize: compact ? 10 : 12, hideOverlap: true },
      splitLine: SPLIT,
    },
    yAxis: [
      {
        type: 'value',
        name: `Cost (${answer.currency})`,
        nameTextStyle: { align: 'left' },
        min: 0,
        axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v) },
        splitLine: SPLIT,
      },
      {
        type: 'value',
        name: answer.hasRecord ? 'Unmet hours / yr' : '',
        min: 0,
        show: answer.hasRecord,
        axisLabel: { fontSize: compact ? 10 : 12 },
        splitLine: { show: false },
      },
    ],
    series,
  };
}

/** Capacity (W) of an option at an outdoor temperature, interpolated on its curve (held at the ends). */
export function capacityAtC(curve: readonly { outdoorC: number; capacityW: number }[], t: number): number {
  const pts = [...curve].sort((a, b) => a.outdoorC - b.outdoorC);
  const first = pts[0];
  const last = pts.at(-1);
  if (!first || !last) return 0;
  if (t <= first.outdoorC) return first.capacityW;
  if (t >= last.outdoorC) return last.capacityW;
  for (let k = 1; k < pts.length; k++) {
    const a = pts[k - 1];
    const b = pts[k];
    if (a && b && t <= b.outdoorC) return a.capacityW + ((b.capacityW - a.capacityW) * (t - a.outdoorC)) / (b.outdoorC - a.outdoorC);
  }
  return last.capacityW;
}

/** Hourly loads of the record in descending order against hours per year, with the chosen unit's capacity at each hour's temperature. */
export function loadDurationChart(answer: SweepAnswer, index: number, system: UnitSystem, compact: boolean): ChartOption | null {
  const points = answer.loadDuration?.points;
  if (!points || points.length === 0) return null;
  const unit = powerChartUnit(system);
  const y = (w: number) => Math.round(powerInChartUnit(w, system) * 100) / 100;
  const row = answer.rows[index];
  const option = row?.selectedOptionId ? answer.options.find((o) => o.id === row.selectedOptionId) : undefined;
  const series: LineSeriesOption[] = [
    {
      name: 'Hourly load',
      type: 'line',
      data: points.map((p) => [Math.round(p.hoursPerYear * 10) / 10, y(p.loadW)]),
      showSymbol: false,
      areaStyle: { color: 'rgba(201, 88, 58, 0.15)' },
      lineStyle: { color: EMBER, width: 2.5 },
      itemStyle: { color: EMBER },
    },
  ];
  if (option) {
    series.push({
      name: `${option.label} capacity`,
      type: 'line',
      data: points.map((p) => [Math.round(p.hoursPerYear * 10) / 10, y(capacityAtC(option.capacityCurve, p.outdoorC))]),
      showSymbol: false,
      lineStyle: { color: INK, width: 2, type: 'dashed' },
      itemStyle: { color: INK },
    });
  }
  return {
    animation: false,
    textStyle: { fontFamily: FONT, color: TEXT },
    grid: { left: compact ? 58 : 80, right: 16, top: compact ? 56 : 40, bottom: compact ? 44 : 52 },
    legend: { top: 0, left: 'center', type: compact ? 'scroll' : 'plain', textStyle: { fontSize: compact ? 11 : 13 } },
    tooltip: { trigger: 'axis', valueFormatter: (v) => `${groupDigits(Number(v), 1)} ${unit}` },
    xAxis: {
      type: 'log',
      min: 1,
      name: 'Hours per average year at or above the load (log scale)',
      nameLocation: 'middle',
      nameGap: compact ? 26 : 32,
      axisLabel: { fontSize: compact ? 10 : 12 },
      splitLine: SPLIT,
    },
    yAxis: { type: 'value', name: `Load (${unit})`, axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v, Number.isInteger(v) ? 0 : 1) }, splitLine: SPLIT },
    series,
  };
}

/** A text alternative for the trade-off chart. */
export function tradeoffChartSummary(answer: SweepAnswer, system: UnitSystem): string {
  const named = answer.rows.filter((r) => !r.isGrid);
  const first = named[0];
  const last = named.at(-1);
  if (!first || !last) return 'Trade-off chart';
  return (
    `Installed price, life-cycle cost${answer.hasRecord ? ' and unmet hours per year' : ''} against the design temperature, ` +
    `from ${formatQuantity('temperature', first.designC, system)} (${designValueTag(first.label)}) to ${formatQuantity('temperature', last.designC, system)} (${designValueTag(last.label)}). ` +
    'The table of design temperatures below lists the same figures.'
  );
}

export { formatPower };

const SCENARIO_COLOURS = [EMBER, INK, '#6F8F3A', '#8A5FA8', '#B8860B'];

export interface ComparisonCell {
  temperature: string;
  unit: string;
  installedPrice: string;
  lifeCycleCost: string;
  unmetHours: string;
}

export interface ComparisonRow {
  label: string;
  cells: (ComparisonCell | null)[];
}

/** The named rungs of each compared sweep side by side (a rung a scenario lacks is null in its column). */
export function comparisonRows(sweeps: readonly (SweepAnswer | null)[], system: UnitSystem): ComparisonRow[] {
  const labels: string[] = [];
  for (const s of sweeps) for (const r of s?.rows ?? []) if (!r.isGrid && !labels.includes(r.label)) labels.push(r.label);
  return labels.map((label) => ({
    label,
    cells: sweeps.map((s) => {
      const r = s?.rows.find((x) => !x.isGrid && x.label === label);
      if (!s || !r) return null;
      const money = (v: string | null) => (v === null ? '—' : formatMoney(v, s.currency));
      return {
        temperature: formatQuantity('temperature', r.designC, system),
        unit: r.selectedOptionId ? optionLabelOf(s)(r.selectedOptionId) : 'None large enough',
        installedPrice: money(r.installedPrice),
        lifeCycleCost: money(r.lifeCycleCost),
        unmetHours: r.unmetHoursPerYear === null ? '—' : groupDigits(r.unmetHoursPerYear, r.unmetHoursPerYear < 10 && r.unmetHoursPerYear > 0 ? 1 : 0),
      };
    }),
  }));
}

/** One chart of the compared scenarios: life-cycle cost (solid) and unmet hours per year (dotted) against the design temperature. */
export function comparisonChart(entries: readonly { name: string; sweep: SweepAnswer | null }[], system: UnitSystem, compact: boolean): ChartOption {
  const x = (c: number) => temperatureForChart(c, system);
  const tUnit = unitLabel('temperature', system);
  const series: LineSeriesOption[] = [];
  entries.forEach((e, k) => {
    const colour = SCENARIO_COLOURS[k % SCENARIO_COLOURS.length] ?? INK;
    if (!e.sweep) return;
    series.push({
      name: `${e.name}: life-cycle cost`,
      type: 'line',
      yAxisIndex: 0,
      data: e.sweep.rows.map((r) => [x(r.designC), moneyNumber(r.lifeCycleCost)]),
      showSymbol: false,
      lineStyle: { color: colour, width: 2.5 },
      itemStyle: { color: colour },
    });
    if (e.sweep.hasRecord) {
      series.push({
        name: `${e.name}: unmet h/yr`,
        type: 'line',
        yAxisIndex: 1,
        data: e.sweep.rows.map((r) => [x(r.designC), r.unmetHoursPerYear]),
        showSymbol: false,
        lineStyle: { color: colour, width: 1.5, type: 'dotted' },
        itemStyle: { color: colour },
      });
    }
  });
  const currency = entries.find((e) => e.sweep)?.sweep?.currency ?? '';
  const xs = entries.flatMap((e) => e.sweep?.rows.map((r) => x(r.designC)) ?? []);
  return {
    animation: false,
    textStyle: { fontFamily: FONT, color: TEXT },
    grid: { left: compact ? 58 : 80, right: compact ? 44 : 64, top: compact ? 72 : 24 + 24 * Math.ceil(series.length / 2), bottom: compact ? 44 : 52 },
    legend: { top: 0, left: 'center', type: compact ? 'scroll' : 'plain', textStyle: { fontSize: compact ? 11 : 12 } },
    tooltip: { trigger: 'axis' },
    xAxis: {
      type: 'value',
      inverse: true,
      min: xs.length > 0 ? Math.floor(Math.min(...xs)) : undefined,
      max: xs.length > 0 ? Math.ceil(Math.max(...xs)) : undefined,
      name: `Design temperature (${tUnit}), milder to colder`,
      nameLocation: 'middle',
      nameGap: compact ? 26 : 32,
      splitLine: SPLIT,
    },
    yAxis: [
      { type: 'value', name: `Life-cycle cost (${currency})`, scale: true, axisLabel: { formatter: (v: number) => groupDigits(v) }, splitLine: SPLIT },
      { type: 'value', name: 'Unmet h/yr', min: 0, splitLine: { show: false } },
    ],
    series,
  };
}
