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
import { designValueName, designValueTag, explain, term, type TermKey } from '@shared/glossary/glossary';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { formatMoneyWhole, parseMoney } from '@shared/money/money';
import type { SweepAnswer, SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { hoursRange, oneIn, perHour } from '@shared/sweep/odds-words';
import { chosenRowIndex, defaultRowIndex, lowestIndoorC, nearestRowIndex, tradeoffSentence } from '@shared/sweep/tradeoff-summary';
import { convertUnits, formatQuantity, unitLabel, type UnitSystem } from '@shared/units/units';
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
    compressor: r.compressorAtDesignW === null ? '—' : formatPower(r.compressorAtDesignW, system),
    installedPrice: money(r.installedPrice),
    annualCost: money(r.annualCost),
    lifeCycleCost: money(r.lifeCycleCost),
    runHours: hours(r.runHoursPerYear),
    unmetHours: hours(r.unmetHoursPerYear),
    unmetWorst: hours(r.unmetHoursWorstYear),
    degreeHours: formatQuantity('degreeHours', r.unmetDegreeHoursPerYear, system),
    backupHours: r.compressorAtDesignW === null ? '—' : hours(r.backupHoursPerYear),
    backupEnergy: r.compressorAtDesignW === null || r.backupEnergyKWh === null ? '—' : `${groupDigits(r.backupEnergyKWh)} kWh`,
    lowestIndoor: formatQuantity('temperature', r.lowestIndoorC ?? lowestIndoorC(r, answer.indoorDesignC), system),
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
    `from ${formatQuantity('temperature', first.designC, system)} (${designValueTag(first.label)}) to ${formatQuantity('temperature', last.designC, system)} (${designValueTag(last.label)}). ` +
    'The table of design temperatures below lists the same figures.'
  );
}

export { formatPower };

const SCENARIO_COLOURS = [EMBER, INK, '#6F8F3A', '#8A5FA8', '#B8860B'];

/** Which design point the comparison lines up: 'chosen' (each scenario's own), or a named design value's label. */
export type ComparePoint = string;

export interface ComparisonColumn {
  scenarioId: string;
  name: string;
  frozen: boolean;
  /** The row compared (null: no sweep, or the scenario lacks that named value). */
  row: SweepRowAnswer | null;
  currency: string;
}

export interface ComparisonFigureRow {
  key: TermKey | 'prices' | 'unmetRange' | 'odds' | 'comfortPrice';
  name: string;
  explain: string;
  cells: string[];
}

export interface ComparisonTable {
  columns: ComparisonColumn[];
  rows: ComparisonFigureRow[];
}

export interface CompareEntry {
  scenario: { id: string; name: string; frozenAt: string | null; chosenDesignC: number | null };
  sweep: SweepAnswer | null;
  prices: EnergyPrices | null;
}

/** The named design values of the compared sweeps, mildest first (the choices of the comparison's point). */
export function comparePointChoices(entries: readonly CompareEntry[]): { value: ComparePoint; text: string }[] {
  const labels: { label: string; designC: number }[] = [];
  for (const e of entries) for (const r of e.sweep?.rows ?? []) if (!r.isGrid && !labels.some((l) => l.label === r.label)) labels.push({ label: r.label, designC: r.designC });
  labels.sort((a, b) => b.designC - a.designC);
  return [{ value: 'chosen', text: 'The point chosen in each scenario' }, ...labels.map((l) => ({ value: l.label, text: designValueName(l.label) }))];
}

