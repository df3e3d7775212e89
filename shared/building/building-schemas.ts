/**
 * The inputs that describe a building for the heat-loss engine. All values are SI: °C, K, W, W/K,
 * W/(m²·K), m²·K/W, m², m³, L/s, cm², m/s, hours. Optional fields carry the trade's defaults
 * (`BUILDING_DEFAULTS`), so `buildingSchema.parse({ conduction, airLeakage, thermalMass })` gives a
 * complete building.
 */
import { z } from 'zod';
import { rowVersionSchema } from '../api/safe-text';

/** Defaults for a new building. */
export const BUILDING_DEFAULTS = {
  /** Indoor design temperature, °C: 21 °C is common practice (no source). */
  indoorDesignC: 21,
  designWind: { source: 'default' as const },
  ventilation: { flowLps: 0, heatRecoveryEffectiveness: 0 },
  ductLossPct: 0,
  /** docs/methods.md#duct-loss-and-margins: load procedures intend loads without arbitrary safety factors [M]. */
  safetyFactorPct: 0,
  internalGainsW: 0,
  creditGainsAtDesign: false,
} as const;

/**
 * Default winter design wind speed, m/s (15 mph): a common trade assumption, no source; it is the
 * wind behind the ASHRAE winter outside film value (docs/methods.md#surface-films, #trade-facts).
 */
export const DEFAULT_DESIGN_WIND_MS = 6.7;

/** Highest heat-recovery effectiveness accepted (sensible). */
export const MAX_HEAT_RECOVERY_EFFECTIVENESS = 0.95;

const num = (label: string, unit: string) => z.number({ error: `Enter the ${label} as a number (${unit})` });

const positive = (label: string, unit: string, max: number) =>
  num(label, unit)
    .positive(`The ${label} must be greater than 0 ${unit}`)
    .max(max, `The ${label} must be at most ${max} ${unit}`);

const nonNegative = (label: string, unit: string, max: number) =>
  num(label, unit).min(0, `The ${label} cannot be negative`).max(max, `The ${label} must be at most ${max} ${unit}`);

// ---------------------------------------------------------------------------------------------
// Conduction

/** One envelope element: its area and either its U-value or its R-value (air to air, films included). */
export const envelopeComponentSchema = z
  .strictObject({
    label: z
      .string({ error: 'Name the envelope element' })
      .trim()
      .min(1, 'Name the envelope element')
      .max(120, 'Use at most 120 characters for the element name'),
    areaM2: positive('area', 'm²', 1_000_000),
    uValue: positive('U-value', 'W/(m²·K)', 100).optional(),
    rValue: positive('R-value', 'm²·K/W', 100).optional(),
  })
  .check((ctx) => {
    const { uValue, rValue } = ctx.value;
    if ((uValue === undefined) === (rValue === undefined)) {
      ctx.issues.push({
        code: 'custom',
        input: ctx.value,
        path: uValue === undefined ? ['uValue'] : ['rValue'],
        message:
          uValue === undefined
            ? 'Enter a U-value or an R-value for this element'
            : 'Enter either a U-value or an R-value for this element, not both',
      });
    }
  });
export type EnvelopeComponent = z.infer<typeof envelopeComponentSchema>;

export const conductionSchema = z.discriminatedUnion(
  'mode',
  [
    z.strictObject({
      mode: z.literal('ua'),
      /** Conduction heat-loss coefficient UA, W/K. */
      uaWPerK: positive('conduction UA', 'W/K', 1_000_000),
    }),
    z.strictObject({
      mode: z.literal('envelope'),
      components: z
        .array(envelopeComponentSchema, { error: 'List the envelope elements' })
        .min(1, 'Add at least one envelope element')
        .max(500, 'Use at most 500 envelope elements'),
    }),
  ],
  { error: 'Choose how conduction is entered: a UA value or a list of envelope elements' },
);
export type Conduction = z.infer<typeof conductionSchema>;

// ---------------------------------------------------------------------------------------------
// Air leakage

export const lblStoreys = [1, 2, 3] as const;
export type LblStoreys = (typeof lblStoreys)[number];
export const shieldingClasses = [1, 2, 3, 4, 5] as const;
export type ShieldingClass = (typeof shieldingClasses)[number];

export const airLeakageSchema = z.discriminatedUnion(
  'mode',
  [
    z.strictObject({
      mode: z.literal('ach'),
      /** Natural air changes per hour at design. */
      ach: nonNegative('air change rate', 'ACH', 50),
      /** Heated air volume, m³. */
      volumeM3: positive('heated volume', 'm³', 10_000_000),
    }),
    z.strictObject({
      mode: z.literal('ach50'),
      /** Blower-door air changes per hour at 50 Pa. */
      ach50: nonNegative('ACH50', 'ACH', 100),
      volumeM3: positive('heated volume', 'm³', 10_000_000),
      /** LBL N-factor (see `N_FACTOR_TABLE` in heat-loss.ts). */
      nFactor: num('N-factor', 'dimensionless')
        .min(5, 'The N-factor must be at least 5')
        .max(50, 'The N-factor must be at most 50'),
    }),
    z.strictObject({
      mode: z.literal('ela'),
      /** Effective leakage area at 4 Pa (C_D = 1), cm². */
      elaCm2: nonNegative('effective leakage area', 'cm²', 1_000_000),
      storeys: z.literal(lblStoreys, { error: 'The number of storeys must be 1, 2 or 3' }),
      shieldingClass: z.literal(shieldingClasses, { error: 'The shielding class must be 1, 2, 3, 4 or 5' }),
    }),
  ],
  { error: 'Choose how air leakage is entered: ACH, blower-door ACH50, or effective leakage area' },
);
export type AirLeakage = z.infer<typeof airLeakageSchema>;

