/**
 * One name per concept per reader. Designers read the trade's terms (design temperature, design
 * load, equivalent full-load hours, unmet hours, unmet degree-hours, backup heat, sizing margin);
 * homeowners read plain words. Every screen, the report, its PDF, the CSV headers and the e-mails
 * take their words from here, so that one quantity never carries two names for the same reader.
 * See docs/glossary.md for the list as the README shows it.
 */
import { formatQuantity, type UnitSystem } from '../units/units';

export type Audience = 'designer' | 'homeowner';

export interface Term {
  /** The trade's term, shown to designers and estimators. */
  designer: string;
  /** Plain words for a homeowner. */
  homeowner: string;
  /** One line that explains the figure (tooltip or info button on the designer's screens). */
  explain: string;
  /** The column name in CSV exports (snake_case, units in the name). */
  csv?: string;
}

export const glossary = {
  designTemperatures: {
    designer: 'Design temperatures',
    homeowner: 'Outdoor temperatures the heating could be sized for',
    explain:
      'The candidate outdoor design temperatures, from the 99 % value down to the coldest return-period value, with a step between them.',
  },
  designTemperature: {
    designer: 'Design temperature',
    homeowner: 'Outdoor temperature it is sized for',
    explain: 'The outdoor temperature at which the unit must still cover the whole heat loss of the building.',
    csv: 'design_temperature_c',
  },
  designPoint: {
    designer: 'Design point',
    homeowner: 'Option',
    explain: 'A named design value (99 %, 99.6 %, mean annual minimum, return period) or a temperature between them.',
    csv: 'design_point',
  },
  designLoad: {
    designer: 'Design load',
    homeowner: 'Heat the house needs on that day',
    explain:
      'Heat loss of the building at the design temperature (conduction, air leakage, ventilation, ducts) with the sizing margin added.',
    csv: 'design_load_w',
  },
  unit: {
    designer: 'Unit selected',
    homeowner: 'Heating unit',
    explain:
      'The smallest option on the list whose capacity at the design temperature covers the design load with the sizing margin.',
    csv: 'unit',
  },
  capacityAtDesign: {
    designer: 'Capacity at the design temperature',
    homeowner: 'Heat it can give on that day',
    explain: 'Output of the selected unit at the design temperature; for a heat pump, compressor plus backup heat.',
    csv: 'capacity_at_design_w',
  },
  compressorAtDesign: {
    designer: 'Compressor at the design temperature',
    homeowner: 'Heat the heat pump alone gives on that day',
    explain: 'Output of the heat pump’s compressor alone at the design temperature, without its backup heat.',
    csv: 'compressor_at_design_w',
  },
  backupHours: {
    designer: 'Backup heat hours per year',
    homeowner: 'Hours a year the backup heater runs',
    explain: 'Hours of an average year in which the heat pump’s backup heat is needed to meet the load.',
    csv: 'backup_hours_per_year',
  },
  backupEnergy: {
    designer: 'Backup heat energy per year',
    homeowner: 'Electricity the backup heater uses a year',
    explain: 'Electricity used by the backup heat in an average year.',
    csv: 'backup_energy_kwh',
  },
  backupHeat: {
    designer: 'Backup heat',
    homeowner: 'Electric backup heat',
    explain:
      'Electric resistance heat that a heat pump adds when its compressor alone cannot keep up; it sets the electrical service needed.',
  },
  installedPrice: {
    designer: 'Installed price',
    homeowner: 'Price to install',
    explain: 'The price of the option installed, as entered on the equipment list.',
    csv: 'installed_price',
  },
  annualEnergy: {
    designer: 'Energy per year',
    homeowner: 'Energy used per year',
    explain: 'Fuel or electricity bought in an average year of the record.',
    csv: 'annual_energy_kwh',
  },
  annualCost: {
    designer: 'Running cost per year',
    homeowner: 'Running cost per year',
    explain: 'Energy bought in an average year of the record at the scenario’s energy prices.',
    csv: 'annual_cost',
  },
  lifeCycleCost: {
    designer: 'Life-cycle cost',
    homeowner: 'Total cost over the years compared',
    explain:
      'Installed price plus the present value of the running costs over the study period, at the real discount rate.',
    csv: 'life_cycle_cost',
  },
  runHours: {
    designer: 'Equivalent full-load hours per year',
    homeowner: 'Full-output hours per year',
    explain:
      'Heat delivered in an average year divided by the unit’s capacity: the hours it would run if it only ran flat out.',
    csv: 'equivalent_full_load_hours_per_year',
  },
  unmetHours: {
    designer: 'Unmet hours per year',
    homeowner: 'Hours a year the house could get cooler than you set it',
    explain: 'Hours of an average year in which the heat loss exceeds what the unit can give.',
    csv: 'unmet_hours_per_year',
  },
  unmetHoursWorstYear: {
    designer: 'Unmet hours in the worst year',
    homeowner: 'Such hours in the coldest year on record',
    explain: 'Unmet hours in the single worst year of the hourly record.',
    csv: 'unmet_hours_worst_year',
  },
  unmetDegreeHours: {
    designer: 'Unmet degree-hours per year',
    homeowner: 'How far and how long it falls short',
    explain:
      'The shortfall summed over the unmet hours, as degrees of outdoor temperature times hours; it weighs a deep shortfall more than a shallow one.',
    csv: 'unmet_degree_hours_per_year',
  },
  lowestIndoor: {
    designer: 'Lowest indoor temperature',
    homeowner: 'Lowest the house would get',
    explain:
      'The lowest indoor temperature in the worst spell of the record, from the building’s thermal time constant (the house cools slowly).',
    csv: 'lowest_indoor_c',
  },
  indoorDrop: {
    designer: 'Drop below the set-point',
    homeowner: 'How far the house could cool',
    explain: 'Set-point minus the lowest indoor temperature in the worst spell of the record.',
    csv: 'indoor_drop_k',
  },
  sizingMargin: {
    designer: 'Sizing margin',
    homeowner: 'Extra size allowed',
    explain: 'Percentage added to the design load before a unit is selected.',
  },
  discountRate: {
    designer: 'Real discount rate',
    homeowner: 'Discount rate',
    explain: 'The yearly rate, above inflation, at which future running costs are brought back to today’s money.',
  },
  studyPeriod: {
    designer: 'Study period',
    homeowner: 'Years counted',
    explain: 'The span of years over which life-cycle costs are compared.',
  },
  equipmentLife: {
    designer: 'Equipment life',
    homeowner: 'Expected life',
    explain: 'Years the unit is expected to last, as entered on the equipment list.',
  },
  balancePoint: {
    designer: 'Balance point',
    homeowner: 'Outdoor temperature where it just keeps up',
    explain:
      'The outdoor temperature at which the unit’s output equals the heat loss; colder than that, it falls behind.',
  },
  designWind: {
    designer: 'Design wind',
    homeowner: 'Wind allowed for',
    explain: 'Wind speed used for air leakage at the design temperature.',
  },
} as const satisfies Record<string, Term>;

