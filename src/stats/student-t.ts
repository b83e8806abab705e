/**
 * Student's two-sample t test with a pooled variance (equal variances assumed), from summary statistics
 * (mean, standard deviation, n per group) or from raw values.
 *
 * Sources:
 * - "Student" (Gosset W. S.) (1908) "The probable error of a mean", Biometrika 6, 1–25.
 * - Fisher R. A. (1925) Statistical Methods for Research Workers, §24 (the two-sample form with pooled variance).
 * Computed as R's t.test(x, y, var.equal = TRUE): pooled variance s² = ((n₁−1)s₁² + (n₂−1)s₂²) / (n₁+n₂−2),
 * standard error s·sqrt(1/n₁ + 1/n₂), t = (m₁ − m₂ − μ₀) / se on n₁+n₂−2 degrees of freedom; the interval for
 * m₁ − m₂ is two-sided or one-sided (one bound infinite) to match the alternative, as R gives it.
 *
 * Welch's test (welch-t.ts) is the safer default when the groups' spreads may differ; this one is kept for
 * comparison with published results that assumed equal variances.
 *
 * @throws Error when a group has no observations, both groups together have fewer than 3, a value, mean or
 *   standard deviation is not finite, a standard deviation is negative, the confidence level is not in (0, 1), or
 *   the standard error is zero (all values equal: the data are constant).
 */
import { tCdf, tQuantile, tSf } from './distributions/t.js';
import type { Alternative, TestResult } from './result.js';

/** One group's summary statistics. `sd` is the sample standard deviation (divisor n − 1). */
export interface GroupSummary {
  mean: number;
  sd: number;
  n: number;
}

export interface TTestOptions {
  alternative?: Alternative;
  /** Difference in means under the null hypothesis (default 0). */
  mu?: number;
  /** Confidence level of the interval for the difference (default 0.95). */
  level?: number;
}

export interface TTestResult extends TestResult {
  statistic: { symbol: string; value: number };
  df: number;
  interval: { lower: number; upper: number; level: number; method: string };
  /** Standard error of the difference in means. */
  standardError: number;
  /** Group means in input order. */
  means: [number, number];
}

export function studentT(a: GroupSummary, b: GroupSummary, options: TTestOptions = {}): TTestResult {
  checkSummary(a, 'first', 'studentT', 1);
  checkSummary(b, 'second', 'studentT', 1);
  const df = a.n + b.n - 2;
  if (df < 1) throw new Error(`studentT: ${a.n + b.n} observations in all; the pooled t test needs at least 3`);
  let ss = 0;
  if (a.n > 1) ss += (a.n - 1) * a.sd * a.sd;
  if (b.n > 1) ss += (b.n - 1) * b.sd * b.sd;
  const se = Math.sqrt((ss / df) * (1 / a.n + 1 / b.n));
  return finishT('student-t', a, b, se, df, options, 'studentT');
}

/** Student's pooled t test from raw values (non-finite values are an error, not silently dropped). */
export function studentTRaw(x: readonly number[], y: readonly number[], options: TTestOptions = {}): TTestResult {
  return studentT(summarize(x, 'first', 'studentTRaw'), summarize(y, 'second', 'studentTRaw'), options);
}

/** Mean and sample standard deviation (two-pass, compensated sums). */
export function summarize(values: readonly number[], which: string, who: string): GroupSummary {
  const n = values.length;
  if (n === 0) throw new Error(`${who}: the ${which} group has no values`);
  values.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new Error(`${who}: value ${i + 1} of the ${which} group is ${v}; values must be finite numbers`);
  });
  const mean = kahanSum(values) / n;
  // Second pass with the correction term (as R's mean does) and centred squares.
  const mean2 = mean + kahanSum(values.map((v) => v - mean)) / n;
  const sd = n > 1 ? Math.sqrt(kahanSum(values.map((v) => (v - mean2) * (v - mean2))) / (n - 1)) : 0;
  return { mean: mean2, sd, n };
}

function kahanSum(values: readonly number[]): number {
  let sum = 0;
  let carry = 0;
  for (const v of values) {
    const y = v - carry;
    const t = sum + y;
    carry = t - sum - y;
    sum = t;
  }
  return sum;
}

export function checkSummary(g: GroupSummary, which: string, who: string, minN: number): void {
  if (!Number.isInteger(g.n) || g.n < minN) {
    throw new Error(`${who}: the ${which} group has n = ${g.n}; it needs a whole number of at least ${minN} observations`);
  }
  if (!Number.isFinite(g.mean)) throw new Error(`${who}: the ${which} group's mean is ${g.mean}; give a finite mean`);
  if (g.n > 1 && !(Number.isFinite(g.sd) && g.sd >= 0)) {
    throw new Error(`${who}: the ${which} group's standard deviation is ${g.sd}; give a finite number >= 0`);
  }
}

/** Statistic, p-value and interval, shared by the pooled and Welch tests (R's t.test, same formulas). */
export function finishT(
  method: string,
  a: GroupSummary,
  b: GroupSummary,
  se: number,
  df: number,
  options: TTestOptions,
  who: string,
): TTestResult {
  const alternative = options.alternative ?? 'two-sided';
  const mu = options.mu ?? 0;
  const level = options.level ?? 0.95;
  if (!Number.isFinite(mu)) throw new Error(`${who}: the null difference mu is ${mu}; give a finite number`);
  if (!(level > 0 && level < 1)) throw new Error(`${who}: confidence level ${level} is not between 0 and 1`);
  const diff = a.mean - b.mean;
  if (!(se >= 10 * Number.EPSILON * Math.max(Math.abs(a.mean), Math.abs(b.mean))) || se === 0) {
    throw new Error(`${who}: the standard error is zero (every value is the same), so a t test is not possible`);
  }
  const t = (diff - mu) / se;
  let p: number;
  let lower: number;
  let upper: number;
  if (alternative === 'two-sided') {
    p = 2 * tSf(Math.abs(t), df);
    const q = tQuantile(1 - (1 - level) / 2, df);
    lower = diff - q * se;
    upper = diff + q * se;
  } else if (alternative === 'less') {
    p = tCdf(t, df);
    lower = -Infinity;
    upper = diff + tQuantile(level, df) * se;
  } else {
    p = tSf(t, df);
    lower = diff - tQuantile(level, df) * se;
    upper = Infinity;
  }
  return {
    method,
    statistic: { symbol: 't', value: t },
    df,
    p: Math.min(1, p),
    alternative,
    nullValue: mu,
    estimate: { name: 'difference in means', value: diff },
    interval: { lower, upper, level, method },
    n: [a.n, b.n],
    warnings: [],
    standardError: se,
    means: [a.mean, b.mean],
  };
}
