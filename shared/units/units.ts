/**
 * The one table of quantities and units. Everything is stored in SI; the user's unit system only
 * changes what is shown and typed. Conversions go through mathjs units (a created instance with
 * only the unit functions, so the client bundle stays small). The readers' exact conversions
 * (°F, mph, knots) and the display helpers for heat flows and money summaries live here too.
 *
 * mathjs defines the foot as 0.3048 m, the British thermal unit as the International Table value
 * (1055.05585262 J) and °R as 5/9 K, so its factors agree with NIST SP 811 (2008), Appendix B
 * (tests/engine/building-quantities.test.ts checks them).
 */
import { create, unitDependencies, type Unit } from 'mathjs';

if (!unitDependencies) throw new Error('mathjs unit functions are missing');
const math = create({ unitDependencies });

/** The user's unit system: SI, or IP (inch-pound). Values are stored in SI either way. */
export const unitSystems = ['SI', 'IP'] as const;
export type UnitSystem = (typeof unitSystems)[number];

/** The quantities Tailroom shows, with their SI and IP units (mathjs names) and display labels. */
export const quantities = {
  temperature: { si: 'degC', ip: 'degF', labelSi: '°C', labelIp: '°F', decimalsSi: 1, decimalsIp: 0 },
  /** A temperature difference (K ↔ °F·Δ): no offset. */
  temperatureDifference: { si: 'K', ip: 'degR', labelSi: 'K', labelIp: '°F', decimalsSi: 1, decimalsIp: 1 },
  speed: { si: 'm/s', ip: 'mi/h', labelSi: 'm/s', labelIp: 'mph', decimalsSi: 1, decimalsIp: 1 },
  length: { si: 'm', ip: 'ft', labelSi: 'm', labelIp: 'ft', decimalsSi: 0, decimalsIp: 0 },
  humidityRatio: { si: 'g/kg', ip: 'g/kg', labelSi: 'g/kg', labelIp: 'gr/lb', decimalsSi: 1, decimalsIp: 0 },
  /** Degree-days: °C·day ↔ °F·day (a difference times a time). */
  degreeDays: { si: 'K', ip: 'degR', labelSi: '°C·day', labelIp: '°F·day', decimalsSi: 0, decimalsIp: 0 },
  /** Degree-hours: °C·h ↔ °F·h (a difference times a time). */
  degreeHours: { si: 'K', ip: 'degR', labelSi: '°C·h', labelIp: '°F·h', decimalsSi: 0, decimalsIp: 0 },
  /** Heat flow: W ↔ Btu/h. */
  power: { si: 'W', ip: 'BTU/h', labelSi: 'W', labelIp: 'Btu/h', decimalsSi: 0, decimalsIp: 0 },
  /** Airflow: L/s ↔ cfm. */
  airflow: { si: 'L/s', ip: 'ft^3/min', labelSi: 'L/s', labelIp: 'cfm', decimalsSi: 1, decimalsIp: 0 },
  /** Airflow per hour: m³/h ↔ cfm. */
  airflowHourly: { si: 'm^3/h', ip: 'ft^3/min', labelSi: 'm³/h', labelIp: 'cfm', decimalsSi: 0, decimalsIp: 0 },
  area: { si: 'm^2', ip: 'ft^2', labelSi: 'm²', labelIp: 'ft²', decimalsSi: 1, decimalsIp: 0 },
  volume: { si: 'm^3', ip: 'ft^3', labelSi: 'm³', labelIp: 'ft³', decimalsSi: 0, decimalsIp: 0 },
  /** Thermal transmittance: W/(m²·K) ↔ Btu/(h·ft²·°F). */
  uValue: {
    si: 'W/(m^2 K)',
    ip: 'BTU/(h ft^2 degR)',
    labelSi: 'W/(m²·K)',
    labelIp: 'Btu/(h·ft²·°F)',
    decimalsSi: 3,
    decimalsIp: 3,
  },
  /** Thermal resistance: m²·K/W ↔ h·ft²·°F/Btu. */
  rValue: {
    si: 'm^2 K/W',
    ip: 'h ft^2 degR/BTU',
    labelSi: 'm²·K/W',
    labelIp: 'h·ft²·°F/Btu',
    decimalsSi: 2,
    decimalsIp: 1,
  },
  /** Conductance (UA): W/K ↔ Btu/(h·°F). */
  conductance: { si: 'W/K', ip: 'BTU/(h degR)', labelSi: 'W/K', labelIp: 'Btu/(h·°F)', decimalsSi: 1, decimalsIp: 1 },
  /** Effective leakage area: cm² ↔ in². */
  leakageArea: { si: 'cm^2', ip: 'in^2', labelSi: 'cm²', labelIp: 'in²', decimalsSi: 0, decimalsIp: 1 },
} as const;
export type Quantity = keyof typeof quantities;

/** The building and equipment quantities (the building form and the equipment list convert these). */
export type BuildingQuantity = Exclude<
  Quantity,
  'temperature' | 'temperatureDifference' | 'speed' | 'length' | 'humidityRatio' | 'degreeDays' | 'degreeHours'
