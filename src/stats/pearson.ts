/**
 * Pearson's product-moment correlation with the t test of zero correlation and Fisher's z interval.
 *
 * r = sum (x - mx)(y - my) / sqrt(sum (x - mx)^2 sum (y - my)^2), with the means from mean() and the sums of
 * products in twice the working precision. Test of rho = 0: t = r sqrt((n - 2) / (1 - r^2)) on n - 2 degrees of
 * freedom (Student 1908; R. A. Fisher, "Frequency distribution of the values of the correlation coefficient in
 * samples from an indefinitely large population", Biometrika 10 (1915) 507-521). Interval: tanh(atanh(r) -+ z / sqrt(n - 3))
 * (R. A. Fisher, "On the 'probable error' of a coefficient of correlation deduced from a small sample", Metron 1
 * (1921) 3-32), one-sided bounds at -1 or 1 for one-sided alternatives. These are the quantities R's cor.test()
 * reports.
 *
 * Weights: with weights w the means, variances and covariance are weighted (r = sum w dx dy / sqrt(sum w dx^2 sum w dy^2)
 * with weighted means), which is the correlation of the weighted least-squares fit. The weights shape the estimate
 * only: n in the t test and in the interval stays the number of pairs with a positive weight, because those pairs
 * (units) are the independent observations; weights that are respondent counts do not multiply the number of units.
 */
import { accurateDot } from './compensated-dot.js';
import { compensatedSum, requireFinite } from './mean.js';
import { normalQuantile } from './distributions/normal.js';
import { tCdf, tSf } from './distributions/t.js';
import type { Alternative, Interval, TestResult } from './result.js';

export interface CorrelationOptions {
  /** 'greater': the correlation is positive; 'less': negative. Default 'two-sided'. */
  alternative?: Alternative;
  /** Confidence level of the interval, default 0.95. */
  level?: number;
  /** Non-negative weights, one per pair (see the module comment for how n is counted). */
  weights?: readonly number[];
}

/** Checks paired finite data of equal length (and weights), returns the pairs kept (weight > 0) and their weights. */
export function pairedData(
  x: readonly number[],
  y: readonly number[],
  what: string,
  weights?: readonly number[],
): { x: number[]; y: number[]; w: number[] | undefined } {
  if (x.length !== y.length) throw new Error(`${what}: x has ${x.length} values but y has ${y.length}.`);
  requireFinite(x, `${what}: x`);
  requireFinite(y, `${what}: y`);
  if (weights === undefined) return { x: [...x], y: [...y], w: undefined };
  if (weights.length !== x.length) throw new Error(`${what}: ${weights.length} weights for ${x.length} pairs.`);
  requireFinite(weights, `${what}: weights`);
  const out = { x: [] as number[], y: [] as number[], w: [] as number[] };
  weights.forEach((w, i) => {
    if (w < 0) throw new Error(`${what}: weight ${i + 1} is negative (${w}).`);
    if (w > 0) {
      out.x.push(x[i]!);
      out.y.push(y[i]!);
      out.w.push(w);
    }
  });
  return out;
}

function weightedMean(v: readonly number[], w: readonly number[] | undefined): number {
  if (w === undefined) {
    const m0 = compensatedSum(v) / v.length;
    return m0 + compensatedSum(v.map((a) => a - m0)) / v.length;
  }
  const sw = compensatedSum(w);
  const m0 = accurateDot(v, w) / sw;
  return m0 + accurateDot(v.map((a) => a - m0), w) / sw;
}

/**
 * The correlation coefficient alone (weighted when w is given), clamped to [-1, 1].
 * @throws Error when x or y does not vary.
 */
