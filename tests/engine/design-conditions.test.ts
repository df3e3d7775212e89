import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { quantile as d3Quantile } from 'd3-array';
import fc from 'fast-check';
import { computeDesignConditions, type DesignConditionsResult } from '../../shared/climate/design-conditions';
import type { DesignConditions } from '../../shared/climate/design-conditions-schema';
import { assertClose } from './close-to';
import { HOUR, hoursOfYear, randomYears, toSeries, yearRows, type FixtureRow } from './series-fixtures';

function conditionsOf(result: DesignConditionsResult): DesignConditions {
  assert.ok(result.ok, result.ok ? '' : result.error.message);
  return result.conditions;
}

describe('record qualification', () => {
  it('a year qualifies with at least 85 % valid hours (8760 or 8784)', () => {
    // spec rule: ⌈0.85 × 8760⌉ = 7446 valid hours, ⌈0.85 × 8784⌉ = 7467 (arithmetic)
    const partial = (year: number, valid: number): FixtureRow[] =>
      yearRows(year, (i) => ({ dryBulbC: i < valid ? 5 : NaN }));
    const r = computeDesignConditions(
      toSeries([...partial(2019, 7446), ...partial(2020, 7466), ...partial(2021, 7445), ...partial(2022, 7467)]),
    );
    const c = conditionsOf(r);
    assert.deepEqual(c.period.qualifyingYears, [2019, 2022]);
    assert.equal(c.period.firstYear, 2019);
    assert.equal(c.period.lastYear, 2022);
    assert.equal(c.period.validHours, 7446 + 7467);
    assert.ok(c.warnings.includes('years-dropped'));
    assert.ok(c.warnings.includes('short-record'));
    assert.ok(
      r.ok &&
        r.warnings.some((w) => w.code === 'years-dropped' && w.message.includes('2020') && w.message.includes('2021')),
    );
  });

  it('eight qualifying years give no short-record warning', () => {
    const c = conditionsOf(
      computeDesignConditions(toSeries(randomYears([2010, 2011, 2012, 2013, 2014, 2015, 2016, 2017], 3))),
    );
    assert.equal(c.period.qualifyingYears.length, 8);
    assert.ok(!c.warnings.includes('short-record'));
  });

  it('zero qualifying years is an error result without numbers, not a crash', () => {
    const r = computeDesignConditions(toSeries(yearRows(2021, (i) => ({ dryBulbC: i % 2 === 0 ? 1 : NaN }))));
    assert.equal(r.ok, false);
    assert.ok(!r.ok);
    assert.equal(r.error.code, 'no-qualifying-years');
    assert.match(r.error.message, /85 %/);
    assert.deepEqual(
      r.years.map((y) => y.year),
      [2021],
    );
    assert.ok(!('conditions' in r));
    const empty = computeDesignConditions(toSeries([]));
    assert.ok(!empty.ok && empty.error.code === 'no-data');
  });

  it('values outside −90…+60 °C are not valid hours and are reported', () => {
    const rows = yearRows(2021, (i) => ({ dryBulbC: i === 0 ? 61 : i === 1 ? -90.5 : i === 2 ? -90 : 10 }));
    const r = computeDesignConditions(toSeries(rows));
    const c = conditionsOf(r);
    assert.equal(c.period.validHours, 8760 - 2);
    assert.ok(c.warnings.includes('out-of-range-values'));
    assert.ok(r.ok && r.usage.dryBulbHours === 8758);
  });

  it('a repeated UTC hour keeps its first value and is counted', () => {
    const rows = yearRows(2021, () => ({ dryBulbC: 10 }));
    // same hour as row 100 (also within the hour: +20 min), colder values that must be ignored
    rows.push({ time: rows[100]!.time, dryBulbC: -50 }, { time: rows[100]!.time + 20 * 60_000, dryBulbC: -40 });
    const r = computeDesignConditions(toSeries(rows));
    const c = conditionsOf(r);
    assert.equal(c.extremeMin.mean, 10);
    assert.equal(c.period.validHours, 8760);
    assert.ok(r.ok && r.warnings.some((w) => w.code === 'duplicate-hours' && w.message.startsWith('2 ')));
    // the first row in input order wins even when it comes later in time order of the file
    const reversed = [{ time: rows[5]!.time, dryBulbC: -30 }, ...rows];
    assert.equal(conditionsOf(computeDesignConditions(toSeries(reversed))).extremeMin.mean, -30);
  });
});