export type TermKey = keyof typeof glossary;

/** The name of a concept for a reader. */
export function term(key: TermKey, audience: Audience = 'designer'): string {
  return glossary[key][audience];
}

/** The one-line explanation of a concept. */
export function explain(key: TermKey): string {
  return glossary[key].explain;
}

/** The CSV column of a concept. */
export function csvColumn(key: TermKey): string {
  const t: Term = glossary[key];
  if (!t.csv) throw new Error(`${key} has no CSV column`);
  return t.csv;
}

/**
 * The names of the named design values (the sweep labels them '99 %', '99.6 %', 'Extreme mean',
 * '5-year' … '50-year'). The label is the key; what a reader sees comes from here.
 */
const namedValues: Record<string, { designer: string; homeowner: string; explain: string }> = {
  '99 %': {
    designer: '99 % design temperature',
    homeowner: 'a typical cold winter night',
    explain: '99 % of the hours of the record are warmer: about 88 colder hours in an average year.',
  },
  '99.6 %': {
    designer: '99.6 % design temperature',
    homeowner: 'a very cold winter night',
    explain: '99.6 % of the hours of the record are warmer: about 35 colder hours in an average year.',
  },
  'Extreme mean': {
    designer: 'Mean annual minimum',
    homeowner: 'the average coldest hour of the year',
    explain: 'The mean over the years of each year’s single coldest hour.',
  },
};

function returnPeriodYears(label: string): number | null {
  const m = /^(\d+)-year$/.exec(label);
  return m ? Number(m[1]) : null;
}

/** A named design value as a reader names it ("50-year return period", "the cold to expect once in 50 years"). */
export function designValueName(label: string, audience: Audience = 'designer'): string {
  const known = namedValues[label];
  if (known) return known[audience];
  const years = returnPeriodYears(label);
  if (years !== null)
    return audience === 'designer' ? `${years}-year return period` : `the cold to expect once in ${years} years`;
  return label;
}

/** A short tag of a named value for tables and charts ("99 %", "Annual min.", "50-yr"); the label itself otherwise. */
export function designValueTag(label: string): string {
  if (label === 'Extreme mean') return 'Annual min.';
  const years = returnPeriodYears(label);
  if (years !== null) return `${years}-yr`;
  return label;
}

/** What a named value means, in one line. */
export function designValueExplain(label: string): string {
  const known = namedValues[label];
  if (known) return known.explain;
  const years = returnPeriodYears(label);
  if (years !== null)
    return `The coldest hour expected on average once in ${years} years (a ${Math.round(100 / years)} % chance in any one winter).`;
  return 'A design temperature added to this scenario.';
}

/** The step between the named design temperatures, in the reader's units ("every 0.5 °C", "every 0.9 °F"). */
export function gridStepText(stepK: number, system: UnitSystem): string {
  return `Show every ${formatQuantity('temperatureDifference', stepK, system)} step`;
}
