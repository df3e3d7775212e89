/**
 * What the trade-off screen shows of a sweep answer, in the user's units: ladder rows as text, the
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
import { formatMoney } from '@shared/money/money';
import type { SweepAnswer, SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { hoursRange, oneIn, perHour } from '@shared/sweep/odds-words';
import { tradeoffSentence } from '@shared/sweep/tradeoff-summary';
import { formatQuantity, unitLabel } from '@shared/units/units';
import { formatPower, groupDigits, powerInChartUnit, temperatureForChart } from '../building/building-units';
import { unitLabel as powerUnitLabel } from '@shared/building/quantities';

export type ChartOption = ComposeOption<
  LineSeriesOption | BarSeriesOption | GridComponentOption | TooltipComponentOption | LegendComponentOption | MarkLineComponentOption
>;

export const EMBER = '#C9583A';
export const COLD = '#4F8FBF';
export const INK = '#1D4E5F';
export const TEXT = '#2A3A40';
const FONT = '"Source Sans 3", system-ui, sans-serif';
const SPLIT = { lineStyle: { color: '#E3E8E6' } };

export interface LadderRowText {
  index: number;
  label: string;
  isGrid: boolean;
  temperature: string;
  designLoad: string;
  unit: string;
  capacity: string;
  /** Heat pumps: the compressor's capacity at the design temperature ('—' for other kinds). */
  compressor: string;
  installedPrice: string;
  annualCost: string;
  lifeCycleCost: string;
  runHours: string;
  unmetHours: string;
  unmetWorst: string;
  degreeHours: string;
  backupHours: string;
  backupEnergy: string;
  lowestIndoor: string;
  drop: string;
  /** Return-period rows from a short record: how far to trust the temperature ('' otherwise). */
  reliability: string;
  /** Unmet hours per average year, 10th–90th percentile of the draws. */
  unmetRange: string;
  /** Annual odds of a colder night, "1-in-8". */
  annualOdds: string;
  /** Odds over the unit's life (or the study period). */
  lifetimeOdds: string;
  /** Price of comfort against the milder neighbour, per avoided cold hour. */
  comfortPrice: string;
}

const hours = (h: number | null) => (h === null ? '—' : h < 10 && h > 0 ? groupDigits(h, 1) : groupDigits(h));

export function optionLabelOf(answer: SweepAnswer): (id: string) => string {
  const labels = new Map(answer.options.map((o) => [o.id, o.label]));
  return (id) => labels.get(id) ?? `Option ${id}`;
}

/** The ladder as the table shows it. */
export function ladderRows(answer: SweepAnswer, system: UnitSystem): LadderRowText[] {
  const label = optionLabelOf(answer);
  const money = (v: string | null) => (v === null ? '—' : formatMoney(v, answer.currency));
  return answer.rows.map((r, index) => ({
    index,
    label: r.label,
    isGrid: r.isGrid,
    temperature: formatQuantity('temperature', r.designC, system),
    designLoad: formatPower(r.designLoadW, system),
    unit: r.selectedOptionId ? label(r.selectedOptionId) : 'None large enough',
    capacity: r.capacityAtDesignW === null ? '—' : formatPower(r.capacityAtDesignW, system),
    compressor: r.compressorAtDesignW === null ? '—' : formatPower(r.compressorAtDesignW, system),
    installedPrice: money(r.installedPrice),
    annualCost: money(r.annualCost),
    lifeCycleCost: money(r.lifeCycleCost),
    runHours: hours(r.runHoursPerYear),
    unmetHours: hours(r.unmetHoursPerYear),
    unmetWorst: hours(r.unmetHoursWorstYear),
    degreeHours: r.unmetDegreeHoursPerYear === null ? '—' : formatQuantity('temperatureDifference', r.unmetDegreeHoursPerYear, system).replace(/ (K|°F)$/, ' $1·h'),
    backupHours: r.compressorAtDesignW === null ? '—' : hours(r.backupHoursPerYear),
    backupEnergy: r.compressorAtDesignW === null || r.backupEnergyKWh === null ? '—' : `${groupDigits(r.backupEnergyKWh)} kWh`,
    lowestIndoor: r.lowestIndoorC === null ? '—' : formatQuantity('temperature', r.lowestIndoorC, system),
    drop: r.worstDropK === null ? '—' : formatQuantity('temperatureDifference', r.worstDropK, system),
    reliability: r.reliabilityNote ?? '',
    unmetRange: hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90),
    annualOdds: oneIn(r.annualExceedanceProbability),
    lifetimeOdds: oneIn(r.lifetimeExceedanceProbability),
    comfortPrice: perHour(r.costPerAvoidedUnmetHour, answer.currency),
  }));
}

