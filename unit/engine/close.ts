import { expect } from 'vitest';

/** Asserts |actual − expected| ≤ relTol·|expected|, printing inputs, actual and expected on failure. */
export function expectClose(actual: number, expected: number, relTol: number, what: string): void {
  const err = Math.abs(actual - expected) / Math.abs(expected);
  expect(err, `${what}: actual ${actual}, expected ${expected}, relative error ${err.toExponential(3)} > ${relTol}`).toBeLessThanOrEqual(relTol);
}