>;

/** 1 g/kg = 7 gr/lb (7000 grains per pound; 1 g/kg = 0.001 lb/lb). */
const GRAINS_PER_LB_PER_G_PER_KG = 7;

/** Converts a value between two mathjs unit expressions (e.g. 'BTU/h' → 'W'). */
export function convertUnits(value: number, from: string, to: string): number {
  if (from === to) return value;
  const u: Unit = math.unit(value, from);
  return u.toNumber(to);
}

/** An SI value in the user's units. */
export function fromSi(quantity: Quantity, value: number, system: UnitSystem): number {
  const q = quantities[quantity];
  if (system === 'SI') return value;
  if (quantity === 'humidityRatio') return value * GRAINS_PER_LB_PER_G_PER_KG;
  return convertUnits(value, q.si, q.ip);
}

/** A value typed in the user's units, in SI. */
export function toSi(quantity: Quantity, value: number, system: UnitSystem): number {
  const q = quantities[quantity];
  if (system === 'SI') return value;
  if (quantity === 'humidityRatio') return value / GRAINS_PER_LB_PER_G_PER_KG;
  return convertUnits(value, q.ip, q.si);
}

export function unitLabel(quantity: Quantity, system: UnitSystem): string {
  const q = quantities[quantity];
  return system === 'SI' ? q.labelSi : q.labelIp;
}

/** A value for display in the user's units with its label, e.g. "−17.8 °C" or "0 °F"; "—" for null. */
export function formatQuantity(quantity: Quantity, value: number | null | undefined, system: UnitSystem): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const q = quantities[quantity];
  const decimals = system === 'SI' ? q.decimalsSi : q.decimalsIp;
  const shown = fromSi(quantity, value, system).toFixed(decimals).replace('-', '−');
  return `${shown === '−0' || /^−0\.0+$/.test(shown) ? shown.slice(1) : shown} ${unitLabel(quantity, system)}`;
}

/** Digits grouped by thousands with a comma (fixed, so the figures read the same everywhere). */
export function groupDigits(value: number, decimals = 0): string {
  const text = Math.abs(value).toFixed(decimals);
  const [whole = '0', fraction] = text.split('.');
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  const sign = value < 0 && Number(text) !== 0 ? '−' : '';
  return `${sign}${grouped}${fraction ? `.${fraction}` : ''}`;
}

/**
 * A heat flow for reading: kW with one decimal from 1 kW up ("12.3 kW"), whole watts below; in IP
 * Btu/h to the nearest 100 from 10 000 up ("41,900 Btu/h"), to the nearest 10 below.
 */
export function formatPower(watts: number, system: UnitSystem): string {
  if (!Number.isFinite(watts)) return '—';
  if (system === 'SI') {
    return Math.abs(watts) >= 1000 ? `${groupDigits(watts / 1000, 1)} kW` : `${groupDigits(watts)} W`;
  }
  const btuh = fromSi('power', watts, 'IP');
  const step = Math.abs(btuh) >= 10_000 ? 100 : 10;
  return `${groupDigits(Math.round(btuh / step) * step)} Btu/h`;
}

/** The unit of a chart's heat-flow axis: kW or kBtu/h (the figures read like the headline). */
export function powerChartUnit(system: UnitSystem): string {
  return system === 'SI' ? 'kW' : 'kBtu/h';
}

/** A heat flow in the chart unit (kW or kBtu/h). */
export function powerInChartUnit(watts: number, system: UnitSystem): number {
  return fromSi('power', watts, system) / 1000;
}

/** A percentage of a fraction for reading: 0.955 → "95.5 %". */
export function formatPercent(fraction: number | null | undefined, decimals = 1): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '—';
  return `${Number((fraction * 100).toFixed(decimals))} %`;
}

// ---------------------------------------------------------------------------------------------
// Exact conversions of the weather readers (all factors exact by definition).

/** °F → °C: t_C = (t_F − 32) · 5/9 (exact, from the definitions of both scales). */
export function fahrenheitToCelsius(tF: number): number {
  return ((tF - 32) * 5) / 9;
}

/** °C → °F (exact). */
export function celsiusToFahrenheit(tC: number): number {
  return (tC * 9) / 5 + 32;
}

/** 1 mph = 0.44704 m/s exactly (1 mile = 1609.344 m by the 1959 international yard). */
export const METRES_PER_SECOND_PER_MPH = 0.44704;

/** 1 knot = 1852 m per 3600 s exactly (1 international nautical mile = 1852 m). */
export const METRES_PER_SECOND_PER_KNOT = 1852 / 3600;

/** mph → m/s. */
export function mphToMs(mph: number): number {
  return mph * METRES_PER_SECOND_PER_MPH;
}

/** knots → m/s. */
export function knotsToMs(knots: number): number {
  return knots * METRES_PER_SECOND_PER_KNOT;
}