describe('dry-bulb design values', () => {
  it('heating and cooling percentiles follow the type-7 rule on the pooled hours', () => {
    // Values v_k = k/200 − 20 for k = 1..8760 in scrambled hour order. Type-7 quantiles of 1..8760 are
    // docs/methods.md#percentiles [C]: 36.036 (p .004), 88.59 (.01), 8724.964 (.996); the affine map carries over.
    const perm = (i: number) => (i * 7919) % 8760; // 7919 is prime, so this is a permutation of 0..8759
    const c = conditionsOf(
      computeDesignConditions(toSeries(yearRows(2021, (i) => ({ dryBulbC: (perm(i) + 1) / 200 - 20 })))),
    );
    assertClose(c.heating.db99_6, 36.036 / 200 - 20, 1e-9, 'db99.6');
    assertClose(c.heating.db99, 88.59 / 200 - 20, 1e-9, 'db99');
    assertClose(c.cooling.db0_4, 8724.964 / 200 - 20, 1e-9, 'db0.4');
    // p = 0.99 → h = 8759 × 0.99 = 8671.41 → 8672.41; p = 0.98 → 8583.82 → 8584.82 (1-based, arithmetic)
    assertClose(c.cooling.db1, 8672.41 / 200 - 20, 1e-9, 'db1');
    assertClose(c.cooling.db2, 8584.82 / 200 - 20, 1e-9, 'db2');
  });

  it('extreme annual minimum: mean, sample SD and return periods', () => {
    // ten years at 10 °C, each with one cold hour: five at −20 + d, five at −20 − d, d = 3·√0.9,
    // so M = −20 and s = 3 exactly; T_n from docs/methods.md#return-periods, #check-values [C]
    const d = 3 * Math.sqrt(0.9);
    const rows: FixtureRow[] = [];
    for (let k = 0; k < 10; k++) {
      const cold = k < 5 ? -20 + d : -20 - d;
      rows.push(...yearRows(2010 + k, (i) => ({ dryBulbC: i === 500 + k ? cold : 10 })));
    }
    const c = conditionsOf(computeDesignConditions(toSeries(rows)));
    assertClose(c.extremeMin.mean, -20, 1e-12, 'mean');
    assertClose(c.extremeMin.sd, 3, 1e-12, 'sd');
    assertClose(c.extremeMin.returnPeriod['5'], -22.158, 1e-3, 'T5');
    assertClose(c.extremeMin.returnPeriod['10'], -23.914, 1e-3, 'T10');
    assertClose(c.extremeMin.returnPeriod['20'], -25.597, 1e-3, 'T20');
    assertClose(c.extremeMin.returnPeriod['50'], -27.777, 1e-3, 'T50');
  });

  it('a single qualifying year leaves the spread and return periods empty with a warning', () => {
    const c = conditionsOf(computeDesignConditions(toSeries(yearRows(2021, (i) => ({ dryBulbC: i % 24 })))));
    assert.equal(c.extremeMin.mean, 0);
    assert.equal(c.extremeMin.sd, null);
    assert.deepEqual(c.extremeMin.returnPeriod, { '5': null, '10': null, '20': null, '50': null });
    assert.ok(c.warnings.includes('single-year-extremes'));
  });
});

