/**
 * The odds of a colder night, the price of comfort and the stated rule (docs/methods.md#odds-of-a-colder-night,
 * #price-of-comfort, #stated-rule). Sources beside each check.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { RETURN_PERIODS, returnPeriodMinimum } from '../../shared/climate/extremes';
import { applyDesignRule, type RuleRow } from '../../shared/sweep/design-rule';
import {
  annualExceedanceProbability,
  lifetimeExceedanceProbability,
  lifetimeOddsSentence,
  oddsOfRows,
  plainOdds,
  recordExceedanceShare,
  statsFromMinima,
  statsFromPublished,
} from '../../shared/sweep/odds';
import { priceOfComfort } from '../../shared/sweep/price-of-comfort';
import { assertClose } from './close-to';

describe('annual exceedance probability (Gumbel, method of moments)', () => {
  it('is 1/n at each n-year value of the ASHRAE Handbook—Fundamentals Ch. 14 check row (M = −20 °C, s = 3 K)', () => {
    // T_n from the handbook formula (docs/methods.md#odds-of-a-colder-night): −22.158, −23.914, −25.597, −27.777 °C.
    const published: Record<(typeof RETURN_PERIODS)[number], number> = {
      5: -22.158,
      10: -23.914,
      20: -25.597,
      50: -27.777,
    };
    for (const n of RETURN_PERIODS) {
      assertClose(
        annualExceedanceProbability(returnPeriodMinimum(-20, 3, n), -20, 3),
        1 / n,
        1e-12,
        `p at the ${n}-year value`,
      );
      // The three-decimal table values give 1/n to within the rounding of the table.
      assertClose(annualExceedanceProbability(published[n], -20, 3), 1 / n, 2e-4, `p at the tabulated ${n}-year value`);
    }
  });

  it('is 1/n at the n-year value for any mean and spread, and falls as the design temperature gets colder', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -45, max: 5, noNaN: true }),
        fc.double({ min: 0.3, max: 10, noNaN: true }),
        fc.double({ min: -60, max: 10, noNaN: true }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (mean, sd, t, step) => {
          for (const n of RETURN_PERIODS) {
            assertClose(
              annualExceedanceProbability(returnPeriodMinimum(mean, sd, n), mean, sd),
              1 / n,
              1e-9,
              `p(T_${n})`,
            );
          }
          const warmer = annualExceedanceProbability(t, mean, sd) ?? NaN;
          const colder = annualExceedanceProbability(t - step, mean, sd) ?? NaN;
          assert.ok(colder <= warmer, `p(${t - step}) = ${colder} should not exceed p(${t}) = ${warmer}`);
          assert.ok(colder >= 0 && warmer <= 1);
        },
      ),
    );
  });

  it('is 1 − e^(−e^(−0.5772)) ≈ 0.4296 at the mean of the yearly minima (hand-computed)', () => {
    // The mean of a Gumbel distribution lies at its exp(−exp(−γ)) ≈ 0.5704 quantile (a textbook
    // property of the distribution, from memory), so a year colder than the mean has odds ≈ 0.4296.
    assertClose(annualExceedanceProbability(-20, -20, 3), 1 - Math.exp(-Math.exp(-0.5772)), 1e-12, 'p(M)');
    assertClose(annualExceedanceProbability(-20, -20, 3), 0.42963, 1e-5, 'p(M), hand value');
  });

  it('has no value without a positive spread', () => {
    assert.equal(annualExceedanceProbability(-20, -20, 0), null);
    assert.equal(statsFromPublished(-20, null), null);
    assert.equal(statsFromPublished(undefined, 3), null);
  });
});

describe('lifetime odds', () => {
  it('matches hand-computed values 1 − (1 − p)^L', () => {
    // METHODS check values (standard probability, computed by hand): n = 20, L = 15 → 0.53671; n = 50, L = 25 → 0.39654.
    assertClose(lifetimeExceedanceProbability(1 / 20, 15), 0.53671, 1e-5, 'n = 20, L = 15');
    assertClose(lifetimeExceedanceProbability(1 / 50, 25), 0.39654, 1e-5, 'n = 50, L = 25');
    // p = 0.25 over 2 years: 1 − 0.75² = 0.4375; p = 0.1 over 20 years: 1 − 0.9^20 = 0.878423.
    assertClose(lifetimeExceedanceProbability(0.25, 2), 0.4375, 1e-12, 'p = 0.25, L = 2');
    assertClose(lifetimeExceedanceProbability(0.1, 20), 0.878423, 1e-6, 'p = 0.1, L = 20');
    assert.equal(lifetimeExceedanceProbability(0, 20), 0);
    assert.equal(lifetimeExceedanceProbability(1, 20), 1);
  });

  it('says the odds in plain words', () => {
    assert.equal(plainOdds(0.26), 'about a 1-in-4 chance');
    assert.equal(plainOdds(0.2), 'about a 1-in-5 chance');
    assert.equal(plainOdds(0.7), 'about a 7-in-10 chance');
    assert.equal(plainOdds(0.004), 'less than a 1-in-100 chance');
    assert.equal(plainOdds(0.97), 'a near-certain chance');
    assert.equal(
      lifetimeOddsSentence(0.25, 20),
      'There is about a 1-in-4 chance of at least one night colder than this in the next 20 years, the period over which the costs are compared.',
    );
  });
});

describe('the record’s own share', () => {
  it('counts the years whose coldest hour was below the design temperature (hand-made minima)', () => {
    const minima = [-18.2, -22.5, -15.0, -25.1, -19.9, -21.0, -17.3, -23.4, -16.6, -20.0];
    assert.equal(recordExceedanceShare(-20, minima), 0.4); // −22.5, −25.1, −21.0, −23.4
    assert.equal(recordExceedanceShare(-26, minima), 0);
    assert.equal(recordExceedanceShare(-14, minima), 1);
    assert.equal(recordExceedanceShare(-20, []), null);
  });

  it('fits the mean and sample SD of the minima and says when the record is short', () => {
    // Mean and sample SD by hand: minima −10, −12, −14 → mean −12, s = 2.
    const stats = statsFromMinima([-10, -12, -14]);
    assert.ok(stats);
    assertClose(stats.meanC, -12, 1e-12, 'mean');
    assertClose(stats.sdK, 2, 1e-12, 'sd');
    assert.equal(stats.shortRecord, true);
    assert.equal(statsFromMinima(Array.from({ length: 10 }, (_, i) => -10 - i))?.shortRecord, false);
  });

  it('gives every row its odds with the unit’s years, and none where no unit is chosen', () => {
    const rows = [
      { designC: -22.158, selectedOptionId: 'a', life: 20 },
      { designC: -27.777, selectedOptionId: null, life: 0 },
    ];
    const odds = oddsOfRows(rows, statsFromPublished(-20, 3), [], (r) => (r.selectedOptionId === null ? null : r.life));
    assertClose(odds[0]?.annualExceedanceProbability, 0.2, 1e-4, '5-year p');
    assertClose(odds[0]?.lifetimeExceedanceProbability, 1 - 0.8 ** 20, 1e-3, '5-year over 20 years');
    assert.equal(odds[0]?.recordExceedanceShare, null);
    assert.equal(odds[1]?.lifetimeExceedanceProbability, null);
    assertClose(odds[1]?.annualExceedanceProbability, 0.02, 1e-4, '50-year p');
  });
});

describe('price of comfort', () => {
  it('divides the extra life-cycle cost by the cold hours the larger unit avoids over the period (hand-made two-option case)', () => {
    // Small unit: LCC 10,000.00, 30 unmet h a year, 120 in the worst year. Large unit: LCC 11,200.00, 5 and 20.
    // Over 20 years: 1,200 / (25 × 20) = 2.40 per hour; worst year: 1,200 / (100 × 20) = 0.60 per hour.
    const rows = [
      { selectedOptionId: 'small', lifeCycleCost: '10000.00', unmetHoursPerYear: 30, unmetHoursWorstYear: 120 },
      { selectedOptionId: 'small', lifeCycleCost: '10000.00', unmetHoursPerYear: 30, unmetHoursWorstYear: 120 },
      { selectedOptionId: 'large', lifeCycleCost: '11200.00', unmetHoursPerYear: 5, unmetHoursWorstYear: 20 },
      { selectedOptionId: 'large', lifeCycleCost: '11200.00', unmetHoursPerYear: 5, unmetHoursWorstYear: 20 },
    ];
    const prices = priceOfComfort(rows, () => 20);
    assert.deepEqual(prices[0], { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null });
    assert.deepEqual(prices[1], { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null });
    assertClose(prices[2]?.costPerAvoidedUnmetHour, 2.4, 1e-12, 'per average-year hour');
    assertClose(prices[2]?.costPerAvoidedWorstYearHour, 0.6, 1e-12, 'per worst-year hour');
    assert.deepEqual(prices[3], { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null });
  });

  it('has no value where the larger unit avoids nothing or a cost is missing', () => {
    const rows = [
      { selectedOptionId: 'a', lifeCycleCost: '100.00', unmetHoursPerYear: 0, unmetHoursWorstYear: 0 },
      { selectedOptionId: 'b', lifeCycleCost: '200.00', unmetHoursPerYear: 0, unmetHoursWorstYear: 0 },
      { selectedOptionId: 'c', lifeCycleCost: null, unmetHoursPerYear: 0, unmetHoursWorstYear: 0 },
    ];
    for (const p of priceOfComfort(rows, () => 15))
      assert.deepEqual(p, { costPerAvoidedUnmetHour: null, costPerAvoidedWorstYearHour: null });
  });
});

describe('stated rule', () => {
  const row = (label: string, designC: number, lcc: string, worst: number, odds: number): RuleRow => ({
    label,
    designC,
    selectedOptionId: label,
    lifeCycleCost: lcc,
    installedPrice: lcc,
    unmetHoursWorstYear: worst,
    lifetimeExceedanceProbability: odds,
  });
  const rows = [
    row('99 %', -15, '9000.00', 80, 0.99),
    row('99.6 %', -17, '9500.00', 30, 0.9),
    row('5-year', -22, '10500.00', 6, 0.6),
    row('20-year', -26, '10400.00', 0, 0.15),
    row('50-year', -28, '12000.00', 0, 0.05),
  ];

  it('picks the lowest life-cycle cost within the limits, and says why', () => {
    const pick = applyDesignRule(rows, { maxUnmetHoursWorstYear: 10, maxLifetimeOddsPct: 20 });
    assert.equal(pick.index, 3);
    assert.match(pick.reason, /picks the point marked “20-year”/);
    assert.match(pick.reason, /at most 20 % odds of a colder night over the study period/);
    assert.match(pick.reason, /at most 10 unmet hours in the worst year of record/);
    assert.match(pick.reason, /1-in-5/);
    assert.equal(applyDesignRule(rows, { maxUnmetHoursWorstYear: 40, maxLifetimeOddsPct: null }).index, 1);
    assert.equal(applyDesignRule(rows, { maxUnmetHoursWorstYear: null, maxLifetimeOddsPct: null }).index, 0);
  });

  it('picks nothing, and says so, when no design temperature meets it', () => {
    const pick = applyDesignRule(rows, { maxUnmetHoursWorstYear: 0, maxLifetimeOddsPct: 1 });
    assert.equal(pick.index, null);
    assert.match(pick.reason, /picks nothing/);
  });
});
