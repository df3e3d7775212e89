/**
 * Scenarios of a project (a climate site, an equipment list or part of it, sizing rules, prices and
 * economics) and the API answers of their sweeps. A frozen scenario is an immutable dated copy for a
 * bid: its inputs and results no longer change.
 */
import { z } from 'zod';
import { rowVersionSchema } from '../api/safe-text';
import { energyPricesSchema } from '../money/energy-prices';
import {
  DEFAULT_HEAT_PUMP_SIZING,
  DEFAULT_STUDY_PERIOD_YEARS,
  equipmentFamilies,
  heatPumpSizings,
  rowKindOfLabel,
  rowKinds,
} from '../sweep/sweep';
import { DEFAULT_DRAWS, DEFAULT_SEED, DEFAULT_TOLERANCES, MAX_DRAWS } from '../sweep/tolerances';

export const SCENARIO_NAME_MAX = 160;
export const EXTRA_DESIGN_TEMPERATURES_MAX = 10;
export const COMPARE_MIN = 2;
export const COMPARE_MAX = 5;
export const DEFAULT_DISCOUNT_RATE_PCT = 3;

const scenarioName = z
  .string({ error: 'Enter a scenario name' })
  .trim()
  .min(1, 'Enter a scenario name')
  .max(SCENARIO_NAME_MAX, `Use at most ${SCENARIO_NAME_MAX} characters`);

const tolerance = (label: string, max: number) =>
  z
    .number({ error: `Enter the ${label} tolerance as a number (%)` })
    .min(0, `The ${label} tolerance cannot be negative`)
    .max(max, `The ${label} tolerance must be at most ${max} %`);

/** How far the estimated inputs may be off, ± % (docs/methods.md#uncertainty-band). */
export const tolerancesSchema = z.strictObject({
  uaPct: tolerance('UA', 90),
  airLeakagePct: tolerance('air leakage', 90),
  pricesPct: tolerance('energy price', 90),
});

/** The Monte Carlo's size and seed: the same seed gives the same band. */
export const uncertaintySettingsSchema = z.strictObject({
  /** Draws; 0 leaves the band out. */
  draws: z
    .int({ error: 'Enter the number of draws as a whole number' })
    .min(0, 'The number of draws cannot be negative')
    .max(MAX_DRAWS, `Use at most ${MAX_DRAWS} draws`),
  seed: z
    .int({ error: 'Enter the seed as a whole number' })
    .min(0, 'The seed cannot be negative')
    .max(4_294_967_295, 'The seed must be at most 4294967295'),
});

/** The designer's rule for the suggested design point (docs/methods.md#stated-rule); null: no rule stated. */
export const designRuleSchema = z.strictObject({
  maxUnmetHoursWorstYear: z
    .number({ error: 'Enter the most unmet hours in the worst year as a number' })
    .min(0, 'The unmet hours cannot be negative')
    .max(8784, 'A year has at most 8784 hours')
    .nullable(),
  maxLifetimeOddsPct: z
    .number({ error: 'Enter the highest lifetime odds as a number (%)' })
    .min(0, 'The odds cannot be negative')
    .max(100, 'The odds must be at most 100 %')
    .nullable(),
});

