import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import {
  DEMO_SITES,
  demoSiteIds,
  findDemoSite,
  generateDemoSeries,
  mulberry32,
  seriesToCsv,
  seriesToIsdLite,
} from '../../shared/climate/demo-weather';
import { parseWeatherText } from '../../shared/climate/readers/index';

const site = (id: string) => {
  const s = findDemoSite(id);
  assert.ok(s, id);
  return s;
};

describe('demo weather', () => {
  it('offers three invented sites, each labelled as invented', () => {
    assert.deepEqual([...demoSiteIds], ['kettlerun-crossing', 'port-esmery', 'tallowmere-vale']);
    for (const s of DEMO_SITES) {
      assert.equal(s.invented, true);
      assert.match(s.name, /\(invented\)$/);
      assert.match(s.description, /^Invented/);
      assert.ok(Math.abs(s.latitude) <= 90 && Math.abs(s.longitude) <= 180);
    }
    assert.equal(findDemoSite('nowhere'), undefined);
  });

  it('is deterministic for a seed and differs between seeds', () => {
    const a = generateDemoSeries(site('port-esmery'), { years: 2 });
    const b = generateDemoSeries(site('port-esmery'), { years: 2 });
    const c = generateDemoSeries(site('port-esmery'), { years: 2, seed: 42 });
    assert.deepEqual(a, b);
    assert.notDeepEqual(a.dryBulbC, c.dryBulbC);
    const r1 = mulberry32(7);
    const r2 = mulberry32(7);
    for (let i = 0; i < 100; i++) {
      const v = r1();
      assert.equal(v, r2());
      assert.ok(v >= 0 && v < 1);
    }
  });

  it('covers whole UTC years hour by hour, with the dew point below the dry-bulb and wind ≥ 0', () => {
    const s = generateDemoSeries(site('tallowmere-vale'), { years: 3, endYear: 2020 });
    assert.equal(s.time.length, 8760 + 8760 + 8784);
    assert.equal(s.time[0], Date.UTC(2018, 0, 1));
    let missing = 0;
    for (let i = 0; i < s.time.length; i++) {
      if (i > 0) assert.equal(s.time[i]! - s.time[i - 1]!, 3_600_000);
      const t = s.dryBulbC[i]!;
      if (Number.isNaN(t)) {
        missing++;
        continue;
      }
      assert.ok(s.dewPointC[i]! < t, `dew point below dry-bulb at row ${i}`);
      assert.ok(s.windSpeedMs[i]! >= 0);
      assert.equal(Math.round(t * 10) / 10, t);
    }
    assert.ok(missing > 0 && missing < s.time.length * 0.02, `a few missing hours (${missing})`);
  });

  it('gives distinct climates: continental colder in winter than maritime, a wider spread inland', () => {
    const cold = computeDesignConditions(generateDemoSeries(site('kettlerun-crossing'), { years: 8 }), {
      elevationM: 560,
    });
    const mild = computeDesignConditions(generateDemoSeries(site('port-esmery'), { years: 8 }), { elevationM: 12 });
    assert.ok(cold.ok && mild.ok);
    assert.ok(cold.conditions.heating.db99_6 < mild.conditions.heating.db99_6 - 15);
    assert.ok(
      cold.conditions.cooling.db0_4 - cold.conditions.heating.db99_6 >
        2 * (mild.conditions.cooling.db0_4 - mild.conditions.heating.db99_6) - 10,
    );
    assert.ok(cold.conditions.hdd18 > mild.conditions.hdd18);
    assert.ok(cold.conditions.warnings.length === 0, cold.conditions.warnings.join());
  });

  it('renders as CSV and ISD-Lite that the readers read back to the same values', () => {
    const s = generateDemoSeries(site('kettlerun-crossing'), { years: 1 });
    for (const text of [seriesToCsv(s), seriesToIsdLite(s)]) {
      const r = parseWeatherText(text);
      assert.ok(r.ok);
      assert.equal(r.rowCount, s.time.length);
      assert.deepEqual(r.series.time, s.time);
      assert.deepEqual(r.series.dryBulbC, s.dryBulbC);
      assert.deepEqual(r.series.dewPointC, s.dewPointC);
      assert.deepEqual(r.series.windSpeedMs, s.windSpeedMs);
    }
    assert.match(seriesToIsdLite(s).split('\n')[0]!, /^\d{4} 01 01 00(\s+-?\d+){8}$/);
  });
});