/** Energy prices as an estimator reads them; oil and propane per US gallon in IP (1 gal = 3.785411784 L, exact). */
export function pricesText(p: EnergyPrices | null, system: UnitSystem): string {
  if (!p) return '—';
  const unitPrice = new Intl.NumberFormat('en-US', { style: 'currency', currency: p.currency, minimumFractionDigits: 2, maximumFractionDigits: 4 });
  const m = (v: string, unit: string) => `${unitPrice.format(parseMoney(v).toFixed(4) as `${number}`)}/${unit}`;
  const perVolume = (perLitre: string) => (system === 'IP' ? m(parseMoney(perLitre).times(convertUnits(1, 'gal', 'L')).toFixed(6), 'gal') : m(perLitre, 'L'));
  const parts = [`electricity ${m(p.electricityPerKwh, 'kWh')}`];
  if (p.gas) parts.push(`gas ${m(p.gas.price, p.gas.unit === 'm3' ? 'm³' : p.gas.unit)}`);
  if (p.oilPerLitre) parts.push(`oil ${perVolume(p.oilPerLitre)}`);
  if (p.propanePerLitre) parts.push(`propane ${perVolume(p.propanePerLitre)}`);
  return parts.join(' · ');
}

/**
 * The estimator's comparison: one column per scenario at the chosen design point (or a named
 * value), with the figures a bid needs, named and explained from the glossary; money to whole units.
 */
export function comparisonTable(entries: readonly CompareEntry[], point: ComparePoint, system: UnitSystem): ComparisonTable {
  const columns: ComparisonColumn[] = entries.map((e) => {
    const rows = e.sweep?.rows ?? [];
    const row = point === 'chosen' ? (rows[chosenRowIndex(rows, e.scenario.chosenDesignC)] ?? null) : (rows.find((r) => !r.isGrid && r.label === point) ?? null);
    return { scenarioId: e.scenario.id, name: e.scenario.name, frozen: e.scenario.frozenAt !== null, row, currency: e.sweep?.currency ?? '' };
  });
  const cell = (k: number, f: (r: SweepRowAnswer, a: SweepAnswer, e: CompareEntry) => string) => {
    const e = entries[k];
    const r = columns[k]?.row;
    return e?.sweep && r ? f(r, e.sweep, e) : '—';
  };
  const money = (v: string | null, a: SweepAnswer) => (v === null ? '—' : formatMoneyWhole(v, a.currency));
  const option = (r: SweepRowAnswer, a: SweepAnswer) => (r.selectedOptionId ? a.options.find((o) => o.id === r.selectedOptionId) : undefined);
  const figure = (key: TermKey, f: (r: SweepRowAnswer, a: SweepAnswer, e: CompareEntry) => string): ComparisonFigureRow => ({
    key,
    name: term(key),
    explain: explain(key),
    cells: entries.map((_, k) => cell(k, f)),
  });
  const rows: ComparisonFigureRow[] = [
    figure('designTemperature', (r) => `${formatQuantity('temperature', r.designC, system)}${r.isGrid ? '' : ` (${designValueTag(r.label)})`}`),
    figure('designLoad', (r) => formatPower(r.designLoadW, system)),
    figure('unit', (r, a) => option(r, a)?.label ?? 'None large enough'),
    figure('capacityAtDesign', (r) => (r.capacityAtDesignW === null ? '—' : formatPower(r.capacityAtDesignW, system))),
    figure('installedPrice', (r, a) => money(r.installedPrice, a)),
    figure('annualCost', (r, a) => money(r.annualCost, a)),
    figure('equipmentLife', (r, a) => {
      const o = option(r, a);
      return o ? `${o.lifeYears} years` : '—';
    }),
    figure('lifeCycleCost', (r, a) => {
      const o = option(r, a);
      const years = a.studyPeriodYears ?? o?.lifeYears;
      return r.lifeCycleCost === null ? '—' : `${money(r.lifeCycleCost, a)}${years ? ` over ${years} years` : ''}`;
    }),
    figure('unmetHours', (r) => hours(r.unmetHoursPerYear)),
    figure('unmetHoursWorstYear', (r) => hours(r.unmetHoursWorstYear)),
    figure('lowestIndoor', (r, a) => formatQuantity('temperature', lowestIndoorC(r, a.indoorDesignC), system)),
    figure('discountRate', (_r, a) => `${a.discountRatePct} %`),
    { key: 'prices', name: 'Energy prices', explain: 'The prices the scenario was swept with: its own, or the organisation’s.', cells: entries.map((e) => pricesText(e.prices, system)) },
    {
      key: 'unmetRange',
      name: 'Likely range of unmet hours',
      explain: 'Unmet hours per average year, 10th to 90th percentile over the tolerances of the estimated inputs (air leakage, UA, prices).',
      cells: entries.map((_, k) => cell(k, (r) => (r.unmetHoursPerYearP10 === null ? '—' : `${hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90)} h/yr`))),
    },
    {
      key: 'odds',
      name: 'Odds of a colder night',
      explain: 'Chance that a winter brings an hour colder than the design temperature (Gumbel fit of the yearly minima), per year and over the study period.',
      cells: entries.map((_, k) =>
        cell(k, (r) =>
          r.annualExceedanceProbability === null
            ? '—'
            : `${oneIn(r.annualExceedanceProbability)} a year` +
              (r.lifetimeExceedanceProbability === null || r.lifetimeYears === null ? '' : `, ${oneIn(r.lifetimeExceedanceProbability)} over ${Math.round(r.lifetimeYears)} years`),
        ),
      ),
    },
    {
      key: 'comfortPrice',
      name: 'Price of each avoided cold hour',
      explain: 'Extra life-cycle cost of this unit over the next milder choice, divided by the unmet hours it avoids over the study period.',
      cells: entries.map((_, k) => cell(k, (r, a) => (r.costPerAvoidedUnmetHour === null ? '—' : `${perHour(r.costPerAvoidedUnmetHour, a.currency)} per hour`))),
    },
  ];
  return { columns, rows };
}

