/**
 * Measures how long the engine takes for a 30-year hourly record of each demo site
 * (run: node --import tsx cli/measure-conditions.ts [years]). Prints the median of several runs.
 */
import {
  computeDesignConditions,
  computeQualityReport,
  DEMO_SITES,
  generateDemoSeries,
  parseWeatherText,
  seriesToCsv,
} from '../shared/climate/index';

const years = Number(process.argv[2] ?? 30);
const runs = 7;

const median = (values: number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)] ?? NaN;
};

function time(task: () => unknown): number {
  const start = performance.now();
  task();
  return performance.now() - start;
}

for (const site of DEMO_SITES) {
  const series = generateDemoSeries(site, { years });
  const csv = seriesToCsv(series);
  const conditions: number[] = [];
  const quality: number[] = [];
  const parse: number[] = [];
  for (let i = 0; i < runs; i++) {
    conditions.push(time(() => computeDesignConditions(series, { elevationM: site.elevationM })));
    quality.push(time(() => computeQualityReport(series)));
    if (i < 3) parse.push(time(() => parseWeatherText(csv)));
  }
  process.stdout.write(
    `${site.id}: ${series.time.length} rows; conditions ${median(conditions).toFixed(0)} ms ` +
      `(first run ${conditions[0]?.toFixed(0) ?? '?'} ms), quality report ${median(quality).toFixed(0)} ms, ` +
      `CSV parse ${median(parse).toFixed(0)} ms (${(csv.length / 1e6).toFixed(1)} MB)\n`,
  );
}
