import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { findDemoSite, generateDemoSeries } from '../../shared/climate/demo-weather';
import type { HourlySeries } from '../../shared/climate/hourly-series';
import { assertDeepClose } from './close-to';
import { referenceConditions, type ReferenceRow } from './reference-conditions';
import { fixtureRandom, toSeries } from './series-fixtures';

function rowsOf(series: HourlySeries): ReferenceRow[] {
  return Array.from(series.time, (time, i) => ({
    time,
    dryBulbC: series.dryBulbC[i]!,
    dewPointC: series.dewPointC[i]!,
    windSpeedMs: series.windSpeedMs[i]!,
  }));
}

/** The engine's conditions in the reference's shape. */
function comparable(series: HourlySeries, elevationM: number | null) {
  const r = computeDesignConditions(series, { elevationM });
  assert.ok(r.ok);
  const { period, warnings: _warnings, ...rest } = r.conditions;
  return { qualifyingYears: period.qualifyingYears, validHours: period.validHours, ...rest };
}

describe('end to end: demo record → design conditions', () => {
  for (const [id, years] of [
    ['kettlerun-crossing', 12],
    ['tallowmere-vale', 5],
  ] as const) {
    it(`${id}, ${years} years: agrees with an independent recomputation to 1e-9`, () => {
      const site = findDemoSite(id);
      assert.ok(site);
      const series = generateDemoSeries(site, { years });
      const expected = referenceConditions(rowsOf(series), site.elevationM);
      assert.equal(expected.qualifyingYears.length, years);
      assertDeepClose(comparable(series, site.elevationM), expected, 1e-9);
    });
  }

  it('with repeated hours, a sparse year, out-of-range values and shuffled rows', () => {
    const site = findDemoSite('port-esmery');
    assert.ok(site);
    const rows = rowsOf(generateDemoSeries(site, { years: 4, endYear: 2023 }));
    const random = fixtureRandom(99);
    // a sparse extra year (about 40 % of its hours), repeated hours with other values, impossible values
    const sparse = rowsOf(generateDemoSeries(site, { years: 1, endYear: 2024, seed: 5 })).filter(() => random() < 0.4);
    const repeats = rows
      .filter(() => random() < 0.01)
      .map((r) => ({ ...r, dryBulbC: r.dryBulbC - 40, time: r.time + 60_000 }));
    const impossible = rows.map((r) => (random() < 0.001 ? { ...r, dryBulbC: 99, windSpeedMs: -3 } : r));
    const shuffled = [...impossible, ...sparse];
    for (let i = shuffled.length - 1; i > 0; i--) {
      const j = Math.floor(random() * (i + 1));
      [shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!];
    }
    // the repeats come after their originals in input order, so the originals must win
    const ordered = [...shuffled, ...repeats];
    const expected = referenceConditions(ordered, null);
    assert.deepEqual(expected.qualifyingYears, [2020, 2021, 2022, 2023]);
    const series = toSeries(ordered);
    assertDeepClose(comparable(series, null), expected, 1e-9);
    const r = computeDesignConditions(series);
    assert.ok(r.ok);
    for (const code of ['duplicate-hours', 'years-dropped', 'out-of-range-values', 'short-record']) {
      assert.ok(r.conditions.warnings.includes(code), code);
    }
  });
});
