/**
 * The inline-edited rows of an equipment list. Each row keeps what the user typed as text (powers
 * in the user's units), and turns it into an option in SI for checking and saving. A power left as
 * it was shown keeps its stored value exactly, so switching units or saving untouched rows never
 * drifts by rounding.
 */
import { signal, type WritableSignal } from '@angular/core';
import { FormControl, FormGroup } from '@angular/forms';
import { fromSi, toSi, unitLabel, type UnitSystem } from '@shared/units/units';
import {
  equipmentOptionSchema,
  type EquipmentKind,
  type EquipmentOption,
  type Fuel,
} from '@shared/equipment/equipment-schemas';
import { formatMoney } from '@shared/money/money';

export type CombustionFuel = 'gas' | 'oil' | 'propane';
export type PowerField = 'outputW' | 'inputW' | 'capacity8_3W' | 'capacityM8_3W' | 'capacityM15W' | 'backupW';
export type TextField =
  | PowerField
  | 'efficiency'
  | 'cop8_3'
  | 'copM8_3'
  | 'copM15'
  | 'installedPrice'
  | 'lifeYears'
  | 'cyclingDegradation'
  | 'minOutputFraction';

const POWER_FIELDS: readonly PowerField[] = [
  'outputW',
  'inputW',
  'capacity8_3W',
  'capacityM8_3W',
  'capacityM15W',
  'backupW',
];

export const KIND_LABELS: Record<EquipmentKind, string> = {
  furnace: 'Furnace',
  boiler: 'Boiler',
  'heat-pump': 'Heat pump',
  electric: 'Electric resistance',
};

export const FUEL_LABELS: Record<Fuel, string> = {
  gas: 'Natural gas',
  oil: 'Oil',
  propane: 'Propane',
  electricity: 'Electricity',
};

const FUELLED: readonly EquipmentKind[] = ['furnace', 'boiler', 'electric'];
const COMBUSTION: readonly EquipmentKind[] = ['furnace', 'boiler'];
const HEAT_PUMP: readonly EquipmentKind[] = ['heat-pump'];
const ALL: readonly EquipmentKind[] = ['furnace', 'boiler', 'heat-pump', 'electric'];

/** A column of typed values: which kinds it applies to, and how its values read. */
export interface ValueColumn {
  field: TextField;
  type: 'power' | 'ratio' | 'percent' | 'money' | 'years';
  kinds: readonly EquipmentKind[];
  /** Header; `{u}` is replaced by the power unit, `{c}` by the currency, `{t:°C}` by a rating temperature in the user's unit. */
  header: string;
}

export const VALUE_COLUMNS: readonly ValueColumn[] = [
  { field: 'outputW', type: 'power', kinds: FUELLED, header: 'Output ({u})' },
  { field: 'inputW', type: 'power', kinds: FUELLED, header: 'Input ({u})' },
  { field: 'efficiency', type: 'percent', kinds: COMBUSTION, header: 'Efficiency (AFUE, %)' },
  { field: 'capacity8_3W', type: 'power', kinds: HEAT_PUMP, header: 'Capacity at {t:H1} ({u})' },
  { field: 'cop8_3', type: 'ratio', kinds: HEAT_PUMP, header: 'COP at {t:H1}' },
  { field: 'capacityM8_3W', type: 'power', kinds: HEAT_PUMP, header: 'Capacity at {t:H3} ({u})' },
  { field: 'copM8_3', type: 'ratio', kinds: HEAT_PUMP, header: 'COP at {t:H3}' },
  { field: 'capacityM15W', type: 'power', kinds: HEAT_PUMP, header: 'Capacity at {t:low} ({u})' },
  { field: 'copM15', type: 'ratio', kinds: HEAT_PUMP, header: 'COP at {t:low}' },
  { field: 'backupW', type: 'power', kinds: HEAT_PUMP, header: 'Backup heat ({u})' },
  { field: 'installedPrice', type: 'money', kinds: ALL, header: 'Installed price ({c})' },
  { field: 'lifeYears', type: 'years', kinds: ALL, header: 'Expected life (years)' },
  {
    field: 'cyclingDegradation',
    type: 'ratio',
    kinds: ALL,
    header: 'Cycling loss C_d (blank: 0.25 heat pumps, 0 others)',
  },
  { field: 'minOutputFraction', type: 'ratio', kinds: ALL, header: 'Minimum output, fraction (blank: single-stage)' },
];

/**
 * The heat-pump rating temperatures as spec sheets print them: 47 °F / 17 °F / 5 °F (the rating
 * points are defined in °F; 8.3 °C, −8.3 °C and −15 °C are their conversions).
 */
export const RATING_POINTS = {
  H1: { si: '8.3 °C', ip: '47 °F' },
  H3: { si: '−8.3 °C', ip: '17 °F' },
  low: { si: '−15 °C', ip: '5 °F' },
} as const;

export function ratingPoint(point: keyof typeof RATING_POINTS, system: UnitSystem): string {
  return RATING_POINTS[point][system === 'SI' ? 'si' : 'ip'];
}

