/**
 * The comparison of scenarios side by side: the design points to line them up at, the table of
 * their figures at that point and each one's difference from a baseline.
 */
import type { UnitSystem } from '@shared/units/units';
import { designValueName, designValueTag, explain, term, type TermKey } from '@shared/glossary/glossary';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { formatMoneyWhole, parseMoney } from '@shared/money/money';
import type { SweepAnswer, SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { hoursRange, oneIn, perHour } from '@shared/sweep/odds-words';
import { chosenRowIndex, lowestIndoorC } from '@shared/sweep/tradeoff-summary';
import { formatQuantity } from '@shared/units/units';
import { formatPower } from '../building/building-units';
import { hours, pricesText } from './tradeoff-text';

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
  for (const e of entries)
    for (const r of e.sweep?.rows ?? [])
      if (!r.isGrid && !labels.some((l) => l.label === r.label)) labels.push({ label: r.label, designC: r.designC });
  labels.sort((a, b) => b.designC - a.designC);
  return [
    { value: 'chosen', text: 'The point chosen in each scenario' },
    ...labels.map((l) => ({ value: l.label, text: designValueName(l.label) })),
  ];
}

/**
 * The estimator's comparison: one column per scenario at the chosen design point (or a named
 * value), with the figures a bid needs, named and explained from the glossary; money to whole units.
 */
export function comparisonTable(
  entries: readonly CompareEntry[],
  point: ComparePoint,
  system: UnitSystem,
): ComparisonTable {
  const columns: ComparisonColumn[] = entries.map((e) => {
    const rows = e.sweep?.rows ?? [];
    const row =
      point === 'chosen'
        ? (rows[chosenRowIndex(rows, e.scenario.chosenDesignC)] ?? null)
        : (rows.find((r) => !r.isGrid && r.label === point) ?? null);
    return {
      scenarioId: e.scenario.id,
      name: e.scenario.name,
      frozen: e.scenario.frozenAt !== null,
      row,
      currency: e.sweep?.currency ?? '',
    };
  });
  const cell = (k: number, f: (r: SweepRowAnswer, a: SweepAnswer, e: CompareEntry) => string) => {
    const e = entries[k];
    const r = columns[k]?.row;
    return e?.sweep && r ? f(r, e.sweep, e) : '—';
  };
  const money = (v: string | null, a: SweepAnswer) => (v === null ? '—' : formatMoneyWhole(v, a.currency));
  const option = (r: SweepRowAnswer, a: SweepAnswer) =>
    r.selectedOptionId ? a.options.find((o) => o.id === r.selectedOptionId) : undefined;
  const figure = (
    key: TermKey,
    f: (r: SweepRowAnswer, a: SweepAnswer, e: CompareEntry) => string,
  ): ComparisonFigureRow => ({
    key,
    name: term(key),
    explain: explain(key),
    cells: entries.map((_, k) => cell(k, f)),
  });
  const rows: ComparisonFigureRow[] = [
    figure(
      'designTemperature',
      (r) => `${formatQuantity('temperature', r.designC, system)}${r.isGrid ? '' : ` (${designValueTag(r.label)})`}`,
    ),
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
    {
      key: 'prices',
      name: 'Energy prices',
      explain: 'The prices the scenario was swept with: its own, or the organisation’s.',
      cells: entries.map((e) => pricesText(e.prices, system)),
    },
    {
      key: 'unmetRange',
      name: 'Likely range of unmet hours',
      explain:
        'Unmet hours per average year, 10th to 90th percentile over the tolerances of the estimated inputs (air leakage, UA, prices).',
      cells: entries.map((_, k) =>
        cell(k, (r) =>
          r.unmetHoursPerYearP10 === null ? '—' : `${hoursRange(r.unmetHoursPerYearP10, r.unmetHoursPerYearP90)} h/yr`,
        ),
      ),
    },
    {
      key: 'odds',
      name: 'Odds of a colder night',
      explain:
        'Chance that a winter brings an hour colder than the design temperature (Gumbel fit of the yearly minima), per year and over the study period.',
      cells: entries.map((_, k) =>
        cell(k, (r) =>
          r.annualExceedanceProbability === null
            ? '—'
            : `${oneIn(r.annualExceedanceProbability)} a year` +
              (r.lifetimeExceedanceProbability === null || r.lifetimeYears === null
                ? ''
                : `, ${oneIn(r.lifetimeExceedanceProbability)} over ${Math.round(r.lifetimeYears)} years`),
        ),
      ),
    },
    {
      key: 'comfortPrice',
      name: 'Price of each avoided cold hour',
      explain:
        'Extra life-cycle cost of this unit over the next milder choice, divided by the unmet hours it avoids over the study period.',
      cells: entries.map((_, k) =>
        cell(k, (r, a) =>
          r.costPerAvoidedUnmetHour === null ? '—' : `${perHour(r.costPerAvoidedUnmetHour, a.currency)} per hour`,
        ),
      ),
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
    {
      key: 'unmetHours',
      name: `${term('unmetHours')}, difference`,
      explain: `${explain('unmetHours')} Shown against the baseline scenario.`,
      cells: table.columns.map((_, k) => diffHours(k)),
    },
  ];
}
