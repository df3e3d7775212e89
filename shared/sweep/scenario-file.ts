/**
 * The scenario file the command line's `sweep` reads (SI units), and its translation into the
 * engine's input. Numbers for money are accepted here and turned into decimal strings.
 */
import { z } from 'zod';
import { tolerancesSchema } from '../scenarios/scenario-schemas';
import { buildingSchema, type Building } from '../building/building-schemas';
import { equipmentOptionSchema } from '../equipment/equipment-schemas';
import { energyPricesSchema, type EnergyPrices } from '../money/energy-prices';
import { MAX_CYCLING_DEGRADATION } from '../equipment/equipment-schemas';
import { heatPumpSizings, type SweepOption } from './sweep';

/** Coldest design temperature accepted, °C (docs/methods.md#bad-input). */
export const MIN_DESIGN_C = -60;

const num = (label: string, unit: string) => z.number({ error: `Enter ${label} as a number (${unit})` });
const range = (label: string, unit: string, min: number, max: number) =>
  num(label, unit)
    .min(min, `${cap(label)} must be at least ${min} ${unit}`)
    .max(max, `${cap(label)} must be at most ${max} ${unit}`);
const above0 = (label: string, unit: string, max: number) =>
  num(label, unit)
    .positive(`${cap(label)} must be greater than 0 ${unit}`)
    .max(max, `${cap(label)} must be at most ${max} ${unit}`);
const cap = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

const MAX_W = 10_000_000;
const price = (label: string) => num(label, 'currency').min(0, `${cap(label)} cannot be negative`);
const life = z
  .int({ error: 'Enter the expected life as a whole number of years' })
  .min(1, 'The expected life must be at least 1 year')
  .max(100, 'The expected life must be at most 100 years');
const id = z.string({ error: 'Give every option an id' }).min(1, 'Give every option an id');
const cycling = {
  cyclingDegradation: range('the cycling degradation coefficient', '', 0, MAX_CYCLING_DEGRADATION).optional(),
  minOutputFraction: range('the minimum output fraction', '', 0.1, 1).optional(),
};

const ratingSchema = z.strictObject({
  outdoorC: num('the rating temperature', '°C'),
  capacityW: above0('the capacity', 'W', MAX_W),
  cop: num('the COP', '')
    .min(1, 'The COP must be at least 1 (below 1 a heat pump would give less heat than resistance heat)')
    .max(10, 'The COP must be at most 10'),
});

const equipmentSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      id,
      label: z.string().optional(),
      kind: z.enum(['furnace', 'boiler']),
      outputW: above0('the output', 'W', MAX_W),
      efficiency: num('the efficiency', 'a fraction such as 0.95')
        .positive('The efficiency must be greater than 0')
        .max(1, 'The efficiency must be at most 1 (enter 95 % as 0.95)'),
      installedPrice: price('the installed price'),
      lifeYears: life,
      energy: z.enum(['gas', 'oil', 'propane'], { error: 'A furnace or boiler burns gas, oil or propane' }),
      ...cycling,
    }),
    z.strictObject({
      id,
      label: z.string().optional(),
      kind: z.literal('electric'),
      outputW: above0('the output', 'W', MAX_W),
      installedPrice: price('the installed price'),
      lifeYears: life,
      energy: z.literal('electricity', { error: 'Electric resistance heat uses electricity' }).optional(),
      ...cycling,
    }),
    z.strictObject({
      id,
      label: z.string().optional(),
      kind: z.literal('heat-pump'),
      /** Ratings at 8.3 °C and −8.3 °C, optionally −15 °C (the rating points the engine uses). */
      ratings: z
        .array(ratingSchema, { error: "List the heat pump's ratings" })
        .min(2, 'A heat pump needs ratings at 8.3 °C and −8.3 °C')
        .max(3, 'Give at most three ratings: 8.3 °C, −8.3 °C and −15 °C'),
      backupW: num('the backup heat', 'W')
        .min(0, 'The backup heat cannot be negative')
        .max(MAX_W, `The backup heat must be at most ${MAX_W} W`)
        .optional(),
      extrapolate: z.boolean({ error: 'Extrapolate is true or false' }).optional(),
      installedPrice: price('the installed price'),
      lifeYears: life,
      energy: z.literal('electricity', { error: 'A heat pump uses electricity' }).optional(),
      ...cycling,
    }),
  ],
  { error: 'The kind must be furnace, boiler, electric or heat-pump' },
);