/** The difference of each scenario from the baseline column, for the money figures and the unmet hours. */
export function differenceRows(table: ComparisonTable, baseline: number): ComparisonFigureRow[] {
  const base = table.columns[baseline]?.row;
  const diffMoney = (pick: (r: SweepRowAnswer) => string | null, currency: string, k: number) => {
    const r = table.columns[k]?.row;
    const a = r ? pick(r) : null;
    const b = base ? pick(base) : null;
    if (k === baseline) return 'baseline';
    if (a === null || b === null) return '—';
    const d = parseMoney(a).minus(parseMoney(b));
    if (d.isZero()) return 'same';
    return `${d.gt(0) ? '+' : '−'}${formatMoneyWhole(d.abs().toString(), currency)}`;
  };
  const diffHours = (k: number) => {
    const r = table.columns[k]?.row;
    if (k === baseline) return 'baseline';
    if (r?.unmetHoursPerYear == null || base?.unmetHoursPerYear == null) return '—';
    const d = r.unmetHoursPerYear - base.unmetHoursPerYear;
    if (Math.abs(d) < 0.05) return 'same';
    return `${d > 0 ? '+' : '−'}${hours(Math.abs(d))} h`;
  };
  const money = (key: TermKey, pick: (r: SweepRowAnswer) => string | null): ComparisonFigureRow => ({
    key,
    name: `${term(key)}, difference`,
    explain: `${explain(key)} Shown against the baseline scenario.`,
    cells: table.columns.map((c, k) => diffMoney(pick, c.currency, k)),
  });
  return [
    money('installedPrice', (r) => r.installedPrice),
    money('annualCost', (r) => r.annualCost),
    money('lifeCycleCost', (r) => r.lifeCycleCost),
    { key: 'unmetHours', name: `${term('unmetHours')}, difference`, explain: `${explain('unmetHours')} Shown against the baseline scenario.`, cells: table.columns.map((_, k) => diffHours(k)) },
  ];
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
      { type: 'value', name: `Life-cycle cost (${currency})`, min: 0, axisLabel: { formatter: (v: number) => groupDigits(v) }, splitLine: SPLIT },
      { type: 'value', name: 'Unmet hours / yr', min: 0, splitLine: { show: false } },
    ],
    series,
  };
}
