/**
 * The tolerance policy, in one place (one tolerance per kind of quantity, not one per assertion):
 * - 'statistic' | 'p' | 'bound': relative 1e-9 against the reference library (R), for iterative or series methods.
 * - 'closed': relative 1e-12, for closed-form quantities (Wilson bounds, z statistics, means).
 * Values near zero are compared with an absolute floor of the same size, so that 0 against 1e-17 passes.
 * On failure the message prints expected, actual, delta and tolerance.
 */
import { expect } from 'vitest';

export const TOLERANCE = {
  statistic: 1e-9,
  p: 1e-9,
  bound: 1e-9,
  closed: 1e-12,
} as const;

export type Quantity = keyof typeof TOLERANCE;

export function relativeError(actual: number, expected: number): number {
  if (actual === expected) return 0;
  if (!Number.isFinite(actual) || !Number.isFinite(expected)) return Infinity;
  const scale = Math.max(Math.abs(expected), Number.MIN_VALUE);
  return Math.abs(actual - expected) / scale;
}

/** Assert |actual - expected| <= tol * max(|expected|, tiny). `what` names the quantity in the failure message. */
export function expectClose(actual: number, expected: number, quantity: Quantity | number, what = ''): void {
  const tol = typeof quantity === 'number' ? quantity : TOLERANCE[quantity];
  const delta = Math.abs(actual - expected);
  const ok =
    actual === expected ||
    (Number.isNaN(actual) && Number.isNaN(expected)) ||
    delta <= tol * Math.abs(expected) ||
    (Math.abs(expected) < tol && delta < tol);
  if (!ok) {
    expect.fail(
      `${what ? what + ': ' : ''}expected ${expected}, actual ${actual}, delta ${delta.toExponential(3)}, ` +
        `relative ${relativeError(actual, expected).toExponential(3)}, tolerance ${tol}`,
    );
  }
  expect(ok).toBe(true);
}

/** Log relative error (number of correct significant digits), as used with NIST StRD certified values. */
export function logRelativeError(actual: number, certified: number): number {
  if (actual === certified) return 15;
  if (certified === 0) return -Math.log10(Math.abs(actual));
  return Math.min(15, -Math.log10(Math.abs(actual - certified) / Math.abs(certified)));
}
