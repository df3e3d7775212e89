/**
 * The building form: one reactive form holding every input of every mode in SI, the building it
 * describes (checked by the shared schema), and the mapping of schema and server paths to fields.
 */
import { type AbstractControl, FormArray, FormControl, FormGroup, type NonNullableFormBuilder } from '@angular/forms';
import {
  BUILDING_DEFAULTS,
  buildingSchema,
  type AirLeakage,
  type Building,
  type BuildingInput,
  type DesignWindSource,
  type LblStoreys,
  type ShieldingClass,
  type ThermalMassClass,
} from '@shared/building/building-schemas';
import { N_FACTOR_RULE_OF_THUMB } from '@shared/building/heat-loss';
import { unit } from './building-units';

export type ConductionMode = 'ua' | 'envelope';
export type AirLeakageMode = AirLeakage['mode'];
export type ThermalMassMode = 'hours' | 'class';
/** Whether an envelope element is given by its U-value or its R-value. */
export type ComponentValueKind = 'u' | 'r';

type Num = FormControl<number | null>;

export type EnvelopeRow = FormGroup<{
  label: FormControl<string>;
  areaM2: Num;
  kind: FormControl<ComponentValueKind>;
  value: Num;
}>;

/** The unit of each number field (constants, so a field's unit keeps its identity between renders). */
export const FIELD_UNITS = {
  indoorDesignC: unit.quantity('temperature'),
  outdoorC: unit.quantity('temperature'),
  uaWPerK: unit.quantity('conductance'),
  areaM2: unit.quantity('area'),
  uValue: unit.quantity('uValue'),
  rValue: unit.quantity('rValue'),
  ach: unit.fixed('ACH'),
  ach50: unit.fixed('ACH50'),
  nFactor: unit.fixed(''),
  volumeM3: unit.quantity('volume'),
  elaCm2: unit.quantity('leakageArea'),
  customMs: unit.quantity('speed'),
  flowLps: unit.quantity('airflow'),
  heatRecoveryEffectiveness: unit.percentOfFraction,
  percent: unit.fixed('%'),
  internalGainsW: unit.quantity('power'),
  timeConstantH: unit.fixed('h'),
  floorAreaM2: unit.quantity('area'),
} as const;

export function buildingForm(fb: NonNullableFormBuilder) {
  const num = (value: number | null = null): Num => fb.control<number | null>(value);
  return fb.group({
    indoorDesignC: num(BUILDING_DEFAULTS.indoorDesignC),
    conduction: fb.group({
      mode: fb.control<ConductionMode>('ua'),
      uaWPerK: num(),
      components: fb.array<EnvelopeRow>([]),
    }),
    airLeakage: fb.group({
      mode: fb.control<AirLeakageMode>('ach50'),
      ach: num(),
      ach50: num(),
      volumeM3: num(),
      nFactor: num(N_FACTOR_RULE_OF_THUMB),
      elaCm2: num(),
      storeys: fb.control<LblStoreys>(2),
      shieldingClass: fb.control<ShieldingClass>(3),
    }),
    designWind: fb.group({
      source: fb.control<DesignWindSource>(BUILDING_DEFAULTS.designWind.source),
      customMs: num(),
    }),
    ventilation: fb.group({
      flowLps: num(BUILDING_DEFAULTS.ventilation.flowLps),
      heatRecoveryEffectiveness: num(BUILDING_DEFAULTS.ventilation.heatRecoveryEffectiveness),
    }),
    ductLossPct: num(BUILDING_DEFAULTS.ductLossPct),
    safetyFactorPct: num(BUILDING_DEFAULTS.safetyFactorPct),
    internalGainsW: num(BUILDING_DEFAULTS.internalGainsW),
    creditGainsAtDesign: fb.control<boolean>(BUILDING_DEFAULTS.creditGainsAtDesign),
    thermalMass: fb.group({
      mode: fb.control<ThermalMassMode>('class'),
      timeConstantH: num(),
      class: fb.control<ThermalMassClass>('medium'),
      floorAreaM2: num(),
    }),
  });
}

export type BuildingForm = ReturnType<typeof buildingForm>;
export type BuildingFormValue = ReturnType<BuildingForm['getRawValue']>;

export function envelopeRow(
  fb: NonNullableFormBuilder,
  row: { label?: string; areaM2?: number | null; kind?: ComponentValueKind; value?: number | null } = {},
): EnvelopeRow {
  return fb.group({
    label: fb.control(row.label ?? ''),
    areaM2: fb.control<number | null>(row.areaM2 ?? null),
    kind: fb.control<ComponentValueKind>(row.kind ?? 'u'),
    value: fb.control<number | null>(row.value ?? null),
  });
}