describe('heating degree-days, base 18.3 °C', () => {
  it('a constant 0 °C year gives 18.3 × days (365 or 366)', () => {
    // docs/methods.md#degree-days, #check-values [C]: 18.3 × 365 = 6679.5; leap year 18.3 × 366 = 6697.8 (arithmetic)
    assertClose(
      conditionsOf(computeDesignConditions(toSeries(yearRows(2021, () => ({ dryBulbC: 0 }))))).hdd18,
      6679.5,
      1e-9,
      '2021',
    );
    assertClose(
      conditionsOf(computeDesignConditions(toSeries(yearRows(2020, () => ({ dryBulbC: 0 }))))).hdd18,
      6697.8,
      1e-9,
      '2020',
    );
    const both = [...yearRows(2020, () => ({ dryBulbC: 0 })), ...yearRows(2021, () => ({ dryBulbC: 0 }))];
    assertClose(
      conditionsOf(computeDesignConditions(toSeries(both))).hdd18,
      (6697.8 + 6679.5) / 2,
      1e-9,
      'average year',
    );
  });

  it('days under 18 valid hours are left out and the year is scaled to its days', () => {
    // 0 °C all year except: days 10–19 entirely missing, day 40 with 17 valid hours at 30 °C.
    // Counted days = 365 − 11 = 354, each 18.3 K → scaled 18.3 × 354 × 365/354 = 6679.5 (our convention)
    const rows = yearRows(2021, (i) => {
      const day = Math.floor(i / 24);
      if (day >= 10 && day < 20) return { dryBulbC: NaN };
      if (day === 40) return { dryBulbC: i % 24 < 17 ? 30 : NaN };
      return { dryBulbC: 0 };
    });
    assertClose(conditionsOf(computeDesignConditions(toSeries(rows))).hdd18, 6679.5, 1e-9, 'hdd');
    // the same day with 18 valid hours at 30 °C counts (mean 30 °C, no degree-days): 18.3 × 355 × 365/356
    const rows18 = yearRows(2021, (i) => {
      const day = Math.floor(i / 24);
      if (day >= 10 && day < 20) return { dryBulbC: NaN };
      if (day === 40) return { dryBulbC: i % 24 < 18 ? 30 : NaN };
      return { dryBulbC: 0 };
    });
    assertClose(
      conditionsOf(computeDesignConditions(toSeries(rows18))).hdd18,
      (18.3 * 354 * 365) / 355,
      1e-9,
      'hdd 18 h',
    );
  });

  it('uses the daily mean, so warm afternoons offset cold nights within a day', () => {
    // hours alternate 10 °C and 30 °C: daily mean 20 °C > 18.3 → 0 degree-days (degree-hours would give > 0)
    const c = conditionsOf(
      computeDesignConditions(toSeries(yearRows(2021, (i) => ({ dryBulbC: i % 2 === 0 ? 10 : 30 })))),
    );
    assert.equal(c.hdd18, 0);
  });
});

describe('humidification', () => {
  it('reproduces the San Francisco humidity ratio and relative humidity for a constant record', () => {
    // DP −3.7 °C at 101 301 Pa → 2.767 g/kg; at MCDB 10.7 °C φ = 34.87 % (docs/methods.md#humidification, #psychrometrics [S + C];
    // ASHRAE Handbook—Fundamentals 2009, Ch. 14 row for WMO 724940: 2.8 g/kg, 10.7 °C [S])
    const rows = yearRows(2021, () => ({ dryBulbC: 10.7, dewPointC: -3.7, stationPressureKpa: 101.301 }));
    const measured = conditionsOf(computeDesignConditions(toSeries(rows)));
    const h = measured.humidification.dp99_6;
    assert.ok(h);
    assert.equal(h.dewPoint, -3.7);
    assertClose(h.humidityRatio, 2.767, 0.001, 'HR measured pressure');
    assertClose(h.meanCoincidentDryBulb, 10.7, 1e-9, 'MCDB');
    assertClose(h.relativeHumidity, 34.87, 0.01, 'RH');
    // the same from the elevation: p(2 m) = 101 301.0 Pa (docs/methods.md#psychrometrics [P = C])
    const noPressure = yearRows(2021, () => ({ dryBulbC: 10.7, dewPointC: -3.7 }));
    const fromElevation = conditionsOf(computeDesignConditions(toSeries(noPressure), { elevationM: 2 }));
    assertClose(fromElevation.humidification.dp99?.humidityRatio, 2.767, 0.001, 'HR from elevation');
    const seaLevel = computeDesignConditions(toSeries(noPressure));
    assert.ok(seaLevel.ok && seaLevel.conditions.warnings.includes('pressure-assumed-sea-level'));
    assert.ok(seaLevel.ok && seaLevel.usage.pressureSource === 'sea-level');
  });

  it('mean coincident dry-bulb uses hours within ±0.5 K of the design dew point', () => {
    // 40 h DP −10 (DB −5), 20 h DP −9.6 (DB −1), 10 h DP −9.4 (DB 20), the rest DP 0 (DB 5).
    // p = .004: h = 35.036 (0-based) → DP −10; window [−10.5, −9.5] → (40·−5 + 20·−1)/60 (arithmetic)
    // p = .01: h = 87.59 → DP 0; window → only the DP 0 hours, DB 5
    const rows = yearRows(2021, (i) => {
      if (i < 40) return { dryBulbC: -5, dewPointC: -10 };
      if (i < 60) return { dryBulbC: -1, dewPointC: -9.6 };
      if (i < 70) return { dryBulbC: 20, dewPointC: -9.4 };
      return { dryBulbC: 5, dewPointC: 0 };
    });
    const c = conditionsOf(computeDesignConditions(toSeries(rows)));
    assert.equal(c.humidification.dp99_6?.dewPoint, -10);
    assertClose(c.humidification.dp99_6?.meanCoincidentDryBulb, (40 * -5 + 20 * -1) / 60, 1e-12, 'MCDB 99.6');
    assert.equal(c.humidification.dp99?.dewPoint, 0);
    assertClose(c.humidification.dp99?.meanCoincidentDryBulb, 5, 1e-12, 'MCDB 99');
  });

  it('no dew point → null humidification with a warning', () => {
    const c = conditionsOf(computeDesignConditions(toSeries(yearRows(2021, () => ({ dryBulbC: 3 })))));
    assert.deepEqual(c.humidification, { dp99_6: null, dp99: null });
    assert.ok(c.warnings.includes('missing-dew-point'));
  });
});

