/**
 * The trade-off screen's words and tables for a sweep answer, in the user's units: the design
 * temperatures, the rules, the chosen point's sentence, the load-duration table, the energy prices.
 * Pure functions, tested on their own.
 */
import type { UnitSystem } from '@shared/units/units';
import { designValueTag } from '@shared/glossary/glossary';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { formatMoneyWhole, parseMoney } from '@shared/money/money';
import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { hoursRange, oneIn, perHour } from '@shared/sweep/odds-words';
import { defaultRowIndex, lowestIndoorC, nearestRowIndex, tradeoffSentence } from '@shared/sweep/tradeoff-summary';
import { convertUnits, formatQuantity } from '@shared/units/units';
import { formatPower, groupDigits } from '../building/building-units';

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

/** A yearly amount: one decimal below 10, whole numbers from 10 up. */
const tenthsBelowTen = (v: number): string => (v < 10 && v > 0 ? groupDigits(v, 1) : groupDigits(v));

/** Unmet hours in one format everywhere: one decimal below 10, whole hours from 10 up. */
export const hours = (h: number | null): string => (h === null ? '—' : tenthsBelowTen(h));

/**
 * Backup energy a year, as hours are written, and "< 0.1 kWh" for a little that would round to
 * nothing (a few minutes of backup are not none).
 */
export const backupEnergy = (kWh: number): string =>
  kWh > 0 && kWh < 0.05 ? '< 0.1 kWh' : `${tenthsBelowTen(kWh)} kWh`;

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
    backupEnergy: r.compressorAtDesignW === null || r.backupEnergyKWh === null ? '—' : backupEnergy(r.backupEnergyKWh),
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
    lines.push(
      'The options mix equipment families, so among those that cover the design load the lowest life-cycle cost is installed.',
    );
  } else if (answer.selectionRule === 'lowest-installed-price') {
    lines.push(
      'The options mix equipment families and there is no hourly record, so among those that cover the design load the lowest installed price is installed.',
    );
  }
  if (answer.studyPeriodYears !== null) {
    const escalation =
      answer.energyEscalationPctPerYear === 0
        ? ''
        : `, energy prices rising ${answer.energyEscalationPctPerYear} % a year above inflation`;
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
    if (a && b && t <= b.outdoorC)
      return a.capacityW + ((b.capacityW - a.capacityW) * (t - a.outdoorC)) / (b.outdoorC - a.outdoorC);
  }
  return last.capacityW;
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

/** Energy prices as an estimator reads them; oil and propane per US gallon in IP (1 gal = 3.785411784 L, exact). */
export function pricesText(p: EnergyPrices | null, system: UnitSystem): string {
  if (!p) return '—';
  const unitPrice = new Intl.NumberFormat('en-US', {
    style: 'currency',
    currency: p.currency,
    minimumFractionDigits: 2,
    maximumFractionDigits: 4,
  });
  const m = (v: string, unit: string) => `${unitPrice.format(parseMoney(v).toFixed(4) as `${number}`)}/${unit}`;
  const perVolume = (perLitre: string) =>
    system === 'IP'
      ? m(
          parseMoney(perLitre)
            .times(convertUnits(1, 'gal', 'L'))
            .toFixed(6),
          'gal',
        )
      : m(perLitre, 'L');
  const parts = [`electricity ${m(p.electricityPerKwh, 'kWh')}`];
  if (p.gas) parts.push(`gas ${m(p.gas.price, p.gas.unit === 'm3' ? 'm³' : p.gas.unit)}`);
  if (p.oilPerLitre) parts.push(`oil ${perVolume(p.oilPerLitre)}`);
  if (p.propanePerLitre) parts.push(`propane ${perVolume(p.propanePerLitre)}`);
  return parts.join(' · ');
}
