/**
 * The odds of a colder night, the price of comfort and the uncertainty band in sentences: the
 * designer's on the trade-off screen, the homeowner's in the report (docs/methods.md#odds-of-a-colder-night,
 * #price-of-comfort, #uncertainty-band). Pure; every temperature honours the unit system.
 */
import { formatMoney, formatMoneyWhole } from '../money/money';
import { formatQuantity, type UnitSystem } from '../units/units';
import { plainOdds, type ExtremeStats } from './odds';
import { wholeDegrees } from './tradeoff-summary';

/** The row fields the sentences read. */
export interface OddsRow {
  label: string;
  designC: number;
  isGrid: boolean;
  selectedOptionId: string | null;
  annualExceedanceProbability: number | null;
  recordExceedanceShare: number | null;
  lifetimeExceedanceProbability: number | null;
  lifetimeYears: number | null;
  costPerAvoidedUnmetHour: number | null;
  costPerAvoidedWorstYearHour: number | null;
  unmetHoursPerYear: number | null;
  unmetHoursPerYearP10: number | null;
  unmetHoursPerYearP90: number | null;
  unmetHoursWorstYearP10: number | null;
  unmetHoursWorstYearP90: number | null;
  lifeCycleCostP10: string | null;
  lifeCycleCostP90: string | null;
  selectionChangeShare: number | null;
}

export interface OddsContext {
  rows: readonly OddsRow[];
  currency: string;
  unitSystem: UnitSystem;
  odds: ExtremeStats | null;
  uncertainty: { draws: number; tolerances: { uaPct: number; airLeakagePct: number; pricesPct: number } } | null;
}

/** "1-in-8" (or "less than 1-in-100", "more than 9-in-10"), for a table cell. */
export function oneIn(probability: number | null): string {
  if (probability === null) return '—';
  if (probability <= 0) return 'none';
  if (probability < 0.01) return '< 1-in-100';
  if (probability > 0.5) return probability >= 0.95 ? '> 9-in-10' : `${Math.round(probability * 10)}-in-10`;
  return `1-in-${Math.round(1 / probability)}`;
}

/** Hours as a short number: one decimal under 10, whole above. */
export function shortHours(h: number): string {
  return h > 0 && h < 10 ? String(Number(h.toFixed(1))) : Math.round(h).toLocaleString('en-US');
}

/** A P10–P90 range of hours for a table cell: "5–30", or the one value when both agree. */
export function hoursRange(p10: number | null, p90: number | null): string {
  if (p10 === null || p90 === null) return '—';
  const a = shortHours(p10);
  const b = shortHours(p90);
  return a === b ? a : `${a}–${b}`;
}

/** Money per hour for a table cell ("$12.40/h"), or "—". */
export function perHour(value: number | null, currency: string): string {
  return value === null ? '—' : `${formatMoney(value.toFixed(2), currency)}/h`;
}

const temperature = (row: OddsRow, system: UnitSystem) => formatQuantity('temperature', row.designC, system);

/** Where the odds come from and how much to trust them, in one sentence (null when there are no odds). */
export function oddsBasisSentence(odds: ExtremeStats | null): string | null {
  if (!odds) return null;
  if (odds.source === 'published') {
    return 'The odds come from the site’s published mean and standard deviation of the yearly coldest temperature (an extreme-value fit).';
  }
  const years = odds.years ?? 0;
  const basis = `The odds come from an extreme-value fit of the coldest hour of each of the record’s ${years} years.`;
  return odds.shortRecord
    ? `${basis} With fewer than 10 years on record these odds mean little: treat them as a rough guide.`
    : basis;
}

/** The designer's sentence on the odds of a night colder than the design temperature. */
export function oddsSentence(index: number, ctx: OddsContext): string {
  const row = ctx.rows[index];
  if (!row) return '';
  if (row.annualExceedanceProbability === null) {
    return 'The odds of a colder night need an hourly record, or the site’s published mean and standard deviation of the yearly minima.';
  }
  const t = temperature(row, ctx.unitSystem);
  const parts = [`A night colder than ${t}: ${plainOdds(row.annualExceedanceProbability)} in any one winter`];
  if (row.recordExceedanceShare !== null && ctx.odds?.years) {
    const n = Math.round(row.recordExceedanceShare * ctx.odds.years);
    parts.push(` (${n} of the ${ctx.odds.years} winters on record had one)`);
  }
  if (row.lifetimeExceedanceProbability !== null && row.lifetimeYears !== null) {
    // L is the study period of the life-cycle cost (docs/methods.md#odds-of-a-colder-night).
    parts.push(
      `, and ${plainOdds(row.lifetimeExceedanceProbability)} over the ${Math.round(row.lifetimeYears)}-year study period`,
    );
  }
  return `${parts.join('')}.`;
}

/** The homeowner's sentence on the odds over the years the costs are compared over (null without them). */
export function plainLifetimeSentence(row: OddsRow, system: UnitSystem): string | null {
  if (row.lifetimeExceedanceProbability === null || row.lifetimeYears === null) return null;
  const years = Math.round(row.lifetimeYears);
  return (
    `There is ${plainOdds(row.lifetimeExceedanceProbability)} of at least one night colder than ${wholeDegrees(row.designC, system)} ` +
    `in the next ${years === 1 ? 'year' : `${years} years`}, the period over which the costs are compared.`
  );
}

