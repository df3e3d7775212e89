/**
 * The trade-off screen's chart configurations (ECharts options): the trade-off chart, the
 * load-duration chart and the chart of compared scenarios, drawn in the one chart theme.
 */
import type { LineSeriesOption, BarSeriesOption } from 'echarts/charts';
import type { UnitSystem } from '@shared/units/units';
import { designValueTag, term } from '@shared/glossary/glossary';
import { formatMoneyWhole } from '@shared/money/money';
import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { hoursRange } from '@shared/sweep/odds-words';
import { unitLabel } from '@shared/units/units';
import { groupDigits, powerChartUnit, powerInChartUnit, temperatureForChart } from '../building/building-units';
import { capacityAtC } from './tradeoff-text';
import {
  BAND_EDGE,
  BAND_FILL,
  CHART_TEXT,
  COLD,
  COLD_FILL,
  EMBER,
  EMBER_FILL,
  FAINT,
  GREEN,
  INK,
  RULE,
  RULE_TEXT,
  SCENARIO_COLOURS,
  SPLIT_LINE,
  TEXT,
} from '../charts/chart-theme';
import { type ChartOption } from '../charts/chart-option';

const moneyNumber = (v: string | null) => (v === null ? null : Number(v));

/**
 * Design temperature across; installed price and life-cycle cost on the left axis, unmet hours per
 * average year on the right (money from zero); named values marked; the chosen point drawn as a vertical line.
 */
