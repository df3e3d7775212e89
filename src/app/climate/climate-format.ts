/**
 * Words and numbers for climate sites: year spans, source names, the design-value rows with their
 * plain explanations, and the hours-per-year figures behind the percentages.
 */
import type { SourceKind } from '@shared/climate/climate-schemas';
import { formatQuantity, type Quantity, type UnitSystem } from '@shared/units/units';

/** Hours in a 365-day year; the percentages of the design values are shares of these. */
export const HOURS_PER_YEAR = 8760;

/** Hours in an average year that a percentage of the hours stands for, rounded (0.4 % → 35 h). */
export function hoursPerYear(percent: number): number {
  return Math.round((percent / 100) * HOURS_PER_YEAR);
}

/** Chance in any one year of an event with an `years`-year return period, % (50 years → 2 %). */
export function yearlyChancePercent(years: number): number {
  return 100 / years;
}

export const MONTH_NAMES = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
] as const;

export const MONTH_SHORT_NAMES = MONTH_NAMES.map((m) => m.slice(0, 3));

export const SOURCE_LABELS: Record<SourceKind, string> = {
  hourly: 'Hourly record',
  published: 'Published values',
};

/** "1995–2024 (30)": the record's span and how many years qualified; "—" when unknown. */
export function yearsLabel(firstYear: number | null, lastYear: number | null, qualifying: number | null): string {
  if (firstYear === null || lastYear === null) return '—';
  const span = firstYear === lastYear ? `${firstYear}` : `${firstYear}–${lastYear}`;
  return qualifying === null ? span : `${span} (${qualifying})`;
}

/** A number with a fixed count of decimals and a true minus sign. */
export function formatNumber(value: number, decimals: number): string {
  const text = value.toFixed(decimals).replace('-', '−');
  return /^−0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/** Latitude and longitude as "45.47° N, 73.74° W"; '' when not given. */
export function coordinatesLabel(latitude: number | null, longitude: number | null): string {
  if (latitude === null || longitude === null) return '';
  const lat = `${Math.abs(latitude).toFixed(2)}° ${latitude >= 0 ? 'N' : 'S'}`;
  const lon = `${Math.abs(longitude).toFixed(2)}° ${longitude >= 0 ? 'E' : 'W'}`;
  return `${lat}, ${lon}`;
}

/** "UTC−5" / "UTC+5:30". */
export function utcOffsetLabel(hours: number | null): string {
  if (hours === null) return '';
  const sign = hours < 0 ? '−' : '+';
  const abs = Math.abs(hours);
  const whole = Math.floor(abs);
  const minutes = Math.round((abs - whole) * 60);
  return `UTC${sign}${whole}${minutes ? `:${String(minutes).padStart(2, '0')}` : ''}`;
}

// ---------------------------------------------------------------------------------------------
// Design-value rows, from computed conditions or from published values alike

type Num = number | null | undefined;

interface LooseHumidification {
  dewPoint?: Num;
  humidityRatio?: Num;
  meanCoincidentDryBulb?: Num;
  relativeHumidity?: Num;
}

/** What computed conditions and published values have in common (published fields may be missing). */
export interface LooseDesignValues {
  heating: { db99_6: number; db99: number };
  cooling?: { db0_4?: Num; db1?: Num; db2?: Num };
  extremeMin?: { mean?: Num; sd?: Num; returnPeriod?: { '5'?: Num; '10'?: Num; '20'?: Num; '50'?: Num } };
  humidification?: { dp99_6?: LooseHumidification | null; dp99?: LooseHumidification | null };
  wind?: {
    coldestMonth?: Num;
    coldestMonth1?: Num;
    coincident99_6?: Num;
    annual1?: Num;
    annual2_5?: Num;
    annual5?: Num;
  };
  hdd18?: Num;
}

export interface DesignValueRow {
  key: string;
  group: string;
  label: string;
  value: string;
  explanation: string;
}

const DASH = '—';

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** The design values as table rows, in the user's units, with a plain sentence each. */
export function designValueRows(values: LooseDesignValues, system: UnitSystem): DesignValueRow[] {
  const q = (quantity: Quantity, value: Num) => formatQuantity(quantity, value, system);
  const percentText = (value: Num) => (value === null || value === undefined ? DASH : `${formatNumber(value, 0)} %`);
  const rows: DesignValueRow[] = [];
  const add = (group: string, key: string, label: string, value: string, explanation: string) =>
    rows.push({ group, key, label, value, explanation });

  const heat = 'Heating';
  add(
    heat,
    'heating-99.6',
    'Heating 99.6 %',
    q('temperature', values.heating.db99_6),
    `Colder than this for about ${plural(hoursPerYear(0.4), 'hour')} in an average year (0.4 % of the hours).`,
  );
  add(
    heat,
    'heating-99',
    'Heating 99 %',
    q('temperature', values.heating.db99),
    `Colder than this for about ${plural(hoursPerYear(1), 'hour')} a year (1 % of the hours).`,
  );

  const ext = 'Extreme annual minimum';
  const extreme = values.extremeMin;
  add(
    ext,
    'extreme-mean',
    'Mean extreme minimum',
    q('temperature', extreme?.mean),
    "Mean of each year's coldest hour.",
  );
  add(
    ext,
    'extreme-sd',
    'Standard deviation',
    q('temperatureDifference', extreme?.sd),
    "How much each year's coldest hour strays from that mean.",
  );
  for (const years of [5, 10, 20, 50] as const) {
    const chance = formatNumber(yearlyChancePercent(years), 0);
    const explanation =
      years === 50
        ? `50-year night: the coldest hour expected once in 50 years (${chance} % chance in any year).`
        : `The coldest hour expected once in ${years} years (${chance} % chance in any year).`;
    add(
      ext,
      `return-${years}`,
      `${years}-year minimum`,
      q('temperature', extreme?.returnPeriod?.[`${years}`]),
      explanation,
    );
  }

  const humid = 'Humidification';
  for (const [key, percent, label] of [
    ['dp99_6', 0.4, '99.6 %'],
    ['dp99', 1, '99 %'],
  ] as const) {
    const h = values.humidification?.[key];
    const hours = plural(hoursPerYear(percent), 'hour');
    add(
      humid,
      `${key}-dew-point`,
      `Dew point ${label}`,
      q('temperature', h?.dewPoint),
      `Air drier than this (lower dew point) for about ${hours} a year.`,
    );
    add(
      humid,
      `${key}-humidity-ratio`,
      `Humidity ratio ${label}`,
      q('humidityRatio', h?.humidityRatio),
      'Water in the air at that dew point, per mass of dry air.',
    );
    add(
      humid,
      `${key}-coincident-dry-bulb`,
      `Mean coincident dry-bulb ${label}`,
      q('temperature', h?.meanCoincidentDryBulb),
      'Average outdoor temperature during those dry hours.',
    );
    add(
      humid,
      `${key}-relative-humidity`,
      `Relative humidity ${label}`,
      percentText(h?.relativeHumidity),
      'Relative humidity of that air at the mean coincident dry-bulb.',
    );
  }

  const cool = 'Cooling';
  for (const [key, percent, label] of [
    ['db0_4', 0.4, 'Cooling 0.4 %'],
    ['db1', 1, 'Cooling 1 %'],
    ['db2', 2, 'Cooling 2 %'],
  ] as const) {
    add(
      cool,
      `cooling-${key}`,
      label,
      q('temperature', values.cooling?.[key]),
      `Warmer than this for about ${plural(hoursPerYear(percent), 'hour')} a year.`,
    );
  }

  const windGroup = 'Wind';
  const wind = values.wind;
  const month = wind?.coldestMonth;
  add(
    windGroup,
    'wind-coldest-month',
    'Coldest month',
    month ? (MONTH_NAMES[month - 1] ?? DASH) : DASH,
    'The month with the lowest mean temperature.',
  );
  add(
    windGroup,
    'wind-coldest-month-1',
    'Coldest-month wind 1 %',
    q('speed', wind?.coldestMonth1),
    'Wind speed exceeded in 1 % of the hours of the coldest month.',
  );
  add(
    windGroup,
    'wind-coincident',
    'Wind with 99.6 % heating',
    q('speed', wind?.coincident99_6),
    'Average wind speed during the hours at or below the 99.6 % heating value.',
  );
  for (const [key, percent, label] of [
    ['annual1', 1, '1'],
    ['annual2_5', 2.5, '2.5'],
    ['annual5', 5, '5'],
  ] as const) {
    add(
      windGroup,
      `wind-${key}`,
      `Annual wind ${label} %`,
      q('speed', wind?.[key]),
      `Wind speed exceeded for about ${plural(hoursPerYear(percent), 'hour')} a year.`,
    );
  }

  const base = system === 'SI' ? '18.3 °C' : '65 °F';
  add(
    'Degree-days',
    'hdd',
    `Heating degree-days (base ${base})`,
    q('degreeDays', values.hdd18),
    `Each day's shortfall of the mean temperature below ${base}, added up over an average year.`,
  );
  return rows;
}

/** An ISO 8601 UTC hour as "1998-01-14 06:00 UTC". */
export function utcHourLabel(iso: string): string {
  const match = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})/.exec(iso);
  return match ? `${match[1] ?? ''} ${match[2] ?? ''} UTC` : iso;
}