describe('wind', () => {
  it('coldest month, its 1 % wind speed and the wind coincident with the 99.6 % dry-bulb', () => {
    // February (672 h) at −5 °C with winds 0.00, 0.01, … 6.71 m/s; 36 July hours at −30 °C with 1 m/s;
    // the rest 10 °C with 3 m/s. Coldest month 2 (mean −5 °C). 99.6 %: h = 35.036 → −30 + 0.036·25 = −29.1,
    // so the coincident hours are the 36 at −30 °C → 1 m/s. Feb 1 %: h = 671·0.99 = 664.29 → 6.6429 m/s.
    const febStart = 31 * 24;
    const julStart = (31 + 28 + 31 + 30 + 31 + 30) * 24;
    const rows = yearRows(2021, (i) => {
      if (i >= febStart && i < febStart + 672) return { dryBulbC: -5, windSpeedMs: (i - febStart) / 100 };
      if (i >= julStart && i < julStart + 36) return { dryBulbC: -30, windSpeedMs: 1 };
      return { dryBulbC: 10, windSpeedMs: 3 };
    });
    const c = conditionsOf(computeDesignConditions(toSeries(rows)));
    assert.equal(c.wind.coldestMonth, 2);
    assertClose(c.heating.db99_6, -29.1, 1e-9, 'db99.6');
    assertClose(c.wind.coldestMonth1, 6.6429, 1e-9, 'coldest-month 1 %');
    assertClose(c.wind.coincident99_6, 1, 1e-12, 'coincident');
    // annual 99 / 97.5 / 95 % points of all the hourly speeds, by d3-array's R-7 quantile (independent library)
    const winds = rows.map((r) => r.windSpeedMs ?? NaN);
    assertClose(c.wind.annual1, d3Quantile(winds, 0.99) ?? NaN, 1e-9, 'annual 1 %');
    assertClose(c.wind.annual2_5, d3Quantile(winds, 0.975) ?? NaN, 1e-9, 'annual 2.5 %');
    assertClose(c.wind.annual5, d3Quantile(winds, 0.95) ?? NaN, 1e-9, 'annual 5 %');
    assert.ok((c.wind.annual1 ?? 0) > 3); // the February winds above 3 m/s make up more than 1 % of the hours
  });

  it('no wind → null speeds with a warning, the coldest month still known', () => {
    const c = conditionsOf(computeDesignConditions(toSeries(yearRows(2021, (i) => ({ dryBulbC: i < 744 ? -3 : 8 })))));
    assert.equal(c.wind.coldestMonth, 1);
    assert.deepEqual(
      [c.wind.coldestMonth1, c.wind.coincident99_6, c.wind.annual1, c.wind.annual2_5, c.wind.annual5],
      [null, null, null, null, null],
    );
    assert.ok(c.warnings.includes('missing-wind'));
  });
});

