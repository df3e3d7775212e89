import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, describe, it } from 'node:test';
import { fileURLToPath } from 'node:url';
import { designConditionsSchema } from '../../shared/climate/design-conditions-schema';
import { assertDeepClose } from './close-to';
import { referenceConditions, type ReferenceRow } from './reference-conditions';

const root = fileURLToPath(new URL('../../', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'tailroom-cli-'));
after(() => {
  rmSync(work, { recursive: true, force: true });
});

function cli(...args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'cli/tailroom-cli.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Reads the demo CSV with a plain split, independently of the product's readers. */
function readCsvPlainly(text: string): ReferenceRow[] {
  const [header, ...lines] = text.trim().split('\n');
  assert.equal(header, 'time,dry_bulb_c,dew_point_c,wind_speed_ms');
  const num = (s: string | undefined) => (s === undefined || s === '' ? NaN : Number(s));
  return lines.map((line) => {
    const [time, db, dp, ws] = line.split(',');
    return { time: Date.parse(time!), dryBulbC: num(db), dewPointC: num(dp), windSpeedMs: num(ws) };
  });
}

describe('command line', () => {
  it('demo → conditions prints the design conditions JSON, agreeing with a recomputation', () => {
    const demo = cli('demo', 'port-esmery', '--years', '3');
    assert.equal(demo.status, 0, demo.stderr);
    const csvPath = join(work, 'port-esmery.csv');
    writeFileSync(csvPath, demo.stdout);

    const run = cli('conditions', csvPath, '--elevation', '12');
    assert.equal(run.status, 0, run.stderr);
    const conditions = designConditionsSchema.parse(JSON.parse(run.stdout));
    assert.deepEqual(conditions.period.qualifyingYears, [2022, 2023, 2024]);
    assert.match(run.stderr, /short-record/);

    const expected = referenceConditions(readCsvPlainly(demo.stdout), 12);
    const { period, warnings: _warnings, ...rest } = conditions;
    assertDeepClose(
      { qualifyingYears: period.qualifyingYears, validHours: period.validHours, ...rest },
      expected,
      1e-9,
    );
  });

  it('detects ISD-Lite input and gives the same result as the CSV of the same record', () => {
    const csvPath = join(work, 'same.csv');
    const isdPath = join(work, 'same.isd');
    writeFileSync(csvPath, cli('demo', 'tallowmere-vale', '--years', '2').stdout);
    writeFileSync(isdPath, cli('demo', 'tallowmere-vale', '--years', '2', '--format', 'isd-lite').stdout);
    const fromCsv = cli('conditions', csvPath, '--elevation', '1650');
    const fromIsd = cli('conditions', isdPath, '--elevation', '1650');
    const forced = cli('conditions', isdPath, '--elevation', '1650', '--format', 'isd-lite');
    assert.equal(fromIsd.status, 0, fromIsd.stderr);
    assert.deepEqual(JSON.parse(fromIsd.stdout), JSON.parse(fromCsv.stdout));
    assert.deepEqual(JSON.parse(forced.stdout), JSON.parse(fromCsv.stdout));
  });

  it('a bad file exits with 1 and names the line', () => {
    const bad = join(work, 'bad.csv');
    writeFileSync(bad, 'time,dry_bulb_c\n2021-01-01T00:00,1\n2021-01-01T01:00,1\n2021-01-01T02:00,warm\n');
    const r = cli('conditions', bad);
    assert.equal(r.status, 1);
    assert.equal(r.stdout, '');
    assert.match(r.stderr, /bad\.csv/);
    assert.match(r.stderr, /line 4: .*"warm" is not a number/);
  });

  it('a file without a qualifying year exits with 1 and says why', () => {
    const sparse = join(work, 'sparse.csv');
    writeFileSync(sparse, 'time,dry_bulb_c\n2021-01-01T00:00,1\n2021-01-01T01:00,1\n');
    const r = cli('conditions', sparse);
    assert.equal(r.status, 1);
    assert.match(r.stderr, /No calendar year/);
  });

  it('usage errors exit with 2 and print the usage', () => {
    for (const args of [
      [],
      ['frobnicate'],
      ['conditions'],
      ['conditions', join(work, 'missing.csv')],
      ['demo', 'nowhere'],
      ['demo', 'port-esmery', '--years', 'x'],
    ]) {
      const r = cli(...args);
      assert.equal(r.status, 2, args.join(' '));
      assert.match(r.stderr, /Usage:/);
      assert.equal(r.stdout, '');
    }
  });
});
