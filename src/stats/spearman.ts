/**
 * Spearman's rank correlation rho (C. Spearman, "The proof and measurement of association between two things",
 * American Journal of Psychology 15 (1904) 72-101): Pearson's r of the ranks, ties given average ranks.
 *
 * p-value: the large-sample t approximation t = rho sqrt((n - 2) / (1 - rho^2)) on n - 2 degrees of freedom
 * (Zar, "Biostatistical Analysis", 5th ed., 2010, section 19.9; Kendall & Gibbons, "Rank Correlation Methods", 5th
 * ed., 1990, ch. 5), which is what R's cor.test(method = "spearman", exact = FALSE) computes. It is used for every n,
 * with ties or without; no exact permutation p-value is computed, so for fewer than about 10 units the p-value is
 * approximate (a warning says so). No interval is reported.
 */
import { correlationCoefficient, correlationT, pairedData, tPValue, type CorrelationOptions } from './pearson.js';
import { averageRanks } from './ranks.js';
import type { TestResult } from './result.js';

/**
 * @throws Error when lengths differ, a value is not finite, fewer than 3 pairs are given, or x or y is constant.
 */
export function spearman(
  x: readonly number[],
  y: readonly number[],
  options: Pick<CorrelationOptions, 'alternative'> = {},
): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  const d = pairedData(x, y, 'Spearman correlation');
  const n = d.x.length;
  if (n < 3) throw new Error(`Spearman correlation needs at least 3 pairs; got ${n}.`);
  const rho = correlationCoefficient(averageRanks(d.x), averageRanks(d.y));
  const df = n - 2;
  const t = correlationT(rho, df);
  const warnings: string[] = [];
  if (n < 10) warnings.push(`With ${n} units the p-value from the t approximation is rough.`);
  return {
    method: 'spearman',
    statistic: { symbol: 't', value: t },
    df,
    p: tPValue(t, df, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'Spearman rho', value: rho },
    n: [n],
    warnings,
  };
}
