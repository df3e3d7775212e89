/**
 * Sweep speed: one full sweep over a 30-year hourly record (invented demo weather), at least 60
 * design-temperature rows and 25 equipment options, by the fast path and by the naive loop in the same run.
 * Run alone with `node --import tsx scripts/bench-sweep.ts`, or as part of `npm run bench`.
 */
import { computeDesignConditions } from '../shared/climate/design-conditions';
import { prepareSeries } from '../shared/climate/prepared-series';
import { DEMO_SITES, generateDemoSeries } from '../shared/climate/demo-weather';
import { scenarioFileSchema, scenarioToEngine, type ScenarioFile } from '../shared/sweep/scenario-file';
import { designLadder, sweep, sweepNaive, type SweepInput } from '../shared/sweep/sweep';
import { buildSweepIndex } from '../shared/sweep/sweep-index';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;

/**
 * 25 heat pumps with backup heat (invented sizes and prices) for a house of about 180 W/K: one
 * family, as a scenario holds by default, sized on the compressor, with cycling losses and the
 * indoor-temperature recovery walk.
 */
function benchScenario(): ScenarioFile {
  const equipment: ScenarioFile['equipment'] = [];
  for (let k = 0; k < 25; k++) {
    const at47 = 6000 + k * 700;
    equipment.push({
      id: `hp-${k}`,
      kind: 'heat-pump',
      ratings: [
        { outdoorC: 8.3, capacityW: at47, cop: 3.8 },
        { outdoorC: -8.3, capacityW: at47 * 0.68, cop: 2.4 },
        { outdoorC: -15, capacityW: at47 * 0.58, cop: 1.9 },
      ],
      backupW: 5000,
      installedPrice: 7000 + at47 * 0.3,
      lifeYears: 15,
      energy: 'electricity',
    });
  }
  return scenarioFileSchema.parse({
    building: {
      indoorC: 21,
      uaWPerK: 180,
      infiltration: { method: 'ach', ach: 0.35, volumeM3: 420 },
      ventilation: { flowLs: 15, recoveryEffectiveness: 0.6 },
      ductLossPct: 5,
      safetyFactorPct: 0,
      internalGainsW: 400,
      timeConstantH: 40,
    },
    equipment,
    prices: { electricityPerKWh: 0.16, gasPerKWh: 0.045 },
    economics: { discountRatePct: 3 },
  });
}

/** The bench scenario as engine input over a record's design conditions (without the record). */
export function benchScenarioInput(designConditions: SweepInput['designConditions']): Omit<SweepInput, 'record'> {
  const scenario = benchScenario();
  return { ...scenarioToEngine(scenario), economics: scenario.economics, designConditions, designWindMs: 6.7 };
}

export interface SweepBenchResult {
  hours: number;
  years: number;
  rows: number;
  options: number;
  indexMs: number;
  fastMs: number;
  coldFastMs: number;
  naiveMs: number;
}

export function benchSweep(runs = 7, log: (line: string) => void = console.log): SweepBenchResult {
  const site = DEMO_SITES[0];
  if (!site) throw new Error('no demo site');
  const series = generateDemoSeries(site, { years: 30 });
  const prepared = prepareSeries(series);
  const conditions = computeDesignConditions(series, { elevationM: site.elevationM });
  if (!conditions.ok) throw new Error(conditions.error.message);
  const qualifyingYears = conditions.conditions.period.qualifyingYears;
  const scenario = benchScenario();
  const engine = scenarioToEngine(scenario);
  const base: Omit<SweepInput, 'record' | 'extraDesignC'> = {
    ...engine,
    economics: scenario.economics,
    designConditions: conditions.conditions,
    designWindMs: 6.7,
  };
  // Quarter-degree extras between the grid points until the sweep has at least 60 design temperatures.
  const extraDesignC: number[] = [];
  const top = conditions.conditions.heating.db99;
  for (let t = Math.floor(top * 2) / 2 - 0.25; designLadder(base.designConditions, extraDesignC).length < 60; t -= 0.5)
    extraDesignC.push(t);
  const rows = designLadder(base.designConditions, extraDesignC).length;

  const t0 = performance.now();
  const index = buildSweepIndex({ prepared, qualifyingYears });
  const indexMs = performance.now() - t0;
  const fast: number[] = [];
  const cold: number[] = [];
  const naive: number[] = [];
  const coldRuns = Math.max(3, Math.ceil(runs / 2));
  for (let r = 0; r < runs; r++) {
    let t = performance.now();
    sweep({ ...base, extraDesignC, record: index });
    fast.push(performance.now() - t);
    if (r < coldRuns) {
      t = performance.now();
      sweep({ ...base, extraDesignC, record: { prepared, qualifyingYears } });
      cold.push(performance.now() - t);
    }
  }
  const naiveRuns = Math.max(3, Math.ceil(runs / 2));
  for (let r = 0; r < naiveRuns; r++) {
    const t = performance.now();
    sweepNaive({ ...base, extraDesignC, record: { prepared, qualifyingYears } });
    naive.push(performance.now() - t);
  }
  const result: SweepBenchResult = {
    hours: index.hours.n,
    years: qualifyingYears.length,
    rows,
    options: engine.options.length,
    indexMs,
    fastMs: median(fast),
    coldFastMs: median(cold),
    naiveMs: median(naive),
  };
  log(
    `Sweep: ${result.years} years (${result.hours} hours) × ${result.rows} design temperatures × ${result.options} options, median of ${runs} (naive ${naiveRuns})`,
  );
  log(`  indexing the record once (grouping hours by temperature): ${result.indexMs.toFixed(1)} ms`);
  log(`  fast sweep on the indexed record: ${result.fastMs.toFixed(1)} ms`);
  log(`  fast sweep including indexing: ${result.coldFastMs.toFixed(1)} ms`);
  log(
    `  naive loop (for every design temperature: choose among the options, then walk every hour): ${result.naiveMs.toFixed(0)} ms`,
  );
  log(
    `  naive / fast: ${(result.naiveMs / result.fastMs).toFixed(0)}× (including indexing: ${(result.naiveMs / result.coldFastMs).toFixed(0)}×)`,
  );
  return result;
}

if (import.meta.url === `file://${process.argv[1] ?? ''}`) benchSweep();
