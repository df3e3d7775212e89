/**
 * The trade-off of one design temperature against the coldest one, in plain words, for the
 * trade-off screen and the client report. Pure; money with decimal.js.
 */
import type { UnitSystem } from '../auth/auth-schemas';
import { formatMoney, parseMoney } from '../money/money';
import { formatQuantity } from '../units/units';
import type { SweepRow } from './sweep';

export interface SummaryContext {
  rows: readonly Pick<
    SweepRow,
    | 'label'
    | 'designC'
    | 'isGrid'
    | 'selectedOptionId'
    | 'selectionReason'
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
}

type Row = SummaryContext['rows'][number];

/** The coldest named rung (the 50-year value when there is one). */
export function coldestNamedRow<T extends Pick<SweepRow, 'isGrid' | 'designC'>>(rows: readonly T[]): T | undefined {
  let coldest: T | undefined;
  for (const r of rows) if (!r.isGrid && (coldest === undefined || r.designC < coldest.designC)) coldest = r;
  return coldest;
}

const hoursText = (h: number): string => {
  if (h === 0) return 'no hours';
  if (h < 0.5) return 'less than an hour';
  const n = h < 10 ? Math.round(h * 10) / 10 : Math.round(h);
  return `about ${n} ${n === 1 ? 'hour' : 'hours'}`;
};

const rung = (r: Row, system: UnitSystem) =>
  r.isGrid ? formatQuantity('temperature', r.designC, system) : `${formatQuantity('temperature', r.designC, system)} (${r.label})`;

function shortfall(r: Row, ctx: SummaryContext): string {
  if (!ctx.hasRecord || r.unmetHoursPerYear === null) return 'How often it would fall behind needs an hourly record of the site.';
  const span = `${ctx.years} ${ctx.years === 1 ? 'year' : 'years'}`;
  if (r.unmetHoursPerYear === 0) return `Over the ${span} of the record it would never fall behind the load.`;
  const sag = formatQuantity('temperatureDifference', r.worstSagC ?? 0, ctx.unitSystem);
  return (
    `It would fall behind the load for ${hoursText(r.unmetHoursPerYear)} in an average year and ` +
    `${hoursText(r.unmetHoursWorstYear ?? 0)} in the worst of the record's ${span}; ` +
    `in the worst spell the house would cool by up to ${sag} below the set-point.`
  );
}

/** One or two sentences: what sizing for the chosen row saves against the coldest rung, and what it risks. */
export function tradeoffSentence(chosen: Row, ctx: SummaryContext): string {
  const system = ctx.unitSystem;
  if (chosen.selectedOptionId === null) {
    return `No option on the list is large enough for ${rung(chosen, system)}: ${chosen.selectionReason ?? 'add a larger unit'}.`;
  }
  const unit = ctx.optionLabel(chosen.selectedOptionId);
  const coldest = coldestNamedRow(ctx.rows);
  const money = (v: string) => formatMoney(v, ctx.currency);
  if (coldest === undefined || coldest.designC >= chosen.designC) {
    return `Sizing for ${rung(chosen, system)}, the coldest point of the ladder, installs ${unit}. ${shortfall(chosen, ctx)}`;
  }
  if (coldest.selectedOptionId === null) {
    return (
      `Sizing for ${rung(chosen, system)} installs ${unit}; no option on the list covers ${rung(coldest, system)}. ` +
      shortfall(chosen, ctx)
    );
  }
  const coldUnit = ctx.optionLabel(coldest.selectedOptionId);
  let cost: string;
  if (coldest.selectedOptionId === chosen.selectedOptionId) {
    cost = `Sizing for ${rung(chosen, system)} installs the same unit as sizing for ${rung(coldest, system)} (${unit}), so the colder design costs nothing more.`;
  } else {
    const d = parseMoney(coldest.installedPrice ?? '0').minus(parseMoney(chosen.installedPrice ?? '0'));
    const priceText = d.isZero() ? 'for the same installed price' : d.gt(0) ? `for ${money(d.toString())} less to install` : `for ${money(d.abs().toString())} more to install`;
    let lcc = '';
    if (chosen.lifeCycleCost !== null && coldest.lifeCycleCost !== null) {
      const l = parseMoney(coldest.lifeCycleCost).minus(parseMoney(chosen.lifeCycleCost));
      lcc = l.isZero() ? ', the same over the study period' : l.gt(0) ? ` (${money(l.toString())} less over the study period)` : ` (${money(l.abs().toString())} more over the study period)`;
    }
    cost = `Sizing for ${rung(chosen, system)} instead of ${rung(coldest, system)} installs ${unit} instead of ${coldUnit}, ${priceText}${lcc}.`;
  }
  return `${cost} ${shortfall(chosen, ctx)}`;
}
