import assert from 'node:assert/strict';

/** Asserts |actual − expected| ≤ tolerance, naming the quantity on failure. */
export function assertClose(
  actual: number | null | undefined,
  expected: number,
  tolerance: number,
  label = 'value',
): void {
  assert.ok(
    typeof actual === 'number' && Number.isFinite(actual),
    `${label}: expected a finite number, got ${String(actual)}`,
  );
  assert.ok(
    Math.abs(actual - expected) <= tolerance,
    `${label}: expected ${expected} ± ${tolerance}, got ${actual} (off by ${Math.abs(actual - expected)})`,
  );
}

/**
 * Walks two JSON-like values and asserts that every number agrees within the tolerance and every
 * other leaf is equal; keys must match.
 */
export function assertDeepClose(actual: unknown, expected: unknown, tolerance: number, path = '$'): void {
  if (typeof expected === 'number') {
    assertClose(actual as number, expected, tolerance, path);
    return;
  }
  if (expected !== null && typeof expected === 'object') {
    assert.ok(actual !== null && typeof actual === 'object', `${path}: expected an object`);
    const a = actual as Record<string, unknown>;
    const e = expected as Record<string, unknown>;
    assert.deepEqual(Object.keys(a).sort(), Object.keys(e).sort(), `${path}: keys differ`);
    for (const key of Object.keys(e)) assertDeepClose(a[key], e[key], tolerance, `${path}.${key}`);
    return;
  }
  assert.equal(actual, expected, path);
}
