/**
 * Kendall's tau-b with ties and its large-sample normal test.
 *
 * tau-b = S / sqrt((n0 - n1)(n0 - n2)), S = concordant - discordant pairs, n0 = n(n-1)/2, n1 = sum t(t-1)/2 over
 * groups of tied x, n2 likewise for y (M. G. Kendall, "The treatment of ties in ranking problems", Biometrika 33
 * (1945) 239-251). Under independence S has mean 0 and the tie-corrected variance
 *   var S = [n(n-1)(2n+5) - sum t(t-1)(2t+5) - sum u(u-1)(2u+5)] / 18
 *         + [sum t(t-1)(t-2)][sum u(u-1)(u-2)] / [9 n(n-1)(n-2)]
 *         + [sum t(t-1)][sum u(u-1)] / [2 n(n-1)]
 * (Kendall & Gibbons, "Rank Correlation Methods", 5th ed., 1990, eq. 4.3), and z = S / sqrt(var S) is referred to the
 * standard normal, without continuity correction. This is R's cor.test(method = "kendall", exact = FALSE).
 * Pairs are counted directly, O(n^2).
 */
import { normalCdf, normalSf } from './distributions/normal.js';
import { pairedData, type CorrelationOptions } from './pearson.js';
import { tieGroupSizes } from './ranks.js';
import type { Alternative, TestResult } from './result.js';

function normalPValue(z: number, alternative: Alternative): number {
  switch (alternative) {
    case 'greater':
      return normalSf(z);
    case 'less':
      return normalCdf(z);
    case 'two-sided':
      return Math.min(1, 2 * normalSf(Math.abs(z)));
  }
}

/**
 * @throws Error when lengths differ, a value is not finite, fewer than 3 pairs are given, or x or y is constant.
 */
export function kendall(
  x: readonly number[],
  y: readonly number[],
  options: Pick<CorrelationOptions, 'alternative'> = {},
): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  const d = pairedData(x, y, 'Kendall correlation');
  const n = d.x.length;
  if (n < 3) throw new Error(`Kendall correlation needs at least 3 pairs; got ${n}.`);
  let s = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      s += Math.sign(d.x[i]! - d.x[j]!) * Math.sign(d.y[i]! - d.y[j]!);
    }
  }
  const tx = tieGroupSizes(d.x);
  const ty = tieGroupSizes(d.y);
  const sum = (ts: number[], f: (t: number) => number): number => ts.reduce((a, t) => a + f(t), 0);
  const n0 = (n * (n - 1)) / 2;
  const n1 = sum(tx, (t) => (t * (t - 1)) / 2);
  const n2 = sum(ty, (t) => (t * (t - 1)) / 2);
  if (n1 === n0) throw new Error('Kendall correlation is undefined: x does not vary.');
  if (n2 === n0) throw new Error('Kendall correlation is undefined: y does not vary.');
  const tau = s / Math.sqrt((n0 - n1) * (n0 - n2));
  const varS =
    (n * (n - 1) * (2 * n + 5) - sum(tx, (t) => t * (t - 1) * (2 * t + 5)) - sum(ty, (t) => t * (t - 1) * (2 * t + 5))) /
      18 +
    (sum(tx, (t) => t * (t - 1) * (t - 2)) * sum(ty, (t) => t * (t - 1) * (t - 2))) / (9 * n * (n - 1) * (n - 2)) +
    (sum(tx, (t) => t * (t - 1)) * sum(ty, (t) => t * (t - 1))) / (2 * n * (n - 1));
  const z = s / Math.sqrt(varS);
  const warnings: string[] = [];
  if (n < 10) warnings.push(`With ${n} units the p-value from the normal approximation is rough.`);
  return {
    method: 'kendall-tau-b',
    statistic: { symbol: 'z', value: z },
    p: normalPValue(z, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'Kendall tau-b', value: Math.max(-1, Math.min(1, tau)) },
    n: [n],
    warnings,
  };
}