export function columnHeader(column: ValueColumn, system: UnitSystem, currency: string): string {
  return column.header
    .replace('{u}', unitLabel('power', system))
    .replace('{c}', currency)
    .replace(/\{t:(H1|H3|low)\}/, (_m, p: keyof typeof RATING_POINTS) => ratingPoint(p, system));
}

/** An efficiency (a fraction) as a percentage for a cell: 0.955 → "95.5". */
export function percentText(fraction: number | undefined): string {
  return fraction === undefined ? '' : String(Number((fraction * 100).toFixed(2)));
}

/** A percentage typed in a cell as a fraction: "95.5" → 0.955 (NaN stays NaN for the check to report). */
function readPercent(text: string): number | undefined {
  const value = readNumber(text.replace(/%\s*$/, ''));
  return value === undefined ? undefined : Number((value / 100).toFixed(6));
}

/** A power in the user's units for reading: 17584 W in IP → "60,000". */
export function formatPowerNumber(watts: number, system: UnitSystem): string {
  return Math.round(fromSi('power', watts, system)).toLocaleString('en-US');
}

/** One stored value as a table cell reads it ('—' when the option has none). */
export function displayValue(
  column: ValueColumn,
  option: EquipmentOption,
  system: UnitSystem,
  currency: string,
): string {
  if (column.field === 'efficiency' && option.kind === 'electric') return '100';
  if (!column.kinds.includes(option.kind)) return '—';
  const value = (option as Partial<Record<TextField, number | string>>)[column.field];
  if (value === undefined) return '—';
  switch (column.type) {
    case 'power':
      return formatPowerNumber(Number(value), system);
    case 'money':
      return formatMoney(String(value), currency);
    case 'percent':
      return percentText(Number(value));
    default:
      return String(value);
  }
}

/** A power as the input shows it: whole W or Btu/h, no separators. */
function powerText(watts: number, system: UnitSystem): string {
  return String(Math.round(fromSi('power', watts, system)));
}

/** Text typed into a number cell: '' is absent; thousands separators are dropped; anything else unreadable is NaN. */
export function readNumber(text: string): number | undefined {
  const t = text.trim().replace(/[\s,](?=\d{3}(\D|$))/g, '');
  if (t === '') return undefined;
  return Number(t);
}

function readMoney(text: string): string {
  return text.trim().replace(/,(?=\d{3}(\D|$))/g, '');
}

type RowControls = {
  kind: FormControl<EquipmentKind>;
  label: FormControl<string>;
  fuel: FormControl<CombustionFuel>;
} & Record<TextField, FormControl<string>>;

/** Heat-pump settings not edited in the table, kept as loaded. */
interface HeatPumpExtras {
  extrapolate?: boolean;
  defrostBand?: boolean;
  cutoutC?: number;
}

let nextKey = 1;

function text(value: number | undefined): string {
  return value === undefined ? '' : String(value);
}

/** A problem with one row: the field it belongs to ('' for the row as a whole) and what to say. */
export interface RowIssue {
  field: string;
  message: string;
}

export type RowCheck = { ok: true; option: EquipmentOption } | { ok: false; issues: RowIssue[] };

/** One editable row of the table. */
export class OptionRow {
  /** Stable identity for the table while rows are added and removed. */
  readonly key = nextKey++;
  readonly form: FormGroup<RowControls>;
  /** The kind, as a signal for the template. */
  readonly kind: WritableSignal<EquipmentKind>;
  private extras: HeatPumpExtras = {};
  /** The stored power behind each shown text, while the text is left as shown. */
  private readonly origins = new Map<PowerField, { text: string; watts: number }>();

  constructor(option: EquipmentOption | null, system: UnitSystem, onEdit: () => void) {
    const control = (value = '') => new FormControl(value, { nonNullable: true });
    this.form = new FormGroup<RowControls>({
      kind: new FormControl<EquipmentKind>(option?.kind ?? 'furnace', { nonNullable: true }),
      label: control(option?.label ?? ''),
      fuel: new FormControl<CombustionFuel>('gas', { nonNullable: true }),
      outputW: control(),
      inputW: control(),
      efficiency: control(),
      capacity8_3W: control(),
      cop8_3: control(),
      capacityM8_3W: control(),
      copM8_3: control(),
      capacityM15W: control(),
      copM15: control(),
      backupW: control(),
      installedPrice: control(option?.installedPrice ?? ''),
      lifeYears: control(text(option?.lifeYears)),
      cyclingDegradation: control(text(option?.cyclingDegradation)),
      minOutputFraction: control(text(option?.minOutputFraction)),
    });
    this.kind = signal(this.form.controls.kind.value);
    if (option) this.fill(option, system);
    this.form.controls.kind.valueChanges.subscribe((kind) => this.kind.set(kind));
    this.form.valueChanges.subscribe(() => onEdit());
  }

  control(field: TextField): FormControl<string> {
    return this.form.controls[field];
  }