/** The price key each energy needs in `prices`. */
const PRICE_KEY = {
  gas: 'gasPerKWh',
  oil: 'oilPerLitre',
  propane: 'propanePerLitre',
  electricity: 'electricityPerKWh',
} as const;

export const scenarioFileSchema = z
  .strictObject({
    building: z.strictObject({
      indoorC: range('the indoor temperature', '°C', 5, 35),
      uaWPerK: above0('the UA (conduction heat-loss coefficient)', 'W/K', 1_000_000),
      infiltration: z.discriminatedUnion(
        'method',
        [
          z.strictObject({
            method: z.literal('ach'),
            ach: range('the air change rate', 'ACH', 0, 50),
            volumeM3: above0('the volume', 'm³', 10_000_000),
          }),
          z.strictObject({
            method: z.literal('ach50'),
            ach50: range('the ACH50', 'ACH', 0, 100),
            volumeM3: above0('the volume', 'm³', 10_000_000),
            nFactor: range('the N-factor', '', 5, 50),
          }),
          z.strictObject({
            method: z.literal('ela'),
            elaCm2: range('the effective leakage area', 'cm²', 0, 1_000_000),
            storeys: z.union([z.literal(1), z.literal(2), z.literal(3)], {
              error: 'The number of storeys must be 1, 2 or 3',
            }),
            shieldingClass: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4), z.literal(5)], {
              error: 'The shielding class must be 1, 2, 3, 4 or 5',
            }),
          }),
        ],
        { error: 'The infiltration method must be ach, ach50 or ela' },
      ),
      ventilation: z
        .strictObject({
          flowLs: range('the ventilation flow', 'L/s', 0, 100_000),
          recoveryEffectiveness: range('the heat-recovery effectiveness', '', 0, 0.95),
        })
        .optional(),
      ductLossPct: range('the duct loss', '%', 0, 100).optional(),
      safetyFactorPct: range('the safety factor', '%', 0, 100).optional(),
      internalGainsW: range('the internal gains', 'W', 0, 1_000_000).optional(),
      /** Credit the internal gains against the design load too (default false). */
      creditGainsAtDesign: z.boolean({ error: 'creditGainsAtDesign is true or false' }).optional(),
      timeConstantH: above0('the time constant', 'h', 2000),
    }),
    equipment: z
      .array(equipmentSchema, { error: 'List the equipment options' })
      .min(1, 'List at least one equipment option'),
    prices: z.strictObject({
      currency: z.string().length(3, 'The currency is a three-letter code such as USD').optional(),
      electricityPerKWh: price('the electricity price'),
      gasPerKWh: price('the gas price').optional(),
      oilPerLitre: price('the oil price').optional(),
      propanePerLitre: price('the propane price').optional(),
    }),
    economics: z.strictObject({
      discountRatePct: range('the discount rate', '%', 0, 30),
      studyPeriodYears: z
        .int({ error: 'Enter the study period as a whole number of years' })
        .min(1, 'The study period must be at least 1 year')
        .max(100, 'The study period must be at most 100 years')
        .optional(),
      energyEscalationPctPerYear: range('the energy price escalation', '% a year', -10, 20).optional(),
    }),
    /** `compressor` (default) or `with-backup` (docs/methods.md#heat-pump-sizing). */
    heatPumpSizing: z.enum(heatPumpSizings, { error: 'heatPumpSizing is "compressor" or "with-backup"' }).optional(),
    designWindMs: range('the design wind speed', 'm/s', 0, 75).optional(),
    elevationM: range('the elevation', 'm', -500, 9000).optional(),
    extraDesignTemperaturesC: z
      .array(num('a design temperature', '°C'), { error: 'List extra design temperatures as numbers (°C)' })
      .max(10, 'Give at most 10 extra design temperatures')
      .optional(),
    /** Tolerances of the estimates for `--uncertainty`, ± % (defaults: UA 10, air leakage 25, prices 15). */
    tolerances: tolerancesSchema.partial().optional(),
  })
  .check((ctx) => {
    const s = ctx.value;
    const seen = new Set<string>();
    s.equipment.forEach((e, i) => {
      if (seen.has(e.id))
        ctx.issues.push({
          code: 'custom',
          input: e.id,
          path: ['equipment', i, 'id'],
          message: `Another option already has the id "${e.id}"`,
        });
      seen.add(e.id);
      const energy = e.kind === 'furnace' || e.kind === 'boiler' ? e.energy : 'electricity';
      if (s.prices[PRICE_KEY[energy]] === undefined) {
        ctx.issues.push({
          code: 'custom',
          input: e,
          path: ['equipment', i, 'energy'],
          message: `"${e.id}" uses ${energy}, but prices has no ${PRICE_KEY[energy]}`,
        });
      }
      if (e.kind === 'heat-pump') {
        const at = (c: number) => e.ratings.some((r) => Math.abs(r.outdoorC - c) < 0.05);
        if (!at(8.3) || !at(-8.3))
          ctx.issues.push({
            code: 'custom',
            input: e.ratings,
            path: ['equipment', i, 'ratings'],
            message: `"${e.id}" needs ratings at 8.3 °C and −8.3 °C (−15 °C is optional)`,
          });
        else if (e.ratings.length === 3 && !at(-15))
          ctx.issues.push({
            code: 'custom',
            input: e.ratings,
            path: ['equipment', i, 'ratings'],
            message: `"${e.id}": the third rating must be at −15 °C`,
          });
      }
    });
    const warmest = s.building.indoorC - 1;
    (s.extraDesignTemperaturesC ?? []).forEach((t, i) => {
      if (t < MIN_DESIGN_C || t > warmest) {
        ctx.issues.push({
          code: 'custom',
          input: t,
          path: ['extraDesignTemperaturesC', i],
          message: `A design temperature must be between ${MIN_DESIGN_C} °C and ${warmest} °C (1 K below the indoor temperature); ${t} °C is not`,
        });
      }
    });
  });
