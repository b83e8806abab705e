/**
 * Sample variance and standard deviation by the corrected two-pass algorithm of Chan, Golub & LeVeque,
 * "Algorithms for computing the sample variance: analysis and recommendations", The American Statistician 37 (1983)
 * 242-247, eq. 1.7:  S = sum (x - m)^2 - (sum (x - m))^2 / n, with m the mean from a first pass. The correction term
 * removes most of the error left in m, so the result keeps nearly full precision even when the data share many
 * leading digits (NIST StRD NumAcc files).
 */
import { mean, requireFinite } from './mean.js';

/** Sum of squared deviations about the mean (corrected two-pass), and the mean used. */
export function sumOfSquaredDeviations(xs: readonly number[]): { ss: number; mean: number } {
  requireFinite(xs, 'sum of squared deviations');
  const m = mean(xs);
  let ss = 0;
  let ssC = 0;
  let d = 0;
  let dC = 0;
  for (let i = 0; i < xs.length; i++) {
    const e = xs[i]! - m;
    // compensated sums of e^2 and of e
    const e2 = e * e;
    const t = ss + e2;
    ssC += Math.abs(ss) >= e2 ? ss - t + e2 : e2 - t + ss;
    ss = t;
    const u = d + e;
    dC += Math.abs(d) >= Math.abs(e) ? d - u + e : e - u + d;
    d = u;
  }
  const sum = d + dC;
  const ssTotal = ss + ssC - (sum * sum) / xs.length;
  return { ss: Math.max(0, ssTotal), mean: m };
}

/**
 * Sample variance with denominator n - 1.
 * @throws Error when fewer than two values are given or a value is not finite.
 * @example variance([2, 4, 4, 4, 5, 5, 7, 9]) // 4.571428571428571 (= 32 / 7)
 */
export function variance(xs: readonly number[]): number {
  requireFinite(xs, 'variance', 2);
  return sumOfSquaredDeviations(xs).ss / (xs.length - 1);
}

/**
 * Sample standard deviation, the square root of variance() (denominator n - 1).
 * @throws Error when fewer than two values are given or a value is not finite.
 */
export function standardDeviation(xs: readonly number[]): number {
  return Math.sqrt(variance(xs));
}
