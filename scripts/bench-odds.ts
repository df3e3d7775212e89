/**
 * Speed of the uncertainty band: the Monte Carlo of 300 draws over a 30-year hourly record (invented
 * demo weather), 25 equipment options, at the design temperatures the trade-off screen sweeps. Run alone with
 * `node --import tsx scripts/bench-odds.ts`, or as part of `npm run bench`.
 */
import { computeDesignConditions } from '../shared/climate/design-conditions';
import { prepareSeries } from '../shared/climate/prepared-series';
import { DEMO_SITES, generateDemoSeries } from '../shared/climate/demo-weather';
import { DEFAULT_TOLERANCES, monteCarloSweep } from '../shared/sweep/monte-carlo';
import { designLadder, indexSweepRecord, sweep } from '../shared/sweep/sweep';
import { benchScenarioInput } from './bench-sweep';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;

export interface OddsBenchResult {
  years: number;
  rows: number;
  draws: number;
  monteCarloMs: number;
  /** CPU time of the run, ms: what the draws cost this process whatever else shares the machine. */
  monteCarloCpuMs: number;
}

export function benchOdds(runs = 5, draws = 300, log: (line: string) => void = console.log): OddsBenchResult {
  const site = DEMO_SITES[0];
  if (!site) throw new Error('no demo site');
  const series = generateDemoSeries(site, { years: 30 });
  const conditions = computeDesignConditions(series, { elevationM: site.elevationM });
  if (!conditions.ok) throw new Error(conditions.error.message);
  const qualifyingYears = conditions.conditions.period.qualifyingYears;
  const index = indexSweepRecord({ prepared: prepareSeries(series), qualifyingYears });
  const input = { ...benchScenarioInput(conditions.conditions), record: index };
  const nominal = sweep(input);
  const times: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < runs; r++) {
    const c = process.cpuUsage();
    const t = performance.now();
    monteCarloSweep(input, { tolerances: DEFAULT_TOLERANCES, draws, seed: r + 1, nominal });
    times.push(performance.now() - t);
    const used = process.cpuUsage(c);
    cpu.push((used.user + used.system) / 1000);
  }
  const result: OddsBenchResult = {
    years: qualifyingYears.length,
    rows: designLadder(conditions.conditions).length,
    draws,
    monteCarloMs: median(times),
    monteCarloCpuMs: median(cpu),
  };
  log(
    `Uncertainty band: Monte Carlo of ${draws} draws (UA ±${DEFAULT_TOLERANCES.uaPct} %, air leakage ±${DEFAULT_TOLERANCES.airLeakagePct} %, prices ±${DEFAULT_TOLERANCES.pricesPct} %) over ${result.years} years × ${result.rows} design temperatures × ${input.options.length} options, median of ${runs}: ${result.monteCarloMs.toFixed(0)} ms (${(result.monteCarloMs / draws).toFixed(2)} ms a draw; CPU time ${result.monteCarloCpuMs.toFixed(0)} ms)`,
  );
  return result;
}

if (import.meta.url === `file://${process.argv[1] ?? ''}`) benchOdds();
