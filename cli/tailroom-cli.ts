/**
 * Tailroom command line.
 *
 *   node --import tsx cli/tailroom-cli.ts conditions <file> [--format csv|isd-lite] [--elevation m] [--last N]
 *   node --import tsx cli/tailroom-cli.ts adjust --weather <reference file> --target <target.json> [--format csv|isd-lite]
 *   node --import tsx cli/tailroom-cli.ts trend <file> [--format csv|isd-lite]
 *   node --import tsx cli/tailroom-cli.ts demo <site-id> [--years N] [--format csv|isd-lite]
 *   node --import tsx cli/tailroom-cli.ts sweep --weather <file> --scenario <scenario.json> [--format csv|isd-lite] [--uncertainty draws=N,seed=S]
 *
 * `conditions` prints the design conditions JSON of an hourly weather file to stdout.
 * `demo` prints a generated demo file for an invented site to stdout.
 * `sweep` prints the design-temperature ladder of a scenario over a weather file as JSON rows.
 * `adjust` prints a reference record shifted and stretched to a target's published values (CSV).
 * `trend` prints each qualifying year's coldest hour with its Theil–Sen slope and Mann–Kendall test.
 * Exit codes: 0 success, 1 unreadable or unusable data, 2 usage error.
 */
import { createReadStream, existsSync, readFileSync, statSync } from 'node:fs';
import { readScenarioFile } from '../shared/sweep/scenario-file';
import { priceOfComfort } from '../shared/sweep/price-of-comfort';
import { periodYearsFor, sweepWithOdds } from '../shared/sweep/sweep-odds';
import { DEFAULT_TOLERANCES, MAX_DRAWS } from '../shared/sweep/tolerances';
import { createInterface } from 'node:readline';
import { z } from 'zod';
import {
  coldestHourTrend,
  computeDesignConditions,
  createParser,
  designConditionsOfLatestYears,
  MIN_BASIS_YEARS,
  shiftAndStretch,
  demoSiteIds,
  detectFormat,
  findDemoSite,
  generateDemoSeries,
  seriesToCsv,
  seriesToIsdLite,
  weatherFileFormats,
  type LineParser,
  type ParseResult,
  type WeatherFileFormat,
} from '../shared/climate/index';

const USAGE = `Usage:
  tailroom-cli conditions <file> [--format csv|isd-lite] [--elevation m] [--last N]
  tailroom-cli adjust --weather <reference file> --target <target.json> [--format csv|isd-lite]
  tailroom-cli trend <file> [--format csv|isd-lite]
  tailroom-cli demo <site-id> [--years N] [--format csv|isd-lite]
  tailroom-cli sweep --weather <file> --scenario <scenario.json> [--format csv|isd-lite] [--uncertainty draws=N,seed=S]

Demo sites (invented): ${demoSiteIds.join(', ')}`;

class UsageError extends Error {}

interface ParsedArgs {
  positional: string[];
  flags: Map<string, string>;
}

function parseArgs(args: readonly string[], allowed: readonly string[]): ParsedArgs {
  const positional: string[] = [];
  const flags = new Map<string, string>();
  for (let i = 0; i < args.length; i++) {
    const arg = args[i] ?? '';
    if (arg.startsWith('--')) {
      // --name=value keeps everything after the first '=' (values such as draws=N,seed=S hold more).
      const eq = arg.indexOf('=');
      const name = eq < 0 ? arg.slice(2) : arg.slice(2, eq);
      const inline = eq < 0 ? undefined : arg.slice(eq + 1);
      if (!allowed.includes(name)) throw new UsageError(`Unknown option --${name}`);
      const value = inline ?? args[++i];
      if (value === undefined) throw new UsageError(`Option --${name} needs a value`);
      flags.set(name, value);
    } else {
      positional.push(arg);
    }
  }
  return { positional, flags };
}

function formatFlag(flags: Map<string, string>): WeatherFileFormat | undefined {
  const value = flags.get('format');
  if (value === undefined) return undefined;
  const format = weatherFileFormats.find((f) => f === value);
  if (format === undefined) throw new UsageError(`--format must be one of ${weatherFileFormats.join(', ')}`);
  return format;
}

function numberFlag(flags: Map<string, string>, name: string): number | undefined {
  const value = flags.get(name);
  if (value === undefined) return undefined;
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n)) throw new UsageError(`--${name} must be a number`);
  return n;
}

