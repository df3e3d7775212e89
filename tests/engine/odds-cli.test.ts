/**
 * The command line's odds, price of comfort and uncertainty band (`sweep … --uncertainty draws=N,seed=S`),
 * docs/methods.md#odds-of-a-colder-night, #price-of-comfort, #uncertainty-band.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, it } from 'node:test';
import { DEMO_SITES, generateDemoSeries, seriesToCsv } from '../../shared/climate/demo-weather';

/** An invented house with a small and a large furnace. */
const SCENARIO = {
  building: {
    indoorC: 21,
    uaWPerK: 200,
    infiltration: { method: 'ach', ach: 0.4, volumeM3: 450 },
    timeConstantH: 40,
  },
  equipment: [
    {
      id: 'small',
      kind: 'furnace',
      outputW: 9000,
      efficiency: 0.95,
      installedPrice: 3900,
      lifeYears: 20,
      energy: 'gas',
    },
    {
      id: 'mid',
      kind: 'furnace',
      outputW: 12000,
      efficiency: 0.95,
      installedPrice: 4400,
      lifeYears: 20,
      energy: 'gas',
    },
    {
      id: 'large',
      kind: 'furnace',
      outputW: 16000,
      efficiency: 0.95,
      installedPrice: 5100,
      lifeYears: 20,
      energy: 'gas',
    },
  ],
  prices: { electricityPerKWh: 0.16, gasPerKWh: 0.045 },
  economics: { discountRatePct: 3 },
  extraDesignTemperaturesC: [-10, -14],
};

const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-odds-cli-'));
const weatherFile = path.join(dir, 'weather.csv');
writeFileSync(weatherFile, seriesToCsv(generateDemoSeries(DEMO_SITES[0]!, { years: 6 })));
const scenarioFile = (name: string, extra: object = {}) => {
  const file = path.join(dir, `${name}.json`);
  writeFileSync(file, JSON.stringify({ ...SCENARIO, ...extra }));
  return file;
};
const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'cli/tailroom-cli.ts', 'sweep', '--weather', weatherFile, ...args], {
    encoding: 'utf8',
  });
type Row = Record<string, unknown>;
const rowsOf = (stdout: string) => (JSON.parse(stdout) as { rows: Row[] }).rows;

describe('tailroom-cli sweep: odds and uncertainty', () => {
  it('gives each row the odds: 1/n at the n-year rows (Gumbel fit of the same yearly minima), lifetime odds 1 − (1 − p)^L', () => {
    const out = run('--scenario', scenarioFile('plain'));
    assert.equal(out.status, 0, out.stderr);
    const rows = rowsOf(out.stdout);
    for (const [label, n] of [
      ['5-year', 5],
      ['10-year', 10],
      ['20-year', 20],
      ['50-year', 50],
    ] as const) {
      const row = rows.find((r) => r['label'] === label);
      assert.ok(row, label);
      const p = row['annualExceedanceProbability'] as number;
      assert.ok(Math.abs(p - 1 / n) < 1e-9, `${label}: ${p}`);
      if (row['selectedOptionId'] !== null) {
        // Every unit here lasts 20 years (the hand formula, docs/methods.md#odds-of-a-colder-night, risk over a service life).
        assert.ok(Math.abs((row['lifetimeExceedanceProbability'] as number) - (1 - (1 - 1 / n) ** 20)) < 1e-9, label);
      }
    }
    for (const r of rows) {
      const share = r['recordExceedanceShare'] as number;
      assert.ok(
        share >= 0 && share <= 1 && Math.abs(share * 6 - Math.round(share * 6)) < 1e-9,
        `a share of 6 years: ${share}`,
      );
      assert.equal('unmetHoursPerYearP10' in r, false, 'no band without --uncertainty');
      assert.ok('costPerAvoidedUnmetHour' in r);
    }
    const probabilities = rows.map((r) => r['annualExceedanceProbability'] as number);
    probabilities
      .slice(1)
      .forEach((p, i) => assert.ok(p <= (probabilities[i] ?? 1), 'odds fall as the design temperature gets colder'));
    // The price of comfort is defined only where the unit changes from the milder row.
    rows.forEach((r, i) => {
      if (i === 0 || r['selectedOptionId'] === rows[i - 1]?.['selectedOptionId'])
        assert.equal(r['costPerAvoidedUnmetHour'], null);
    });
  });

  it('with zero tolerances gives P10 = P90 = the nominal figures and no change of unit', () => {
    const file = scenarioFile('zero', { tolerances: { uaPct: 0, airLeakagePct: 0, pricesPct: 0 } });
    const out = run('--scenario', file, '--uncertainty', 'draws=40,seed=9');
    assert.equal(out.status, 0, out.stderr);
    for (const r of rowsOf(out.stdout)) {
      assert.equal(r['unmetHoursPerYearP10'], r['unmetHoursPerYear']);
      assert.equal(r['unmetHoursPerYearP90'], r['unmetHoursPerYear']);
      assert.equal(r['lifeCycleCostP10'], r['lifeCycleCost']);
      assert.equal(r['lifeCycleCostP90'], r['lifeCycleCost']);
      assert.equal(r['selectionChangeShare'], 0);
    }
  });

  it('is reproducible with a seed, and the band brackets a spread with the default tolerances', () => {
    const file = scenarioFile('default');
    const a = run('--scenario', file, '--uncertainty', 'draws=60,seed=3');
    const b = run('--scenario', file, '--uncertainty=draws=60,seed=3');
    assert.equal(a.status, 0, a.stderr);
    assert.equal(a.stdout, b.stdout);
    const rows = rowsOf(a.stdout);
    assert.ok(
      rows.some((r) => Number(r['lifeCycleCostP90']) > Number(r['lifeCycleCostP10'])),
      'prices ±15 % spread the life-cycle cost',
    );
    for (const r of rows) {
      if (r['lifeCycleCostP10'] === null) continue;
      assert.ok(Number(r['lifeCycleCostP10']) <= Number(r['lifeCycleCostP90']));
      assert.ok((r['unmetHoursPerYearP10'] as number) <= (r['unmetHoursPerYearP90'] as number));
    }
  });

  it('refuses a malformed --uncertainty with exit code 2 and the expected form', () => {
    for (const bad of ['draws=0,seed=1', 'draws=ten,seed=1', 'seed=1', 'draws=10,seed=1,extra=2', 'draws=10;seed=1']) {
      const out = run('--scenario', scenarioFile('plain'), '--uncertainty', bad);
      assert.equal(out.status, 2, bad);
      assert.match(out.stderr, /--uncertainty/);
    }
  });
});