describe('properties', () => {
  const years = [2018, 2019, 2020];
  const base = (seed: number) => randomYears(years, seed);

  it('adding k to every temperature adds k to every dry-bulb result; the SD is unchanged', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.double({ min: -20, max: 20, noNaN: true }), (seed, k) => {
        const rows = base(seed);
        const a = conditionsOf(computeDesignConditions(toSeries(rows)));
        const b = conditionsOf(
          computeDesignConditions(toSeries(rows.map((r) => ({ ...r, dryBulbC: r.dryBulbC + k })))),
        );
        const tol = 1e-9;
        assertClose(b.heating.db99_6, a.heating.db99_6 + k, tol, 'db99.6');
        assertClose(b.heating.db99, a.heating.db99 + k, tol, 'db99');
        assertClose(b.cooling.db0_4, a.cooling.db0_4 + k, tol, 'db0.4');
        assertClose(b.cooling.db1, a.cooling.db1 + k, tol, 'db1');
        assertClose(b.cooling.db2, a.cooling.db2 + k, tol, 'db2');
        assertClose(b.extremeMin.mean, a.extremeMin.mean + k, tol, 'mean');
        assertClose(b.extremeMin.sd, a.extremeMin.sd ?? NaN, tol, 'sd');
        for (const n of ['5', '10', '20', '50'] as const) {
          assertClose(b.extremeMin.returnPeriod[n], (a.extremeMin.returnPeriod[n] ?? NaN) + k, tol, `T${n}`);
        }
      }),
      { numRuns: 15 },
    );
  });

  it('99.6 % ≤ 99 % heating value and 0.4 % ≥ 1 % ≥ 2 % cooling value', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), (seed) => {
        const c = conditionsOf(computeDesignConditions(toSeries(base(seed))));
        assert.ok(c.heating.db99_6 <= c.heating.db99);
        assert.ok(c.cooling.db0_4 >= c.cooling.db1 && c.cooling.db1 >= c.cooling.db2);
        const dp = c.humidification;
        assert.ok(dp.dp99_6 && dp.dp99 && dp.dp99_6.dewPoint <= dp.dp99.dewPoint);
      }),
      { numRuns: 15 },
    );
  });

  it('the order of the hours does not matter', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 1, max: 1e6 }), (seed, shuffleSeed) => {
        const rows = base(seed);
        const shuffled = [...rows];
        let s = shuffleSeed;
        for (let i = shuffled.length - 1; i > 0; i--) {
          s = (s * 1103515245 + 12345) % 2147483648;
          const j = s % (i + 1);
          [shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!];
        }
        assert.deepEqual(computeDesignConditions(toSeries(shuffled)), computeDesignConditions(toSeries(rows)));
      }),
      { numRuns: 10 },
    );
  });

  it('removing a whole non-qualifying year changes nothing but the period span and warnings', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1e6 }),
        fc.double({ min: 0.05, max: 0.8, noNaN: true }),
        (seed, fraction) => {
          const rows = base(seed);
          const sparse = randomYears([2021], seed + 1, fraction);
          const withSparse = conditionsOf(computeDesignConditions(toSeries([...rows, ...sparse])));
          const without = conditionsOf(computeDesignConditions(toSeries(rows)));
          assert.ok(withSparse.warnings.includes('years-dropped'));
          assert.equal(withSparse.period.lastYear, 2021);
          const strip = (c: DesignConditions) => ({
            ...c,
            period: { ...c.period, firstYear: 0, lastYear: 0 },
            warnings: [],
          });
          assert.deepEqual(strip(withSparse), strip(without));
        },
      ),
      { numRuns: 10 },
    );
  });

  it('repeated hours keep the first value', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1e6 }),
        fc.array(fc.nat(), { minLength: 1, maxLength: 50 }),
        (seed, picks) => {
          const rows = base(seed);
          const repeats = picks.map((p) => {
            const r = rows[p % rows.length]!;
            return { time: r.time + (p % 60) * 60_000, dryBulbC: -80, dewPointC: -85, windSpeedMs: 70 };
          });
          const a = conditionsOf(computeDesignConditions(toSeries([...rows, ...repeats])));
          const b = conditionsOf(computeDesignConditions(toSeries(rows)));
          assert.ok(a.warnings.includes('duplicate-hours'));
          assert.deepEqual({ ...a, warnings: [] }, { ...b, warnings: [] });
        },
      ),
      { numRuns: 10 },
    );
  });
});

describe('usage', () => {
  it('says which years and how many hours each part used', () => {
    const rows = randomYears([2019, 2020], 11);
    rows[10] = { ...rows[10]!, dewPointC: NaN };
    rows[11] = { ...rows[11]!, windSpeedMs: NaN };
    const r = computeDesignConditions(toSeries(rows), { elevationM: 300 });
    assert.ok(r.ok);
    const total = hoursOfYear(2019) + hoursOfYear(2020);
    assert.deepEqual(r.usage.qualifyingYears, [2019, 2020]);
    assert.equal(r.usage.dryBulbHours, total);
    assert.equal(r.usage.dewPointHours, total - 1);
    assert.equal(r.usage.windHours, total - 1);
    assert.equal(r.usage.degreeDays, total / 24);
    assert.equal(r.usage.pressureSource, 'elevation');
    assert.equal(rows[1]!.time - rows[0]!.time, HOUR);
  });
});