/** Streams a file line by line through the parser for its (given or detected) format. */
async function parseFile(
  path: string,
  format: WeatherFileFormat | undefined,
): Promise<ParseResult & { format: WeatherFileFormat }> {
  const lines = createInterface({ input: createReadStream(path, { encoding: 'utf8' }), crlfDelay: Infinity });
  let parser: LineParser | undefined;
  let chosen = format;
  const pending: { line: string; n: number }[] = [];
  let lineNumber = 0;
  for await (const line of lines) {
    lineNumber++;
    if (parser === undefined) {
      pending.push({ line, n: lineNumber });
      if (line.trim() === '') continue;
      chosen ??= detectFormat(line);
      parser = createParser(chosen);
      for (const p of pending) parser.push(p.line, p.n);
      continue;
    }
    parser.push(line, lineNumber);
  }
  chosen ??= 'csv';
  parser ??= createParser(chosen);
  return { ...parser.finish(), format: chosen };
}

/** A weather file read, or null after its first problems were printed to stderr. */
async function readWeather(
  path: string,
  format: WeatherFileFormat | undefined,
): Promise<(ParseResult & { ok: true }) | null> {
  const parsed = await parseFile(path, format);
  if (parsed.ok) return parsed;
  const lines = parsed.problems.map((p) => `  line ${p.line}: ${p.message}`);
  const more = parsed.problemCount - parsed.problems.length;
  process.stderr.write(
    `${path}: cannot be read as ${parsed.format}:\n${lines.join('\n')}\n` +
      (more > 0 ? `  … and ${more} more problem(s)\n` : ''),
  );
  return null;
}

function existingFile(path: string): void {
  if (!existsSync(path) || !statSync(path).isFile()) throw new UsageError(`No such file: ${path}`);
}

/** target.json of `adjust`: the published values the reference is adjusted to. */
const adjustTargetSchema = z.object({
  heating: z.object({ db99_6: z.number().min(-90).max(60) }),
  hdd18: z.number().min(0).max(20000).nullable().optional(),
});

async function adjustCommand(args: readonly string[]): Promise<number> {
  const { positional, flags } = parseArgs(args, ['weather', 'target', 'format']);
  if (positional.length > 0) throw new UsageError(`Unexpected argument ${positional[0] ?? ''}`);
  const weather = flags.get('weather');
  const targetPath = flags.get('target');
  if (weather === undefined || targetPath === undefined)
    throw new UsageError('adjust needs --weather <file> and --target <target.json>');
  existingFile(weather);
  existingFile(targetPath);
  const format = formatFlag(flags);
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(targetPath, 'utf8'));
  } catch {
    process.stderr.write(`${targetPath}: not valid JSON\n`);
    return 1;
  }
  const checked = adjustTargetSchema.safeParse(raw);
  if (!checked.success) {
    const lines = checked.error.issues.map((i) => `  ${i.path.join('.') || '(file)'}: ${i.message}`);
    process.stderr.write(`${targetPath}: not a valid target:\n${lines.join('\n')}\n`);
    return 1;
  }
  const parsed = await readWeather(weather, format);
  if (!parsed) return 1;
  const result = shiftAndStretch(parsed.series, { db99_6: checked.data.heating.db99_6, hdd18: checked.data.hdd18 });
  if (!result.ok) {
    process.stderr.write(`${weather}: refused: ${result.message}\n`);
    return 1;
  }
  process.stdout.write(seriesToCsv(result.series));
  process.stderr.write(
    JSON.stringify({ shiftK: result.shiftK, stretch: result.stretch, referenceMeanC: result.referenceMeanC }) + '\n',
  );
  return 0;
}

async function trendCommand(args: readonly string[]): Promise<number> {
  const { positional, flags } = parseArgs(args, ['format']);
  const [file, extra] = positional;
  if (file === undefined) throw new UsageError('trend needs a file');
  if (extra !== undefined) throw new UsageError(`Unexpected argument ${extra}`);
  existingFile(file);
  const parsed = await readWeather(file, formatFlag(flags));
  if (!parsed) return 1;
  const trend = coldestHourTrend(parsed.series);
  if (trend.annual.length === 0) {
    process.stderr.write(`${file}: no calendar year has at least 85 % valid hourly dry-bulb values\n`);
    return 1;
  }
  process.stderr.write(`${trend.sentence}\n`);
  const out = {
    annualMinimaC: trend.annual.map((a) => ({ year: a.year, minC: a.minC })),
    senSlopeKPerDecade: trend.senSlopeKPerDecade,
    mannKendall: trend.mannKendall,
  };
  process.stdout.write(JSON.stringify(out, null, 2) + '\n');
  return 0;
}