export type ScenarioFile = z.infer<typeof scenarioFileSchema>;

const money = (n: number): string => n.toFixed(2);
const unitPrice = (n: number): string => n.toFixed(6);

/** Exact rating temperatures: 47 °F, 17 °F and 5 °F in °C (docs/methods.md#heat-pump-capacity). */
const RATING_POINTS = [
  { c: 8.3, key: '8_3' },
  { c: -8.3, key: 'M8_3' },
  { c: -15, key: 'M15' },
] as const;

/** The scenario's building, options and prices in the engine's own (validated) shapes. */
export function scenarioToEngine(s: ScenarioFile): {
  building: Building;
  options: SweepOption[];
  prices: EnergyPrices;
} {
  const b = s.building;
  const inf = b.infiltration;
  const building = buildingSchema.parse({
    indoorDesignC: b.indoorC,
    conduction: { mode: 'ua', uaWPerK: b.uaWPerK },
    airLeakage:
      inf.method === 'ach'
        ? { mode: 'ach', ach: inf.ach, volumeM3: inf.volumeM3 }
        : inf.method === 'ach50'
          ? { mode: 'ach50', ach50: inf.ach50, volumeM3: inf.volumeM3, nFactor: inf.nFactor }
          : { mode: 'ela', elaCm2: inf.elaCm2, storeys: inf.storeys, shieldingClass: inf.shieldingClass },
    ventilation: b.ventilation
      ? { flowLps: b.ventilation.flowLs, heatRecoveryEffectiveness: b.ventilation.recoveryEffectiveness }
      : undefined,
    ductLossPct: b.ductLossPct,
    safetyFactorPct: b.safetyFactorPct,
    internalGainsW: b.internalGainsW,
    creditGainsAtDesign: b.creditGainsAtDesign,
    thermalMass: { mode: 'hours', timeConstantH: b.timeConstantH },
  });
  const options = s.equipment.map((e): SweepOption => {
    const common = {
      label: e.label ?? e.id,
      installedPrice: money(e.installedPrice),
      lifeYears: e.lifeYears,
      ...(e.cyclingDegradation === undefined ? {} : { cyclingDegradation: e.cyclingDegradation }),
      ...(e.minOutputFraction === undefined ? {} : { minOutputFraction: e.minOutputFraction }),
    };
    if (e.kind === 'heat-pump') {
      const at = (c: number) => e.ratings.find((r) => Math.abs(r.outdoorC - c) < 0.05);
      const fields: Record<string, number> = {};
      for (const point of RATING_POINTS) {
        const r = at(point.c);
        if (r) {
          fields[`capacity${point.key}W`] = r.capacityW;
          fields[`cop${point.key}`] = r.cop;
        }
      }
      if (fields['capacity8_3W'] === undefined || fields['capacityM8_3W'] === undefined) {
        throw new Error(`${e.id}: a heat pump needs ratings at 8.3 °C and −8.3 °C`);
      }
      return {
        id: e.id,
        ...equipmentOptionSchema.parse({
          kind: 'heat-pump',
          ...common,
          ...fields,
          backupW: e.backupW ?? 0,
          extrapolate: e.extrapolate ?? false,
        }),
      };
    }
    if (e.kind === 'electric')
      return { id: e.id, ...equipmentOptionSchema.parse({ kind: 'electric', ...common, outputW: e.outputW }) };
    return {
      id: e.id,
      ...equipmentOptionSchema.parse({
        kind: e.kind,
        ...common,
        fuel: e.energy,
        efficiency: e.efficiency,
        outputW: e.outputW,
      }),
    };
  });
  const p = s.prices;
  const prices = energyPricesSchema.parse({
    currency: p.currency ?? 'USD',
    electricityPerKwh: unitPrice(p.electricityPerKWh),
    ...(p.gasPerKWh !== undefined ? { gas: { unit: 'kWh', price: unitPrice(p.gasPerKWh) } } : {}),
    ...(p.oilPerLitre !== undefined ? { oilPerLitre: unitPrice(p.oilPerLitre) } : {}),
    ...(p.propanePerLitre !== undefined ? { propanePerLitre: unitPrice(p.propanePerLitre) } : {}),
  });
  return { building, options, prices };
}