/** The step into the chosen row's unit (the first row with it) and the step out of it (the next unit colder). */
function stepsAround(
  index: number,
  rows: readonly OddsRow[],
): { into: OddsRow | undefined; next: OddsRow | undefined } {
  const row = rows[index];
  if (!row?.selectedOptionId) return { into: undefined, next: undefined };
  let first = index;
  while (first > 0 && rows[first - 1]?.selectedOptionId === row.selectedOptionId) first--;
  let last = index;
  while (last < rows.length - 1 && rows[last + 1]?.selectedOptionId === row.selectedOptionId) last++;
  return { into: rows[first], next: rows[last + 1] };
}

/**
 * The price of comfort beside the chosen point: what the step up to its unit cost per cold hour it
 * avoids, and what the next larger unit would cost per further hour. Empty when neither is defined.
 */
export function comfortSentence(index: number, ctx: OddsContext): string {
  const { into, next } = stepsAround(index, ctx.rows);
  const money = (v: number) => formatMoney(v.toFixed(2), ctx.currency);
  const parts: string[] = [];
  const describe = (step: OddsRow, lead: string) => {
    const avg = step.costPerAvoidedUnmetHour;
    if (avg === null) return;
    const worst = step.costPerAvoidedWorstYearHour;
    const years = step.lifetimeYears === null ? '' : ` over ${Math.round(step.lifetimeYears)} years`;
    const what =
      avg <= 0
        ? `${lead} costs nothing extra over the study period and avoids cold hours as well`
        : `${lead} costs about ${money(avg)} for each cold hour it avoids in an average year${years}` +
          (worst !== null ? ` (${money(worst)} if every year were like the worst on record)` : '');
    parts.push(`${what}.`);
  };
  if (into) describe(into, `Going up to this unit at ${temperature(into, ctx.unitSystem)}`);
  if (next) describe(next, `The next larger unit, from ${temperature(next, ctx.unitSystem)},`);
  return parts.join(' ');
}

/** The homeowner's sentence on the price of comfort of the chosen point (null when undefined). */
export function plainComfortSentence(index: number, ctx: OddsContext): string | null {
  const { into } = stepsAround(index, ctx.rows);
  const v = into?.costPerAvoidedUnmetHour ?? null;
  if (v === null || v <= 0) return null;
  const years = into?.lifetimeYears == null ? '' : ` over ${Math.round(into.lifetimeYears)} years`;
  return `Compared with the next smaller unit, each hour of cold it avoids costs about ${formatMoney(v.toFixed(2), ctx.currency)}${years}.`;
}

/** What the tolerances are about, in plain words, by the largest. */
function dependsOn(tol: OddsContext['uncertainty']): string {
  if (!tol) return '';
  const t = tol.tolerances;
  const causes: [number, string][] = [
    [t.airLeakagePct, 'how leaky the house turns out to be'],
    [t.uaPct, 'how well it is insulated'],
  ];
  const named = causes
    .filter(([pct]) => pct > 0)
    .sort((a, b) => b[0] - a[0])
    .map(([, words]) => words);
  return named.length === 0 ? '' : `, depending on ${named.join(' and ')}`;
}

/** The designer's sentence on the band at the chosen point (empty without a band). */
export function bandSentence(index: number, ctx: OddsContext): string {
  const row = ctx.rows[index];
  const u = ctx.uncertainty;
  if (!row || !u || row.unmetHoursPerYearP10 === null || row.unmetHoursPerYearP90 === null) return '';
  const t = u.tolerances;
  const parts = [
    `Over ${u.draws} draws with UA ±${t.uaPct} %, air leakage ±${t.airLeakagePct} % and prices ±${t.pricesPct} %, ` +
      `the unmet hours per average year range from ${shortHours(row.unmetHoursPerYearP10)} to ${shortHours(row.unmetHoursPerYearP90)} (10th to 90th percentile)`,
  ];
  if (row.unmetHoursWorstYearP10 !== null && row.unmetHoursWorstYearP90 !== null) {
    parts.push(
      `, in the worst year from ${shortHours(row.unmetHoursWorstYearP10)} to ${shortHours(row.unmetHoursWorstYearP90)}`,
    );
  }
  if (row.lifeCycleCostP10 !== null && row.lifeCycleCostP90 !== null) {
    // Whole units, as every other life-cycle cost on the screens.
    parts.push(
      `; the life-cycle cost from ${formatMoneyWhole(row.lifeCycleCostP10, ctx.currency)} to ${formatMoneyWhole(row.lifeCycleCostP90, ctx.currency)}`,
    );
  }
  const share = row.selectionChangeShare ?? 0;
  parts.push(
    share > 0
      ? `. A different unit would be selected in ${Math.round(share * 100)} % of the draws.`
      : '. The selected unit is the same in every draw.',
  );
  return parts.join('');
}

/** The homeowner's sentence on the band (null without one). */
export function plainBandSentence(row: OddsRow, ctx: Pick<OddsContext, 'uncertainty'>): string | null {
  if (row.unmetHoursPerYearP10 === null || row.unmetHoursPerYearP90 === null) return null;
  const a = row.unmetHoursPerYearP10;
  const b = row.unmetHoursPerYearP90;
  if (b === 0)
    return 'Even if the house turns out leakier or less well insulated than measured, this unit should keep up in a typical year.';
  const hrs = (h: number) => (h === 0 ? 'none' : `about ${shortHours(h)}`);
  return `How often it falls behind: between ${hrs(a)} and ${hrs(b)} hours a year${dependsOn(ctx.uncertainty)}.`;
}
