import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { computeQualityReport } from '../../shared/climate/quality-report';
import { assertClose } from './close-to';
import { HOUR, toSeries, yearRows, type FixtureRow } from './series-fixtures';

describe('data-quality report', () => {
  // 2021: all hours at 5 °C except: hours 100–106 invalid (7-h gap), hours 200–209 absent (10-h gap),
  // hours 300–304 invalid (5 h, not a gap), hours 400–401 out of range (75 °C), two repeated hours.
  // 2022: only the first 4000 hours, at −5 °C (45.7 %, not qualifying).
  const rows2021 = yearRows(2021, (i) => {
    if (i >= 200 && i < 210) return null;
    if ((i >= 100 && i < 107) || (i >= 300 && i < 305)) return { dryBulbC: NaN };
    if (i === 400 || i === 401) return { dryBulbC: 75 };
    return { dryBulbC: 5 };
  });
  const rows2022 = yearRows(2022, (i) => (i < 4000 ? { dryBulbC: -5 } : null));
  const start = Date.UTC(2021, 0, 1);
  const rows: FixtureRow[] = [
    ...rows2021,
    ...rows2022,
    { time: start + 50 * HOUR, dryBulbC: -30 },
    { time: start + 51 * HOUR, dryBulbC: -30 },
  ];
  const report = computeQualityReport(toSeries(rows));

  it('lists the years found and which qualify, with completeness', () => {
    assert.deepEqual(report.yearsFound, [2021, 2022]);
    assert.deepEqual(report.qualifyingYears, [2021]);
    const [y2021, y2022] = report.completeness;
    assert.equal(y2021?.validHours, 8760 - 10 - 7 - 5 - 2);
    assertClose(y2021?.completeness, (8760 - 24) / 8760, 1e-12, '2021');
    assert.equal(y2021?.qualifies, true);
    assert.equal(y2022?.validHours, 4000);
    assertClose(y2022?.completeness, 4000 / 8760, 1e-12, '2022');
    assert.equal(y2022?.qualifies, false);
  });

  it('finds gaps of ≥ 6 missing hours, the longest with its start', () => {
    assert.equal(report.gaps.count, 2);
    assert.deepEqual(report.gaps.longest, { start: '2021-01-09T08:00Z', hours: 10 }); // hour 200 = day 8 + 8 h
    assert.deepEqual(report.gaps.first[0], { start: '2021-01-05T04:00Z', hours: 7 }); // hour 100
  });

  it('counts repeated hours and out-of-range values with their times', () => {
    assert.equal(report.duplicates, 2);
    assert.equal(report.outOfRange.count, 2);
    assert.equal(report.outOfRange.byField.dryBulbC, 2);
    assert.deepEqual(report.outOfRange.first[0], { field: 'dryBulbC', time: '2021-01-17T16:00Z', value: 75 }); // hour 400
  });

  it('gives the cumulative distribution and monthly statistics of the qualifying years', () => {
    assert.equal(report.statisticsBasis, 'qualifying-years');
    assert.equal(report.distribution.hours, 8736);
    // all valid 2021 hours are 5 °C: one bin (4.5, 5], cumulative fraction 1
    assert.deepEqual(report.distribution.bins, [{ upperC: 5, hours: 8736, cumulativeFraction: 1 }]);
    const jan = report.monthly[0]!;
    assert.deepEqual(jan, { month: 1, hours: 744 - 24, minC: 5, meanC: 5, maxC: 5 });
    assert.equal(report.monthly.length, 12);
  });

  it('bins a spread of values cumulatively (value and fraction at or below)', () => {
    // 2021 hours take the values −1.0, −0.9, …, 1.9 cyclically (30 values): 0.5 K bins with upper edges
    // −1.0, −0.5, 0, 0.5, 1, 1.5, 2 hold 1, 5, 5, 5, 5, 5, 4 values per cycle (arithmetic)
    const values = Array.from({ length: 30 }, (_, k) => Math.round((-1 + k / 10) * 10) / 10);
    const r = computeQualityReport(toSeries(yearRows(2021, (i) => ({ dryBulbC: values[i % 30]! }))));
    assert.deepEqual(
      r.distribution.bins.map((b) => b.upperC),
      [-1, -0.5, 0, 0.5, 1, 1.5, 2],
    );
    const perCycle = [1, 5, 5, 5, 5, 5, 4];
    const fullCycles = Math.floor(8760 / 30); // 292, remainder 0
    assert.deepEqual(
      r.distribution.bins.map((b) => b.hours),
      perCycle.map((c) => c * fullCycles),
    );
    assertClose(r.distribution.bins[2]?.cumulativeFraction, 11 / 30, 1e-12, 'F(0 °C)');
    assert.equal(r.distribution.bins.at(-1)?.cumulativeFraction, 1);
  });

  it('falls back to all years when none qualifies', () => {
    const r = computeQualityReport(toSeries(rows2022));
    assert.equal(r.statisticsBasis, 'all-years');
    assert.deepEqual(r.qualifyingYears, []);
    assert.equal(r.distribution.hours, 4000);
    assert.equal(r.monthly[11]?.hours, 0);
    assert.equal(r.monthly[11]?.meanC, null);
  });
});