/**
 * Where a problem sits in the scenario file, in the file's own terms: `building.uaWPerK`,
 * `equipment "hp-3" ratings[0].cop`, `extraDesignTemperaturesC[1]`.
 */
export function scenarioFieldName(scenario: unknown, path: readonly PropertyKey[]): string {
  if (path.length === 0) return '(the scenario)';
  const parts: string[] = [];
  let node: unknown = scenario;
  path.forEach((key, i) => {
    const child: unknown =
      node !== null && typeof node === 'object' ? (node as Record<PropertyKey, unknown>)[key] : undefined;
    if (typeof key === 'number') {
      const itemId: unknown =
        path[i - 1] === 'equipment' && child !== null && typeof child === 'object'
          ? (child as Record<string, unknown>)['id']
          : undefined;
      const suffix = typeof itemId === 'string' && itemId !== '' ? ` "${itemId}"` : `[${key}]`;
      parts.push(`${parts.pop() ?? ''}${suffix}`);
    } else {
      parts.push(String(key));
    }
    node = child;
  });
  return parts.join('.');
}

export interface ScenarioProblem {
  field: string;
  message: string;
}

/** The scenario file checked: its engine input, or every problem named by field. */
export function readScenarioFile(
  raw: unknown,
):
  | { ok: true; scenario: ScenarioFile; engine: ReturnType<typeof scenarioToEngine> }
  | { ok: false; problems: ScenarioProblem[] } {
  const checked = scenarioFileSchema.safeParse(raw);
  if (!checked.success) {
    return {
      ok: false,
      problems: checked.error.issues.map((i) => ({ field: scenarioFieldName(raw, i.path), message: i.message })),
    };
  }
  try {
    return { ok: true, scenario: checked.data, engine: scenarioToEngine(checked.data) };
  } catch (error) {
    const issues =
      error instanceof z.ZodError
        ? error.issues.map((i) => i.message)
        : [error instanceof Error ? error.message : String(error)];
    return { ok: false, problems: issues.map((message) => ({ field: '(the scenario)', message })) };
  }
}