/** What the sweep's rules were, in one sentence each: heat-pump sizing, how the unit was chosen, the study period. */
export function rulesText(answer: SweepAnswer): string[] {
  const lines: string[] = [];
  if (answer.options.some((o) => o.kind === 'heat-pump')) {
    lines.push(
      answer.heatPumpSizing === 'compressor'
        ? 'Heat pumps are sized on the compressor alone: its capacity at the design temperature covers the design load, and backup heat serves colder hours and emergencies.'
        : 'Heat pumps are sized with their backup heat: compressor and backup together cover the design load.',
    );
  }
  if (answer.selectionRule === 'lowest-life-cycle-cost') {
    lines.push('The options mix equipment families, so among those that cover the design load the lowest life-cycle cost is installed.');
  } else if (answer.selectionRule === 'lowest-installed-price') {
    lines.push('The options mix equipment families and there is no hourly record, so among those that cover the design load the lowest installed price is installed.');
  }
  if (answer.studyPeriodYears !== null) {
    const escalation = answer.energyEscalationPctPerYear === 0 ? '' : `, energy prices rising ${answer.energyEscalationPctPerYear} % a year above inflation`;
    lines.push(
      `Life-cycle costs cover one ${answer.studyPeriodYears}-year study period for every option (replacements and remaining value included) at a ${answer.discountRatePct} % real discount rate${escalation}; running costs include cycling losses.`,
    );
  }
  return lines;
}

/** The row shown first: the 99.6 % rung, or the first named one. */
export function defaultIndex(rows: readonly SweepRowAnswer[]): number {
  const i = rows.findIndex((r) => r.label === '99.6 %');
  if (i >= 0) return i;
  return Math.max(0, rows.findIndex((r) => !r.isGrid));
}

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
  });
}

/** The row nearest to a design temperature (°C). */
export function nearestIndex(rows: readonly SweepRowAnswer[], designC: number): number {
  let best = 0;
  let bestD = Infinity;
  rows.forEach((r, i) => {
    const d = Math.abs(r.designC - designC);
    if (d < bestD || (d === bestD && !r.isGrid)) {
      best = i;
      bestD = d;
    }
  });
  return best;
}

const moneyNumber = (v: string | null) => (v === null ? null : Number(v));

/**
 * Design temperature across; installed price and life-cycle cost on the left axis, unmet hours per
 * average year on the right; named rungs marked; the chosen point drawn as a vertical line.
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
  const money = (v: number) => formatMoney(v.toFixed(2), answer.currency).replace(/\.00$/, '');
  const named = rows.filter((r) => !r.isGrid);
  const xs = rows.map((r) => x(r.designC));
  const series: (LineSeriesOption | BarSeriesOption)[] = [
    {
      name: 'Installed price',
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
            label: { formatter: r.label, color: TEXT, fontSize: compact ? 9 : 11, position: 'insideEndTop' as const, rotate: 90 },
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
      name: 'Life-cycle cost',
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
      name: 'Unmet hours per year',
      type: 'line',
      yAxisIndex: 1,
      data: rows.map((r) => [x(r.designC), r.unmetHoursPerYear]),
      showSymbol: false,
      areaStyle: { color: 'rgba(79, 143, 191, 0.18)' },
      lineStyle: { color: COLD, width: 2 },
      itemStyle: { color: COLD },
    });
    series.push(...unmetBandSeries(answer, x));
  }
  return {
    animation: false,
    textStyle: { fontFamily: FONT, color: TEXT },
    grid: { left: compact ? 58 : 80, right: answer.hasRecord ? (compact ? 44 : 64) : 16, top: compact ? 64 : 48, bottom: compact ? 44 : 52 },
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
        const list = Array.isArray(params) ? (params as { seriesName: string; dataIndex: number; value: [number, number | null] }[]) : [];
        const t = list[0]?.value[0];
        const lines = list
          .filter((p) => p.seriesName !== BAND_BASE)
          .map((p) => {
            if (p.seriesName === BAND_NAME) {
              const r = rows[p.dataIndex];
              return `${BAND_NAME}: ${r ? hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90) : '—'}`;
            }
            return p.value[1] === null ? `${p.seriesName}: —` : `${p.seriesName}: ${p.seriesName.startsWith('Unmet') ? groupDigits(p.value[1], 1) : money(p.value[1])}`;
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
      splitLine: SPLIT,
    },
    yAxis: [
      {
        type: 'value',
        name: `Cost (${answer.currency})`,
        nameTextStyle: { align: 'left' },
        scale: true,
        axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v) },
        splitLine: SPLIT,
      },
      {
        type: 'value',
        name: answer.hasRecord ? 'Unmet h/yr' : '',
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
        r.unmetHoursPerYearP10 === null || r.unmetHoursPerYearP90 === null ? null : r.unmetHoursPerYearP90 - r.unmetHoursPerYearP10,
      ]),
      showSymbol: false,
      silent: true,
      lineStyle: { opacity: 0 },
      areaStyle: { color: 'rgba(138, 95, 168, 0.22)' },
      itemStyle: { color: 'rgba(138, 95, 168, 0.55)' },
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
      lineStyle: { color: '#3E7B3A', type: 'dashed' as const, width: 2 },
      label: { formatter: 'Rule', color: '#2F5F2C', fontSize: compact ? 10 : 12, position: 'end' as const, fontWeight: 'bold' as const },
    },
  ];
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
  const unit = powerUnitLabel('power', system);
  const y = (w: number) => Math.round(powerInChartUnit(w, system));
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
    tooltip: { trigger: 'axis', valueFormatter: (v) => `${groupDigits(Number(v))} ${unit}` },
    xAxis: {
      type: 'log',
      min: 1,
      name: 'Hours per average year at or above the load (log scale)',
      nameLocation: 'middle',
      nameGap: compact ? 26 : 32,
      axisLabel: { fontSize: compact ? 10 : 12 },
      splitLine: SPLIT,
    },
    yAxis: { type: 'value', name: `Load (${unit})`, axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => groupDigits(v) }, splitLine: SPLIT },
    series,
  };
}

/** One line of the load-duration chart's table: a share of the year, its load and the chosen unit's capacity. */
export interface LoadDurationRowText {
  hours: string;
  outdoor: string;
  load: string;
  capacity: string;
  keepsUp: string;
}

