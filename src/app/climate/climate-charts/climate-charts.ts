import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { MarkLineComponentOption } from 'echarts/components';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { DesignConditions } from '@shared/climate/design-conditions-schema';
import type { ClimateChartData } from '@shared/climate/climate-schemas';
import { designValueName } from '@shared/glossary/glossary';
import { fromSi, unitLabel, type UnitSystem } from '@shared/units/units';
import { CHART_TEXT, COLD, COLD_TEXT, EMBER, INK, INK_BARS, SLATE, SPLIT_LINE, TEXT } from '../../charts/chart-theme';
import { provideCharts } from '../../charts/provide-charts';
import { HOURS_PER_YEAR, MONTH_NAMES, MONTH_SHORT_NAMES, formatNumber } from '../climate-format';
import { type ChartOption } from '../../charts/chart-option';
import { compactScreen } from '../../core/compact-screen';

type MarkLineData = NonNullable<MarkLineComponentOption['data']>[number];

/** The lowest share of hours the log axis shows, % (about one hour in 1.1 years). */
const LOG_FLOOR_PERCENT = 0.01;

interface Mark {
  label: string;
  valueC: number;
  color: string;
  type: 'solid' | 'dashed' | 'dotted';
}

/**
 * The site's hourly record as charts: the cumulative frequency of the dry-bulb with the design
 * values marked, and the monthly minimum, mean and maximum.
 */