async function conditionsCommand(args: readonly string[]): Promise<number> {
  const { positional, flags } = parseArgs(args, ['format', 'elevation', 'last']);
  const [file, extra] = positional;
  if (file === undefined) throw new UsageError('conditions needs a file');
  if (extra !== undefined) throw new UsageError(`Unexpected argument ${extra}`);
  existingFile(file);
  const format = formatFlag(flags);
  const elevationM = numberFlag(flags, 'elevation');
  const last = numberFlag(flags, 'last');
  if (last !== undefined && (!Number.isInteger(last) || last < MIN_BASIS_YEARS || last > 200)) {
    throw new UsageError(`--last must be a whole number of years from ${MIN_BASIS_YEARS} to 200`);
  }

  const parsed = await readWeather(file, format);
  if (!parsed) return 1;
  const result =
    last === undefined
      ? computeDesignConditions(parsed.series, { elevationM })
      : designConditionsOfLatestYears(parsed.series, last, { elevationM });
  if (!result.ok) {
    process.stderr.write(`${file}: ${result.error.message}\n`);
    for (const y of result.years)
      process.stderr.write(`  ${y.year}: ${(y.completeness * 100).toFixed(1)} % valid hours\n`);
    return 1;
  }
  for (const w of result.warnings) process.stderr.write(`warning (${w.code}): ${w.message}\n`);
  process.stdout.write(JSON.stringify(result.conditions, null, 2) + '\n');
  return 0;
}

/** `--uncertainty draws=N,seed=S`: both whole numbers, draws 1–MAX_DRAWS. */
function uncertaintyFlag(flags: Map<string, string>): { draws: number; seed: number } | null {
  const value = flags.get('uncertainty');
  if (value === undefined) return null;
  const parts = new Map<string, string>();
  for (const part of value.split(',')) {
    const [key = '', v, extra] = part.split('=');
    if (v === undefined || extra !== undefined || !['draws', 'seed'].includes(key.trim()) || parts.has(key.trim())) {
      throw new UsageError('--uncertainty must be draws=N,seed=S');
    }
    parts.set(key.trim(), v.trim());
  }
  const whole = (key: string, min: number, max: number): number => {
    const text = parts.get(key);
    const n = Number(text);
    if (text === undefined || !/^\d+$/.test(text) || n < min || n > max) {
      throw new UsageError(`--uncertainty ${key} must be a whole number from ${min} to ${max}`);
    }
    return n;
  };
  return { draws: whole('draws', 1, MAX_DRAWS), seed: whole('seed', 0, 4_294_967_295) };
}

