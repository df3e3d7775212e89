/**
 * An equipment option the user could install: a furnace, a boiler, a heat pump or electric
 * resistance heat, with its rated output, efficiency or heat-pump ratings, installed price and
 * expected life. SI: W, °C; efficiency and COP are fractions; prices are decimal strings.
 */
import { z } from 'zod';
import { moneyStringSchema } from '../money/money';
import { rowVersionSchema } from '../api/safe-text';
import { energyPricesSchema } from '../money/energy-prices';

export const equipmentKinds = ['furnace', 'boiler', 'heat-pump', 'electric'] as const;
export type EquipmentKind = (typeof equipmentKinds)[number];
export const fuels = ['gas', 'oil', 'electricity', 'propane'] as const;
export type Fuel = z.infer<typeof fuelSchema>;
export const fuelSchema = z.enum(fuels, { error: 'The fuel must be gas, oil, electricity or propane' });
export const combustionFuels = ['gas', 'oil', 'propane'] as const;

const MAX_POWER_W = 10_000_000;

const power = (label: string) =>
  z
    .number({ error: `Enter the ${label} as a number (W)` })
    .positive(`The ${label} must be greater than 0 W`)
    .max(MAX_POWER_W, `The ${label} must be at most ${MAX_POWER_W} W`);

const cop = (label: string) =>
  z
    .number({ error: `Enter the ${label} as a number` })
    .min(1, `The ${label} must be at least 1 (below 1 a heat pump would give less heat than resistance heat)`)
    .max(10, `The ${label} must be at most 10`);

/** Highest cycling degradation coefficient C_d accepted (docs/methods.md#cycling). */
export const MAX_CYCLING_DEGRADATION = 0.5;

const common = {
  label: z
    .string({ error: 'Name the equipment option' })
    .trim()
    .min(1, 'Name the equipment option')
    .max(160, 'Use at most 160 characters for the name'),
  /** Installed price, in the organisation's currency, e.g. "8450.00". */
  installedPrice: moneyStringSchema,
  /** Expected life, years. */
  lifeYears: z
    .int({ error: 'Enter the expected life as a whole number of years' })
    .min(1, 'The expected life must be at least 1 year')
    .max(100, 'The expected life must be at most 100 years'),
  /**
   * Cycling degradation coefficient C_d of PLF = 1 − C_d·(1 − PLR), 0–0.5 (docs/methods.md#cycling).
   * Left out: 0.25 for a heat pump, 0 for fuel-fired and resistance heat.
   */
  cyclingDegradation: z
    .number({ error: 'Enter the cycling degradation coefficient as a number such as 0.25' })
    .min(0, 'The cycling degradation coefficient cannot be negative')
    .max(MAX_CYCLING_DEGRADATION, `The cycling degradation coefficient must be at most ${MAX_CYCLING_DEGRADATION}`)
    .optional(),
  /**
   * Variable-capacity units: the lowest output as a fraction of full output (0.1–1). Below it the
   * unit cycles at its minimum output; above it, it modulates with no cycling loss. Left out: the
   * unit is single-stage (docs/methods.md#cycling).
   */
  minOutputFraction: z
    .number({ error: 'Enter the minimum output as a fraction such as 0.3' })
    .min(0.1, 'The minimum output must be at least 0.1 of full output')
    .max(1, 'The minimum output must be at most 1 (full output)')
    .optional(),
};

/** Output rating: either the output, or the input (output = input × efficiency). */
const rated = {
  /** Rated heating output, W. */
  outputW: power('output').optional(),
  /** Rated input, W (output = input × efficiency, docs/methods.md#combustion-output). */
  inputW: power('input').optional(),
};

const combustionFields = {
  fuel: z.enum(combustionFuels, { error: 'A furnace or boiler burns gas, oil or propane' }),
  /** AFUE or steady-state efficiency, 0–1. */
  efficiency: z
    .number({ error: 'Enter the efficiency as a fraction such as 0.95' })
    .positive('The efficiency must be greater than 0')
    .max(1, 'The efficiency must be at most 1 (enter 95 % as 0.95)'),
  ...rated,
};

export const furnaceSchema = z.strictObject({ kind: z.literal('furnace'), ...common, ...combustionFields });
export const boilerSchema = z.strictObject({ kind: z.literal('boiler'), ...common, ...combustionFields });

export const electricSchema = z.strictObject({
  kind: z.literal('electric'),
  ...common,
  fuel: z.literal('electricity', { error: 'Electric resistance heat uses electricity' }).default('electricity'),
  /** Resistance heat turns all its input into heat. */
  efficiency: z.literal(1, { error: 'The efficiency of electric resistance heat is 1' }).default(1),
  ...rated,
});

