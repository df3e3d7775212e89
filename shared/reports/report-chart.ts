/**
 * The report's one chart as an ECharts option: total cost over the years compared (axis from zero, so a
 * small difference does not look like a cliff) and the hours a year the house could get cooler than
 * set, against the outdoor temperature each size is sized for, with the presented options marked. Used by the report page (canvas) and
 * the PDF (SVG rendered on the server), so both show the same picture.
 */
import {
  BAND_EDGE,
  BAND_FILL,
  CHART_FONT as FONT,
  COLD,
  COLD_FILL,
  EMBER,
  EMBER_TEXT,
  GREEN,
  SPLIT,
  TEXT,
} from '../charts/chart-palette';
import type { ReportView } from './report-schemas';

/** The PDF's font name (pdfmake's registered Source Sans 3); no quotes, which would break the SVG attribute. */
const PRINT_FONT = 'SourceSans';
/** The shaded band's legend entry. */
const BAND_NAME = 'Likely range of those hours';

const group = (v: number) =>
  Math.round(v)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, ',');

/** "The options above are marked A and B." (the chart marks the presented options with letters). */
export function optionMarks(count: number): string {
  const letters = 'ABC'.slice(0, Math.max(0, Math.min(3, count))).split('');
  if (letters.length === 0) return '';
  if (letters.length === 1) return 'The option above is marked A.';
  return `The options above are marked ${letters.slice(0, -1).join(', ')} and ${letters.at(-1) ?? ''}.`;
}

export function reportChartOption(
  view: ReportView,
  options: { compact: boolean; forPrint?: boolean },
): Record<string, unknown> {
  const { chart } = view;
  const ts = chart.rows.map((r) => r.t);
  const hasHours = chart.rows.some((r) => r.unmetHours !== null);
  const hasBand = chart.rows.some((r) => r.unmetLow !== null && r.unmetHigh !== null);
  const small = options.compact || options.forPrint === true;
  return {
    animation: false,
    textStyle: { fontFamily: options.forPrint ? PRINT_FONT : FONT, color: TEXT, fontSize: small ? 10 : 12 },
    grid: {
      left: small ? 52 : 72,
      right: hasHours ? (small ? 36 : 56) : 16,
      top: options.compact ? 64 : small ? 48 : 56,
      bottom: small ? 40 : 48,
    },
    legend: {
      // The band's invisible lower edge stays out of the legend.
      data: [
        'Total cost over the years compared',
        ...(hasHours ? [options.compact ? 'Hours a year cooler' : 'Hours a year cooler than you set it'] : []),
        ...(hasBand ? [BAND_NAME] : []),
      ],
      top: 0,
      left: 'center',
      itemGap: options.compact ? 8 : 16,
      textStyle: { fontSize: small ? 10 : 12, fontFamily: options.forPrint ? PRINT_FONT : FONT },
    },
    tooltip: options.forPrint ? undefined : { trigger: 'axis' },
    xAxis: {
      type: 'value',
      inverse: true,
      min: ts.length > 0 ? Math.floor(Math.min(...ts)) : undefined,
      max: ts.length > 0 ? Math.ceil(Math.max(...ts)) : undefined,
      name: `Sized for nights down to (${chart.temperatureUnit})`,
      nameLocation: 'middle',
      nameGap: small ? 24 : 30,
      splitNumber: options.compact ? 4 : 6,
      axisLabel: {
        hideOverlap: true,
        fontSize: small ? 10 : 12,
        formatter: (v: number) => String(v).replace('-', '−'),
      },
      splitLine: { lineStyle: { color: SPLIT } },
    },
    yAxis: [
      {
        type: 'value',
        name: `Total cost (${chart.currency})`,
        min: 0,
        splitNumber: options.compact ? 3 : 5,
        nameTextStyle: { align: 'left' },
        axisLabel: {
          fontSize: small ? 10 : 12,
          formatter: (v: number) => (options.compact && v >= 1000 ? `${group(v / 1000)}k` : group(v)),
        },
        splitLine: { lineStyle: { color: SPLIT } },
      },
      {
        type: 'value',
        name: hasHours ? (options.compact ? 'Hours / yr' : 'Hours a year cooler') : '',
        nameTextStyle: { align: 'right' },
        min: 0,
        show: hasHours,
        splitNumber: options.compact ? 3 : 5,
        axisLabel: { fontSize: small ? 10 : 12 },
        splitLine: { show: false },
      },
    ],
    series: [
      {
        name: 'Total cost over the years compared',
        type: 'line',
        yAxisIndex: 0,
        showSymbol: false,
        data: chart.rows.map((r) => [r.t, r.lifeCycleCost]),
        lineStyle: { color: GREEN, width: 2.5 },
        itemStyle: { color: GREEN },
        markLine: {
          symbol: 'none',
          silent: true,
          animation: false,
          data: chart.points.map((p) => ({
            xAxis: p.t,
            lineStyle: { color: EMBER, width: 2, type: 'solid' },
            label: {
              formatter: p.label,
              color: EMBER_TEXT,
              fontSize: small ? 11 : 13,
              fontWeight: 'bold',
              position: 'end',
            },
          })),
        },
      },
      ...(hasHours
        ? [
            {
              name: options.compact ? 'Hours a year cooler' : 'Hours a year cooler than you set it',
              type: 'line',
              yAxisIndex: 1,
              showSymbol: false,
              data: chart.rows.map((r) => [r.t, r.unmetHours]),
              areaStyle: { color: COLD_FILL },
              lineStyle: { color: COLD, width: 2 },
              itemStyle: { color: COLD },
            },
          ]
        : []),
      // The range of the hours short, depending on how the estimates turn out: an invisible lower
      // edge with the width stacked on it as a shaded area (docs/methods.md#uncertainty-band).
      ...(hasBand
        ? [
            {
              name: 'band-low',
              type: 'line',
              yAxisIndex: 1,
              stack: 'band',
              showSymbol: false,
              silent: true,
              data: chart.rows.map((r) => [r.t, r.unmetLow]),
              lineStyle: { opacity: 0 },
              tooltip: { show: false },
            },
            {
              name: BAND_NAME,
              type: 'line',
              yAxisIndex: 1,
              stack: 'band',
              showSymbol: false,
              silent: true,
              data: chart.rows.map((r) => [
                r.t,
                r.unmetLow === null || r.unmetHigh === null ? null : r.unmetHigh - r.unmetLow,
              ]),
              lineStyle: { opacity: 0 },
              areaStyle: { color: BAND_FILL },
              itemStyle: { color: BAND_EDGE },
            },
          ]
        : []),
    ],
  };
}