/**
 * What the form describes, as the API takes it. Empty number fields are sent as null, so the
 * schema names them ("Enter the … as a number") instead of filling in a default.
 */
export function buildingInputOf(v: BuildingFormValue): unknown {
  const c = v.conduction;
  const a = v.airLeakage;
  const t = v.thermalMass;
  const w = v.designWind;
  const conduction =
    c.mode === 'ua'
      ? { mode: 'ua', uaWPerK: c.uaWPerK }
      : {
          mode: 'envelope',
          components: c.components.map((row) => ({
            label: row.label,
            areaM2: row.areaM2,
            ...(row.kind === 'u' ? { uValue: row.value } : { rValue: row.value }),
          })),
        };
  const airLeakage =
    a.mode === 'ach'
      ? { mode: 'ach', ach: a.ach, volumeM3: a.volumeM3 }
      : a.mode === 'ach50'
        ? { mode: 'ach50', ach50: a.ach50, volumeM3: a.volumeM3, nFactor: a.nFactor }
        : { mode: 'ela', elaCm2: a.elaCm2, storeys: a.storeys, shieldingClass: a.shieldingClass };
  const designWind =
    w.source === 'custom' || w.customMs !== null ? { source: w.source, customMs: w.customMs } : { source: w.source };
  const thermalMass =
    t.mode === 'hours'
      ? { mode: 'hours', timeConstantH: t.timeConstantH }
      : { mode: 'class', class: t.class, floorAreaM2: t.floorAreaM2 };
  return {
    indoorDesignC: v.indoorDesignC,
    conduction,
    airLeakage,
    designWind,
    ventilation: {
      flowLps: v.ventilation.flowLps,
      heatRecoveryEffectiveness: v.ventilation.heatRecoveryEffectiveness,
    },
    ductLossPct: v.ductLossPct,
    safetyFactorPct: v.safetyFactorPct,
    internalGainsW: v.internalGainsW,
    creditGainsAtDesign: v.creditGainsAtDesign,
    thermalMass,
  };
}

/** The form's values of a saved building (the other modes' fields keep their current values). */
export function fillBuildingForm(form: BuildingForm, fb: NonNullableFormBuilder, b: BuildingInput | Building): void {
  const current = form.getRawValue();
  const rows =
    b.conduction.mode === 'envelope'
      ? b.conduction.components.map((c) =>
          envelopeRow(fb, {
            label: c.label,
            areaM2: c.areaM2,
            kind: c.uValue === undefined ? 'r' : 'u',
            value: c.uValue ?? c.rValue ?? null,
          }),
        )
      : [];
  setRows(form, rows);
  const a = b.airLeakage;
  const t = b.thermalMass;
  form.reset({
    indoorDesignC: b.indoorDesignC ?? BUILDING_DEFAULTS.indoorDesignC,
    conduction: {
      mode: b.conduction.mode,
      uaWPerK: b.conduction.mode === 'ua' ? b.conduction.uaWPerK : null,
      components: form.controls.conduction.controls.components.getRawValue(),
    },
    airLeakage: {
      ...current.airLeakage,
      mode: a.mode,
      ...(a.mode === 'ach' ? { ach: a.ach, volumeM3: a.volumeM3 } : {}),
      ...(a.mode === 'ach50' ? { ach50: a.ach50, volumeM3: a.volumeM3, nFactor: a.nFactor } : {}),
      ...(a.mode === 'ela' ? { elaCm2: a.elaCm2, storeys: a.storeys, shieldingClass: a.shieldingClass } : {}),
    },
    designWind: {
      source: b.designWind?.source ?? BUILDING_DEFAULTS.designWind.source,
      customMs: b.designWind?.customMs ?? null,
    },
    ventilation: {
      flowLps: b.ventilation?.flowLps ?? BUILDING_DEFAULTS.ventilation.flowLps,
      heatRecoveryEffectiveness:
        b.ventilation?.heatRecoveryEffectiveness ?? BUILDING_DEFAULTS.ventilation.heatRecoveryEffectiveness,
    },
    ductLossPct: b.ductLossPct ?? BUILDING_DEFAULTS.ductLossPct,
    safetyFactorPct: b.safetyFactorPct ?? BUILDING_DEFAULTS.safetyFactorPct,
    internalGainsW: b.internalGainsW ?? BUILDING_DEFAULTS.internalGainsW,
    creditGainsAtDesign: b.creditGainsAtDesign ?? BUILDING_DEFAULTS.creditGainsAtDesign,
    thermalMass: {
      ...current.thermalMass,
      mode: t.mode,
      ...(t.mode === 'hours' ? { timeConstantH: t.timeConstantH } : { class: t.class, floorAreaM2: t.floorAreaM2 }),
    },
  });
}

