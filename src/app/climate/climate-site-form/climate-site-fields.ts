/**
 * The number fields of the climate-site form: where each sits in the form (the same path as in the
 * API body, so server field errors land on it), its label and the quantity its unit follows.
 */
import { unitLabel, type Quantity, type UnitSystem } from '@shared/units/units';

export interface NumberField {
  /** Dotted path in the form and in the API body, e.g. `publishedValues.heating.db99_6`. */
  path: string;
  label: string;
  /** Converted between the user's units and SI; absent for unit-free numbers. */
  quantity?: Quantity;
  /** Unit shown for unit-free numbers (°, h, %). */
  fixedUnit?: string;
  hint?: string;
  required?: boolean;
  /** Whole numbers only (years). */
  integer?: boolean;
}

export interface FieldSection {
  id: string;
  title: string;
  note?: string;
  fields: NumberField[];
}

const P = 'publishedValues';

function humidification(key: 'dp99_6' | 'dp99'): NumberField[] {
  const base = `${P}.humidification.${key}`;
  return [
    { path: `${base}.dewPoint`, label: 'Dew point', quantity: 'temperature' },
    { path: `${base}.humidityRatio`, label: 'Humidity ratio', quantity: 'humidityRatio' },
    { path: `${base}.meanCoincidentDryBulb`, label: 'Mean coincident dry-bulb', quantity: 'temperature' },
    { path: `${base}.relativeHumidity`, label: 'Relative humidity', fixedUnit: '%' },
  ];
}

/** Location fields shared by both kinds of site (name and notes are text fields of their own). */
export const LOCATION_FIELDS: NumberField[] = [
  { path: 'latitude', label: 'Latitude', fixedUnit: '°', hint: 'North positive, e.g. 45.47' },
  { path: 'longitude', label: 'Longitude', fixedUnit: '°', hint: 'East positive, west negative, e.g. −73.74' },
  { path: 'elevationM', label: 'Elevation', quantity: 'length' },
  { path: 'utcOffsetHours', label: 'UTC offset', fixedUnit: 'h', hint: 'Local standard time minus UTC, e.g. −5' },
];

export const PERIOD_FIELDS: NumberField[] = [
  { path: `${P}.period.firstYear`, label: 'First year of the record', integer: true },
  { path: `${P}.period.lastYear`, label: 'Last year of the record', integer: true },
];

/** The published design values after the source, in the order of the form. */
export const PUBLISHED_SECTIONS: FieldSection[] = [
  {
    id: 'heating',
    title: 'Heating',
    note: 'Dry-bulb temperatures that 99.6 % and 99 % of the hours of a year are at or above.',
    fields: [
      { path: `${P}.heating.db99_6`, label: '99.6 % dry-bulb', quantity: 'temperature', required: true },
      { path: `${P}.heating.db99`, label: '99 % dry-bulb', quantity: 'temperature', required: true },
    ],
  },
  {
    id: 'cooling',
    title: 'Cooling',
    fields: [
      { path: `${P}.cooling.db0_4`, label: '0.4 % dry-bulb', quantity: 'temperature' },
      { path: `${P}.cooling.db1`, label: '1 % dry-bulb', quantity: 'temperature' },
      { path: `${P}.cooling.db2`, label: '2 % dry-bulb', quantity: 'temperature' },
    ],
  },
  {
    id: 'extreme',
    title: 'Extreme annual minimum',
    fields: [
      { path: `${P}.extremeMin.mean`, label: 'Mean', quantity: 'temperature' },
      { path: `${P}.extremeMin.sd`, label: 'Standard deviation', quantity: 'temperatureDifference' },
      { path: `${P}.extremeMin.returnPeriod.5`, label: '5-year minimum', quantity: 'temperature' },
      { path: `${P}.extremeMin.returnPeriod.10`, label: '10-year minimum', quantity: 'temperature' },
      { path: `${P}.extremeMin.returnPeriod.20`, label: '20-year minimum', quantity: 'temperature' },
      { path: `${P}.extremeMin.returnPeriod.50`, label: '50-year minimum', quantity: 'temperature' },
    ],
  },
  { id: 'humid-99-6', title: 'Humidification 99.6 %', fields: humidification('dp99_6') },
  { id: 'humid-99', title: 'Humidification 99 %', fields: humidification('dp99') },
  {
    id: 'wind',
    title: 'Wind',
    fields: [
      { path: `${P}.wind.coldestMonth1`, label: 'Coldest-month 1 %', quantity: 'speed' },
      { path: `${P}.wind.coincident99_6`, label: 'Mean at 99.6 % heating', quantity: 'speed' },
      { path: `${P}.wind.annual1`, label: 'Annual 1 %', quantity: 'speed' },
      { path: `${P}.wind.annual2_5`, label: 'Annual 2.5 %', quantity: 'speed' },
      { path: `${P}.wind.annual5`, label: 'Annual 5 %', quantity: 'speed' },
    ],
  },
  {
    id: 'degree-days',
    title: 'Degree-days',
    fields: [
      {
        path: `${P}.hdd18`,
        label: 'Heating degree-days',
        quantity: 'degreeDays',
        hint: 'Heating degree-days of an average year',
      },
    ],
  },
];

/** Every number field with a unit conversion. */
export const ALL_NUMBER_FIELDS: NumberField[] = [
  ...LOCATION_FIELDS,
  ...PERIOD_FIELDS,
  ...PUBLISHED_SECTIONS.flatMap((s) => s.fields),
];

/** "99.6 % dry-bulb (°F)" */
export function fieldLabel(field: NumberField, system: UnitSystem): string {
  const unit = field.quantity ? unitLabel(field.quantity, system) : field.fixedUnit;
  if (field.path.endsWith('.hdd18')) {
    return `HDD, base ${system === 'SI' ? '18.3 °C' : '65 °F'} (${unit ?? ''})`;
  }
  return unit ? `${field.label} (${unit})` : field.label;
}

/** Rounds away floating-point noise of a unit conversion (a few decimals more than shown). */
export function roundConverted(value: number, decimals = 3): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
