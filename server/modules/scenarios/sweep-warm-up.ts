/**
 * Warms a sweep worker's compiled code before the first user's sweep: a few sweeps of a short invented
 * record with a furnace and a heat pump take the engine's hot loops through the JavaScript engine's
 * optimising tiers, so that the first sweeps of real records run at the speed of later ones
 * (docs/architecture.md#stored-records-and-the-sweep-index). The figures are thrown away.
 */
import { computeDesignConditions } from '@shared/climate/design-conditions';
import { DEMO_SITES, generateDemoSeries } from '@shared/climate/demo-weather';
import { loadDuration } from '@shared/sweep/sweep';
import { buildSweepIndex } from '@shared/sweep/sweep-index';
import { sweepWithOdds } from '@shared/sweep/sweep-odds';
import { scenarioFileSchema, scenarioToEngine } from '@shared/sweep/scenario-file';

/** Sweeps run at start-up; enough for the hot loops to reach the optimising compiler. */
const WARM_UP_SWEEPS = 30;

export function warmUpSweeps(): void {
  const site = DEMO_SITES[0];
  if (!site) return;
  const series = generateDemoSeries(site, { years: 3 });
  const computed = computeDesignConditions(series, { elevationM: site.elevationM });
  if (!computed.ok) return;
  const scenario = scenarioFileSchema.parse({
    building: {
      indoorC: 21,
      uaWPerK: 180,
      infiltration: { method: 'ach', ach: 0.35, volumeM3: 420 },
      ductLossPct: 5,
      safetyFactorPct: 0,
      timeConstantH: 40,
    },
    equipment: [
      {
        id: 'warm-furnace',
        kind: 'furnace',
        outputW: 12_000,
        efficiency: 0.95,
        installedPrice: 4000,
        lifeYears: 20,
        energy: 'gas',
      },
      {
        id: 'warm-heat-pump',
        kind: 'heat-pump',
        ratings: [
          { outdoorC: 8.3, capacityW: 9000, cop: 3.8 },
          { outdoorC: -8.3, capacityW: 6100, cop: 2.4 },
          { outdoorC: -15, capacityW: 5200, cop: 1.9 },
        ],
        backupW: 5000,
        installedPrice: 9000,
        lifeYears: 15,
        energy: 'electricity',
      },
    ],
    prices: { electricityPerKWh: 0.16, gasPerKWh: 0.045 },
    economics: { discountRatePct: 3 },
  });
  const index = buildSweepIndex({ series, qualifyingYears: computed.conditions.period.qualifyingYears });
  const engine = scenarioToEngine(scenario);
  for (let k = 0; k < WARM_UP_SWEEPS; k++) {
    const input = {
      ...engine,
      economics: { discountRatePct: 3 + k / 100 },
      designConditions: computed.conditions,
      designWindMs: 6.7,
      record: index,
    };
    sweepWithOdds(input, { uncertainty: null });
    loadDuration(input.building, index, input.designWindMs);
  }
}