@Component({
  selector: 'app-climate-charts',
  imports: [NgxEchartsDirective],
  providers: [provideCharts()],
  templateUrl: './climate-charts.html',
  styleUrl: './climate-charts.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateCharts {
  readonly data = input.required<ClimateChartData>();
  readonly conditions = input.required<DesignConditions>();
  readonly unitSystem = input.required<UnitSystem>();

  protected readonly compact = compactScreen();

  protected readonly temperatureUnit = computed(() => unitLabel('temperature', this.unitSystem()));

  private toUser(c: number): number {
    return Math.round(fromSi('temperature', c, this.unitSystem()) * 100) / 100;
  }

  protected readonly marks = computed<Mark[]>(() => {
    const c = this.conditions();
    const rp = c.extremeMin.returnPeriod;
    const marks: Mark[] = [
      { label: '99.6 %', valueC: c.heating.db99_6, color: COLD, type: 'solid' },
      { label: '99 %', valueC: c.heating.db99, color: COLD, type: 'dashed' },
      { label: designValueName('Extreme mean'), valueC: c.extremeMin.mean, color: INK, type: 'dashed' },
    ];
    for (const years of ['5', '10', '20', '50'] as const) {
      const v = rp[years];
      if (v !== null) marks.push({ label: `${years}-year`, valueC: v, color: SLATE, type: 'dotted' });
    }
    return marks;
  });

  /** Text beside the chart for those who cannot see it. */
  protected readonly cdfSummary = computed(() => {
    const unit = this.temperatureUnit();
    const parts = this.marks().map((m) => `${m.label} ${formatNumber(this.toUser(m.valueC), 1)} ${unit}`);
    return `Share of the hours at or below each dry-bulb temperature. Marked: ${parts.join(', ')}.`;
  });

  protected readonly cdfOptions = computed<ChartOption>(() => {
    const compact = this.compact();
    const unit = this.temperatureUnit();
    const db99C = this.conditions().heating.db99;
    const bins = this.data().distribution.bins.filter((b) => b.cumulativeFraction * 100 >= LOG_FLOOR_PERCENT);
    const curve = bins.map((b) => [this.toUser(b.upperC), b.cumulativeFraction * 100]);
    // The cold tail: up to the 99 % value, plus the first bin beyond so the two lines meet.
    const tailEnd = bins.findIndex((b) => b.upperC > db99C);
    const tail = curve.slice(0, tailEnd === -1 ? curve.length : tailEnd + 1);

    const marks = this.marks();
    const xs = [...curve.map((p) => p[0] ?? 0), ...marks.map((m) => this.toUser(m.valueC))];
    const step = this.unitSystem() === 'SI' ? 5 : 10;
    const xMin = Math.floor((Math.min(...xs) - 1) / step) * step;
    // On a phone the warm half (a flat line near 100 %) gives way to the cold tail.
    const median = bins.find((b) => b.cumulativeFraction >= 0.6);
    const warmest =
      compact && median ? Math.max(this.toUser(median.upperC), ...xs.slice(curve.length)) : Math.max(...xs);
    const xMax = Math.ceil((warmest + 1) / step) * step;

    const markData: MarkLineData[] = marks.map((m, i) => ({
      name: m.label,
      xAxis: this.toUser(m.valueC),
      lineStyle: { color: m.color, type: m.type, width: m.type === 'solid' ? 2 : 1.5 },
      label: {
        formatter: m.label,
        color: m.color === SLATE ? TEXT : m.color === COLD ? COLD_TEXT : m.color,
        fontSize: compact ? 10 : 12,
        position: i % 2 === 0 ? 'insideEndTop' : 'insideMiddleTop',
      },
    }));

    return {
      animation: false,
      textStyle: CHART_TEXT,
      grid: { left: compact ? 48 : 64, right: compact ? 12 : 24, top: compact ? 40 : 48, bottom: compact ? 48 : 56 },
      legend: {
        top: 0,
        left: 'center',
        itemWidth: 18,
        textStyle: { fontSize: compact ? 11 : 13 },
        data: ['Hours at or below', 'Cold tail (colder than 99 %)'],
      },
      tooltip: {
        trigger: 'axis',
        valueFormatter: (value) => `${formatNumber(Number(value), 2)} %`,
      },
      xAxis: {
        type: 'value',
        min: xMin,
        max: xMax,
        interval: step,
        name: `Hourly dry-bulb (${unit})`,
        nameLocation: 'middle',
        nameGap: compact ? 28 : 32,
        axisLabel: { fontSize: compact ? 10 : 12 },
        splitLine: SPLIT_LINE,
      },
      yAxis: {
        type: 'log',
        logBase: 10,
        min: LOG_FLOOR_PERCENT,
        max: 100,
        name: 'Hours at or below (%, log scale)',
        axisLine: { onZero: false },
        nameLocation: 'middle',
        nameGap: compact ? 36 : 48,
        axisLabel: { fontSize: compact ? 10 : 12, formatter: (v: number) => `${v}` },
        splitLine: SPLIT_LINE,
      },
      series: [
        {
          name: 'Hours at or below',
          type: 'line',
          data: curve,
          showSymbol: false,
          lineStyle: { color: INK, width: 2 },
          itemStyle: { color: INK },
          z: 2,
          markLine: { symbol: 'none', silent: true, animation: false, data: markData },
        },
        {
          name: 'Cold tail (colder than 99 %)',
          type: 'line',
          data: tail,
          showSymbol: false,
          lineStyle: { color: COLD, width: 4 },
          itemStyle: { color: COLD },
          z: 3,
          tooltip: { show: false },
        },
      ],
    };
  });

  protected readonly monthlyRows = computed(() =>
    this.data().monthly.map((m) => ({
      month: MONTH_NAMES[m.month - 1] ?? String(m.month),
      short: MONTH_SHORT_NAMES[m.month - 1] ?? String(m.month),
      min: m.minC === null ? null : this.toUser(m.minC),
      mean: m.meanC === null ? null : this.toUser(m.meanC),
      max: m.maxC === null ? null : this.toUser(m.maxC),
    })),
  );

  protected readonly monthlyOptions = computed<ChartOption>(() => {
    const compact = this.compact();
    const unit = this.temperatureUnit();
    const rows = this.monthlyRows();
    return {
      animation: false,
      textStyle: CHART_TEXT,
      grid: { left: compact ? 44 : 64, right: compact ? 8 : 24, top: compact ? 40 : 48, bottom: compact ? 28 : 36 },
      legend: { top: 0, left: 'center', textStyle: { fontSize: compact ? 11 : 13 } },
      tooltip: { trigger: 'axis', valueFormatter: (value) => `${formatNumber(Number(value), 1)} ${unit}` },
      xAxis: {
        type: 'category',
        data: rows.map((r) => (compact ? r.short.charAt(0) : r.short)),
        axisLabel: { fontSize: compact ? 10 : 12, interval: 0 },
      },
      yAxis: {
        type: 'value',
        name: `Dry-bulb (${unit})`,
        nameLocation: 'middle',
        nameGap: compact ? 32 : 44,
        axisLabel: { fontSize: compact ? 10 : 12 },
        splitLine: SPLIT_LINE,
      },
      series: [
        {
          name: 'Mean',
          type: 'bar',
          data: rows.map((r) => r.mean),
          itemStyle: { color: INK_BARS },
          barMaxWidth: 28,
        },
        {
          name: 'Minimum',
          type: 'line',
          data: rows.map((r) => r.min),
          lineStyle: { color: COLD, width: 2 },
          itemStyle: { color: COLD },
          symbol: 'circle',
          symbolSize: compact ? 4 : 6,
        },
        {
          name: 'Maximum',
          type: 'line',
          data: rows.map((r) => r.max),
          lineStyle: { color: EMBER, width: 2 },
          itemStyle: { color: EMBER },
          symbol: 'circle',
          symbolSize: compact ? 4 : 6,
        },
      ],
    };
  });

  protected fmt(value: number | null): string {
    return value === null ? '—' : formatNumber(value, 1);
  }

  protected readonly hoursNote = `The coldest 1 % of a year is about ${Math.round(HOURS_PER_YEAR / 100)} hours.`;
}
