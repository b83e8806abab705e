/**
 * Two one-sided tests (TOST) for equivalence of two rates within a margin ("there is no real difference between
 * the two sites" needs a margin, not a failed test).
 *
 * Sources:
 * - D. J. Schuirmann (1987), "A comparison of the two one-sided tests procedure and the power approach for
 *   assessing the equivalence of average bioavailability", Journal of Pharmacokinetics and Biopharmaceutics 15,
 *   657-680.
 * - S. Wellek (2010), Testing Statistical Hypotheses of Equivalence and Noninferiority, 2nd ed., CRC Press,
 *   chapter 6 (equivalence of two binomial rates).
 *
 * Uses the unpooled (Wald) standard error of d = p1 - p2, se = sqrt(p1 q1/n1 + p2 q2/n2):
 *
 *     z_lower = (d + margin)/se, p_lower = P(Z > z_lower)    (H0: d <= -margin)
 *     z_upper = (d - margin)/se, p_upper = P(Z <= z_upper)   (H0: d >= margin)
 *     p = max(p_lower, p_upper).
 *
 * Equivalence at level alpha (p < alpha) is the same as the Wald interval d -/+ z_{1-alpha} se, reported here at
 * confidence 1 - 2 alpha, lying inside (-margin, margin). The Newcombe interval is not used for this test.
 *
 * Finite-population correction (W. G. Cochran (1977), Sampling Techniques, 3rd ed., Wiley, §3.3): where the number
 * eligible N is given for a group, its variance p q / n takes the factor f = (N - n)/(N - 1), so
 * se = sqrt(f1 p1 q1/n1 + f2 p2 q2/n2), as in the corrected z test and Newcombe interval (finite-population.ts).
 * When both groups are a census (se = 0) the difference is known exactly: each one-sided p is 0 when its bound is
 * beaten and 1 when it is not.
 */
import type { TestResult } from './result.js';
import { normalCdf, normalSf, normalSfQuantile } from './distributions/normal.js';
import { checkCounts } from './wilson.js';

export interface OneSidedPart {
  z: number;
  p: number;
}

/**
 * Result of an equivalence test. `nullValue` is the margin; `alternative` is 'two-sided' (the gap lies inside
 * the margin on both sides); `p` is the larger of the two one-sided p-values; the interval is at 1 - 2 alpha.
 */
export interface EquivalenceResult extends TestResult {
  margin: number;
  /** Test of H0: p1 - p2 <= -margin. */
  lowerTest: OneSidedPart;
  /** Test of H0: p1 - p2 >= margin. */
  upperTest: OneSidedPart;
}

export interface TostOptions {
  /** Level of each one-sided test (default 0.05, giving a 90% interval). */
  alpha?: number;
  /** Number eligible in the first group, for the finite-population correction. */
  populationSize1?: number;
  /** Number eligible in the second group, for the finite-population correction. */
  populationSize2?: number;
}

/** (N − n)/(N − 1), or 1 without a number eligible. */
function factor(n: number, populationSize: number | undefined, fn: string): number {
  if (populationSize === undefined) return 1;
  if (!(Number.isFinite(populationSize) && populationSize >= n)) throw new Error(`${fn}: the number eligible must be at least n = ${n}, got ${populationSize}`);
  return populationSize === 1 ? 0 : (populationSize - n) / (populationSize - 1);
}

/** z = d / se, with a zero standard error giving ±Infinity for a nonzero d and 0 for none. */
function ratio(d: number, se: number): number {
  if (se > 0) return d / se;
  return d === 0 ? 0 : d > 0 ? Infinity : -Infinity;
}

/**
 * TOST for |p1 - p2| < margin with x1 of n1 and x2 of n2; method 'tost-two-proportions'.
 *
 * @throws Error when counts are out of range, the margin is not in (0, 1), alpha is not in (0, 0.5), or both
 *   groups answered all alike (standard error 0).
 */
export function tostTwoProportions(
  x1: number,
  n1: number,
  x2: number,
  n2: number,
  margin: number,
  options: TostOptions = {},
): EquivalenceResult {
  const fn = 'tostTwoProportions';
  const alpha = options.alpha ?? 0.05;
  checkCounts(x1, n1, fn);
  checkCounts(x2, n2, fn);
  if (!(margin > 0 && margin < 1)) throw new Error(`${fn}: the margin must be between 0 and 1, got ${margin}`);
  if (!(alpha > 0 && alpha < 0.5)) throw new Error(`${fn}: alpha must be between 0 and 0.5, got ${alpha}`);
  const p1 = x1 / n1;
  const p2 = x2 / n2;
  const d = p1 - p2;
  const f1 = factor(n1, options.populationSize1, fn);
  const f2 = factor(n2, options.populationSize2, fn);
  const spread = (p1 * (1 - p1)) / n1 + (p2 * (1 - p2)) / n2;
  const se = Math.sqrt((f1 * p1 * (1 - p1)) / n1 + (f2 * p2 * (1 - p2)) / n2);
  if (spread === 0) {
    throw new Error(
      `${fn}: each group answered all alike (${x1} of ${n1} and ${x2} of ${n2} agreeing), so the standard error ` +
        'is 0 and the test is undefined; report the two rates with their intervals instead',
    );
  }
  const zLower = ratio(d + margin, se);
  const zUpper = ratio(d - margin, se);
  const lowerTest = { z: zLower, p: normalSf(zLower) };
  const upperTest = { z: zUpper, p: normalCdf(zUpper) };
  const binding = lowerTest.p >= upperTest.p ? lowerTest : upperTest;
  const zc = normalSfQuantile(alpha);

  const warnings: string[] = [];
  if (Math.min(x1, n1 - x1, x2, n2 - x2) < 5) {
    warnings.push('Fewer than 5 answers fall on one side in a group, so the normal approximation is rough here.');
  }
  return {
    method: 'tost-two-proportions',
    statistic: { symbol: 'z', value: binding.z },
    p: binding.p,
    alternative: 'two-sided',
    nullValue: margin,
    estimate: { name: 'difference in proportions', value: d },
    interval: { lower: d - zc * se, upper: d + zc * se, level: 1 - 2 * alpha, method: 'wald' },
    n: [n1, n2],
    warnings,
    margin,
    lowerTest,
    upperTest,
  };
}