/** Names of the hourly fields the data-quality report speaks of. */
export const SERIES_FIELD_LABELS: Record<string, { label: string; quantity?: Quantity; unit?: string }> = {
  dryBulbC: { label: 'Dry-bulb', quantity: 'temperature' },
  dewPointC: { label: 'Dew point', quantity: 'temperature' },
  windSpeedMs: { label: 'Wind speed', quantity: 'speed' },
  stationPressureKpa: { label: 'Station pressure', unit: 'kPa' },
};

/** A value of an hourly field with its unit, in the user's units where they differ. */
export function seriesValueLabel(field: string, value: number, system: UnitSystem): string {
  const f = SERIES_FIELD_LABELS[field];
  if (f?.quantity) return formatQuantity(f.quantity, value, system);
  return `${formatNumber(value, 1)}${f?.unit ? ` ${f.unit}` : ''}`;
}

/** Plain sentences for the warning codes stored with computed conditions. */
export const DESIGN_WARNING_TEXTS: Record<string, string> = {
  'short-record': 'The record is short; values from fewer years vary more from one period to the next.',
  'years-dropped': 'Some years were left out because too many of their hours were missing.',
  'duplicate-hours': 'Some hours appeared more than once; the first value of each was kept.',
  'out-of-range-values': 'Some values were outside physical limits and were treated as missing.',
  'invalid-times': 'Some rows had times that could not be read and were skipped.',
  'missing-dew-point': 'The record has no dew points, so humidification values could not be computed.',
  'missing-wind': 'The record has no wind speeds, so wind values could not be computed.',
  'single-year-extremes':
    'With a single year, the spread of yearly minima and the return-period values cannot be estimated.',
  'no-coincident-hours': 'No hours matched the design dew point closely enough for a mean coincident dry-bulb.',
  'pressure-assumed-sea-level': 'No elevation was given, so sea-level pressure was assumed for the humidity ratio.',
};
