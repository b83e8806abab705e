/**
 * Power of the pooled two-proportion z test, and the smallest difference it could reliably detect.
 *
 * Sources:
 * - J. L. Fleiss, B. Levin and M. C. Paik (2003), Statistical Methods for Rates and Proportions, 3rd ed., Wiley,
 *   section 4.2 (normal-approximation power of the pooled test: null spread from the pooled rate, spread under
 *   the alternative from the two rates).
 * - Matches R's power.prop.test when n1 = n2 = n (its formula is the case n1 = n2 of the one below).
 *
 * With d = |p1 - p2|, pbar = (n1 p1 + n2 p2)/(n1 + n2), and z the upper alpha/2 (two-sided) or alpha (one-sided)
 * normal quantile:
 *
 *     V0 = pbar (1 - pbar) (1/n1 + 1/n2),      V1 = p1 (1 - p1)/n1 + p2 (1 - p2)/n2,
 *     power = P(Z > (z sqrt(V0) - d) / sqrt(V1))        [+ P(Z > (z sqrt(V0) + d) / sqrt(V1)) when strict, two-sided]
 *
 * For n1 = n2 = n, pbar = (p1 + p2)/2 and this is R's formula term for term. One-sided power assumes the true
 * difference lies in the direction tested (as R does). `strict` adds the chance of rejecting in the wrong
 * direction (R's strict = TRUE); it is off by default, as in R.
 */
import { normalSf, normalSfQuantile } from './distributions/normal.js';
import { smallestGapReaching } from './smallest-gap.js';

import type { PowerSettings, Sided } from './result.js';

export type { Sided };

export interface PowerOptions extends PowerSettings {
  /** Count rejections in the wrong direction too (two-sided only; default false). */
  strict?: boolean;
}

function checkArgs(n1: number, n2: number, alpha: number, fn: string): void {
  if (!(Number.isFinite(n1) && n1 > 0 && Number.isFinite(n2) && n2 > 0)) {
    throw new Error(`${fn}: both group sizes must be above 0, got n1 = ${n1}, n2 = ${n2}`);
  }
  if (!(alpha > 0 && alpha < 1)) throw new Error(`${fn}: alpha must be between 0 and 1, got ${alpha}`);
}

function power(n1: number, n2: number, p1: number, p2: number, zq: number, strict: boolean): number {
  const d = Math.abs(p1 - p2);
  const pbar = (n1 * p1 + n2 * p2) / (n1 + n2);
  const sd0 = Math.sqrt(pbar * (1 - pbar) * (1 / n1 + 1 / n2));
  const sd1 = Math.sqrt((p1 * (1 - p1)) / n1 + (p2 * (1 - p2)) / n2);
  const main = normalSf((zq * sd0 - d) / sd1);
  return strict ? main + normalSf((zq * sd0 + d) / sd1) : main;
}

/**
 * Power of the pooled two-proportion z test at level alpha when the true rates are p1 (n1 answering) and p2
 * (n2 answering).
 *
 * @throws Error when a size is not positive, alpha is outside (0, 1), a rate is outside [0, 1], or both rates are 0
 *   or both are 1 (no variation, power undefined).
 */
export function powerTwoProportions(
  n1: number,
  n2: number,
  p1: number,
  p2: number,
  options: PowerOptions = {},
): number {
  const { alpha = 0.05, sided = 'two-sided' } = options;
  const fn = 'powerTwoProportions';
  checkArgs(n1, n2, alpha, fn);
  if (!(p1 >= 0 && p1 <= 1 && p2 >= 0 && p2 <= 1)) {
    throw new Error(`${fn}: rates must be between 0 and 1, got p1 = ${p1}, p2 = ${p2}`);
  }
  if (p1 * (1 - p1) + p2 * (1 - p2) === 0) {
    throw new Error(`${fn}: both rates are 0 or 1 (p1 = ${p1}, p2 = ${p2}), so the power is undefined`);
  }
  const zq = normalSfQuantile(sided === 'two-sided' ? alpha / 2 : alpha);
  return power(n1, n2, p1, p2, zq, (options.strict ?? false) && sided === 'two-sided');
}

export interface DetectableDifference {
  /** Smallest rise above the base rate detectable with the given power, in proportion units; null if none is. */
  increase: number | null;
  /** Smallest fall below the base rate detectable with the given power, in proportion units; null if none is. */
  decrease: number | null;
}

/**
 * Minimum detectable difference: the smallest gap delta such that the pooled z test at level alpha has at least
 * the given power when group 2's rate is `baseRate` and group 1's is baseRate + delta (increase) or
 * baseRate - delta (decrease). Found by bisection on the power function to full double precision; a direction is
 * null when even the largest possible gap (to a rate of 1 or 0) does not reach the power.
 *
 * @throws Error when sizes, alpha or power are out of range, or the base rate is not between 0 and 1.
 */
export function minDetectableDifference(
  n1: number,
  n2: number,
  baseRate: number,
  settings: PowerSettings = {},
): DetectableDifference {
  const { alpha = 0.05, power: targetPower = 0.8, sided = 'two-sided' } = settings;
  const fn = 'minDetectableDifference';
  checkArgs(n1, n2, alpha, fn);
  if (!(baseRate >= 0 && baseRate <= 1)) {
    throw new Error(`${fn}: the base rate must be between 0 and 1, got ${baseRate}`);
  }
  if (!(targetPower > 0 && targetPower < 1)) {
    throw new Error(`${fn}: the power must be between 0 and 1, got ${targetPower}`);
  }
  const zq = normalSfQuantile(sided === 'two-sided' ? alpha / 2 : alpha);
  // A base rate of 0% or 100% leaves room on one side only: a fall from 100% (or a rise from 0%) is still detectable,
  // its power rising with the gap as for any base; the side with no room has no detectable gap.
  const solve = (sign: 1 | -1): number | null => {
    const room = sign === 1 ? 1 - baseRate : baseRate;
    return room > 0 ? smallestGapReaching((delta) => power(n1, n2, baseRate + sign * delta, baseRate, zq, false), room, targetPower) : null;
  };
  return { increase: solve(1), decrease: solve(-1) };
}
