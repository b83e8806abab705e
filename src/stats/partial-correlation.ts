/**
 * Partial correlation of x and y controlling for k variables z1..zk: the Pearson correlation of the residuals of x
 * and of y after least-squares regression (with intercept) on z1..zk (Fisher, "The distribution of the partial
 * correlation coefficient", Metron 3 (1924) 329-332; Anderson, "An Introduction to Multivariate Statistical
 * Analysis", 3rd ed., 2003, section 4.3). Under the null hypothesis of zero partial correlation,
 * t = r sqrt((n - 2 - k) / (1 - r^2)) has a t distribution with n - 2 - k degrees of freedom, and the Fisher z
 * interval uses standard error 1 / sqrt(n - 3 - k) (Anderson, Theorem 4.3.5).
 */
import { leastSquares } from './least-squares.js';
import {
  correlationCoefficient,
  correlationT,
  fisherZInterval,
  pairedData,
  tPValue,
  type CorrelationOptions,
} from './pearson.js';
import { requireFinite } from './mean.js';
import type { TestResult } from './result.js';

/**
 * @param controls one array per control variable, each as long as x
 * @throws Error when lengths differ, a value is not finite, there are fewer than k + 3 pairs, a control variable is
 *   constant or collinear with the others, or x or y is fully explained by the controls.
 */
export function partialCorrelation(
  x: readonly number[],
  y: readonly number[],
  controls: readonly (readonly number[])[],
  options: Pick<CorrelationOptions, 'alternative' | 'level'> = {},
): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  const d = pairedData(x, y, 'partial correlation');
  const n = d.x.length;
  const k = controls.length;
  controls.forEach((z, j) => {
    if (z.length !== n) throw new Error(`partial correlation: control ${j + 1} has ${z.length} values for ${n} pairs.`);
    requireFinite(z, `partial correlation: control ${j + 1}`);
  });
  const df = n - 2 - k;
  if (df < 1) throw new Error(`partial correlation with ${k} controls needs at least ${k + 3} pairs; got ${n}.`);
  const names = controls.map((_, j) => `control ${j + 1}`);
  const residualsOf = (v: number[]): number[] =>
    k === 0 ? v : leastSquares(controls, v, { names }).residuals;
  let r: number;
  try {
    r = correlationCoefficient(residualsOf(d.x), residualsOf(d.y));
  } catch (e) {
    if (e instanceof Error && e.message.includes('does not vary')) {
      throw new Error(`partial correlation is undefined: ${/: x does/.test(e.message) ? 'x' : 'y'} is fully explained by the controls.`);
    }
    throw e;
  }
  const t = correlationT(r, df);
  const warnings: string[] = [];
  const result: TestResult = {
    method: 'partial-pearson',
    statistic: { symbol: 't', value: t },
    df,
    p: tPValue(t, df, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'partial r', value: r },
    n: [n],
    warnings,
  };
  if (n - 3 - k > 0) result.interval = fisherZInterval(r, n - 3 - k, level, alternative);
  else warnings.push('There are too few units for a confidence interval of the partial correlation.');
  return result;
}
