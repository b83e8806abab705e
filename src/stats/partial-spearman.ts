/**
 * Partial Spearman rank correlation of x and y controlling for k variables z1..zk: every variable is replaced by its
 * ranks (ties given average ranks), and the partial correlation of the ranks is taken, i.e. the Pearson correlation
 * of the residuals of rank(x) and of rank(y) after least-squares regression (with intercept) on rank(z1)..rank(zk)
 * (the rank transformation of W. J. Conover and R. L. Iman, "Rank transformations as a bridge between parametric
 * and nonparametric statistics", The American Statistician 35 (1981) 124-129, applied to Fisher's partial
 * correlation; S. Kim, "ppcor: an R package for a fast calculation to semi-partial correlation coefficients",
 * Communications for Statistical Applications and Methods 22 (2015) 665-674, section 2).
 *
 * p-value: as for the partial correlation of values, t = rho sqrt((n - 2 - k) / (1 - rho^2)) referred to the t
 * distribution on n - 2 - k degrees of freedom (the large-sample approximation Spearman's rho itself uses, see
 * spearman.ts; Kim 2015 uses the same). It is approximate for any n and rough for small n (a warning says so). No
 * interval is reported, as for Spearman's rho.
 */
import type { CorrelationOptions } from './pearson.js';
import { partialCorrelation } from './partial-correlation.js';
import { averageRanks } from './ranks.js';
import { requireFinite } from './mean.js';
import type { TestResult } from './result.js';

/**
 * @param controls one array per control variable, each as long as x
 * @throws Error when lengths differ, a value is not finite, there are fewer than k + 3 pairs, a control's ranks are
 *   constant or collinear with the others, or the ranks of x or y are fully explained by the controls' ranks.
 */
export function partialSpearman(
  x: readonly number[],
  y: readonly number[],
  controls: readonly (readonly number[])[],
  options: Pick<CorrelationOptions, 'alternative'> = {},
): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  if (controls.length === 0) throw new Error('partial Spearman correlation needs at least one control.');
  if (x.length !== y.length) throw new Error(`partial Spearman correlation: x has ${x.length} values but y has ${y.length}.`);
  // Ranks would hide a value that is not a number, so the values themselves are checked (lengths are checked on the ranks).
  requireFinite(x, 'partial Spearman correlation: x');
  requireFinite(y, 'partial Spearman correlation: y');
  controls.forEach((z, j) => requireFinite(z, `partial Spearman correlation: control ${j + 1}`));
  // The partial correlation of the ranks, with its t test on n - 2 - k degrees of freedom; no interval is kept.
  const ranked = partialCorrelation(averageRanks(x), averageRanks(y), controls.map((z) => averageRanks(z)), { alternative });
  const n = x.length;
  const k = controls.length;
  const warnings: string[] = [];
  if (n - k < 10) warnings.push(`With ${n} units and ${k} ${k === 1 ? 'control' : 'controls'} the p-value from the t approximation is rough.`);
  return {
    method: 'partial-spearman',
    statistic: ranked.statistic as { symbol: string; value: number },
    df: ranked.df as number,
    p: ranked.p,
    alternative,
    nullValue: 0,
    estimate: { name: 'partial Spearman rho', value: ranked.estimate.value },
    n: [n],
    warnings,
  };
}
