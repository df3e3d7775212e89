/**
 * What the client sees of a report: plain-words paragraphs and the chosen design points with the
 * figures the designer picked, formatted in the report's units (shared by the page and the PDF).
 */
import type { UnitSystem } from '@shared/auth/auth-schemas';
import type { Building } from '@shared/building/building-schemas';
import { heatLoss } from '@shared/building/heat-loss';
import { formatQuantity as formatBuildingQuantity } from '@shared/building/quantities';
import { METHOD_VERSION } from '@shared/climate/design-conditions-schema';
import { formatMoney } from '@shared/money/money';
import { SIZING_CAUTIONS } from '@shared/reports/cautions';
import { reportFigureLabels, type ReportFigure, type ReportView } from '@shared/reports/report-schemas';
import { sweepAnswerSchema, type SweepAnswer, type SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { oddsBasisSentence, plainBandSentence, plainComfortSentence, plainLifetimeSentence } from '@shared/sweep/odds-words';
import { tradeoffSentence } from '@shared/sweep/tradeoff-summary';
import { formatQuantity, fromSi, unitLabel } from '@shared/units/units';
import { SWEEP_VERSION } from '../scenarios/sweep-service';

export interface ReportSource {
  report: { title: string; note: string; points: number[]; figures: ReportFigure[]; unitSystem: UnitSystem; createdAt: Date };
  scenarioName: string;
  frozenAt: Date | null;
  sweep: SweepAnswer;
  project: { name: string; clientName: string; siteAddress: string; building: Building | null };
  firmName: string;
  logoUrl: string | null;
  pdfUrl: string;
  expiresAt: Date | null;
}

const power = (w: number, system: UnitSystem): string => {
  if (system === 'SI') return w >= 1000 ? `${(w / 1000).toFixed(1)} kW` : `${Math.round(w)} W`;
  return formatBuildingQuantity('power', Math.round(w / 100) * 100, 'IP').replace(/\B(?=(\d{3})+(?!\d))/g, ',');
};

const hours = (h: number | null): string => {
  if (h === null) return 'not available (needs an hourly record)';
  if (h === 0) return 'none';
  if (h < 10) return `about ${Number(h.toFixed(1))}`;
  return `about ${Math.round(h).toLocaleString('en-US')}`;
};

function figureText(key: ReportFigure, r: SweepRowAnswer, a: SweepAnswer, system: UnitSystem): string {
  const money = (v: string | null) => (v === null ? 'not available' : formatMoney(v, a.currency));
  switch (key) {
    case 'installedPrice':
      return money(r.installedPrice);
    case 'annualCost':
      return money(r.annualCost);
    case 'lifeCycleCost':
      return r.lifeCycleCost === null || a.studyPeriodYears === null ? money(r.lifeCycleCost) : `${money(r.lifeCycleCost)} over ${a.studyPeriodYears} years`;
    case 'compressor':
      return r.compressorAtDesignW === null ? 'not a heat pump' : power(r.compressorAtDesignW, system);
    case 'runHours':
      return hours(r.runHoursPerYear);
    case 'backupHours':
      return r.compressorAtDesignW === null ? 'not a heat pump' : hours(r.backupHoursPerYear);
    case 'backupEnergy':
      return r.compressorAtDesignW === null ? 'not a heat pump' : r.backupEnergyKWh === null ? 'not available (needs an hourly record)' : `${Math.round(r.backupEnergyKWh).toLocaleString('en-US')} kWh`;
    case 'lowestIndoor':
      return r.lowestIndoorC === null ? 'not available (needs an hourly record)' : formatQuantity('temperature', r.lowestIndoorC, system);
    case 'unmetHours':
      return hours(r.unmetHoursPerYear);
    case 'unmetWorstYear':
      return hours(r.unmetHoursWorstYear);
    case 'sag':
      return r.worstSagC === null ? 'not available' : r.worstSagC === 0 ? 'it keeps the set-point' : `up to ${formatQuantity('temperatureDifference', r.worstSagC, system)}`;
  }
}

function nearestRow(rows: readonly SweepRowAnswer[], t: number): SweepRowAnswer | undefined {
  let best: SweepRowAnswer | undefined;
  for (const r of rows) {
    if (best === undefined || Math.abs(r.designC - t) < Math.abs(best.designC - t) || (Math.abs(r.designC - t) === Math.abs(best.designC - t) && !r.isGrid)) best = r;
  }
  return best;
}

const HEAT_PUMP_FIGURES: ReadonlySet<ReportFigure> = new Set<ReportFigure>(['compressor', 'backupHours', 'backupEnergy']);

export function buildReportView(src: ReportSource): ReportView {
  const { report } = src;
  // A result kept from before a field was added (a frozen one) gets the field's default.
  const a = sweepAnswerSchema.parse(src.sweep);
  const system = report.unitSystem;
  const temp = (c: number) => formatQuantity('temperature', c, system);
  const named = (label: string) => a.rows.find((r) => !r.isGrid && r.label === label);
  const labelOf = new Map(a.options.map((o) => [o.id, o.label]));

  // The building in one paragraph.
  let building = 'The building has not been described.';
  const b = src.project.building;
  const r99 = named('99 %');
  if (b && r99) {
    const h = heatLoss(b, r99.designC, a.designWindMs);
    const ua = h.conductanceWPerK.total * (1 + h.ductLossFraction);
    // IP: W/K × (1 Btu/h ÷ 0.29307107 W) ÷ (1.8 °F per K), NIST SP 811 (2008) Appendix B.
    const uaText = system === 'SI' ? `${Math.round(ua)} W` : `${Math.round(ua / 0.29307107 / 1.8)} Btu/h`;
    building =
      `Kept at ${temp(b.indoorDesignC)} indoors, the house loses about ${uaText} for every degree ${system === 'SI' ? '(°C)' : '(°F)'} it is warmer inside than out, ` +
      `through its walls, roof, windows and floor and with the outside air that leaks or is let in. On a ${temp(r99.designC)} day that is about ${power(h.loadW, system)} of heat` +
      (b.safetyFactorPct > 0 ? `; units are sized for ${b.safetyFactorPct} % more.` : '.');
  }

  // The climate in plain words.
  const climate: string[] = [];
  const r996 = named('99.6 %');
  if (r99 && r996) {
    climate.push(
      `At ${a.climateSiteName}, the “99 % design temperature” is ${temp(r99.designC)}: in an average year about 88 hours (1 % of the year) are colder than that. ` +
        `The stricter 99.6 % value, ${temp(r996.designC)}, leaves about 35 colder hours a year.`,
    );
  }
  const r50 = named('50-year');
  if (r50) {
    climate.push(`The coldest hour to expect about once in 50 years is near ${temp(r50.designC)}: any single winter has about a 2 % chance of getting that cold.`);
  }
  climate.push(
    a.hasRecord && a.years.length > 0
      ? `The hour-by-hour figures replay ${a.years.length} years of ${a.climateBasis?.estimateLabel ? 'an estimated hourly record' : 'hourly weather records'} (${a.years[0] ?? ''}–${a.years.at(-1) ?? ''}) against the house.`
      : 'This place has published design values only, so running costs and the hours a unit would fall behind are not available.',
  );
  if (a.climateBasis?.latestYears) climate.push(`These figures use the latest ${a.climateBasis.latestYears} years of the record only, to reflect recent winters.`);
  if (a.climateBasis?.estimateLabel) climate.push(a.climateBasis.estimateLabel);

  const oddsContext = { rows: a.rows, currency: a.currency, unitSystem: system, odds: a.odds, uncertainty: a.uncertainty };
  const options = report.points.flatMap((t) => {
    const r = nearestRow(a.rows, t);
    if (!r) return [];
    const odds = [
      plainLifetimeSentence(r, system),
      plainBandSentence(r, oddsContext),
      plainComfortSentence(a.rows.indexOf(r), oddsContext),
    ].filter((x): x is string => x !== null);
    const unit = r.selectedOptionId ? (labelOf.get(r.selectedOptionId) ?? r.selectedOptionId) : 'No unit on the list is large enough';
    return [
      {
        heading: r.isGrid ? `Sized for ${temp(r.designC)}` : `Sized for the ${r.label} design temperature (${temp(r.designC)})`,
        rungLabel: r.label,
        designC: r.designC,
        temperature: temp(r.designC),
        unit,
        capacity: r.capacityAtDesignW === null ? '—' : power(r.capacityAtDesignW, system),
        // Heat-pump figures are left out for an option that is not a heat pump: a homeowner has no use for "not a heat pump".
        figures: report.figures
          .filter((key) => r.compressorAtDesignW !== null || !HEAT_PUMP_FIGURES.has(key))
          .map((key) => ({ key, label: reportFigureLabels[key], text: figureText(key, r, a, system) })),
        sentence: tradeoffSentence(r, {
          rows: a.rows,
          optionLabel: (id) => labelOf.get(id) ?? id,
          currency: a.currency,
          unitSystem: system,
          hasRecord: a.hasRecord,
          years: a.years.length,
        }),
        odds,
      },
    ];
  });
  if (a.odds?.shortRecord) climate.push(oddsBasisSentence(a.odds) ?? '');

  const tUnit = unitLabel('temperature', system);
  const chartT = (c: number) => Math.round(fromSi('temperature', c, system) * 100) / 100;
  const computed = new Date(a.computedAt);
  return {
    firm: { name: src.firmName, logoUrl: src.logoUrl },
    title: report.title,
    note: report.note,
    preparedAt: report.createdAt.toISOString(),
    computedAt: a.computedAt,
    frozen: src.frozenAt !== null,
    project: { name: src.project.name, clientName: src.project.clientName, siteAddress: src.project.siteAddress },
    building,
    climate,
    options,
    chart: {
      temperatureUnit: tUnit,
      currency: a.currency,
      rows: a.rows.map((r) => ({
        t: chartT(r.designC),
        lifeCycleCost: r.lifeCycleCost === null ? null : Number(r.lifeCycleCost),
        unmetHours: r.unmetHoursPerYear,
        unmetLow: r.unmetHoursPerYearP10,
        unmetHigh: r.unmetHoursPerYearP90,
      })),
      points: options.map((o) => ({ t: chartT(o.designC), label: o.rungLabel })),
    },
    cautions: [...SIZING_CAUTIONS],
    provenance:
      `Scenario “${src.scenarioName}”, ` +
      (src.frozenAt ? `frozen for a bid on ${src.frozenAt.toISOString().slice(0, 10)}` : `live; last computed ${computed.toISOString().slice(0, 16).replace('T', ' ')} UTC`) +
      `. Indoor ${temp(a.indoorDesignC)}, design wind ${a.designWindMs.toFixed(1)} m/s, real discount rate ${a.discountRatePct} %` +
      (a.studyPeriodYears === null ? '' : `, life-cycle costs over one ${a.studyPeriodYears}-year study period`) +
      (a.options.some((o) => o.kind === 'heat-pump') ? (a.heatPumpSizing === 'compressor' ? ', heat pumps sized on the compressor alone' : ', heat pumps sized with their backup heat') : '') +
      `, prices in ${a.currency}. ` +
      `Methods ${SWEEP_VERSION} and ${METHOD_VERSION}; inputs ${a.inputHash.slice(0, 12)}.`,
    unitSystem: system,
    expiresAt: src.expiresAt ? src.expiresAt.toISOString() : null,
    pdfUrl: src.pdfUrl,
  };
}
