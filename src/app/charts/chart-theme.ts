/**
 * The one chart theme of the screens: the palette shared with the report's chart, and the pieces
 * every ECharts option repeats (grid lines, text style, series colours in order).
 */
import {
  CHART_FONT,
  COLD,
  GOLD,
  GREEN,
  INK,
  EMBER,
  SPLIT,
  TEAL,
  TEXT,
  UMBER,
  VIOLET,
} from '@shared/charts/chart-palette';

export * from '@shared/charts/chart-palette';

/** Grid lines of a value axis. */
export const SPLIT_LINE = { lineStyle: { color: SPLIT } };

/** The text style of a whole chart. */
export const CHART_TEXT = { fontFamily: CHART_FONT, color: TEXT };

/** Line colours for equipment options, in order. */
export const EQUIPMENT_COLOURS = [COLD, INK, GREEN, VIOLET, GOLD, TEAL, UMBER];

/** Line colours for scenarios compared side by side, in order. */
export const SCENARIO_COLOURS = [EMBER, INK, GREEN, VIOLET, GOLD];
