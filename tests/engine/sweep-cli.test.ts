/**
 * The command line's `sweep`: a scenario file (SI) and a weather file in, the ladder rows out.
 * The rows are checked against the naive reference path of the engine (hours × rows × options).
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, it } from 'node:test';
import { DEMO_SITES, generateDemoSeries, seriesToCsv } from '../../shared/climate/demo-weather';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { parseWeatherText } from '../../shared/climate/readers';
import { scenarioFileSchema, scenarioToEngine } from '../../shared/sweep/scenario-file';
import { sweepNaive } from '../../shared/sweep/sweep';

const SCENARIO = {
  building: {
    indoorC: 21,
    uaWPerK: 180,
    infiltration: { method: 'ach', ach: 0.35, volumeM3: 420 },
    ventilation: { flowLs: 0, recoveryEffectiveness: 0 },
    ductLossPct: 0,
    safetyFactorPct: 0,
    internalGainsW: 0,
    timeConstantH: 40,
  },
  equipment: [
    {
      id: 'f-40',
      kind: 'furnace',
      outputW: 11700,
      efficiency: 0.96,
      installedPrice: 4100,
      lifeYears: 20,
      energy: 'gas',
    },
    {
      id: 'hp-3',
      kind: 'heat-pump',
      ratings: [
        { outdoorC: 8.3, capacityW: 10500, cop: 3.6 },
        { outdoorC: -8.3, capacityW: 7000, cop: 2.3 },
      ],
      backupW: 5000,
      installedPrice: 9800,
      lifeYears: 15,
      energy: 'electricity',
    },
    {
      id: 'f-80',
      kind: 'furnace',
      outputW: 23400,
      efficiency: 0.95,
      installedPrice: 5700,
      lifeYears: 20,
      energy: 'gas',
    },
  ],
  prices: { electricityPerKWh: 0.16, gasPerKWh: 0.045 },
  economics: { discountRatePct: 3 },
  extraDesignTemperaturesC: [-15],
};

const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-sweep-cli-'));
const csv = seriesToCsv(generateDemoSeries(DEMO_SITES[0]!, { years: 4 }));
const weatherFile = path.join(dir, 'weather.csv');
const scenarioFile = path.join(dir, 'scenario.json');
writeFileSync(weatherFile, csv);
writeFileSync(scenarioFile, JSON.stringify(SCENARIO));

const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'cli/tailroom-cli.ts', 'sweep', ...args], { encoding: 'utf8' });

describe('tailroom-cli sweep', () => {
  it('prints the ladder rows, equal to the naive reference over the same record', () => {
    const out = run('--weather', weatherFile, '--scenario', scenarioFile);
    assert.equal(out.status, 0, out.stderr);
    const { rows } = JSON.parse(out.stdout) as { rows: Record<string, unknown>[] };
    const labels = rows.map((r) => r['label']);
    for (const l of ['99 %', '99.6 %', 'Extreme mean', '5-year', '50-year', '-15 °C'])
      assert.ok(labels.includes(l), `${l} in ${labels.join(', ')}`);

    const parsed = parseWeatherText(csv);
    assert.ok(parsed.ok);
    const conditions = computeDesignConditions(parsed.series);
    assert.ok(conditions.ok);
    const reference = sweepNaive({
      ...scenarioToEngine(scenarioFileSchema.parse(SCENARIO)),
      economics: SCENARIO.economics,
      designConditions: conditions.conditions,
      designWindMs: 6.7,
      record: { series: parsed.series, qualifyingYears: conditions.conditions.period.qualifyingYears },
      extraDesignC: [-15],
      heatPumpSizing: 'compressor',
    }).rows.filter((r) => !r.isGrid);
    assert.equal(rows.length, reference.length);
    rows.forEach((row, i) => {
      const ref = reference[i]!;
      assert.equal(row['selectedOptionId'], ref.selectedOptionId, String(row['label']));
      assert.equal(row['installedPrice'], ref.installedPrice);
      assert.equal(row['lifeCycleCost'], ref.lifeCycleCost);
      for (const key of [
        'designLoadW',
        'annualEnergyKWh',
        'runHoursPerYear',
        'backupHoursPerYear',
        'backupEnergyKWh',
        'unmetHoursPerYear',
        'unmetDegreeHoursPerYear',
        'lowestIndoorC',
        'worstDropK',
        'worstSagC',
      ] as const) {
        const a = row[key] as number | null;
        const b = ref[key];
        if (a === null || b === null) assert.equal(a, b, key);
        else
          assert.ok(Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b)), `${String(row['label'])} ${key}: ${a} vs ${b}`);
      }
    });
    // Where nothing is large enough the row says so instead of hiding it.
    for (const r of rows) if (r['selectedOptionId'] === null) assert.equal(r['installedPrice'], null);
  });

  it('refuses a bad scenario with the field path, and wrong usage with exit code 2', () => {
    const bad = path.join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...SCENARIO, economics: { discountRatePct: 'three' } }));
    const out = run('--weather', weatherFile, '--scenario', bad);
    assert.equal(out.status, 1);
    assert.match(out.stderr, /economics\.discountRatePct/);
    assert.equal(run('--weather', weatherFile).status, 2);
  });

  it('warns on stderr of a short record (4 years) and prints the warnings and settings with the rows', () => {
    const out = run('--weather', weatherFile, '--scenario', scenarioFile);
    assert.equal(out.status, 0, out.stderr);
    assert.match(out.stderr, /warning \(short-record\)/);
    assert.match(out.stderr, /warning \(return-periods-unreliable\)/);
    assert.match(out.stderr, /warning \(fifty-year-short-record\)/);
    const answer = JSON.parse(out.stdout) as {
      warnings: { code: string }[];
      heatPumpSizing: string;
      studyPeriodYears: number;
      selectionRule: string;
    };
    assert.equal(answer.heatPumpSizing, 'compressor');
    assert.equal(answer.studyPeriodYears, 20);
    // Furnaces and a heat pump: a mixed list is decided on life-cycle cost.
    assert.equal(answer.selectionRule, 'lowest-life-cycle-cost');
    assert.ok(answer.warnings.some((w) => w.code === 'mixed-families'));
  });

  const refusals: [string, (s: typeof SCENARIO) => unknown, RegExp][] = [
    [
      'UA of 0',
      (s) => ({ ...s, building: { ...s.building, uaWPerK: 0 } }),
      /building\.uaWPerK: The UA \(conduction heat-loss coefficient\) must be greater than 0 W\/K/,
    ],
    [
      'indoor −40 °C',
      (s) => ({ ...s, building: { ...s.building, indoorC: -40 } }),
      /building\.indoorC: The indoor temperature must be at least 5 °C/,
    ],
    [
      'duplicate option ids',
      (s) => ({ ...s, equipment: [...s.equipment, s.equipment[0]] }),
      /equipment "f-40"\.id: Another option already has the id "f-40"/,
    ],
    [
      'an energy without a price',
      (s) => ({ ...s, prices: { electricityPerKWh: 0.16 } }),
      /equipment "f-40"\.energy: "f-40" uses gas, but prices has no gasPerKWh/,
    ],
    [
      'an extra design temperature of −300 °C',
      (s) => ({ ...s, extraDesignTemperaturesC: [-300] }),
      /extraDesignTemperaturesC\[0\]: A design temperature must be between -60 °C and 20 °C/,
    ],
    [
      'an extra design temperature of 80 °C',
      (s) => ({ ...s, extraDesignTemperaturesC: [80] }),
      /extraDesignTemperaturesC\[0\]: .*80 °C is not/,
    ],
    [
      'a COP below 1',
      (s) => ({
        ...s,
        equipment: s.equipment.map((e) =>
          e.kind === 'heat-pump' && e.ratings
            ? { ...e, ratings: [e.ratings[0], { outdoorC: -8.3, capacityW: 7000, cop: 0.8 }] }
            : e,
        ),
      }),
      /equipment "hp-3"\.ratings\[1\]\.cop: The COP must be at least 1/,
    ],
    [
      'a cycling degradation above 0.5',
      (s) => ({ ...s, equipment: [{ ...s.equipment[0], cyclingDegradation: 0.7 }] }),
      /equipment "f-40"\.cyclingDegradation: .*at most 0\.5/,
    ],
    [
      'an unknown sizing rule',
      (s) => ({ ...s, heatPumpSizing: 'biggest' }),
      /heatPumpSizing: heatPumpSizing is "compressor" or "with-backup"/,
    ],
  ];
  for (const [name, change, message] of refusals) {
    it(`refuses ${name}: exit 1, the field named in the scenario's own terms, no JSON dump`, () => {
      const bad = path.join(dir, 'refused.json');
      writeFileSync(bad, JSON.stringify(change(SCENARIO)));
      const out = run('--weather', weatherFile, '--scenario', bad);
      assert.equal(out.status, 1, out.stdout);
      assert.match(out.stderr, message);
      assert.equal(out.stdout, '');
      assert.doesNotMatch(out.stderr, /conduction\.|"code":|invalid_type|Error:/);
    });
  }
});
