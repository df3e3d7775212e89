/**
 * Tailroom's chart colours and font, the same tones as the app's theme (src/styles.scss). Every chart
 * draws from here: the screens' charts (through src/app/charts/chart-theme.ts) and the report's chart,
 * which the report page and the PDF share. Text tones are the darker ones that read at 4.5:1 on white.
 */

/** Ember: the unit's output, the chosen point, costs. */
export const EMBER = '#C9583A';
/** Ember's darker text tone, for words drawn in ember (4.8:1 on white). */
export const EMBER_TEXT = '#B44E33';
/** Glacier blue: the cold, outdoor temperatures, hours short of heat. */
export const COLD = '#4F8FBF';
/** Glacier's darker text tone, for words drawn in glacier blue (5.3:1 on paper). */
export const COLD_TEXT = '#356C97';
/** Ink: the heat loss, the main line. */
export const INK = '#1D4E5F';
export const SLATE = '#5E6E75';
/** Text on charts. */
export const TEXT = '#2A3A40';
export const GREEN = '#6F8F3A';
/** The design rule's line and its label. */
export const RULE = '#3E7B3A';
export const RULE_TEXT = '#2F5F2C';
export const VIOLET = '#8A5FA8';
export const GOLD = '#B8860B';
export const TEAL = '#2F8F83';
export const UMBER = '#7A6F5A';
/** Thin marks that should not draw the eye (named design values). */
export const FAINT = '#9AA7AB';
/** Grid lines. */
export const SPLIT = '#E3E8E6';
export const WHITE = '#FFFFFF';

/** Translucent fills: the hours area, the likely range band and its edge, the cost area, histogram bars. */
export const COLD_FILL = 'rgba(79, 143, 191, 0.18)';
export const BAND_FILL = 'rgba(138, 95, 168, 0.22)';
export const BAND_EDGE = 'rgba(138, 95, 168, 0.55)';
export const EMBER_FILL = 'rgba(201, 88, 58, 0.15)';
export const INK_BARS = 'rgba(29, 78, 95, 0.55)';

/** The screens' chart font (the shipped Source Sans 3). */
export const CHART_FONT = '"Source Sans 3", system-ui, sans-serif';
