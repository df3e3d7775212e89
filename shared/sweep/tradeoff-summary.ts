/**
 * The trade-off of one design temperature against the coldest named one, in words: the designer's
 * sentence (the trade's terms) for the trade-off screen, and the homeowner's sentence (plain words)
 * for the client report. Pure; money with decimal.js, shown to whole units.
 */
import { designValueName } from '../glossary/glossary';
import { formatMoneyWhole, parseMoney } from '../money/money';
import { formatPower, formatQuantity, fromSi, unitLabel, type UnitSystem } from '../units/units';
import type { SweepRow } from './sweep';

export interface SummaryContext {
  rows: readonly Pick<
    SweepRow,
    | 'label'
    | 'designC'
    | 'designLoadW'
    | 'isGrid'
    | 'selectedOptionId'
    | 'installedPrice'
    | 'lifeCycleCost'
    | 'unmetHoursPerYear'
    | 'unmetHoursWorstYear'
    | 'worstSagC'
  >[];
  optionLabel: (id: string) => string;
  currency: string;
  unitSystem: UnitSystem;
  hasRecord: boolean;
  /** Years of the record the hour-based figures come from. */
  years: number;
  /** The indoor set-point, °C (for the lowest indoor temperature). */
  indoorC: number;
}

type Row = SummaryContext['rows'][number];

/** The coldest named design value (the 50-year value when there is one). */
export function coldestNamedRow<T extends Pick<SweepRow, 'isGrid' | 'designC'>>(rows: readonly T[]): T | undefined {
  let coldest: T | undefined;
  for (const r of rows) if (!r.isGrid && (coldest === undefined || r.designC < coldest.designC)) coldest = r;
  return coldest;
}

/** A count of hours in words ("about 23 hours"); the first words of a sentence read the same. */
export function hoursInWords(h: number): string {
  if (h === 0) return 'no hours';
  if (h < 0.5) return 'less than an hour';
  const n = h < 10 ? Math.round(h * 10) / 10 : Math.round(h);
  return `about ${n} ${n === 1 ? 'hour' : 'hours'}`;
}

/** A design point as the designer names it: "−17.0 °C (99 % design temperature)" or just the temperature. */
export function designPointText(r: Pick<Row, 'isGrid' | 'designC' | 'label'>, system: UnitSystem): string {
  const t = formatQuantity('temperature', r.designC, system);
  return r.isGrid ? t : `${t} (${designValueName(r.label)})`;
}

/** The lowest indoor temperature in the worst spell, °C: the set-point less the drop. */
export function lowestIndoorC(r: Pick<Row, 'worstSagC'>, indoorC: number): number | null {
  return r.worstSagC === null ? null : indoorC - r.worstSagC;
}

function shortfall(r: Row, ctx: SummaryContext): string {
  if (!ctx.hasRecord || r.unmetHoursPerYear === null) return 'Unmet hours need an hourly record of the site.';
  const span = `${ctx.years} ${ctx.years === 1 ? 'year' : 'years'}`;
  if (r.unmetHoursPerYear === 0) return `Over the ${span} of the record it meets the load in every hour.`;
  const lowest = formatQuantity('temperature', lowestIndoorC(r, ctx.indoorC), ctx.unitSystem);
  return (
    `Unmet hours: ${hoursInWords(r.unmetHoursPerYear).replace(/^about /, '')} in an average year and ` +
    `${hoursInWords(r.unmetHoursWorstYear ?? 0).replace(/^about /, '')} in the worst of the record's ${span}; ` +
    `lowest indoor temperature in the worst spell ${lowest}.`
  );
}

/** A temperature for a homeowner: whole degrees in the reader's unit ("about 18 °C" reads better than 18.3 °C). */
export function wholeDegrees(c: number, system: UnitSystem): string {
  return `${String(Math.round(fromSi('temperature', c, system))).replace('-', '−')} ${unitLabel('temperature', system)}`;
}

/** Why no option is chosen, in the reader's units. */
export function noUnitText(r: Pick<Row, 'designC' | 'designLoadW'>, system: UnitSystem): string {
  return `No option on the list delivers the design load of ${formatPower(r.designLoadW, system)} at ${formatQuantity('temperature', r.designC, system)}; add a larger unit.`;
}

