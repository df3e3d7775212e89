/**
 * SI ↔ IP conversion of the building and equipment quantities (power, airflow, area, volume,
 * U-value, R-value, conductance, leakage area). Everything is stored in SI; the user's unit
 * system only changes what is shown and typed. Conversions go through mathjs units, with a
 * the one small instance of `shared/units/units.ts`.
 *
 * mathjs defines the foot as 0.3048 m, the British thermal unit as the International Table value
 * (1055.05585262 J) and °R as 5/9 K, so its factors agree with NIST SP 811 (2008), Appendix B
 * (tests/engine/building-quantities.test.ts checks them).
 */
import type { UnitSystem } from '../auth/auth-schemas';
import { convertUnits } from '../units/units';

export { convertUnits };

/** The building and equipment quantities, with SI and IP units (mathjs names) and display labels. */
export const buildingQuantities = {
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
  rValue: { si: 'm^2 K/W', ip: 'h ft^2 degR/BTU', labelSi: 'm²·K/W', labelIp: 'h·ft²·°F/Btu', decimalsSi: 2, decimalsIp: 1 },
  /** Conductance (UA): W/K ↔ Btu/(h·°F). */
  conductance: { si: 'W/K', ip: 'BTU/(h degR)', labelSi: 'W/K', labelIp: 'Btu/(h·°F)', decimalsSi: 1, decimalsIp: 1 },
  /** Effective leakage area: cm² ↔ in². */
  leakageArea: { si: 'cm^2', ip: 'in^2', labelSi: 'cm²', labelIp: 'in²', decimalsSi: 0, decimalsIp: 1 },
} as const;
export type BuildingQuantity = keyof typeof buildingQuantities;

/** An SI value in the user's units. */
export function fromSi(quantity: BuildingQuantity, value: number, system: UnitSystem): number {
  if (system === 'SI') return value;
  const q = buildingQuantities[quantity];
  return convertUnits(value, q.si, q.ip);
}

/** A value typed in the user's units, in SI. */
export function toSi(quantity: BuildingQuantity, value: number, system: UnitSystem): number {
  if (system === 'SI') return value;
  const q = buildingQuantities[quantity];
  return convertUnits(value, q.ip, q.si);
}

export function unitLabel(quantity: BuildingQuantity, system: UnitSystem): string {
  const q = buildingQuantities[quantity];
  return system === 'SI' ? q.labelSi : q.labelIp;
}

/** A value for display in the user's units with its label, e.g. 8000 W in IP → "27297 Btu/h"; "—" for null. */
export function formatQuantity(quantity: BuildingQuantity, value: number | null | undefined, system: UnitSystem): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const q = buildingQuantities[quantity];
  const decimals = system === 'SI' ? q.decimalsSi : q.decimalsIp;
  let shown = fromSi(quantity, value, system).toFixed(decimals);
  if (/^-0(\.0+)?$/.test(shown)) shown = shown.slice(1);
  return `${shown.replace('-', '−')} ${unitLabel(quantity, system)}`;
}
