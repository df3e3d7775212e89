import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import {
  exceedanceRisk,
  gumbelFactor,
  meanAndSampleSd,
  returnPeriodMaximum,
  returnPeriodMinimum,
} from '../../shared/climate/extremes';
import { assertClose } from './close-to';

describe('Gumbel return periods (ASHRAE Handbook—Fundamentals, Ch. 14)', () => {
  it('F(n) for n = 5, 10, 20, 50 matches the formula values with γ = 0.5772', () => {
    // ASHRAE Handbook—Fundamentals 2009–2021, Ch. 14, return-period formula [S]; values docs/methods.md#return-periods, #check-values [C]
    assertClose(gumbelFactor(5), 0.719457, 1e-6, 'F(5)');
    assertClose(gumbelFactor(10), 1.304563, 1e-6, 'F(10)');
    assertClose(gumbelFactor(20), 1.865811, 1e-6, 'F(20)');
    assertClose(gumbelFactor(50), 2.592288, 1e-6, 'F(50)');
  });

  it('T_n of minima for M = −20 °C, s = 3 K', () => {
    // ASHRAE Handbook—Fundamentals, Ch. 14 [S]; check values docs/methods.md#return-periods, #check-values [C]
    assertClose(returnPeriodMinimum(-20, 3, 5), -22.158, 1e-3, 'T5');
    assertClose(returnPeriodMinimum(-20, 3, 10), -23.914, 1e-3, 'T10');
    assertClose(returnPeriodMinimum(-20, 3, 20), -25.597, 1e-3, 'T20');
    assertClose(returnPeriodMinimum(-20, 3, 50), -27.777, 1e-3, 'T50');
  });

  it('reproduces the published San Francisco Intl AP row from its tabulated mean and SD', () => {
    // ASHRAE Handbook—Fundamentals 2009, Ch. 14 design conditions, WMO 724940, as reproduced in public
    // weather statistics documentation [S]; tolerance 0.25 K for the one-decimal rounding of M and s,
    // docs/methods.md#return-periods [S + C]
    assertClose(returnPeriodMaximum(34.6, 2.3, 50), 40.5, 0.25, 'max T50');
    assertClose(returnPeriodMinimum(1.8, 1.5, 5), 0.8, 0.25, 'min T5');
    assertClose(returnPeriodMinimum(1.8, 1.5, 10), -0.1, 0.25, 'min T10');
    assertClose(returnPeriodMinimum(1.8, 1.5, 20), -0.9, 0.25, 'min T20');
    assertClose(returnPeriodMinimum(1.8, 1.5, 50), -1.9, 0.25, 'min T50');
  });

  it('exceedance risk over a service life', () => {
    // standard probability 1 − (1 − 1/n)^L; docs/methods.md#return-periods, #check-values [C]
    assertClose(exceedanceRisk(20, 15), 0.53671, 1e-5, 'n=20, L=15');
    assertClose(exceedanceRisk(50, 25), 0.3965, 1e-4, 'n=50, L=25');
    assert.equal(exceedanceRisk(20, 0), 0);
  });

  it('uses the sample standard deviation (n − 1)', () => {
    // 2, 4, 4, 4, 5, 5, 7, 9: mean 5, Σ(x − 5)² = 32, sample SD = √(32/7) (arithmetic by hand)
    const { mean, sd } = meanAndSampleSd([2, 4, 4, 4, 5, 5, 7, 9]);
    assert.equal(mean, 5);
    assertClose(sd, Math.sqrt(32 / 7), 1e-12, 'sd');
    assert.ok(Number.isNaN(meanAndSampleSd([3]).sd));
  });
});
