import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { LineSeriesOption } from 'echarts/charts';
import { NgxEchartsDirective } from 'ngx-echarts';
import { formatQuantity, unitLabel as temperatureUnitLabel, type UnitSystem } from '@shared/units/units';
import { provideCharts } from '../../charts/provide-charts';
import { groupDigits, powerChartUnit, powerInChartUnit, temperatureForChart } from '../building-units';
import { CHART_TEXT, COLD, EMBER, INK, SPLIT_LINE, TEXT, WHITE } from '../../charts/chart-theme';
import { equipmentSummary, type HeatLossModel } from './heat-loss-model';
import { type ChartOption } from '../../charts/chart-option';
import { compactScreen } from '../../core/compact-screen';

/**
 * The building's heat loss as it stands in the form: the breakdown at the design temperature, and the
 * heat loss against outdoor temperature beside the output of the project's equipment.
 */
@Component({
  selector: 'app-heat-loss-panel',
  imports: [NgxEchartsDirective],
  providers: [provideCharts()],
  templateUrl: './heat-loss-panel.html',
  styleUrl: './heat-loss-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HeatLossPanel {
  readonly model = input.required<HeatLossModel>();
  readonly unitSystem = input.required<UnitSystem>();
  /** Where the outdoor temperature comes from, e.g. "99 % heating dry-bulb of Lakeview station". */
  readonly outdoorLabel = input.required<string>();
  /** Time constant of the building, h (null when the thermal mass is not complete). */
  readonly timeConstantH = input<number | null>(null);

  protected readonly compact = compactScreen();

  protected readonly powerUnit = computed(() => powerChartUnit(this.unitSystem()));
  private readonly temperatureUnit = computed(() => temperatureUnitLabel('temperature', this.unitSystem()));

  protected readonly outdoorText = computed(() =>
    formatQuantity('temperature', this.model().outdoorC, this.unitSystem()),
  );
  protected readonly windText = computed(() => formatQuantity('speed', this.model().windMs, this.unitSystem()));
  protected readonly deltaText = computed(() =>
    formatQuantity('temperatureDifference', this.model().result.deltaTK, this.unitSystem()),
  );
  protected readonly timeConstantText = computed(() => {
    const h = this.timeConstantH();
    return h === null || !Number.isFinite(h) ? '' : `${groupDigits(h, 1)} h`;
  });

  protected readonly equipmentRows = computed(() => {
    const model = this.model();
    return model.equipment.map((line, i) => ({
      key: `${String(i)}-${line.label}`,
      label: line.label,
      colour: line.colour,
      text: equipmentSummary(line, model, this.unitSystem()),
    }));
  });

  protected readonly breakdownSummary = computed(
    () =>
      `Heat loss at ${this.outdoorText()}: ` +
      this.model()
        .rows.map((r) => `${r.label} ${r.text}`)
        .join(', ') +
      '.',
  );

  protected readonly curveSummary = computed(() => {
    const m = this.model();
    const parts = m.equipment.map((e) => e.label);
    return (
      `Heat loss against outdoor temperature, ${formatQuantity('temperature', m.rangeC.min, this.unitSystem())} ` +
      `to ${formatQuantity('temperature', m.rangeC.max, this.unitSystem())}` +
      (parts.length ? `, with the output of ${parts.join(', ')}` : '') +
      '. The same values are listed beside the chart.'
    );
  });

  protected readonly breakdownOptions = computed<ChartOption>(() => {
    const compact = this.compact();
    const system = this.unitSystem();
    const unit = this.powerUnit();
    const rows = this.model().rows;
    return {
      animation: false,
      textStyle: CHART_TEXT,
      grid: { left: compact ? 104 : 210, right: compact ? 56 : 88, top: 8, bottom: compact ? 40 : 48 },
      tooltip: { trigger: 'item', valueFormatter: (v) => `${groupDigits(Number(v), 1)} ${unit}` },
      xAxis: {
        type: 'value',
        name: `Heat flow (${unit})`,
        nameLocation: 'middle',
        nameGap: compact ? 26 : 30,
        splitNumber: compact ? 3 : 5,
        axisLabel: {
          fontSize: compact ? 10 : 12,
          hideOverlap: true,
          formatter: (v: number) => groupDigits(v, Number.isInteger(v) ? 0 : 1),
        },
        splitLine: SPLIT_LINE,
      },
      yAxis: {
        type: 'category',
        inverse: true,
        data: rows.map((r) => (compact ? r.label.replace(/ \(.*\)$/, '') : r.label)),
        axisLabel: { fontSize: compact ? 10 : 12, width: compact ? 96 : 200, overflow: 'truncate' },
      },
      series: [
        {
          name: 'Heat loss',
          type: 'bar',
          barMaxWidth: 22,
          data: rows.map((r) => ({
            value: Math.round(powerInChartUnit(r.watts, system) * 10) / 10,
            itemStyle: { color: r.colour },
          })),
          label: {
            show: true,
            position: 'right',
            fontSize: compact ? 10 : 12,
            color: TEXT,
            formatter: (p) => groupDigits(Number(p.value), 1),
          },
        },
      ],
    };
  });

  protected readonly curveOptions = computed<ChartOption>(() => {
    const compact = this.compact();
    const system = this.unitSystem();
    const unit = this.powerUnit();
    const tUnit = this.temperatureUnit();
    const m = this.model();
    const x = (c: number) => temperatureForChart(c, system);
    const y = (w: number) => Math.round(powerInChartUnit(w, system) * 100) / 100;
    const pts = (points: [number, number][]) => points.map(([t, w]) => [x(t), y(w)]);

    const series: LineSeriesOption[] = [
      {
        name: 'Building heat loss',
        type: 'line',
        data: pts(m.loadCurve),
        showSymbol: false,
        lineStyle: { color: EMBER, width: 3 },
        itemStyle: { color: EMBER },
        z: 4,
        markLine: {
          symbol: 'none',
          silent: true,
          animation: false,
          data: [
            {
              name: 'Design temperature',
              xAxis: x(m.outdoorC),
              lineStyle: { color: COLD, type: 'dashed', width: 1.5 },
              label: { formatter: 'Design', color: COLD, fontSize: compact ? 10 : 12, position: 'insideEndTop' },
            },
          ],
        },
      },
    ];
    if (m.designCurve) {
      series.push({
        name: 'With sizing margin',
        type: 'line',
        data: pts(m.designCurve),
        showSymbol: false,
        lineStyle: { color: EMBER, width: 1.5, type: 'dashed' },
        itemStyle: { color: EMBER },
        z: 3,
      });
    }
    for (const e of m.equipment) {
      series.push({
        name: e.label,
        type: 'line',
        data: pts(e.points),
        showSymbol: false,
        lineStyle: { color: e.colour, width: 2, type: e.kind === 'heat-pump' ? 'solid' : 'dotted' },
        itemStyle: { color: e.colour },
        z: 2,
      });
    }
    const balance = m.equipment.flatMap((e) =>
      e.balanceC === null || e.balanceW === null
        ? []
        : [{ value: [x(e.balanceC), y(e.balanceW)], itemStyle: { color: e.colour } }],
    );
    if (balance.length > 0) {
      series.push({
        name: 'Balance points',
        type: 'line',
        data: balance,
        symbol: 'diamond',
        symbolSize: compact ? 10 : 13,
        showSymbol: true,
        lineStyle: { opacity: 0 },
        itemStyle: { color: INK, borderColor: WHITE, borderWidth: 1 },
        label: {
          show: true,
          position: 'top',
          fontSize: compact ? 10 : 12,
          color: INK,
          formatter: (p) => `${groupDigits(Number((p.value as number[])[0]), 1)} ${tUnit}`,
        },
        z: 5,
      });
    }

    const step = (system === 'SI' ? 5 : 10) * (compact ? 2 : 1);
    const xMin = Math.floor(x(m.rangeC.min) / step) * step;
    const xMax = Math.ceil(x(m.rangeC.max) / step) * step;
    return {
      animation: false,
      textStyle: CHART_TEXT,
      // On a phone the legend scrolls (the options are also listed under the chart); wider, it wraps.
      grid: {
        left: compact ? 52 : 76,
        right: compact ? 12 : 24,
        top: compact ? 56 : 32 + 24 * Math.ceil(series.length / 3),
        bottom: compact ? 48 : 56,
      },
      legend: {
        type: compact ? 'scroll' : 'plain',
        top: 0,
        left: 'center',
        itemWidth: 18,
        textStyle: { fontSize: compact ? 11 : 13 },
      },
      tooltip: {
        trigger: 'axis',
        valueFormatter: (v) => `${groupDigits(Number(v), 1)} ${unit}`,
      },
      xAxis: {
        type: 'value',
        min: xMin,
        max: xMax,
        interval: step,
        name: `Outdoor temperature (${tUnit})`,
        nameLocation: 'middle',
        nameGap: compact ? 28 : 32,
        axisLabel: { fontSize: compact ? 10 : 12 },
        splitLine: SPLIT_LINE,
      },
      yAxis: {
        type: 'value',
        min: 0,
        name: `Heat flow (${unit})`,
        axisLine: { onZero: false },
        nameLocation: 'middle',
        nameGap: compact ? 40 : 60,
        axisLabel: {
          fontSize: compact ? 10 : 12,
          formatter: (v: number) => groupDigits(v, Number.isInteger(v) ? 0 : 1),
        },
        splitLine: SPLIT_LINE,
      },
      series,
    };
  });
}