/** Puts back form values kept aside (all modes' fields, as typed). */
export function restoreBuildingForm(form: BuildingForm, fb: NonNullableFormBuilder, value: BuildingFormValue): void {
  setRows(
    form,
    value.conduction.components.map((row) => envelopeRow(fb, row)),
  );
  form.setValue(value);
  form.markAsDirty();
}

/** A new building's form values. */
export function resetBuildingForm(form: BuildingForm, fresh: BuildingForm): void {
  setRows(form, []);
  form.reset(fresh.getRawValue());
}

function setRows(form: BuildingForm, rows: EnvelopeRow[]): void {
  const array = form.controls.conduction.controls.components;
  array.clear({ emitEvent: false });
  for (const row of rows) array.push(row, { emitEvent: false });
}

// ---------------------------------------------------------------------------------------------
// Paths and messages

/** Where a schema or server path (`building.` prefix optional) sits in the form. */
export function formPathOf(path: string): string {
  const p = path.startsWith('building.') ? path.slice('building.'.length) : path;
  return p.replace(/^(conduction\.components\.\d+)\.(uValue|rValue)$/, '$1.value');
}

/** Messages whose wording assumes the stored unit, reworded for the field as shown. */
function messageFor(formPath: string, message: string): string {
  if (formPath === 'ventilation.heatRecoveryEffectiveness') {
    if (message.includes('at most')) return 'The heat-recovery effectiveness must be at most 95 %';
    if (message.includes('as a number')) return 'Enter the heat-recovery effectiveness as a number (%)';
  }
  return message;
}

export type BuildingCheck =
  | { ok: true; building: Building; issues: Map<string, string> }
  | { ok: false; building: null; issues: Map<string, string> };

/** The form's values checked by the shared building schema: the building, or the messages by form path. */
export function checkBuilding(value: BuildingFormValue): BuildingCheck {
  const result = buildingSchema.safeParse(buildingInputOf(value));
  if (result.success) return { ok: true, building: result.data, issues: new Map() };
  const issues = new Map<string, string>();
  for (const issue of result.error.issues) {
    const path = formPathOf(issue.path.map(String).join('.'));
    if (!issues.has(path)) issues.set(path, messageFor(path, issue.message));
  }
  return { ok: false, building: null, issues };
}

/** Every leaf control of the form with its dotted path. */
export function leafControls(control: AbstractControl, prefix = ''): [string, AbstractControl][] {
  if (control instanceof FormGroup || control instanceof FormArray) {
    const entries: [string, AbstractControl][] = [];
    const children: [string, AbstractControl][] =
      control instanceof FormArray
        ? control.controls.map((c, i) => [String(i), c])
        : Object.entries(control.controls as Record<string, AbstractControl>);
    for (const [key, child] of children) entries.push(...leafControls(child, prefix ? `${prefix}.${key}` : key));
    return entries;
  }
  return [[prefix, control]];
}

/** Server messages for fields, each kept until that field's value changes. */
export interface ServerIssue {
  message: string;
  value: unknown;
}

/**
 * Puts the schema's messages (`schema`) and the server's (`server`) on the fields they name and
 * clears the others. Returns the messages that name no field.
 */
export function showIssues(
  form: BuildingForm,
  schemaIssues: Map<string, string>,
  serverIssues: Map<string, ServerIssue>,
): string[] {
  const placed = new Set<string>();
  for (const [path, control] of leafControls(form)) {
    const errors: Record<string, string> = {};
    const schema = schemaIssues.get(path);
    if (schema) errors['schema'] = schema;
    const server = serverIssues.get(path);
    if (server && server.value === control.value) errors['server'] = server.message;
    else if (server) serverIssues.delete(path);
    const next = Object.keys(errors).length > 0 ? errors : null;
    if (JSON.stringify(next) !== JSON.stringify(control.errors)) control.setErrors(next);
    if (schema) placed.add(path);
    if (server) placed.add(path);
  }
  const unplaced: string[] = [];
  for (const [path, message] of schemaIssues) if (!placed.has(path)) unplaced.push(message);
  return unplaced;
}

/** The message under a field: the server's first, then the schema's. */
export function buildingFieldError(control: AbstractControl): string {
  const errors = control.errors;
  if (!errors) return '';
  const server: unknown = errors['server'];
  if (typeof server === 'string') return server;
  const schema: unknown = errors['schema'];
  if (typeof schema === 'string') return schema;
  return 'This value is not valid';
}
