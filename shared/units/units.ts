/**
 * SI ↔ IP conversion for display and input. Everything is stored in SI; the
 * user's unit system only changes what is shown and typed. Conversions go
 * through mathjs units (a created instance with only the unit functions, so the
 * client bundle stays small).
 */
import { create, unitDependencies, type Unit } from 'mathjs';
import type { UnitSystem } from '../auth/auth-schemas';

if (!unitDependencies) throw new Error('mathjs unit functions are missing');
const math = create({ unitDependencies });

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
} as const;
export type Quantity = keyof typeof quantities;

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