/** The durations (hours per average year) the load-duration table reads the chart at. */
const DURATION_STEPS = [1, 10, 50, 100, 500, 1000, 2000, 4000, 8000];

/**
 * The load-duration chart as a table, for those who cannot see the chart: the load reached for at least
 * 1, 10, 50 … hours of an average year, the outdoor temperature of that hour, and what the chosen unit
 * gives there. Empty without a record.
 */
export function loadDurationTable(answer: SweepAnswer, index: number, system: UnitSystem): LoadDurationRowText[] {
  const points = answer.loadDuration?.points ?? [];
  const row = answer.rows[index];
  const option = row?.selectedOptionId ? answer.options.find((o) => o.id === row.selectedOptionId) : undefined;
  const picked = new Set<(typeof points)[number]>();
  for (const step of DURATION_STEPS) {
    const p = points.find((q) => q.hoursPerYear >= step);
    if (p) picked.add(p);
  }
  return [...picked].map((p) => {
    const capacityW = option ? capacityAtC(option.capacityCurve, p.outdoorC) : null;
    return {
      hours: groupDigits(p.hoursPerYear, p.hoursPerYear < 10 ? 1 : 0),
      outdoor: formatQuantity('temperature', p.outdoorC, system),
      load: formatPower(p.loadW, system),
      capacity: capacityW === null ? '—' : formatPower(capacityW, system),
      keepsUp: capacityW === null ? 'No unit' : capacityW >= p.loadW ? 'Yes' : 'No',
    };
  });
}

/** A text alternative for the trade-off chart. */
export function tradeoffChartSummary(answer: SweepAnswer, system: UnitSystem): string {
  const named = answer.rows.filter((r) => !r.isGrid);
  const first = named[0];
  const last = named.at(-1);
  if (!first || !last) return 'Trade-off chart';
  return (
    `Installed price, life-cycle cost${answer.hasRecord ? ' and unmet hours per year' : ''}${answer.uncertainty ? ' with its 10–90 % range' : ''} against the design temperature, ` +
    `from ${formatQuantity('temperature', first.designC, system)} (${first.label}) to ${formatQuantity('temperature', last.designC, system)} (${last.label}). ` +
    'The ladder table below lists the same figures.'
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
  /** "5–30 unmet h/yr (10–90 %)", null without a band. */
  unmetRange: string | null;
  /** "1-in-8 a year, 7-in-10 over its 20 years", null without odds. */
  odds: string | null;
  /** "$12.40 per cold hour avoided", null where not defined. */
  comfort: string | null;
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
        unmetRange: r.unmetHoursPerYearP10 === null ? null : `${hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90)} unmet h/yr (10–90 %)`,
        odds:
          r.annualExceedanceProbability === null
            ? null
            : `${oneIn(r.annualExceedanceProbability)} a year` +
              (r.lifetimeExceedanceProbability === null || r.lifetimeYears === null
                ? ''
                : `, ${oneIn(r.lifetimeExceedanceProbability)} over ${Math.round(r.lifetimeYears)} years`),
        comfort: r.costPerAvoidedUnmetHour === null ? null : `${perHour(r.costPerAvoidedUnmetHour, s.currency)} per cold hour avoided`,
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