export const scenarioSettingsSchema = z.strictObject({
  /** Design temperatures to add to the named ones, °C. */
  extraDesignC: z
    .array(
      z
        .number({ error: 'Enter a temperature as a number (°C)' })
        .min(-60, 'A design temperature must be at least −60 °C')
        .max(20, 'A design temperature must be at most 20 °C'),
    )
    .max(EXTRA_DESIGN_TEMPERATURES_MAX, `Add at most ${EXTRA_DESIGN_TEMPERATURES_MAX} design temperatures`)
    .default([]),
  /** Real discount rate for the life-cycle cost, % per year (NIST Handbook 135). */
  discountRatePct: z
    .number({ error: 'Enter the discount rate as a number (%)' })
    .min(0, 'The discount rate cannot be negative')
    .max(30, 'The discount rate must be at most 30 %')
    .default(DEFAULT_DISCOUNT_RATE_PCT),
  /** Length of the one study period every option is costed over, years (docs/methods.md#life-cycle-cost). */
  studyPeriodYears: z
    .int({ error: 'Enter the study period as a whole number of years' })
    .min(1, 'The study period must be at least 1 year')
    .max(100, 'The study period must be at most 100 years')
    .default(DEFAULT_STUDY_PERIOD_YEARS),
  /** Real escalation of energy prices, % a year (0: prices keep pace with inflation). */
  energyEscalationPctPerYear: z
    .number({ error: 'Enter the energy price escalation as a number (% a year)' })
    .min(-10, 'The energy price escalation must be at least −10 % a year')
    .max(20, 'The energy price escalation must be at most 20 % a year')
    .default(0),
  /** How heat pumps are counted against the design load (docs/methods.md#heat-pump-sizing). */
  heatPumpSizing: z
    .enum(heatPumpSizings, { error: 'Size heat pumps on the compressor alone or with the backup heat' })
    .default(DEFAULT_HEAT_PUMP_SIZING),
  /**
   * The equipment family the scenario considers (the New scenario dialog asks); null considers every
   * family in the list, and then the lowest life-cycle cost decides (docs/methods.md#selection).
   */
  equipmentFamily: z
    .enum(equipmentFamilies, { error: 'Choose fuel-fired, heat pump or electric resistance' })
    .nullable()
    .default(null),
  /** Sizing margin over the design load, %; null uses the building's own safety factor. */
  safetyFactorPct: z
    .number({ error: 'Enter the sizing margin as a number (%)' })
    .min(0, 'The sizing margin cannot be negative')
    .max(100, 'The sizing margin must be at most 100 %')
    .nullable()
    .default(null),
  /** Energy prices for this scenario; null uses the organisation's prices. */
  prices: energyPricesSchema.nullable().default(null),
  /** The options of the list to consider, by label; null considers the whole list. */
  optionLabels: z
    .array(z.string().trim().min(1).max(160))
    .min(1, 'Choose at least one option, or consider the whole list')
    .max(200)
    .nullable()
    .default(null),
  /** Climate basis: the latest N qualifying years of the site's record (N ≥ 8); null uses the whole record. */
  climateBasisYears: z
    .int({ error: 'Enter the number of recent years as a whole number' })
    .min(8, 'Use at least 8 recent years, or the whole record')
    .max(200, 'Use at most 200 years')
    .nullable()
    .default(null),
  /** Tolerances of the estimated inputs for the uncertainty band. */
  tolerances: tolerancesSchema.default({ ...DEFAULT_TOLERANCES }),
  uncertainty: uncertaintySettingsSchema.default({ draws: DEFAULT_DRAWS, seed: DEFAULT_SEED }),
  rule: designRuleSchema.nullable().default(null),
});
export type ScenarioSettings = z.infer<typeof scenarioSettingsSchema>;
export type ScenarioSettingsInput = z.input<typeof scenarioSettingsSchema>;

/** POST /api/v1/projects/:projectId/scenarios (the project's site and list when none is given) */
export const scenarioInputSchema = z.strictObject({
  name: scenarioName,
  climateSiteId: z.uuid('Choose a climate site from the list').nullable().optional(),
  equipmentListId: z.uuid('Choose an equipment list from the list').nullable().optional(),
  settings: scenarioSettingsSchema.optional(),
});
export type ScenarioInput = z.input<typeof scenarioInputSchema>;

/** The design point chosen on the trade-off screen, °C (null: none chosen yet). */
export const chosenDesignCSchema = z
  .number({ error: 'Enter the chosen design temperature as a number (°C)' })
  .min(-70, 'A design temperature must be at least −70 °C')
  .max(20, 'A design temperature must be at most 20 °C')
  .nullable();

/** PATCH /api/v1/projects/:projectId/scenarios/:scenarioId (409 `stale_update`; 409 `frozen` for inputs or the chosen point of a frozen one) */
export const scenarioPatchSchema = z.strictObject({
  version: rowVersionSchema('The version of the scenario being changed is required'),
  name: scenarioName.optional(),
  chosenDesignC: chosenDesignCSchema.optional(),
  climateSiteId: z.uuid('Choose a climate site from the list').nullable().optional(),
  equipmentListId: z.uuid('Choose an equipment list from the list').nullable().optional(),
  settings: scenarioSettingsSchema.optional(),
});
export type ScenarioPatch = z.input<typeof scenarioPatchSchema>;

/** POST …/scenarios/:scenarioId/duplicate and …/freeze */
export const scenarioCopySchema = z.strictObject({ name: scenarioName.optional() });