/** The designer's sentence: what sizing for the chosen row saves against the coldest named value, and what it risks. */
export function tradeoffSentence(chosen: Row, ctx: SummaryContext): string {
  const system = ctx.unitSystem;
  const point = (r: Row) => designPointText(r, system);
  if (chosen.selectedOptionId === null) return noUnitText(chosen, system);
  const unit = ctx.optionLabel(chosen.selectedOptionId);
  const coldest = coldestNamedRow(ctx.rows);
  const money = (v: string) => formatMoneyWhole(v, ctx.currency);
  if (coldest === undefined || coldest.designC >= chosen.designC) {
    return `Sizing for ${point(chosen)}, the coldest of the design temperatures, installs ${unit}. ${shortfall(chosen, ctx)}`;
  }
  if (coldest.selectedOptionId === null) {
    return `Sizing for ${point(chosen)} installs ${unit}; no option on the list covers ${point(coldest)}. ${shortfall(chosen, ctx)}`;
  }
  const coldUnit = ctx.optionLabel(coldest.selectedOptionId);
  let cost: string;
  if (coldest.selectedOptionId === chosen.selectedOptionId) {
    cost = `Sizing for ${point(chosen)} installs the same unit as sizing for ${point(coldest)} (${unit}), so the colder design costs nothing more.`;
  } else {
    const d = parseMoney(coldest.installedPrice ?? '0').minus(parseMoney(chosen.installedPrice ?? '0'));
    const priceText = d.isZero()
      ? 'for the same installed price'
      : d.gt(0)
        ? `for ${money(d.toString())} less installed`
        : `for ${money(d.abs().toString())} more installed`;
    let lcc = '';
    if (chosen.lifeCycleCost !== null && coldest.lifeCycleCost !== null) {
      const l = parseMoney(coldest.lifeCycleCost).minus(parseMoney(chosen.lifeCycleCost));
      lcc = l.isZero()
        ? ', the same life-cycle cost over the study period'
        : l.gt(0)
          ? ` (${money(l.toString())} less life-cycle cost over the study period)`
          : ` (${money(l.abs().toString())} more life-cycle cost over the study period)`;
    }
    cost = `Sizing for ${point(chosen)} instead of ${point(coldest)} installs ${unit} instead of ${coldUnit}, ${priceText}${lcc}.`;
  }
  return `${cost} ${shortfall(chosen, ctx)}`;
}

/**
 * The homeowner's sentence for one option: plain words, no trade terms. "On the coldest nights of
 * a typical winter this unit keeps up; in the coldest of the last 30 years it would have fallen short
 * for about 6 hours, and at the worst the house would have cooled to about 18 °C."
 */
export function homeownerSentence(r: Row, ctx: SummaryContext): string {
  const system = ctx.unitSystem;
  if (r.selectedOptionId === null)
    return 'No unit on the list is big enough for this choice, so it is shown for comparison only.';
  if (!ctx.hasRecord || r.unmetHoursPerYear === null || r.unmetHoursWorstYear === null) {
    return 'This place has no hour-by-hour weather record in the report, so how often this unit could fall short is not known.';
  }
  const span = `the last ${ctx.years} ${ctx.years === 1 ? 'year' : 'years'}`;
  const lowestC = lowestIndoorC(r, ctx.indoorC);
  const lowest = lowestC === null ? null : `about ${wholeDegrees(lowestC, system)}`;
  if (r.unmetHoursWorstYear === 0) {
    return `This unit keeps the house at the temperature you set in every hour of ${span} of weather records, including the coldest nights.`;
  }
  const typical =
    r.unmetHoursPerYear < 0.5
      ? 'On the coldest nights of a typical winter this unit keeps up'
      : `In a typical winter this unit keeps up except for ${hoursInWords(r.unmetHoursPerYear)} a year on the coldest nights, when the house gets a little cooler than you set it`;
  const worst = `in the coldest of ${span} it would have fallen short for ${hoursInWords(r.unmetHoursWorstYear)}${lowest ? `, and at the worst the house would have cooled to ${lowest}` : ''}.`;
  return `${typical}; ${worst}`;
}

/** The index of the row nearest to a design temperature (°C); a named value wins a tie. */
export function nearestRowIndex(rows: readonly Pick<SweepRow, 'designC' | 'isGrid'>[], designC: number): number {
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

/** The row shown first: the 99.6 % design value, or the first named one. */
export function defaultRowIndex(rows: readonly Pick<SweepRow, 'kind' | 'isGrid'>[]): number {
  const i = rows.findIndex((r) => r.kind === 'p996');
  if (i >= 0) return i;
  return Math.max(
    0,
    rows.findIndex((r) => !r.isGrid),
  );
}

/** The chosen row: the one nearest the saved design point, or the default one when none is saved. */
export function chosenRowIndex(
  rows: readonly Pick<SweepRow, 'kind' | 'isGrid' | 'designC'>[],
  chosenDesignC: number | null,
): number {
  return chosenDesignC === null ? defaultRowIndex(rows) : nearestRowIndex(rows, chosenDesignC);
}
