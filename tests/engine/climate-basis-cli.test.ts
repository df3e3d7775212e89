/** The command line of the climate basis: `adjust`, `conditions --last N` and `trend`. */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import { fileURLToPath } from 'node:url';
import { designConditionsSchema } from '../../shared/climate/design-conditions-schema';
import { assertClose } from './close-to';

const root = fileURLToPath(new URL('../../', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'tailroom-basis-cli-'));
after(() => {
  rmSync(work, { recursive: true, force: true });
});

function cli(...args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'cli/tailroom-cli.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

const referencePath = join(work, 'reference.csv');
let reference: ReturnType<typeof designConditionsSchema.parse>;

before(() => {
  const demo = cli('demo', 'kettlerun-crossing', '--years', '12');
  assert.equal(demo.status, 0, demo.stderr);
  writeFileSync(referencePath, demo.stdout);
  const run = cli('conditions', referencePath);
  assert.equal(run.status, 0, run.stderr);
  reference = designConditionsSchema.parse(JSON.parse(run.stdout));
});

describe('adjust', () => {
  it('prints a record whose 99.6 % value and degree-days are the target’s, and Δ, α, T̄ on stderr', () => {
    const target = { heating: { db99_6: reference.heating.db99_6 + 1.5 }, hdd18: Math.round(reference.hdd18 * 0.93) };
    const targetPath = join(work, 'target.json');
    writeFileSync(targetPath, JSON.stringify(target));
    const run = cli('adjust', '--weather', referencePath, '--target', targetPath);
    assert.equal(run.status, 0, run.stderr);
    assert.equal(run.stdout.split('\n', 1)[0], 'time,dry_bulb_c,dew_point_c,wind_speed_ms');
    const line = JSON.parse(run.stderr.trim()) as { shiftK: number; stretch: number; referenceMeanC: number };
    assert.deepEqual(Object.keys(line).sort(), ['referenceMeanC', 'shiftK', 'stretch']);
    assert.ok(line.stretch !== 0);

    const adjustedPath = join(work, 'adjusted.csv');
    writeFileSync(adjustedPath, run.stdout);
    const again = cli('conditions', adjustedPath);
    assert.equal(again.status, 0, again.stderr);
    const adjusted = designConditionsSchema.parse(JSON.parse(again.stdout));
    assertClose(adjusted.heating.db99_6, target.heating.db99_6, 1e-6, '99.6 % value');
    assertClose(adjusted.hdd18, target.hdd18, 1e-3, 'degree-days');

    // T̄ is the reference's mean dry-bulb, here summed by a plain read of the CSV.
    const temps = readFileSync(referencePath, 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((l) => l.split(',')[1] ?? '')
      .filter((v) => v !== '')
      .map(Number);
    assertClose(line.referenceMeanC, temps.reduce((a, b) => a + b, 0) / temps.length, 1e-9, 'T̄');
  });

  it('without degree-days: α = 0 and Δ = target − reference 99.6 % value', () => {
    const targetPath = join(work, 'target-no-hdd.json');
    writeFileSync(targetPath, JSON.stringify({ heating: { db99_6: reference.heating.db99_6 - 2 } }));
    const run = cli('adjust', '--weather', referencePath, '--target', targetPath);
    assert.equal(run.status, 0, run.stderr);
    const line = JSON.parse(run.stderr.trim()) as { shiftK: number; stretch: number };
    assert.equal(line.stretch, 0);
    assertClose(line.shiftK, -2, 1e-9, 'Δ');
  });

  it('a refused adjustment exits 1 with the reason and prints no record', () => {
    const targetPath = join(work, 'target-far.json');
    writeFileSync(
      targetPath,
      JSON.stringify({ heating: { db99_6: reference.heating.db99_6 - 12 }, hdd18: reference.hdd18 * 0.4 }),
    );
    const run = cli('adjust', '--weather', referencePath, '--target', targetPath);
    assert.equal(run.status, 1);
    assert.equal(run.stdout, '');
    assert.match(run.stderr, /too far off/);
  });

  it('a bad target file exits 1 naming the field; a missing option exits 2', () => {
    const targetPath = join(work, 'target-bad.json');
    writeFileSync(targetPath, JSON.stringify({ heating: { db99_6: 'cold' } }));
    const bad = cli('adjust', '--weather', referencePath, '--target', targetPath);
    assert.equal(bad.status, 1);
    assert.match(bad.stderr, /heating\.db99_6/);
    assert.equal(cli('adjust', '--weather', referencePath).status, 2);
  });
});

describe('conditions --last N', () => {
  it('gives the conditions of the same file trimmed to its latest N years, with the window in `period`', () => {
    const lines = readFileSync(referencePath, 'utf8').trim().split('\n');
    const lastYear = reference.period.lastYear;
    const trimmedPath = join(work, 'trimmed.csv');
    // Trimmed by a plain text comparison of the year at the start of each time stamp.
    writeFileSync(
      trimmedPath,
      [lines[0], ...lines.slice(1).filter((l) => Number(l.slice(0, 4)) > lastYear - 8)].join('\n') + '\n',
    );
    const windowed = cli('conditions', referencePath, '--last', '8');
    const trimmed = cli('conditions', trimmedPath);
    assert.equal(windowed.status, 0, windowed.stderr);
    assert.equal(trimmed.status, 0, trimmed.stderr);
    const w = designConditionsSchema.parse(JSON.parse(windowed.stdout));
    assert.deepEqual(w, designConditionsSchema.parse(JSON.parse(trimmed.stdout)));
    assert.equal(w.period.firstYear, lastYear - 7);
    assert.equal(w.period.qualifyingYears.length, 8);
  });

  it('refuses a window shorter than 8 years (exit 2)', () => {
    const run = cli('conditions', referencePath, '--last', '5');
    assert.equal(run.status, 2);
    assert.match(run.stderr, /--last must be a whole number of years from 8/);
  });
});

describe('trend', () => {
  it('prints the yearly minima (checked against a plain read of the file), the slope and the Mann–Kendall figures', () => {
    const run = cli('trend', referencePath);
    assert.equal(run.status, 0, run.stderr);
    const out = JSON.parse(run.stdout) as {
      annualMinimaC: { year: number; minC: number }[];
      senSlopeKPerDecade: number;
      mannKendall: { s: number; varS: number; z: number; p: number };
    };
    const minima = new Map<number, number>();
    for (const l of readFileSync(referencePath, 'utf8').trim().split('\n').slice(1)) {
      const [time = '', db = ''] = l.split(',');
      if (db === '') continue;
      const y = Number(time.slice(0, 4));
      minima.set(y, Math.min(minima.get(y) ?? Infinity, Number(db)));
    }
    assert.deepEqual(
      out.annualMinimaC,
      [...minima.entries()].map(([year, minC]) => ({ year, minC })),
    );
    assert.equal(typeof out.senSlopeKPerDecade, 'number');
    assert.deepEqual(Object.keys(out.mannKendall).sort(), ['p', 's', 'varS', 'z']);
    // Var(S) = [n(n−1)(2n+5) − Σ t(t−1)(2t+5)]/18 over groups of equal minima (Kendall 1975), from the plain read.
    const groups = new Map<number, number>();
    for (const m of minima.values()) groups.set(m, (groups.get(m) ?? 0) + 1);
    const tieTerm = [...groups.values()].reduce((sum, t) => sum + t * (t - 1) * (2 * t + 5), 0);
    assertClose(out.mannKendall.varS, (12 * 11 * 29 - tieTerm) / 18, 1e-9, 'Var(S)');
    assert.match(run.stderr, /coldest hour of the year/);
  });
});
