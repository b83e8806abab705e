/**
 * Welch's two-sample t test (unequal variances), from summary statistics (mean, standard deviation, n per group)
 * or from raw values.
 *
 * Sources:
 * - Welch B. L. (1947) "The generalization of 'Student's' problem when several different population variances are
 *   involved", Biometrika 34, 28–35.
 * - Satterthwaite F. E. (1946) "An approximate distribution of estimates of variance components", Biometrics
 *   Bulletin 2, 110–114 (the degrees of freedom).
 * Computed as R's t.test(x, y) (var.equal = FALSE): se = sqrt(s₁²/n₁ + s₂²/n₂),
 * df = se⁴ / ((s₁²/n₁)²/(n₁−1) + (s₂²/n₂)²/(n₂−1)), t = (m₁ − m₂ − μ₀) / se; the interval for m₁ − m₂ is
 * two-sided or one-sided (one bound infinite) to match the alternative.
 *
 * @throws Error when a group has fewer than 2 observations, a value, mean or standard deviation is not finite, a
 *   standard deviation is negative, the confidence level is not in (0, 1), or both groups are constant.
 */
import { checkSummary, finishT, summarize, type GroupSummary, type TTestOptions, type TTestResult } from './student-t.js';

export function welchT(a: GroupSummary, b: GroupSummary, options: TTestOptions = {}): TTestResult {
  checkSummary(a, 'first', 'welchT', 2);
  checkSummary(b, 'second', 'welchT', 2);
  const va = (a.sd * a.sd) / a.n;
  const vb = (b.sd * b.sd) / b.n;
  const se2 = va + vb;
  const se = Math.sqrt(se2);
  const df = (se2 * se2) / ((va * va) / (a.n - 1) + (vb * vb) / (b.n - 1));
  return finishT('welch-t', a, b, se, df, options, 'welchT');
}

/** Welch's t test from raw values (non-finite values are an error, not silently dropped). */
export function welchTRaw(x: readonly number[], y: readonly number[], options: TTestOptions = {}): TTestResult {
  return welchT(summarize(x, 'first', 'welchTRaw'), summarize(y, 'second', 'welchTRaw'), options);
}