async function sweepCommand(args: readonly string[]): Promise<number> {
  const { positional, flags } = parseArgs(args, ['weather', 'scenario', 'format', 'uncertainty']);
  const uncertainty = uncertaintyFlag(flags);
  if (positional.length > 0) throw new UsageError(`Unexpected argument ${positional[0] ?? ''}`);
  const weather = flags.get('weather');
  const scenarioPath = flags.get('scenario');
  if (weather === undefined || scenarioPath === undefined)
    throw new UsageError('sweep needs --weather <file> and --scenario <file>');
  for (const f of [weather, scenarioPath]) {
    if (!existsSync(f) || !statSync(f).isFile()) throw new UsageError(`No such file: ${f}`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(scenarioPath, 'utf8'));
  } catch {
    process.stderr.write(`${scenarioPath}: not valid JSON\n`);
    return 1;
  }
  const read = readScenarioFile(raw);
  if (!read.ok) {
    const lines = read.problems.map((p) => `  ${p.field}: ${p.message}`);
    process.stderr.write(`${scenarioPath}: not a valid scenario:\n${lines.join('\n')}\n`);
    return 1;
  }
  const { scenario, engine } = read;
  const parsed = await parseFile(weather, formatFlag(flags));
  if (!parsed.ok) {
    const lines = parsed.problems.map((p) => `  line ${p.line}: ${p.message}`);
    process.stderr.write(`${weather}: cannot be read as ${parsed.format}:\n${lines.join('\n')}\n`);
    return 1;
  }
  const conditions = computeDesignConditions(parsed.series, { elevationM: scenario.elevationM });
  if (!conditions.ok) {
    process.stderr.write(`${weather}: ${conditions.error.message}\n`);
    return 1;
  }
  const input = {
    ...engine,
    economics: scenario.economics,
    heatPumpSizing: scenario.heatPumpSizing ?? 'compressor',
    designConditions: conditions.conditions,
    designWindMs: scenario.designWindMs ?? 6.7,
    record: { series: parsed.series, qualifyingYears: conditions.conditions.period.qualifyingYears },
    extraDesignC: scenario.extraDesignTemperaturesC ?? [],
  };
  const result = sweepWithOdds(input, {
    uncertainty: uncertainty && { ...uncertainty, tolerances: { ...DEFAULT_TOLERANCES, ...scenario.tolerances } },
  });
  // The price of comfort between neighbouring rows of the ladder printed (the named rows).
  const named = result.rows.filter((r) => !r.isGrid);
  const comfort = priceOfComfort(named, periodYearsFor(input, result.studyPeriodYears));
  const rows = named.map((r, i) => ({
    kind: r.kind,
    label: r.label,
    designC: r.designC,
    designLoadW: r.designLoadW,
    selectedOptionId: r.selectedOptionId,
    capacityAtDesignW: r.capacityAtDesignW,
    compressorAtDesignW: r.compressorAtDesignW,
    installedPrice: r.installedPrice,
    annualEnergyKWh: r.annualEnergyKWh,
    annualCost: r.annualCost,
    runHoursPerYear: r.runHoursPerYear,
    backupHoursPerYear: r.backupHoursPerYear,
    backupEnergyKWh: r.backupEnergyKWh,
    unmetHoursPerYear: r.unmetHoursPerYear,
    unmetHoursWorstYear: r.unmetHoursWorstYear,
    unmetDegreeHoursPerYear: r.unmetDegreeHoursPerYear,
    lowestIndoorC: r.lowestIndoorC,
    worstDropK: r.worstDropK,
    worstSagC: r.worstSagC,
    lifeCycleCost: r.lifeCycleCost,
    reliabilityNote: r.reliabilityNote,
    annualExceedanceProbability: r.annualExceedanceProbability,
    recordExceedanceShare: r.recordExceedanceShare,
    lifetimeExceedanceProbability: r.lifetimeExceedanceProbability,
    costPerAvoidedUnmetHour: comfort[i]?.costPerAvoidedUnmetHour ?? null,
    ...(uncertainty
      ? {
          unmetHoursPerYearP10: r.unmetHoursPerYearP10,
          unmetHoursPerYearP90: r.unmetHoursPerYearP90,
          lifeCycleCostP10: r.lifeCycleCostP10,
          lifeCycleCostP90: r.lifeCycleCostP90,
          selectionChangeShare: r.selectionChangeShare,
        }
      : {}),
  }));
  for (const w of result.warnings) process.stderr.write(`warning (${w.code}): ${w.message}\n`);
  const { heatPumpSizing, selectionRule, studyPeriodYears, energyEscalationPctPerYear, warnings } = result;
  process.stdout.write(
    JSON.stringify(
      { heatPumpSizing, selectionRule, studyPeriodYears, energyEscalationPctPerYear, warnings, rows },
      null,
      2,
    ) + '\n',
  );
  return 0;
}

function demoCommand(args: readonly string[]): number {
  const { positional, flags } = parseArgs(args, ['years', 'format']);
  const [siteId, extra] = positional;
  if (siteId === undefined) throw new UsageError('demo needs a site id');
  if (extra !== undefined) throw new UsageError(`Unexpected argument ${extra}`);
  const site = findDemoSite(siteId);
  if (site === undefined) throw new UsageError(`Unknown demo site ${siteId}`);
  const years = numberFlag(flags, 'years') ?? 10;
  if (!Number.isInteger(years) || years < 1 || years > 200)
    throw new UsageError('--years must be a whole number from 1 to 200');
  const series = generateDemoSeries(site, { years });
  const format = formatFlag(flags) ?? 'csv';
  process.stdout.write(format === 'isd-lite' ? seriesToIsdLite(series) : seriesToCsv(series));
  return 0;
}

async function main(argv: readonly string[]): Promise<number> {
  const [command, ...rest] = argv;
  try {
    if (command === 'conditions') return await conditionsCommand(rest);
    if (command === 'demo') return demoCommand(rest);
    if (command === 'sweep') return await sweepCommand(rest);
    if (command === 'adjust') return await adjustCommand(rest);
    if (command === 'trend') return await trendCommand(rest);
    throw new UsageError(command === undefined ? 'No command given' : `Unknown command ${command}`);
  } catch (error) {
    if (error instanceof UsageError) {
      process.stderr.write(`${error.message}\n\n${USAGE}\n`);
      return 2;
    }
    throw error;
  }
}

process.exitCode = await main(process.argv.slice(2));
