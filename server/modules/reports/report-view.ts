/**
 * What the client sees of a report: plain-words paragraphs and the chosen design points with the
 * figures the designer picked, formatted in the report's units (shared by the page and the PDF).
 */
import type { Building } from '@shared/building/building-schemas';
import { effectiveConductanceWPerK, heatLoss } from '@shared/building/heat-loss';
import { METHOD_VERSION } from '@shared/climate/design-conditions-schema';
import { designValueName, designValueTag } from '@shared/glossary/glossary';
import { formatMoneyWhole } from '@shared/money/money';
import { HOMEOWNER_CAUTIONS, HOMEOWNER_CAUTIONS_TITLE } from '@shared/reports/cautions';
import { reportFigureLabels, type ReportFigure, type ReportView } from '@shared/reports/report-schemas';
import { sweepAnswerSchema, type SweepAnswer, type SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import type { RowKind } from '@shared/sweep/sweep';
import {
  oddsBasisSentence,
  plainBandSentence,
  plainComfortSentence,
  plainLifetimeSentence,
} from '@shared/sweep/odds-words';
import { homeownerSentence, lowestIndoorC, nearestRowIndex, wholeDegrees } from '@shared/sweep/tradeoff-summary';
import { formatPower, formatQuantity, fromSi, unitLabel, type UnitSystem } from '@shared/units/units';
import { SWEEP_VERSION } from '../scenarios/sweep-service';

export interface ReportSource {
  report: {
    title: string;
    note: string;
    points: number[];
    figures: ReportFigure[];
    unitSystem: UnitSystem;
    createdAt: Date;
  };
  frozenAt: Date | null;
  sweep: SweepAnswer;
  project: { name: string; clientName: string; siteAddress: string; building: Building | null };
  firmName: string;
  /** The designer who prepared the report: the homeowner's contact. */
  contact: { name: string; email: string; phone: string };
  logoUrl: string | null;
  pdfUrl: string;
  expiresAt: Date | null;
}

/** A count of hours as a homeowner reads it. */
const hours = (h: number | null): string => {
  if (h === null) return 'not known (needs hourly weather records)';
  if (h === 0) return 'none';
  if (h < 0.5) return 'less than an hour';
  if (h < 10) return `about ${Number(h.toFixed(1))}`;
  return `about ${Math.round(h).toLocaleString('en-US')}`;
};

function figureText(key: ReportFigure, r: SweepRowAnswer, a: SweepAnswer, system: UnitSystem): string {
  const money = (v: string | null) => (v === null ? 'not known' : formatMoneyWhole(v, a.currency));
  switch (key) {
    case 'installedPrice':
      return money(r.installedPrice);
    case 'annualCost':
      return money(r.annualCost);
    case 'lifeCycleCost':
      return r.lifeCycleCost === null || a.studyPeriodYears === null
        ? money(r.lifeCycleCost)
        : `${money(r.lifeCycleCost)} over ${a.studyPeriodYears} years`;
    case 'compressor':
      return r.compressorAtDesignW === null ? 'not a heat pump' : formatPower(r.compressorAtDesignW, system);
    case 'runHours':
      return hours(r.runHoursPerYear);
    case 'backupHours':
      return r.compressorAtDesignW === null ? 'not a heat pump' : hours(r.backupHoursPerYear);
    case 'backupEnergy':
      return r.compressorAtDesignW === null
        ? 'not a heat pump'
        : r.backupEnergyKWh === null
          ? 'not known'
          : Math.round(r.backupEnergyKWh) === 0
            ? 'none'
            : `about ${Math.round(r.backupEnergyKWh).toLocaleString('en-US')} kWh`;
    case 'unmetHours':
      return hours(r.unmetHoursPerYear);
    case 'unmetWorstYear':
      return hours(r.unmetHoursWorstYear);
    case 'lowestIndoor': {
      const low = r.lowestIndoorC ?? lowestIndoorC(r, a.indoorDesignC);
      if (low === null) return 'not known';
      return low >= a.indoorDesignC - 0.05
        ? `stays at ${wholeDegrees(a.indoorDesignC, system)}`
        : `about ${wholeDegrees(low, system)}`;
    }
  }
}

const HEAT_PUMP_FIGURES: ReadonlySet<ReportFigure> = new Set<ReportFigure>([
  'compressor',
  'backupHours',
  'backupEnergy',
]);

export function buildReportView(src: ReportSource): ReportView {
  const { report } = src;
  // A result kept from before a field was added (a frozen one) gets the field's default.
  const a = sweepAnswerSchema.parse(src.sweep);
  const system = report.unitSystem;
  const temp = (c: number) => formatQuantity('temperature', c, system);
  // Whole degrees for the homeowner's paragraphs.
  const roundTemp = (c: number) => wholeDegrees(c, system);
  const named = (kind: RowKind) => a.rows.find((r) => r.kind === kind);
  const labelOf = new Map(a.options.map((o) => [o.id, o.label]));

  // The building in one paragraph.
  let building = 'The building has not been described.';
  const b = src.project.building;
  const r99 = named('p99');
  if (b && r99) {
    const h = heatLoss(b, r99.designC, a.designWindMs);
    const ua = effectiveConductanceWPerK(h);
    // IP: W/K × (1 Btu/h ÷ 0.29307107 W) ÷ (1.8 °F per K), NIST SP 811 (2008) Appendix B.
    const uaText = system === 'SI' ? `${Math.round(ua)} W` : `${Math.round(ua / 0.29307107 / 1.8)} Btu/h`;
    building =
      `Kept at ${roundTemp(b.indoorDesignC)} indoors, the house loses about ${uaText} of heat for every degree ${system === 'SI' ? '(°C)' : '(°F)'} it is warmer inside than out, ` +
      `through its walls, roof, windows and floor and with the outside air that leaks or is let in. On a ${roundTemp(r99.designC)} night that is about ${formatPower(h.loadW, system)} of heat` +
      (b.safetyFactorPct > 0 ? `; each option allows ${b.safetyFactorPct} % more.` : '.');
  }

  // The climate in plain words.
  const climate: string[] = [];
  const r996 = named('p996');
  if (r99 && r996) {
    climate.push(
      `At ${a.climateSiteName}, ${designValueName('99 %', 'homeowner')} gets down to about ${roundTemp(r99.designC)}: only about 88 hours of an average year (1 %) are colder than that. ` +
        `On ${designValueName('99.6 %', 'homeowner')} it gets down to about ${roundTemp(r996.designC)}, with about 35 colder hours a year.`,
    );
  }
  const mean = named('annualMin');
  if (mean) climate.push(`The average coldest hour of the year is about ${roundTemp(mean.designC)}.`);
  const r50 = named('rp50');
  if (r50) {
    climate.push(
      `The cold to expect about once in 50 years is near ${roundTemp(r50.designC)}: any one winter has about a 2 % chance of getting that cold.`,
    );
  }
  climate.push(
    a.hasRecord && a.years.length > 0
      ? `The figures below replay ${a.years.length} years of ${a.climateBasis?.estimateLabel ? 'an estimated hour-by-hour weather record' : 'hour-by-hour weather records'} (${a.years[0] ?? ''}–${a.years.at(-1) ?? ''}) against the house.`
      : 'This place has no hour-by-hour weather record here, so running costs and the hours a unit could fall short are not known.',
  );
  if (a.climateBasis?.latestYears)
    climate.push(
      `These figures use the latest ${a.climateBasis.latestYears} years of the record only, to reflect recent winters.`,
    );
  if (a.climateBasis?.estimateLabel) climate.push(a.climateBasis.estimateLabel);

  const oddsContext = {
    rows: a.rows,
    currency: a.currency,
    unitSystem: system,
    odds: a.odds,
    uncertainty: a.uncertainty,
  };
  const letters = 'ABC';
  const options = report.points.flatMap((t, k) => {
    const r = a.rows[nearestRowIndex(a.rows, t)];
    if (!r) return [];
    const letter = letters[k] ?? String(k + 1);
    // One paragraph per option, led by its letter: the sentences stand below the option cards.
    const oddsLines = [
      plainLifetimeSentence(r, system),
      plainBandSentence(r, oddsContext),
      plainComfortSentence(a.rows.indexOf(r), oddsContext),
    ].filter((x): x is string => x !== null);
    const odds = oddsLines.length > 0 ? [`Option ${letter}: ${oddsLines.join(' ')}`] : [];
    const unit = r.selectedOptionId
      ? (labelOf.get(r.selectedOptionId) ?? r.selectedOptionId)
      : 'No unit on the list is big enough';
    return [
      {
        heading: r.isGrid
          ? `Option ${letter}: sized for ${roundTemp(r.designC)} nights`
          : `Option ${letter}: sized for ${designValueName(r.label, 'homeowner')} (${roundTemp(r.designC)})`,
        tag: r.isGrid ? roundTemp(r.designC) : designValueTag(r.label),
        designC: r.designC,
        temperature: roundTemp(r.designC),
        unit,
        capacity: r.capacityAtDesignW === null ? '—' : formatPower(r.capacityAtDesignW, system),
        // Heat-pump figures are left out for an option that is not a heat pump: a homeowner has no use for "not a heat pump".
        figures: report.figures
          .filter((key) => r.compressorAtDesignW !== null || !HEAT_PUMP_FIGURES.has(key))
          .map((key) => ({ key, label: reportFigureLabels[key], text: figureText(key, r, a, system) })),
        sentence: homeownerSentence(r, {
          rows: a.rows,
          optionLabel: (id) => labelOf.get(id) ?? id,
          currency: a.currency,
          unitSystem: system,
          hasRecord: a.hasRecord,
          years: a.years.length,
          indoorC: a.indoorDesignC,
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
    contact: src.contact,
    title: report.title,
    note: report.note,
    preparedAt: report.createdAt.toISOString(),
    computedAt: a.computedAt,
    frozen: src.frozenAt !== null,
    status: src.frozenAt
      ? 'The figures in this report are fixed: they will not change.'
      : `The figures in this report may still change if your installer updates the details; they were last worked out on ${computed.toISOString().slice(0, 10)}.`,
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
      points: options.map((o, k) => ({ t: chartT(o.designC), label: letters[k] ?? String(k + 1) })),
    },
    cautionsTitle: HOMEOWNER_CAUTIONS_TITLE,
    cautions: [...HOMEOWNER_CAUTIONS],
    provenance:
      (src.frozenAt
        ? `Figures fixed on ${src.frozenAt.toISOString().slice(0, 10)}`
        : `Figures last worked out ${computed.toISOString().slice(0, 16).replace('T', ' ')} UTC`) +
      `. Indoors ${temp(a.indoorDesignC)}, wind ${formatQuantity('speed', a.designWindMs, system)}, discount rate ${a.discountRatePct} % a year above inflation` +
      (a.studyPeriodYears === null ? '' : `, costs over ${a.studyPeriodYears} years`) +
      (a.options.some((o) => o.kind === 'heat-pump')
        ? a.heatPumpSizing === 'compressor'
          ? ', heat pumps sized without their backup heater'
          : ', heat pumps sized with their backup heater'
        : '') +
      `, prices in ${a.currency}. ` +
      `Methods ${SWEEP_VERSION} and ${METHOD_VERSION}; inputs ${a.inputHash.slice(0, 12)}.`,
    unitSystem: system,
    expiresAt: src.expiresAt ? src.expiresAt.toISOString() : null,
    pdfUrl: src.pdfUrl,
  };
}