  /** Puts a stored power in a cell, in the user's units. */
  private setPower(field: PowerField, watts: number | undefined, system: UnitSystem): void {
    if (watts === undefined) {
      this.origins.delete(field);
      this.form.controls[field].setValue('', { emitEvent: false });
      return;
    }
    const shown = powerText(watts, system);
    this.origins.set(field, { text: shown, watts });
    this.form.controls[field].setValue(shown, { emitEvent: false });
  }

  private fill(option: EquipmentOption, system: UnitSystem): void {
    const c = this.form.controls;
    if (option.kind === 'heat-pump') {
      this.setPower('capacity8_3W', option.capacity8_3W, system);
      this.setPower('capacityM8_3W', option.capacityM8_3W, system);
      this.setPower('capacityM15W', option.capacityM15W, system);
      this.setPower('backupW', option.backupW, system);
      c.cop8_3.setValue(text(option.cop8_3));
      c.copM8_3.setValue(text(option.copM8_3));
      c.copM15.setValue(text(option.copM15));
      this.extras = {
        extrapolate: option.extrapolate,
        defrostBand: option.defrostBand,
        ...(option.cutoutC === undefined ? {} : { cutoutC: option.cutoutC }),
      };
    } else {
      this.setPower('outputW', option.outputW, system);
      this.setPower('inputW', option.inputW, system);
      if (option.kind !== 'electric') {
        c.fuel.setValue(option.fuel);
        c.efficiency.setValue(percentText(option.efficiency));
      }
    }
  }

  /** A cell's power in W: the stored value while the text is as shown, else the typed value converted. */
  private watts(field: PowerField, system: UnitSystem): number | undefined {
    const typed = this.form.controls[field].value;
    const origin = this.origins.get(field);
    if (origin?.text === typed.trim()) return origin.watts;
    const value = readNumber(typed);
    if (value === undefined || !Number.isFinite(value)) return value;
    return Math.round(toSi('power', value, system) * 100) / 100;
  }

  /** The row as an option to check (values in SI; unreadable numbers stay NaN for the check to report). */
  toInput(system: UnitSystem): Record<string, unknown> {
    const v = this.form.getRawValue();
    const common = {
      kind: v.kind,
      label: v.label,
      installedPrice: readMoney(v.installedPrice),
      lifeYears: readNumber(v.lifeYears),
      cyclingDegradation: readNumber(v.cyclingDegradation),
      minOutputFraction: readNumber(v.minOutputFraction),
    };
    const power = (field: PowerField) => this.watts(field, system);
    switch (v.kind) {
      case 'furnace':
      case 'boiler':
        return {
          ...common,
          fuel: v.fuel,
          efficiency: readPercent(v.efficiency),
          outputW: power('outputW'),
          inputW: power('inputW'),
        };
      case 'electric':
        return { ...common, fuel: 'electricity', efficiency: 1, outputW: power('outputW'), inputW: power('inputW') };
      case 'heat-pump':
        return {
          ...common,
          fuel: 'electricity',
          capacity8_3W: power('capacity8_3W'),
          cop8_3: readNumber(v.cop8_3),
          capacityM8_3W: power('capacityM8_3W'),
          copM8_3: readNumber(v.copM8_3),
          capacityM15W: power('capacityM15W'),
          copM15: readNumber(v.copM15),
          backupW: power('backupW') ?? 0,
          ...this.extras,
        };
    }
  }

  /** Checks the row with the same rules the server applies. */
  check(system: UnitSystem): RowCheck {
    const input = Object.fromEntries(Object.entries(this.toInput(system)).filter(([, value]) => value !== undefined));
    const result = equipmentOptionSchema.safeParse(input);
    if (result.success) return { ok: true, option: result.data };
    return {
      ok: false,
      issues: result.error.issues.map((issue) => {
        const field = typeof issue.path[0] === 'string' ? issue.path[0] : '';
        // The schema speaks of a fraction; the cell takes a percentage.
        return {
          field,
          message:
            field === 'efficiency'
              ? 'Enter the efficiency in %, more than 0 and at most 100 (for example 95)'
              : issue.message,
        };
      }),
    };
  }

  /** Shows a message on a cell; false when the row has no such cell. */
  markError(field: string, message: string): boolean {
    const control = this.form.get(field);
    if (!control || field === '') return false;
    control.setErrors({ ...(control.errors ?? {}), server: message });
    control.markAsTouched();
    return true;
  }

  /** Re-expresses the typed powers in other units (stored values stay exact). */
  changeUnits(from: UnitSystem, to: UnitSystem): void {
    if (from === to) return;
    for (const field of POWER_FIELDS) {
      const watts = this.watts(field, from);
      if (watts === undefined || !Number.isFinite(watts)) continue;
      this.setPower(field, watts, to);
    }
  }
}

/** The installed price for reading, or '' when the text is not an amount yet. */
export function priceHint(text: string, currency: string): string {
  const t = readMoney(text);
  if (!/^\d{1,13}(\.\d{1,2})?$/.test(t)) return '';
  return formatMoney(t, currency);
}
