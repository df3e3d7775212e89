/**
 * The climate basis of a job: the shift-and-stretch estimate of an hourly record from published
 * values (Belcher, Hacker and Powell, 2005), the latest-years window, and the trend of the coldest
 * hour (Theil–Sen; Mann–Kendall).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import jStat from 'jstat';
import { TheilSenRegression } from 'ml-regression-theil-sen';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import { findDemoSite, generateDemoSeries } from '../../shared/climate/demo-weather';
import {
  latestQualifyingYears,
  latestYearsSeries,
  designConditionsOfLatestYears,
} from '../../shared/climate/record-window';
import { prepareSeries } from '../../shared/climate/prepared-series';
import { MAX_STRETCH, shiftAndStretch } from '../../shared/climate/shift-stretch';
import { coldestHourTrend, mannKendall, theilSenSlope } from '../../shared/climate/trend';
import { assertClose } from './close-to';
import { toSeries, yearRows } from './series-fixtures';

const site = findDemoSite('kettlerun-crossing');
if (!site) throw new Error('demo site missing');
const reference = generateDemoSeries(site, { years: 12 });
const refConditions = computeDesignConditions(reference);
if (!refConditions.ok) throw new Error('demo record has no conditions');
const ref = refConditions.conditions;

describe('shift and stretch of a reference record (Belcher, Hacker and Powell 2005, BSERT 26(1))', () => {
  it('the adjusted record has the target’s 99.6 % value and degree-days, recomputed from its hours', () => {
    // Target: 2.5 K colder at the 99.6 % value and 8 % more degree-days than the reference (invented).
    const target = { db99_6: ref.heating.db99_6 - 2.5, hdd18: ref.hdd18 * 1.08 };
    const result = shiftAndStretch(reference, target);
    assert.ok(result.ok, result.ok ? '' : result.message);
    const adjusted = computeDesignConditions(result.series);
    assert.ok(adjusted.ok);
    // The two matching conditions of the method; the recomputation is the design-conditions engine, not the solver.
    assertClose(adjusted.conditions.heating.db99_6, target.db99_6, 1e-9, '99.6 % value');
    assertClose(adjusted.conditions.hdd18, target.hdd18, 1e-6, 'degree-days');
    assert.ok(result.stretch !== 0 && Math.abs(result.stretch) <= MAX_STRETCH);
    assert.deepEqual(adjusted.conditions.period.qualifyingYears, ref.period.qualifyingYears);
  });

  it('applies T′ = T + Δ + α·(T − T̄) hour by hour, shifts the dew point by Δ capped at the dry-bulb, and keeps the wind', () => {
    const result = shiftAndStretch(reference, { db99_6: ref.heating.db99_6 + 1, hdd18: ref.hdd18 * 0.95 });
    assert.ok(result.ok);
    const prepared = prepareSeries(reference);
    for (const i of [0, 1000, 25_000, 60_000, prepared.length - 1]) {
      const t = prepared.dryBulbC[i] ?? NaN;
      const expected = t + result.shiftK + result.stretch * (t - result.referenceMeanC);
      assertClose(result.series.dryBulbC[i], expected, 1e-9, `dry-bulb of row ${i}`);
      const dp = Math.min((prepared.dewPointC[i] ?? NaN) + result.shiftK, expected);
      assertClose(result.series.dewPointC[i], dp, 1e-9, `dew point of row ${i}`);
      assert.equal(result.series.windSpeedMs[i], prepared.windSpeedMs[i]);
    }
    for (let i = 0; i < result.series.time.length; i++) {
      const db = result.series.dryBulbC[i] ?? NaN;
      const dp = result.series.dewPointC[i] ?? NaN;
      if (!Number.isNaN(db) && !Number.isNaN(dp)) assert.ok(dp <= db, `dew point above dry-bulb at row ${i}`);
    }
  });

  it('without degree-days the stretch is 0 and the shift alone matches the 99.6 % value', () => {
    const result = shiftAndStretch(reference, { db99_6: ref.heating.db99_6 - 4 });
    assert.ok(result.ok);
    assert.equal(result.stretch, 0);
    assertClose(result.shiftK, -4, 1e-9, 'Δ');
    const adjusted = computeDesignConditions(result.series);
    assert.ok(adjusted.ok);
    assertClose(adjusted.conditions.heating.db99_6, ref.heating.db99_6 - 4, 1e-9, '99.6 % value');
    assertClose(adjusted.conditions.heating.db99, ref.heating.db99 - 4, 1e-9, '99 % value moves by Δ too');
  });

  it('refuses a reference whose climate is too far off (|α| > 0.5)', () => {
    // Half the degree-days with a colder 99.6 % value would need a very large stretch.
    const result = shiftAndStretch(reference, { db99_6: ref.heating.db99_6 - 10, hdd18: ref.hdd18 * 0.5 });
    assert.equal(result.ok, false);
    if (!result.ok) {
      assert.ok(result.code === 'stretch-too-large' || result.code === 'degree-days-unreachable', result.code);
      assert.match(result.message, /too far off/);
    }
  });

  it('refuses a reference with fewer than 8 qualifying years', () => {
    const short = generateDemoSeries(site, { years: 7 });
    const result = shiftAndStretch(short, { db99_6: -20 });
    assert.equal(result.ok, false);
    if (!result.ok) {
      assert.equal(result.code, 'short-reference');
      assert.match(result.message, /only 7 qualifying/);
    }
  });
});

describe('latest N qualifying years', () => {
  it('a window of 10 years gives the conditions of the record trimmed to its last 10 years', () => {
    const years = latestQualifyingYears(prepareSeries(reference), 10);
    assert.equal(years.length, 10);
    // The trimmed record is cut by a plain date comparison here, independently of the window code.
    const from = Date.UTC(years[0] ?? 0, 0, 1);
    const keep = [...reference.time.keys()].filter((i) => (reference.time[i] ?? 0) >= from);
    const pick = (c: Float64Array) => Float64Array.from(keep, (i) => c[i] ?? NaN);
    const trimmed = {
      time: pick(reference.time),
      dryBulbC: pick(reference.dryBulbC),
      dewPointC: pick(reference.dewPointC),
      windSpeedMs: pick(reference.windSpeedMs),
      stationPressureKpa: pick(reference.stationPressureKpa),
    };
    const windowed = designConditionsOfLatestYears(reference, 10);
    const direct = computeDesignConditions(trimmed);
    assert.ok(windowed.ok && direct.ok);
    assert.deepEqual(windowed.conditions, direct.conditions);
    assert.equal(windowed.conditions.period.firstYear, years[0]);
    assert.equal(latestYearsSeries(reference, 40).time.length, reference.time.length);
  });
});

describe('Theil–Sen slope (Sen 1968, JASA 63) against the npm package ml-regression-theil-sen 3.0.0', () => {
  it('agrees with the package on random series', () => {
    // The package takes the lower of the two middle slopes when their number is even (its median is
    // median-quickselect's lower median); Sen's estimator averages them. So: equal when the number of
    // pairs n(n−1)/2 is odd, and never below the package's value when it is even.
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -400, max: 50 }), { minLength: 2, maxLength: 40 }), (tenths) => {
        const values = tenths.map((v) => v / 10);
        const years = values.map((_, i) => 1990 + i);
        const ours = theilSenSlope(years, values);
        const theirs = new TheilSenRegression(years, values).slope;
        const pairs = (values.length * (values.length - 1)) / 2;
        if (pairs % 2 === 1) assertClose(ours, theirs, 1e-9, 'slope');
        else
          assert.ok(ours !== null && ours >= theirs - 1e-12, `slope ${String(ours)} below the lower median ${theirs}`);
      }),
      { numRuns: 300 },
    );
  });

  it('a hand-worked check: y = 1, 3, 2, 5, 4 over x = 1…5 (ten pairs) has the median slope 0.875', () => {
    // Pairwise slopes, worked by hand: 2, 1/2, 4/3, 3/4, −1, 1, 1/3, 3, 1, −1; sorted, the middle pair is
    // 3/4 and 1, so Sen's median is 0.875 and the package's lower median 0.75.
    assert.equal(theilSenSlope([1, 2, 3, 4, 5], [1, 3, 2, 5, 4]), 0.875);
    assert.equal(new TheilSenRegression([1, 2, 3, 4, 5], [1, 3, 2, 5, 4]).slope, 0.75);
  });
});

describe('Mann–Kendall test (Mann 1945; Kendall 1975)', () => {
  it('x = 1, 3, 2, 5, 4, 6, 8, 7, 9, 10: S = 39, Var(S) = 125, Z = 3.3988, p from the normal distribution of jstat 1.9.6', () => {
    // Worked by hand from the definitions in Kendall (1975): of the 45 pairs only (3,2), (5,4) and (8,7)
    // fall, so S = 42 − 3 = 39; Var(S) = n(n−1)(2n+5)/18 = 10·9·25/18 = 125; Z = (S − 1)/√Var = 38/√125.
    const mk = mannKendall([1, 3, 2, 5, 4, 6, 8, 7, 9, 10]);
    assert.ok(mk);
    assert.equal(mk.s, 39);
    assert.equal(mk.varS, 125);
    assertClose(mk.z, 38 / Math.sqrt(125), 1e-12, 'Z');
    assertClose(mk.z, 3.3988, 1e-4, 'Z (four places)');
    const p = 2 * (1 - jStat.normal.cdf(Math.abs(mk.z), 0, 1));
    assertClose(mk.p, p, 1e-7, 'two-sided p');
  });

  it('corrects the variance for ties: x = 1, 2, 2, 3, 1 (hand-worked)', () => {
    // Pairs: (1,2)+ (1,2)+ (1,3)+ (1,1)0 (2,2)0 (2,3)+ (2,1)− (2,3)+ (2,1)− (3,1)− → S = 5 − 3 = 2.
    // Ties: two groups of 2 → Σ t(t−1)(2t+5) = 2·(2·1·9) = 36; Var = (5·4·15 − 36)/18 = 264/18.
    const mk = mannKendall([1, 2, 2, 3, 1]);
    assert.ok(mk);
    assert.equal(mk.s, 2);
    assertClose(mk.varS, 264 / 18, 1e-12, 'Var(S)');
    assertClose(mk.z, 1 / Math.sqrt(264 / 18), 1e-12, 'Z');
    assertClose(mk.p, 2 * (1 - jStat.normal.cdf(mk.z, 0, 1)), 1e-7, 'p (jstat)');
  });

  it('a falling series gives a negative S and Z with the continuity correction; no change gives Z = 0', () => {
    const mk = mannKendall([10, 9, 8, 7, 6, 5, 4, 3, 2, 1]);
    assert.ok(mk);
    assert.equal(mk.s, -45);
    assertClose(mk.z, -44 / Math.sqrt(125), 1e-12, 'Z');
    const flat = mannKendall([2, 2, 2, 2]);
    assert.ok(flat);
    assert.equal(flat.s, 0);
    assert.equal(flat.z, 0);
    assertClose(flat.p, 1, 1e-7, 'p');
  });
});

/** A record of `years.length` years whose coldest hour of year k is `minima[k]` (invented). */
function recordWithMinima(minima: readonly number[]) {
  const rows = minima.flatMap((min, k) =>
    yearRows(2000 + k, (i) => ({ dryBulbC: i === 500 ? min : 5 + 10 * Math.sin(i / 500) })),
  );
  return toSeries(rows);
}