export function correlationCoefficient(x: readonly number[], y: readonly number[], w?: readonly number[]): number {
  const mx = weightedMean(x, w);
  const my = weightedMean(y, w);
  // Deviations scaled by their largest magnitude (r is scale-free), so squares neither underflow nor overflow.
  const scaled = (v: readonly number[], m: number): number[] => {
    const d = v.map((a) => a - m);
    const big = d.reduce((acc, a) => Math.max(acc, Math.abs(a)), 0);
    return big > 0 && Number.isFinite(big) ? d.map((a) => a / big) : d;
  };
  const dx = scaled(x, mx);
  const dy = scaled(y, my);
  const wdx = w === undefined ? dx : dx.map((d, i) => d * w[i]!);
  const wdy = w === undefined ? dy : dy.map((d, i) => d * w[i]!);
  const sxx = accurateDot(wdx, dx);
  const syy = accurateDot(wdy, dy);
  if (!(sxx > 0)) throw new Error('correlation is undefined: x does not vary.');
  if (!(syy > 0)) throw new Error('correlation is undefined: y does not vary.');
  const sxy = accurateDot(wdx, dy);
  const r = sxy / Math.sqrt(sxx * syy);
  return Math.max(-1, Math.min(1, r));
}

/** p-value of t on df degrees of freedom for the alternative (R's pt usage in cor.test). */
export function tPValue(t: number, df: number, alternative: Alternative): number {
  if (t === Infinity) return alternative === 'less' ? 1 : 0;
  if (t === -Infinity) return alternative === 'greater' ? 1 : 0;
  switch (alternative) {
    case 'greater':
      return tSf(t, df);
    case 'less':
      return tCdf(t, df);
    case 'two-sided':
      return Math.min(1, 2 * tSf(Math.abs(t), df));
  }
}

/** t = r sqrt(df / (1 - r^2)), infinite at |r| = 1. */
export function correlationT(r: number, df: number): number {
  if (r === 1) return Infinity;
  if (r === -1) return -Infinity;
  return r * Math.sqrt(df / ((1 - r) * (1 + r)));
}

/**
 * Fisher z interval tanh(atanh(r) -+ q / sqrt(m)), m = n - 3 for a plain correlation (n - 3 - k for a partial one).
 */
export function fisherZInterval(r: number, m: number, level: number, alternative: Alternative): Interval {
  if (!(level > 0 && level < 1)) throw new Error(`confidence level ${level} is not between 0 and 1.`);
  if (!(m > 0)) throw new Error('the Fisher z interval needs at least 4 pairs (n - 3 > 0).');
  const z = Math.atanh(r);
  const sigma = 1 / Math.sqrt(m);
  const clamp = (v: number): number => Math.max(-1, Math.min(1, v));
  let lower = -1;
  let upper = 1;
  if (alternative === 'two-sided') {
    const q = normalQuantile((1 + level) / 2);
    lower = Math.tanh(z - q * sigma);
    upper = Math.tanh(z + q * sigma);
  } else if (alternative === 'greater') {
    lower = Math.tanh(z - normalQuantile(level) * sigma);
  } else {
    upper = Math.tanh(z + normalQuantile(level) * sigma);
  }
  return { lower: clamp(lower), upper: clamp(upper), level, method: 'fisher-z' };
}

/**
 * Pearson correlation of paired x and y with its t test (rho = 0) and Fisher z interval.
 * @throws Error when lengths differ, a value is not finite, fewer than 3 pairs are given, or x or y does not vary.
 *   The interval is left out (with a warning) for exactly 3 pairs.
 * @example pearson([1, 2, 3, 4, 5], [2, 1, 4, 3, 5]).estimate.value // 0.8
 */
export function pearson(x: readonly number[], y: readonly number[], options: CorrelationOptions = {}): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  const d = pairedData(x, y, 'Pearson correlation', options.weights);
  const n = d.x.length;
  if (n < 3) throw new Error(`Pearson correlation needs at least 3 pairs; got ${n}.`);
  const r = correlationCoefficient(d.x, d.y, d.w);
  const df = n - 2;
  const t = correlationT(r, df);
  const warnings: string[] = [];
  if (d.w !== undefined) {
    warnings.push(`The correlation is weighted; the test counts the ${n} units, not the weights.`);
  }
  const result: TestResult = {
    method: 'pearson',
    statistic: { symbol: 't', value: t },
    df,
    p: tPValue(t, df, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'Pearson r', value: r },
    n: [n],
    warnings,
  };
  if (n > 3) result.interval = fisherZInterval(r, n - 3, level, alternative);
  else warnings.push('With 3 units there is no confidence interval for the correlation.');
  return result;
}
