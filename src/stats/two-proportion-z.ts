/**
 * Pooled two-proportion z test of p1 = p2 ("department A is doing better than department B").
 *
 * Sources:
 * - J. L. Fleiss, B. Levin and M. C. Paik (2003), Statistical Methods for Rates and Proportions, 3rd ed., Wiley,
 *   section 2.5 (the pooled z test, with and without continuity correction).
 * - Matches R's prop.test(c(x1, x2), c(n1, n2)) with correct = FALSE (default here) or TRUE: chi-square = z^2.
 *
 *     pbar = (x1 + x2)/(n1 + n2),  s = 1/n1 + 1/n2,  d = x1/n1 - x2/n2,
 *     z = sign(d) (|d| - c s) / sqrt(pbar (1 - pbar) s),   c = min(1/2, |d|/s) if corrected, else 0.
 *
 * p-values: two-sided 2 P(Z > |z|), 'less' (p1 below p2) P(Z <= z), 'greater' P(Z > z).
 * The interval for p1 - p2 is Newcombe's hybrid score interval (newcombe.ts) by default, or, on request, the Wald
 * interval d -/+ (z_q sqrt(p1 q1/n1 + p2 q2/n2) + c s) that prop.test prints. For a one-sided alternative the
 * interval is one-sided at the level, with -1 or 1 as the open end. Population sizes, when given, only narrow the
 * Newcombe interval; the test itself does not use them.
 */
import type { Alternative, TestResult } from './result.js';
import { normalCdf, normalQuantile, normalSf } from './distributions/normal.js';
import { newcombeInterval } from './newcombe.js';
import { checkCounts, checkLevel } from './wilson.js';

export interface TwoProportionZOptions {
  alternative?: Alternative;
  /** Confidence level of the interval (default 0.95). */
  level?: number;
  /** Yates continuity correction (default false). */
  correct?: boolean;
  /** Interval for p1 - p2 (default 'newcombe-hybrid'). */
  interval?: 'newcombe-hybrid' | 'wald';
  populationSize1?: number;
  populationSize2?: number;
}

/**
 * Pooled z test of H0: p1 = p2 for x1 of n1 against x2 of n2; method 'two-proportion-z'. Estimate p1 - p2.
 *
 * @throws Error when counts or level are out of range, or when every answer in both groups is the same
 *   (pooled rate 0 or 1), where the test is undefined.
 */
export function twoProportionZTest(
  x1: number,
  n1: number,
  x2: number,
  n2: number,
  options: TwoProportionZOptions = {},
): TestResult {
  const fn = 'twoProportionZTest';
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  const correct = options.correct ?? false;
  checkCounts(x1, n1, fn);
  checkCounts(x2, n2, fn);
  checkLevel(level, fn);
  const pbar = (x1 + x2) / (n1 + n2);
  if (pbar === 0 || pbar === 1) {
    throw new Error(
      `${fn}: every answer in both groups is the same (${x1} of ${n1} and ${x2} of ${n2} agreeing), so the ` +
        'z test is undefined; report the two rates with their intervals instead',
    );
  }
  const p1 = x1 / n1;
  const p2 = x2 / n2;
  const d = p1 - p2;
  const s = 1 / n1 + 1 / n2;
  const c = correct ? Math.min(0.5, Math.abs(d) / s) : 0;
  const z = (Math.sign(d) * (Math.abs(d) - c * s)) / Math.sqrt(pbar * (1 - pbar) * s);
  const p =
    alternative === 'two-sided' ? Math.min(1, 2 * normalSf(Math.abs(z))) : alternative === 'less' ? normalCdf(z) : normalSf(z);

  // Two-sided interval at the level, or the matching bound of the two-sided interval at 2 level - 1.
  const twoSidedLevel = alternative === 'two-sided' ? level : 2 * level - 1;
  let lower: number;
  let upper: number;
  let method: string;
  if ((options.interval ?? 'newcombe-hybrid') === 'wald') {
    const zq = normalQuantile((1 + twoSidedLevel) / 2);
    const width = zq * Math.sqrt((p1 * (1 - p1)) / n1 + (p2 * (1 - p2)) / n2) + c * s;
    lower = Math.max(d - width, -1);
    upper = Math.min(d + width, 1);
    method = 'wald';
  } else {
    const iv = newcombeInterval(x1, n1, x2, n2, {
      level: twoSidedLevel,
      populationSize1: options.populationSize1,
      populationSize2: options.populationSize2,
    });
    lower = iv.lower;
    upper = iv.upper;
    method = iv.method;
  }
  if (alternative === 'less') lower = -1;
  if (alternative === 'greater') upper = 1;

  const warnings: string[] = [];
  const expected = [n1 * pbar, n1 * (1 - pbar), n2 * pbar, n2 * (1 - pbar)];
  if (Math.min(...expected) < 5) {
    warnings.push(
      'An expected count is below 5, so the normal approximation is rough; Fisher\'s exact test is safer here.',
    );
  }
  return {
    method: 'two-proportion-z',
    statistic: { symbol: 'z', value: z },
    p,
    alternative,
    nullValue: 0,
    estimate: { name: 'difference in proportions', value: d },
    interval: { lower, upper, level, method },
    n: [n1, n2],
    warnings,
  };
}

/** Positional form of {@link twoProportionZTest}: twoProportionZ(x1, n1, x2, n2, alternative, level). */
export function twoProportionZ(
  x1: number,
  n1: number,
  x2: number,
  n2: number,
  alternative: Alternative = 'two-sided',
  level = 0.95,
): TestResult {
  return twoProportionZTest(x1, n1, x2, n2, { alternative, level });
}
