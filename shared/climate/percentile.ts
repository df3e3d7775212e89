/**
 * Percentiles by linear interpolation between order statistics (Hyndman–Fan type 7, the
 * default of R and NumPy). For n ascending values x[0..n−1] and probability p:
 * h = (n − 1)·p, value = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]) (0-based).
 */

/**
 * The p-quantile (0 ≤ p ≤ 1) of values already sorted ascending. NaN for an empty sample.
 * The caller guarantees the order; nothing is checked, so the call is O(1).
 */
export function quantileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0 || !(p >= 0 && p <= 1)) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const low = sorted[lo] ?? NaN;
  if (lo >= n - 1) return low;
  const high = sorted[lo + 1] ?? NaN;
  const frac = h - lo;
  return frac === 0 ? low : low + frac * (high - low);
}

/** Sorts a copy of the finite values ascending (numeric typed-array sort). */
export function sortedFinite(values: ArrayLike<number> & Iterable<number>): Float64Array {
  const out = new Float64Array(values.length);
  let k = 0;
  for (const v of values) {
    if (Number.isFinite(v)) out[k++] = v;
  }
  return out.subarray(0, k).sort();
}

/** The p-quantile of any finite values (copied and sorted first; NaN values are ignored). */
export function quantile(values: ArrayLike<number> & Iterable<number>, p: number): number {
  return quantileOfSorted(sortedFinite(values), p);
}
