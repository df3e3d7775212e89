/**
 * Units of the building form and of the heat-loss figures. The form keeps every number in SI (the
 * source of truth); what the user sees and types is converted for display only, so switching the
 * unit system never changes a stored value.
 */
import {
  fromSi,
  groupDigits,
  formatPower,
  powerChartUnit,
  powerInChartUnit,
  quantities,
  toSi,
  unitLabel,
  type BuildingQuantity,
  type UnitSystem,
} from '@shared/units/units';

export { formatPower, groupDigits, powerChartUnit, powerInChartUnit };

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

/** An SI value as the user sees it. */
export function toDisplay(fieldUnit: FieldUnit, si: number, system: UnitSystem): number {
  switch (fieldUnit.kind) {
    case 'fixed':
      return si;
    case 'percent-of-fraction':
      return si * 100;
    case 'quantity': {
      return fromSi(fieldUnit.quantity, si, system);
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
      return toSi(fieldUnit.quantity, shown, system);
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
      return unitLabel(fieldUnit.quantity, system);
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
  const decimals = quantities[fieldUnit.quantity].decimalsIp + 1;
  const significant = 3 - Math.floor(Math.log10(Math.abs(shown))) - 1;
  return String(Number(shown.toFixed(Math.min(10, Math.max(decimals, significant)))));
}

/** A temperature in the user's unit, rounded to 0.01 for charts. */
export function temperatureForChart(c: number, system: UnitSystem): number {
  return Math.round(fromSi('temperature', c, system) * 100) / 100;
}