export const scenarioSchema = z.object({
  id: z.uuid(),
  projectId: z.uuid(),
  name: z.string(),
  climateSiteId: z.uuid().nullable(),
  climateSiteName: z.string().nullable(),
  equipmentListId: z.uuid().nullable(),
  equipmentListName: z.string().nullable(),
  settings: scenarioSettingsSchema,
  /** When it was frozen for a bid (null: editable). */
  frozenAt: z.string().nullable(),
  /** The scenario a frozen copy was taken from (null when that one was deleted, or not frozen). */
  frozenFromId: z.uuid().nullable(),
  /** The design point chosen on the trade-off screen, °C (a frozen copy keeps the one of its bid). */
  chosenDesignC: z.number().nullable(),
  /** What the chosen point installs, when its sweep is at hand (the project's scenario list shows it). */
  chosenPoint: z
    .object({
      designC: z.number(),
      label: z.string(),
      isGrid: z.boolean(),
      unit: z.string().nullable(),
      installedPrice: z.string().nullable(),
      currency: z.string(),
    })
    .nullable(),
  version: z.int(),
  updatedByName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Scenario = z.infer<typeof scenarioSchema>;
export const scenarioListSchema = z.array(scenarioSchema);

const nullableNumber = z.number().nullable();
/** A row kept from before rows carried their kind (stored reports, cached results) gets it from its label. */
function withRowKind(row: unknown): unknown {
  if (typeof row !== 'object' || row === null || 'kind' in row) return row;
  const { label, isGrid } = row as { label?: unknown; isGrid?: unknown };
  return typeof label === 'string' ? { ...row, kind: rowKindOfLabel(label, isGrid === true) } : row;
}

const sweepRowFieldsSchema = z.object({
  /** What the row stands for (`RowKind`); find rows by it, never by `label`. */
  kind: z.enum(rowKinds),
  /** Display only. */
  label: z.string(),
  designC: z.number(),
  designLoadW: z.number(),
  selectedOptionId: z.string().nullable(),
  selectionReason: z.string().nullable(),
  capacityAtDesignW: nullableNumber,
  /** Heat pumps: the compressor's capacity at the design temperature, W. */
  compressorAtDesignW: nullableNumber.default(null),
  installedPrice: z.string().nullable(),
  /** With cycling losses. */
  annualEnergyKWh: nullableNumber,
  annualCost: z.string().nullable(),
  /** Equivalent full-load hours (of the compressor for a heat pump). */
  runHoursPerYear: nullableNumber,
  backupHoursPerYear: nullableNumber.default(null),
  backupEnergyKWh: nullableNumber.default(null),
  unmetHoursPerYear: nullableNumber,
  unmetHoursWorstYear: nullableNumber,
  unmetEnergyKWhPerYear: nullableNumber,
  unmetDegreeHoursPerYear: nullableNumber,
  lowestIndoorC: nullableNumber.default(null),
  worstDropK: nullableNumber.default(null),
  /** Deprecated (see the README): `worstDropK` under its old name, kept for one release. */
  worstSagC: nullableNumber,
  /** Over the answer's `studyPeriodYears`. */
  lifeCycleCost: z.string().nullable(),
  isGrid: z.boolean(),
  unavailableReason: z.string().nullable(),
  costUnavailableReason: z.string().nullable(),
  reliabilityNote: z.string().nullable().default(null),
  // The odds of a colder night, the price of comfort and the uncertainty band (null where not
  // defined, and in results kept from before they were computed).
  annualExceedanceProbability: nullableNumber.default(null),
  recordExceedanceShare: nullableNumber.default(null),
  lifetimeExceedanceProbability: nullableNumber.default(null),
  lifetimeYears: nullableNumber.default(null),
  costPerAvoidedUnmetHour: nullableNumber.default(null),
  costPerAvoidedWorstYearHour: nullableNumber.default(null),
  unmetHoursPerYearP10: nullableNumber.default(null),
  unmetHoursPerYearP90: nullableNumber.default(null),
  unmetHoursWorstYearP10: nullableNumber.default(null),
  unmetHoursWorstYearP90: nullableNumber.default(null),
  lifeCycleCostP10: z.string().nullable().default(null),
  lifeCycleCostP90: z.string().nullable().default(null),
  selectionChangeShare: nullableNumber.default(null),
});
export const sweepRowSchema = z.preprocess(withRowKind, sweepRowFieldsSchema);
export type SweepRowAnswer = z.infer<typeof sweepRowSchema>;

/** One option as the sweep saw it: the id the rows name, and what to show for it. */
export const sweepOptionSchema = z.object({
  id: z.string(),
  label: z.string(),
  kind: z.string(),
  fuel: z.string(),
  lifeYears: z.int(),
  installedPrice: z.string(),
  /** Capacity of the option (with backup) at each whole degree from +20 °C down to −45 °C, for the load-duration chart. */
  capacityCurve: z.array(z.object({ outdoorC: z.number(), capacityW: z.number() })),
});
export type SweepOptionAnswer = z.infer<typeof sweepOptionSchema>;

/** Hours of the record by hourly load, for the load-duration chart (loads descending). */
export const loadDurationSchema = z.object({
  /** Hours per average qualifying year at or above each load. */
  points: z.array(z.object({ hoursPerYear: z.number(), loadW: z.number(), outdoorC: z.number() })),
});

/** POST/GET …/scenarios/:scenarioId/sweep */
export const sweepAnswerSchema = z.object({
  scenarioId: z.uuid(),
  inputHash: z.string(),
  /** Whether the result came from the result cache (or a frozen copy) rather than a new run. */
  cached: z.boolean(),
  frozen: z.boolean(),
  computedAt: z.string(),
  climateSiteName: z.string(),
  equipmentListName: z.string(),
  currency: z.string(),
  hasRecord: z.boolean(),
  years: z.array(z.int()),
  timeConstantH: z.number(),
  designWindMs: z.number(),
  indoorDesignC: z.number(),
  discountRatePct: z.number(),
  /**
   * The one study period of every life-cycle cost, years (null in results frozen before study
   * periods, where each option was costed over its own life).
   */
  studyPeriodYears: z.int().nullable().default(null),
  energyEscalationPctPerYear: z.number().default(0),
  /** Results frozen before the setting existed counted heat pumps with their backup. */
  heatPumpSizing: z.enum(heatPumpSizings).default('with-backup'),
  selectionRule: z
    .enum(['smallest-capacity', 'lowest-life-cycle-cost', 'lowest-installed-price'])
    .default('smallest-capacity'),
  /** About the record's length and the option list: {code, message}. */
  warnings: z.array(z.object({ code: z.string(), message: z.string() })).default([]),
  options: z.array(sweepOptionSchema),
  rows: z.array(sweepRowSchema),
  loadDuration: loadDurationSchema.nullable(),
  /** Things the user should know (options of the subset no longer in the list, a design wind that fell back…). */
  notes: z.array(z.string()),
  /** Which years of the record the figures use, and whether the record is estimated (absent on answers kept from before). */
  climateBasis: z
    .object({
      /** Plain words, e.g. "Whole record (1995–2024, 30 years)" or "Latest 10 years (2015–2024)". */
      description: z.string(),
      latestYears: z.int().nullable(),
      /** The estimate sentence when the hourly record is estimated from another site's. */
      estimateLabel: z.string().nullable(),
    })
    .optional(),
  /** The yearly minima behind the odds (null: neither a record nor a published mean and SD). */
  odds: z
    .object({
      meanC: z.number(),
      sdK: z.number(),
      source: z.enum(['record', 'published']),
      years: z.int().nullable(),
      shortRecord: z.boolean(),
    })
    .nullable()
    .default(null),
  /** The Monte Carlo behind the band (null: no record, or no draws). */
  uncertainty: z.object({ draws: z.int(), seed: z.int(), tolerances: tolerancesSchema }).nullable().default(null),
});
export type SweepAnswer = z.infer<typeof sweepAnswerSchema>;

/** GET /api/v1/projects/:projectId/scenario-comparison?ids=a,b[,c…] (2–5 scenarios of the project) */
export const compareQuerySchema = z.strictObject({
  ids: z
    .string({ error: `Choose ${COMPARE_MIN} to ${COMPARE_MAX} scenarios to compare` })
    .transform((s) => [
      ...new Set(
        s
          .split(',')
          .map((x) => x.trim())
          .filter((x) => x.length > 0),
      ),
    ])
    .pipe(
      z
        .array(z.uuid('Unknown scenario'))
        .min(COMPARE_MIN, `Choose ${COMPARE_MIN} to ${COMPARE_MAX} scenarios to compare`)
        .max(COMPARE_MAX, `Choose ${COMPARE_MIN} to ${COMPARE_MAX} scenarios to compare`),
    ),
});

export const comparisonSchema = z.object({
  entries: z.array(
    z.object({
      scenario: scenarioSchema,
      sweep: sweepAnswerSchema.nullable(),
      /** Why the scenario has no sweep (incomplete inputs). */
      problem: z.string().nullable(),
      /** The energy prices the sweep used (the scenario's own or the organisation's). */
      prices: energyPricesSchema.nullable(),
    }),
  ),
});
export type Comparison = z.infer<typeof comparisonSchema>;
