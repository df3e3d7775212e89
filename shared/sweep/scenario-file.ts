/**
 * The scenario file the command line's `sweep` reads (SI units), and its translation into the
 * engine's input. Numbers for money are accepted here and turned into decimal strings.
 */
import { z } from 'zod';
import { tolerancesSchema } from '../scenarios/scenario-schemas';
import { buildingSchema, type Building } from '../building/building-schemas';
import { equipmentOptionSchema } from '../equipment/equipment-schemas';
import { energyPricesSchema, type EnergyPrices } from '../money/energy-prices';
import type { SweepOption } from './sweep';

const positive = z.number().positive();
const nonNegative = z.number().min(0);

const ratingSchema = z.strictObject({ outdoorC: z.number(), capacityW: positive, cop: positive });

const equipmentSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    id: z.string().min(1),
    label: z.string().optional(),
    kind: z.enum(['furnace', 'boiler']),
    outputW: positive,
    efficiency: z.number().positive().max(1),
    installedPrice: nonNegative,
    lifeYears: z.int().min(1),
    energy: z.enum(['gas', 'oil', 'propane']),
  }),
  z.strictObject({
    id: z.string().min(1),
    label: z.string().optional(),
    kind: z.literal('electric'),
    outputW: positive,
    installedPrice: nonNegative,
    lifeYears: z.int().min(1),
    energy: z.literal('electricity').optional(),
  }),
  z.strictObject({
    id: z.string().min(1),
    label: z.string().optional(),
    kind: z.literal('heat-pump'),
    /** Ratings at 8.3 °C and −8.3 °C, optionally −15 °C (the rating points the engine uses). */
    ratings: z.array(ratingSchema).min(2).max(3),
    backupW: nonNegative.optional(),
    extrapolate: z.boolean().optional(),
    installedPrice: nonNegative,
    lifeYears: z.int().min(1),
    energy: z.literal('electricity').optional(),
  }),
]);

export const scenarioFileSchema = z.strictObject({
  building: z.strictObject({
    indoorC: z.number(),
    uaWPerK: nonNegative,
    infiltration: z.discriminatedUnion('method', [
      z.strictObject({ method: z.literal('ach'), ach: nonNegative, volumeM3: positive }),
      z.strictObject({ method: z.literal('ach50'), ach50: nonNegative, volumeM3: positive, nFactor: positive }),
      z.strictObject({
        method: z.literal('ela'),
        elaCm2: nonNegative,
        storeys: z.union([z.literal(1), z.literal(2), z.literal(3)]),
        shieldingClass: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4), z.literal(5)]),
      }),
    ]),
    ventilation: z.strictObject({ flowLs: nonNegative, recoveryEffectiveness: z.number().min(0).max(0.95) }).optional(),
    ductLossPct: nonNegative.optional(),
    safetyFactorPct: nonNegative.optional(),
    internalGainsW: nonNegative.optional(),
    timeConstantH: positive,
  }),
  equipment: z.array(equipmentSchema).min(1),
  prices: z.strictObject({
    currency: z.string().length(3).optional(),
    electricityPerKWh: nonNegative,
    gasPerKWh: nonNegative.optional(),
    oilPerLitre: nonNegative.optional(),
    propanePerLitre: nonNegative.optional(),
  }),
  economics: z.strictObject({ discountRatePct: z.number().min(0).max(30) }),
  designWindMs: nonNegative.optional(),
  elevationM: z.number().optional(),
  extraDesignTemperaturesC: z.array(z.number()).optional(),
  /** Tolerances of the estimates for `--uncertainty`, ± % (defaults: UA 10, air leakage 25, prices 15). */
  tolerances: tolerancesSchema.partial().optional(),
});
export type ScenarioFile = z.infer<typeof scenarioFileSchema>;

const money = (n: number): string => n.toFixed(2);
const unitPrice = (n: number): string => n.toFixed(6);

/** Exact rating temperatures: 47 °F, 17 °F and 5 °F in °C (METHODS §4.3). */
const RATING_POINTS = [
  { c: 8.3, key: '8_3' },
  { c: -8.3, key: 'M8_3' },
  { c: -15, key: 'M15' },
] as const;

/** The scenario's building, options and prices in the engine's own (validated) shapes. */
export function scenarioToEngine(s: ScenarioFile): { building: Building; options: SweepOption[]; prices: EnergyPrices } {
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
    ventilation: b.ventilation ? { flowLps: b.ventilation.flowLs, heatRecoveryEffectiveness: b.ventilation.recoveryEffectiveness } : undefined,
    ductLossPct: b.ductLossPct,
    safetyFactorPct: b.safetyFactorPct,
    internalGainsW: b.internalGainsW,
    thermalMass: { mode: 'hours', timeConstantH: b.timeConstantH },
  });
  const options = s.equipment.map((e): SweepOption => {
    const common = { label: e.label ?? e.id, installedPrice: money(e.installedPrice), lifeYears: e.lifeYears };
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
        ...equipmentOptionSchema.parse({ kind: 'heat-pump', ...common, ...fields, backupW: e.backupW ?? 0, extrapolate: e.extrapolate ?? false }),
      };
    }
    if (e.kind === 'electric') return { id: e.id, ...equipmentOptionSchema.parse({ kind: 'electric', ...common, outputW: e.outputW }) };
    return {
      id: e.id,
      ...equipmentOptionSchema.parse({ kind: e.kind, ...common, fuel: e.energy, efficiency: e.efficiency, outputW: e.outputW }),
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