describe('trend of the coldest hour: properties (fast-check)', () => {
  const minimaArb = fc.array(
    fc.integer({ min: -400, max: -60 }).map((v) => v / 10),
    { minLength: 10, maxLength: 14 },
  );

  it('adding k to every temperature leaves the slope unchanged and shifts every minimum by k', () => {
    fc.assert(
      fc.property(
        minimaArb,
        fc.integer({ min: -50, max: 50 }).map((v) => v / 10),
        (minima, k) => {
          const base = recordWithMinima(minima);
          const shifted = { ...base, dryBulbC: base.dryBulbC.map((t) => t + k) };
          const a = coldestHourTrend(base);
          const b = coldestHourTrend(shifted);
          assert.deepEqual(
            a.annual.map((x) => x.minC),
            minima,
          );
          b.annual.forEach((x, i) => {
            assertClose(x.minC - k, minima[i] ?? NaN, 1e-9, 'shifted minimum − k');
          });
          assertClose(b.senSlopeKPerDecade, a.senSlopeKPerDecade ?? NaN, 1e-9, 'slope');
          assert.equal(b.mannKendall?.s, a.mannKendall?.s);
        },
      ),
      { numRuns: 15 },
    );
  });

  it('reversing the years flips the sign of the slope and of S', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -400, max: 0 }), { minLength: 3, maxLength: 30 }), (tenths) => {
        const values = tenths.map((v) => v / 10);
        const years = values.map((_, i) => 1980 + i);
        const reversed = [...values].reverse();
        assertClose(theilSenSlope(years, reversed), -(theilSenSlope(years, values) ?? NaN), 1e-9, 'slope');
        const [forward, backward] = [mannKendall(values)?.s, mannKendall(reversed)?.s];
        assert.ok(
          forward !== undefined && backward === -forward,
          `S ${String(forward)} reversed to ${String(backward)}`,
        );
      }),
      { numRuns: 200 },
    );
  });

  it('says there are too few years below 10, and states the trend in plain words from 10', () => {
    const few = coldestHourTrend(recordWithMinima([-20, -21, -19, -22, -18, -20, -23, -17, -21]));
    assert.equal(few.enough, false);
    assert.match(few.sentence, /at least 10 are needed/);
    const warming = coldestHourTrend(recordWithMinima([-30, -29, -28, -27, -26, -25, -24, -23, -22, -21]));
    assert.equal(warming.enough, true);
    assertClose(warming.senSlopeKPerDecade, 10, 1e-9, 'K per decade');
    assert.match(
      warming.sentence,
      /^Over 2000–2009 the coldest hour of the year has warmed by about 10\.0 K per decade; a trend this strong would arise by chance less than 1 time in 1000\.$/,
    );
  });
});
