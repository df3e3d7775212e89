/**
 * Units of the building form and of the heat-loss figures. The form keeps every number in SI (the
 * source of truth); what the user sees and types is converted for display only, so switching the
 * unit system never changes a stored value.
 */
import type { UnitSystem } from '@shared/auth/auth-schemas';
import {
  buildingQuantities,
  fromSi as buildingFromSi,
  toSi as buildingToSi,
  unitLabel as buildingUnitLabel,
  type BuildingQuantity,
} from '@shared/building/quantities';
import {
  fromSi as climateFromSi,
  quantities as climateQuantities,
  toSi as climateToSi,
  unitLabel as climateUnitLabel,
} from '@shared/units/units';

/** Unit-converted quantities of the form: the building quantities plus temperature and speed. */
export type ConvertedQuantity = BuildingQuantity | 'temperature' | 'speed';

/**
 * How a number field shows its value: a converted quantity, a fraction typed as a percentage
 * (heat-recovery effectiveness), or a plain number with a fixed unit (%, ACH, h).
 */
export type FieldUnit =
  | { kind: 'quantity'; quantity: ConvertedQuantity }
  | { kind: 'percent-of-fraction' }
  | { kind: 'fixed'; label: string };

export const unit = {
  quantity: (quantity: ConvertedQuantity): FieldUnit => ({ kind: 'quantity', quantity }),
  percentOfFraction: { kind: 'percent-of-fraction' } as FieldUnit,
  fixed: (label: string): FieldUnit => ({ kind: 'fixed', label }),
};

function isClimateQuantity(q: ConvertedQuantity): q is 'temperature' | 'speed' {
  return q === 'temperature' || q === 'speed';
}

/** An SI value as the user sees it. */
export function toDisplay(fieldUnit: FieldUnit, si: number, system: UnitSystem): number {
  switch (fieldUnit.kind) {
    case 'fixed':
      return si;
    case 'percent-of-fraction':
      return si * 100;
    case 'quantity': {
      const q = fieldUnit.quantity;
      return isClimateQuantity(q) ? climateFromSi(q, si, system) : buildingFromSi(q, si, system);
    }
  }
}

/** A value the user typed, in SI. */
export function fromDisplay(fieldUnit: FieldUnit, shown: number, system: UnitSystem): number {
  switch (fieldUnit.kind) {
    case 'fixed':
      return shown;
    case 'percent-of-fraction':
      return shown / 100;
    case 'quantity': {
      const q = fieldUnit.quantity;
      return isClimateQuantity(q) ? climateToSi(q, shown, system) : buildingToSi(q, shown, system);
    }
  }
}

/** The unit suffix of a field, e.g. "W/K" or "Btu/(h·°F)". */
export function displayUnit(fieldUnit: FieldUnit, system: UnitSystem): string {
  switch (fieldUnit.kind) {
    case 'fixed':
      return fieldUnit.label;
    case 'percent-of-fraction':
      return '%';
    case 'quantity': {
      const q = fieldUnit.quantity;
      return isClimateQuantity(q) ? climateUnitLabel(q, system) : buildingUnitLabel(q, system);
    }
  }
}

/** A number as written in a field: six significant digits, without conversion noise. */
export function fieldText(value: number): string {
  if (!Number.isFinite(value)) return '';
  return String(Number(value.toPrecision(6)));
}

/**
 * What a field shows for a stored SI value. SI values are shown as stored; values converted to IP
 * are rounded to one decimal more than the figures elsewhere (at least three significant digits).
 * Only the text is rounded: the stored SI value stays as it is until the user types.
 */
export function displayText(fieldUnit: FieldUnit, si: number, system: UnitSystem): string {
  const shown = toDisplay(fieldUnit, si, system);
  if (system === 'SI' || fieldUnit.kind !== 'quantity' || !Number.isFinite(shown) || shown === 0) {
    return fieldText(shown);
  }
  const q = fieldUnit.quantity;
  const decimals = (isClimateQuantity(q) ? climateQuantities[q].decimalsIp : buildingQuantities[q].decimalsIp) + 1;
  const significant = 3 - Math.floor(Math.log10(Math.abs(shown))) - 1;
  return String(Number(shown.toFixed(Math.min(10, Math.max(decimals, significant)))));
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
  const btuh = buildingFromSi('power', watts, 'IP');
  const step = Math.abs(btuh) >= 10_000 ? 100 : 10;
  return `${groupDigits(Math.round(btuh / step) * step)} Btu/h`;
}

/** A heat flow in the chart unit (W or Btu/h). */
export function powerInChartUnit(watts: number, system: UnitSystem): number {
  return buildingFromSi('power', watts, system);
}

/** A temperature in the user's unit, rounded to 0.01 for charts. */
export function temperatureForChart(c: number, system: UnitSystem): number {
  return Math.round(climateFromSi('temperature', c, system) * 100) / 100;
}