// ---------------------------------------------------------------------------------------------
// Design wind

export const designWindSources = ['coincident99_6', 'coldestMonth1', 'default', 'custom'] as const;
export type DesignWindSource = (typeof designWindSources)[number];

export const designWindSchema = z
  .strictObject({
    source: z.enum(designWindSources, {
      error: 'Choose the design wind: coincident with the 99.6 % dry-bulb, coldest-month 1 %, default or custom',
    }),
    customMs: nonNegative('custom design wind speed', 'm/s', 75).optional(),
  })
  .check((ctx) => {
    if (ctx.value.source === 'custom' && ctx.value.customMs === undefined) {
      ctx.issues.push({
        code: 'custom',
        input: ctx.value,
        path: ['customMs'],
        message: 'Enter the custom design wind speed (m/s)',
      });
    }
  });
export type DesignWind = z.infer<typeof designWindSchema>;

// ---------------------------------------------------------------------------------------------
// Ventilation

export const ventilationSchema = z.strictObject({
  /** Mechanical (balanced) ventilation airflow, L/s. */
  flowLps: nonNegative('ventilation airflow', 'L/s', 100_000),
  /** Sensible heat-recovery effectiveness, 0 (none) to 0.95. */
  heatRecoveryEffectiveness: num('heat-recovery effectiveness', '0 to 0.95')
    .min(0, 'The heat-recovery effectiveness cannot be negative')
    .max(
      MAX_HEAT_RECOVERY_EFFECTIVENESS,
      `The heat-recovery effectiveness must be at most ${MAX_HEAT_RECOVERY_EFFECTIVENESS}`,
    ),
});
export type Ventilation = z.infer<typeof ventilationSchema>;

// ---------------------------------------------------------------------------------------------
// Thermal mass

export const thermalMassClasses = ['light', 'medium', 'heavy'] as const;
export type ThermalMassClass = (typeof thermalMassClasses)[number];

export const thermalMassSchema = z.discriminatedUnion(
  'mode',
  [
    z.strictObject({
      mode: z.literal('hours'),
      /** Thermal time constant τ = C/H, hours. */
      timeConstantH: positive('time constant', 'h', 2000),
    }),
    z.strictObject({
      mode: z.literal('class'),
      class: z.enum(thermalMassClasses, { error: 'Choose a thermal-mass class: light, medium or heavy' }),
      /** Conditioned floor area, m²: the class gives a capacitance per m² of floor (docs/methods.md#indoor-temperature). */
      floorAreaM2: positive('floor area', 'm²', 1_000_000),
    }),
  ],
  { error: 'Choose how thermal mass is entered: a time constant in hours or a construction class' },
);
export type ThermalMass = z.infer<typeof thermalMassSchema>;

// ---------------------------------------------------------------------------------------------
// Building

export const buildingSchema = z.strictObject({
  indoorDesignC: num('indoor design temperature', '°C')
    .min(5, 'The indoor design temperature must be at least 5 °C')
    .max(35, 'The indoor design temperature must be at most 35 °C')
    .default(BUILDING_DEFAULTS.indoorDesignC),
  conduction: conductionSchema,
  airLeakage: airLeakageSchema,
  designWind: designWindSchema.default(BUILDING_DEFAULTS.designWind),
  ventilation: ventilationSchema.default(BUILDING_DEFAULTS.ventilation),
  /** Duct loss as a percentage of the other losses (docs/methods.md#duct-loss-and-margins: 10–30 % for ducts outside, ≈ 0 inside [M]). */
  ductLossPct: nonNegative('duct loss', '%', 100).default(BUILDING_DEFAULTS.ductLossPct),
  /** Safety factor applied to the load after gains, %. */
  safetyFactorPct: nonNegative('sizing margin', '%', 100).default(BUILDING_DEFAULTS.safetyFactorPct),
  /** Internal/solar gains credited against the load, W. */
  internalGainsW: nonNegative('internal-gain credit', 'W', 1_000_000).default(BUILDING_DEFAULTS.internalGainsW),
  /**
   * Whether the gains are also credited against the design load (sizing). Off by default: usual
   * practice sizes without gains, which may be absent on the coldest night (docs/methods.md#design-load).
   * The hourly load always credits them.
   */
  creditGainsAtDesign: z
    .boolean({ error: 'Credit gains at design is true or false' })
    .default(BUILDING_DEFAULTS.creditGainsAtDesign),
  thermalMass: thermalMassSchema,
});
export type Building = z.infer<typeof buildingSchema>;
/** What a form or API sends: fields with defaults may be left out. */
export type BuildingInput = z.input<typeof buildingSchema>;

/**
 * GET /api/v1/projects/:projectId/building → { version, building } (building null until saved).
 * PUT the same shape with the project's `version`: 409 `stale_update` when the project changed since.
 */
export const projectBuildingPutSchema = z.strictObject({
  version: rowVersionSchema('The version of the project being changed is required'),
  building: buildingSchema,
});
export const projectBuildingAnswerSchema = z.object({
  version: z.int(),
  building: buildingSchema.nullable(),
});
export type ProjectBuildingAnswer = z.infer<typeof projectBuildingAnswerSchema>;
