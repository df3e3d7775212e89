import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { quantile as d3Quantile, quantileSorted as d3QuantileSorted } from 'd3-array';
import fc from 'fast-check';
import { quantile, quantileOfSorted, sortedFinite } from '../../shared/climate/percentile';
import { assertClose } from './close-to';

describe('percentiles (linear interpolation between order statistics)', () => {
  it('docs/methods.md#percentiles check values', () => {
    // Hyndman–Fan type 7 (NumPy percentile default); values docs/methods.md#percentiles, #check-values [C]
    const hours = Float64Array.from({ length: 8760 }, (_, i) => i + 1);
    assertClose(quantileOfSorted(hours, 0.004), 36.036, 1e-9, '1..8760 at 0.004');
    assertClose(quantileOfSorted(hours, 0.01), 88.59, 1e-9, '1..8760 at 0.010');
    assertClose(quantileOfSorted(hours, 0.996), 8724.964, 1e-9, '1..8760 at 0.996');
    const tenths = Float64Array.from({ length: 10000 }, (_, i) => i / 10);
    assertClose(quantileOfSorted(tenths, 0.004), 3.9996, 1e-9, '0.0..999.9 at 0.004');
    assertClose(quantileOfSorted(tenths, 0.01), 9.999, 1e-9, '0.0..999.9 at 0.010');
  });

  it('edge cases: empty, single value, p = 0 and 1', () => {
    assert.ok(Number.isNaN(quantileOfSorted([], 0.5)));
    assert.equal(quantileOfSorted([7], 0.004), 7);
    assert.equal(quantileOfSorted([1, 2, 3], 0), 1);
    assert.equal(quantileOfSorted([1, 2, 3], 1), 3);
    assert.equal(quantileOfSorted([1, 2, 3, 4], 0.5), 2.5);
  });

  it('agrees with d3-array (R-7) on random samples', () => {
    // d3-array quantileSorted/quantile: an independent general-purpose implementation of the R-7 rule
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -80, max: 60, noNaN: true }), { minLength: 1, maxLength: 400 }),
        fc.constantFrom(0.004, 0.01, 0.025, 0.05, 0.5, 0.95, 0.975, 0.98, 0.99, 0.996),
        (values, p) => {
          const sorted = sortedFinite(values);
          const expected = d3QuantileSorted(Array.from(sorted), p);
          assert.ok(expected !== undefined);
          assertClose(quantileOfSorted(sorted, p), expected, 1e-9 * Math.max(1, Math.abs(expected)), `p=${p}`);
          assertClose(
            quantile(values, p),
            d3Quantile(values, p) ?? NaN,
            1e-9 * Math.max(1, Math.abs(expected)),
            `p=${p} unsorted`,
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it('sortedFinite drops NaN and sorts numerically', () => {
    assert.deepEqual(Array.from(sortedFinite([10, NaN, -2, 3, 100])), [-2, 3, 10, 100]);
  });
});