export const heatPumpSchema = z.strictObject({
  kind: z.literal('heat-pump'),
  ...common,
  fuel: z.literal('electricity', { error: 'A heat pump uses electricity' }).default('electricity'),
  /** Heating capacity and COP at 8.3 °C (47 °F, rating point H1). */
  capacity8_3W: power('capacity at 8.3 °C'),
  cop8_3: cop('COP at 8.3 °C'),
  /** Heating capacity and COP at −8.3 °C (17 °F, rating point H3). */
  capacityM8_3W: power('capacity at −8.3 °C'),
  copM8_3: cop('COP at −8.3 °C'),
  /** Optional: heating capacity and COP at −15 °C (5 °F, rating point H4). */
  capacityM15W: power('capacity at −15 °C').optional(),
  copM15: cop('COP at −15 °C').optional(),
  /** Electric backup heat, W (COP 1). */
  backupW: z
    .number({ error: 'Enter the backup heat as a number (W)' })
    .min(0, 'The backup heat cannot be negative')
    .max(MAX_POWER_W, `The backup heat must be at most ${MAX_POWER_W} W`)
    .default(0),
  /** Beyond the coldest rating point: false holds capacity and COP flat, true extends the last segment. */
  extrapolate: z.boolean({ error: 'Extrapolate is true or false' }).default(false),
  /**
   * Use the frost/defrost band of the DOE/AHRI method between −8.3 °C and 7.2 °C (45 °F), with the
   * default 1.7 °C (35 °F) point derived from the two ratings (docs/methods.md#heat-pump-capacity [M]).
   */
  defrostBand: z.boolean({ error: 'Defrost band is true or false' }).default(false),
  /** Low-ambient cut-out, °C: below it the compressor gives nothing (docs/methods.md#heat-pump-capacity [M]). */
  cutoutC: z
    .number({ error: 'Enter the cut-out temperature as a number (°C)' })
    .min(-60, 'The cut-out temperature must be at least −60 °C')
    .max(20, 'The cut-out temperature must be at most 20 °C')
    .optional(),
});

export const equipmentOptionSchema = z
  .discriminatedUnion('kind', [furnaceSchema, boilerSchema, heatPumpSchema, electricSchema], {
    error: 'The kind must be furnace, boiler, heat-pump or electric',
  })
  .check((ctx) => {
    const o = ctx.value;
    if (o.kind === 'heat-pump') {
      if ((o.capacityM15W === undefined) !== (o.copM15 === undefined)) {
        ctx.issues.push({
          code: 'custom',
          input: o,
          path: [o.capacityM15W === undefined ? 'capacityM15W' : 'copM15'],
          message: 'Enter both the capacity and the COP at −15 °C, or neither',
        });
      }
    } else if ((o.outputW === undefined) === (o.inputW === undefined)) {
      ctx.issues.push({
        code: 'custom',
        input: o,
        path: [o.outputW === undefined ? 'outputW' : 'inputW'],
        message:
          o.outputW === undefined
            ? 'Enter the rated output or the rated input'
            : 'Enter either the rated output or the rated input, not both',
      });
    }
  });
export type EquipmentOption = z.infer<typeof equipmentOptionSchema>;
export type EquipmentOptionInput = z.input<typeof equipmentOptionSchema>;
export type HeatPumpOption = Extract<EquipmentOption, { kind: 'heat-pump' }>;
export type FuelledOption = Exclude<EquipmentOption, { kind: 'heat-pump' }>;

export const EQUIPMENT_LIST_NAME_MAX = 160;
export const EQUIPMENT_OPTIONS_MAX = 200;
/** Largest CSV accepted for an import preview, characters. */
export const EQUIPMENT_CSV_MAX_CHARS = 500_000;

const listName = z
  .string({ error: 'Name the equipment list' })
  .trim()
  .min(1, 'Name the equipment list')
  .max(EQUIPMENT_LIST_NAME_MAX, `Use at most ${EQUIPMENT_LIST_NAME_MAX} characters`);
const version = rowVersionSchema('The version being changed is required');

/** POST /api/v1/equipment-lists */
export const equipmentListInputSchema = z.strictObject({ name: listName });

/** PATCH /api/v1/equipment-lists/:listId (rename) */
export const equipmentListPatchSchema = z.strictObject({ version, name: listName });

/**
 * PUT /api/v1/equipment-lists/:listId/options: the whole list of options, as edited inline.
 * Replaces the options in one transaction; 409 `stale_update` when the list changed since `version`.
 */
export const equipmentOptionsPutSchema = z.strictObject({
  version,
  options: z
    .array(equipmentOptionSchema)
    .max(EQUIPMENT_OPTIONS_MAX, `A list holds at most ${EQUIPMENT_OPTIONS_MAX} options`),
});

/** POST /api/v1/equipment-lists/:listId/csv-preview: parse a CSV without storing anything. */
export const equipmentCsvPreviewSchema = z.strictObject({
  csv: z
    .string({ error: 'Paste or choose a CSV file' })
    .min(1, 'The file is empty')
    .max(EQUIPMENT_CSV_MAX_CHARS, 'The file is too large'),
});

/** One row of GET /api/v1/equipment-lists */
export const equipmentListSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  optionCount: z.int(),
  version: z.int(),
  updatedAt: z.string(),
});
export type EquipmentListSummary = z.infer<typeof equipmentListSummarySchema>;

/** GET /api/v1/equipment-lists/:listId (options in their saved order) */
export const equipmentListSchema = equipmentListSummarySchema.extend({
  options: z.array(equipmentOptionSchema),
});
export type EquipmentList = z.infer<typeof equipmentListSchema>;

/** 200 answer of a CSV preview (a refused file answers 400 `invalid_file` with line details). */
export const equipmentCsvPreviewResultSchema = z.object({ options: z.array(equipmentOptionSchema) });

/** GET / PUT /api/v1/energy-prices (PUT body: { version, prices }; version 0 when none saved yet) */
export const energyPricesPutSchema = z.strictObject({
  version: rowVersionSchema('The version of the prices being changed is required', 0),
  prices: energyPricesSchema,
});
export const energyPricesAnswerSchema = z.object({ version: z.int(), prices: energyPricesSchema.nullable() });
export type EnergyPricesAnswer = z.infer<typeof energyPricesAnswerSchema>;