export function tradeoffChart(
  answer: SweepAnswer,
  index: number,
  system: UnitSystem,
  compact: boolean,
  ruleIndex: number | null = null,
): ChartOption {
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
            lineStyle: { color: FAINT, type: 'dotted' as const, width: 1 },
            // On the page's paper colour, so the cost lines passing behind do not strike the tag through.
            label: {
              formatter: designValueTag(r.label),
              color: TEXT,
              fontSize: compact ? 9 : 11,
              position: 'insideEndTop' as const,
              rotate: 90,
              backgroundColor: 'rgba(247, 248, 246, 0.9)',
              padding: [1, 2],
            },
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
          ...ruleMark(answer, ruleIndex, x, compact),
        ],
      },
    },
    {
      name: term('lifeCycleCost'),
      type: 'line',
      yAxisIndex: 0,
      data: rows.map((r) => [x(r.designC), moneyNumber(r.lifeCycleCost)]),
      showSymbol: false,
      lineStyle: { color: GREEN, width: 2 },
      itemStyle: { color: GREEN },
    },
  ];
  if (answer.hasRecord) {
    series.push({
      name: term('unmetHours'),
      type: 'line',
      yAxisIndex: 1,
      data: rows.map((r) => [x(r.designC), r.unmetHoursPerYear]),
      showSymbol: false,
      areaStyle: { color: COLD_FILL },
      lineStyle: { color: COLD, width: 2 },
      itemStyle: { color: COLD },
    });
    series.push(...unmetBandSeries(answer, x));
  }
  return {
    animation: false,
    textStyle: CHART_TEXT,
    grid: {
      left: compact ? 58 : 80,
      right: answer.hasRecord ? (compact ? 44 : 64) : 16,
      top: compact ? 64 : 48,
      bottom: compact ? 44 : 52,
    },
    legend: {
      top: 0,
      left: 'center',
      type: compact ? 'scroll' : 'plain',
      textStyle: { fontSize: compact ? 11 : 13 },
      data: series.map((x) => String(x.name)).filter((n) => n !== BAND_BASE),
    },
    tooltip: {
      trigger: 'axis',
      axisPointer: { type: 'line' },
      formatter: (params: unknown) => {
        const list = Array.isArray(params)
          ? (params as { seriesName: string; dataIndex: number; value: [number, number | null] }[])
          : [];
        const t = list[0]?.value[0];
        const lines = list
          .filter((p) => p.seriesName !== BAND_BASE)
          .map((p) => {
            if (p.seriesName === BAND_NAME) {
              const r = rows[p.dataIndex];
              return `${BAND_NAME}: ${r ? hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90) : '—'}`;
            }
            return p.value[1] === null
              ? `${p.seriesName}: —`
              : `${p.seriesName}: ${p.seriesName.startsWith('Unmet') ? groupDigits(p.value[1], 1) : money(p.value[1])}`;
          });
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
      splitLine: SPLIT_LINE,
    },
    yAxis: [
      {
        type: 'value',
        name: `Cost (${answer.currency})`,
        nameTextStyle: { align: 'left' },
        min: 0,
        axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v) },
        splitLine: SPLIT_LINE,
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

/** Legend name of the uncertainty band, and of its invisible lower edge. */
export const BAND_NAME = 'Unmet h/yr, 10–90 % range';
const BAND_BASE = 'band-base';

/**
 * The uncertainty band of the unmet hours per year: an invisible series at the 10th percentile with
 * the 90th-minus-10th stacked on it as a shaded area (echarts' stacked-area idiom).
 */
function unmetBandSeries(answer: SweepAnswer, x: (c: number) => number): LineSeriesOption[] {
  if (!answer.uncertainty) return [];
  const rows = answer.rows;
  return [
    {
      name: BAND_BASE,
      type: 'line',
      yAxisIndex: 1,
      stack: 'unmet-band',
      data: rows.map((r) => [x(r.designC), r.unmetHoursPerYearP10]),
      showSymbol: false,
      silent: true,
      lineStyle: { opacity: 0 },
      tooltip: { show: false },
    },
    {
      name: BAND_NAME,
      type: 'line',
      yAxisIndex: 1,
      stack: 'unmet-band',
      data: rows.map((r) => [
        x(r.designC),
        r.unmetHoursPerYearP10 === null || r.unmetHoursPerYearP90 === null
          ? null
          : r.unmetHoursPerYearP90 - r.unmetHoursPerYearP10,
      ]),
      showSymbol: false,
      silent: true,
      lineStyle: { opacity: 0 },
      areaStyle: { color: BAND_FILL },
      itemStyle: { color: BAND_EDGE },
    },
  ];
}

/** The design point the stated rule picks, as a dashed green line labelled "Rule". */
function ruleMark(answer: SweepAnswer, ruleIndex: number | null, x: (c: number) => number, compact: boolean) {
  const r = ruleIndex === null ? undefined : answer.rows[ruleIndex];
  if (!r) return [];
  return [
    {
      xAxis: x(r.designC),
      lineStyle: { color: RULE, type: 'dashed' as const, width: 2 },
      label: {
        formatter: 'Rule',
        color: RULE_TEXT,
        fontSize: compact ? 10 : 12,
        position: 'end' as const,
        fontWeight: 'bold' as const,
      },
    },
  ];
}

/** Hourly loads of the record in descending order against hours per year, with the chosen unit's capacity at each hour's temperature. */
export function loadDurationChart(
  answer: SweepAnswer,
  index: number,
  system: UnitSystem,
  compact: boolean,
): ChartOption | null {
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
      areaStyle: { color: EMBER_FILL },
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
    textStyle: CHART_TEXT,
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
      splitLine: SPLIT_LINE,
    },
    yAxis: {
      type: 'value',
      name: `Load (${unit})`,
      axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v, Number.isInteger(v) ? 0 : 1) },
      splitLine: SPLIT_LINE,
    },
    series,
  };
}

/** One chart of the compared scenarios: life-cycle cost (solid) and unmet hours per year (dotted) against the design temperature. */
export function comparisonChart(
  entries: readonly { name: string; sweep: SweepAnswer | null }[],
  system: UnitSystem,
  compact: boolean,
): ChartOption {
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
        name: `${e.name}: unmet hours / yr`,
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
    textStyle: CHART_TEXT,
    grid: {
      left: compact ? 58 : 80,
      right: compact ? 44 : 64,
      top: compact ? 72 : 24 + 24 * Math.ceil(series.length / 2),
      bottom: compact ? 44 : 52,
    },
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
      splitLine: SPLIT_LINE,
    },
    yAxis: [
      {
        type: 'value',
        name: `Life-cycle cost (${currency})`,
        min: 0,
        axisLabel: { formatter: (v: number) => groupDigits(v) },
        splitLine: SPLIT_LINE,
      },
      { type: 'value', name: 'Unmet hours / yr', min: 0, splitLine: { show: false } },
    ],
    series,
  };
}
