/**
 * Power of the one-sample score test of a rate against a fixed value p0, and the smallest gap from p0 it could
 * reliably detect.
 *
 * Source: J. M. Lachin (1981), "Introduction to sample size determination and power analysis for clinical trials",
 * Controlled Clinical Trials 2, 93-113, section on a single proportion (normal approximation with the null
 * variance p0(1 - p0) for the critical value and the variance p(1 - p) at the true rate p). Also S.-C. Chow, J. Shao
 * and H. Wang (2008), Sample Size Calculations in Clinical Research, 2nd ed., Chapman & Hall, section 4.1.
 *
 * With d = |p - p0| and z the upper alpha/2 (two-sided) or alpha (one-sided) normal quantile:
 *
 *     power = P(Z > (z sqrt(p0 (1 - p0)) - d sqrt(n)) / sqrt(p (1 - p)))
 *
 * (the chance of rejecting in the direction of the true rate; the other tail is left out, as in R's power.prop.test
 * with strict = FALSE). With a population of N, both variances are multiplied by the finite-population factor
 * (N - n)/(N - 1), which is the same as using n / f in place of n (Cochran 1977, Sampling Techniques, §3.3).
 */
import { normalSf, normalSfQuantile } from './distributions/normal.js';
import { smallestGapReaching } from './smallest-gap.js';
import { finitePopulationFactor } from './wilson.js';

import type { PowerSettings } from './result.js';

/** Power settings with the number eligible, for the finite-population correction. */
export interface OneProportionPower extends PowerSettings {
  /** Number eligible (N), when known: the variance is multiplied by (N − n)/(N − 1). */
  populationSize?: number;
}

function effectiveN(n: number, populationSize: number | undefined, fn: string): number {
  if (!(Number.isFinite(n) && n > 0)) throw new Error(`${fn}: the number who answered must be above 0, got ${n}`);
  if (populationSize === undefined) return n;
  const f = finitePopulationFactor(n, populationSize, fn);
  return f > 0 ? n / f : Infinity;
}

function checkRates(alpha: number, p0: number, fn: string): void {
  if (!(alpha > 0 && alpha < 1)) throw new Error(`${fn}: alpha must be between 0 and 1, got ${alpha}`);
  if (!(p0 > 0 && p0 < 1)) throw new Error(`${fn}: the fixed value p0 must be strictly between 0 and 1, got ${p0}`);
}

function powerAt(nEff: number, p: number, p0: number, zq: number): number {
  const d = Math.abs(p - p0);
  const sd1 = Math.sqrt(p * (1 - p));
  const num = zq * Math.sqrt(p0 * (1 - p0)) - d * Math.sqrt(nEff);
  if (sd1 === 0) return num < 0 ? 1 : 0;
  return normalSf(num / sd1);
}

/**
 * Power of the score test of H0: rate = p0 at level alpha when the true rate is p, with n answering (and a
 * population of N when known).
 *
 * @throws Error when n is not positive, alpha is outside (0, 1), p0 is not strictly between 0 and 1, p is outside
 *   [0, 1], or the population is smaller than n.
 */
export function powerOneProportion(n: number, p: number, p0: number, settings: OneProportionPower = {}): number {
  const { alpha = 0.05, sided = 'two-sided', populationSize } = settings;
  const fn = 'powerOneProportion';
  checkRates(alpha, p0, fn);
  if (!(p >= 0 && p <= 1)) throw new Error(`${fn}: the true rate must be between 0 and 1, got ${p}`);
  const nEff = effectiveN(n, populationSize, fn);
  return powerAt(nEff, p, p0, normalSfQuantile(sided === 'two-sided' ? alpha / 2 : alpha));
}

/**
 * The smallest gap above p0 (increase) and below it (decrease) that the score test would detect with the given
 * power; null in a direction where even a rate of 1 (or 0) would not reach it. Bisection on the power to full double
 * precision.
 *
 * @throws Error on the same conditions as {@link powerOneProportion}, or a power outside (0, 1).
 */
export function minDetectableGap(
  n: number,
  p0: number,
  settings: OneProportionPower = {},
): { increase: number | null; decrease: number | null } {
  const { alpha = 0.05, power: targetPower = 0.8, sided = 'two-sided', populationSize } = settings;
  const fn = 'minDetectableGap';
  checkRates(alpha, p0, fn);
  if (!(targetPower > 0 && targetPower < 1)) throw new Error(`${fn}: the power must be between 0 and 1, got ${targetPower}`);
  const nEff = effectiveN(n, populationSize, fn);
  const zq = normalSfQuantile(sided === 'two-sided' ? alpha / 2 : alpha);
  const solve = (s: 1 | -1): number | null =>
    smallestGapReaching((delta) => powerAt(nEff, p0 + s * delta, p0, zq), s === 1 ? 1 - p0 : p0, targetPower);
  return { increase: solve(1), decrease: solve(-1) };
}
