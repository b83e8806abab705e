/**
 * The finite-population correction for a sample proportion, and the tests that carry it.
 *
 * Source: W. G. Cochran (1977), Sampling Techniques, 3rd ed., Wiley, §2.6 and §3.3: for a simple random sample of n
 * from a population of N, the variance of the sample proportion is f p(1 − p)/n with f = (N − n)/(N − 1). Every
 * normal-approximation figure built from that variance takes the same factor: it is as if each group had
 * n / f respondents (its effective size), which is how the detectable difference is corrected here.
 *
 * - fpcFactor(n, N) = (N − n)/(N − 1) (0 when everyone answered, 1 as N grows without bound).
 * - twoProportionZFpc: the pooled z test with z = (p1 − p2) / sqrt(p̄ (1 − p̄) (f1/n1 + f2/n2)), p̄ = (x1 + x2)/(n1 + n2)
 *   (the pooled test of two-proportion-z.ts, its variance corrected group by group).
 * - oneSampleScoreFpc: the score test of p = p0 with z = (p̂ − p0) / sqrt(p0 (1 − p0) f / n).
 *
 * When everyone in a group answered (f = 0) its rate has no sampling error: a test whose variance is zero gives
 * p = 0 for any difference and p = 1 for none.
 */
import { normalCdf, normalSf } from './distributions/normal.js';
import { newcombeInterval } from './newcombe.js';
import { wilson } from './wilson.js';
import type { Alternative, TestResult } from './result.js';

/** Effective sizes beyond this are treated as a census (f = 0) in the power formulas. */
const CENSUS_SIZE = 1e12;

/** (N − n)/(N − 1): the factor on the variance of a proportion from n of N. @throws Error unless 1 <= n <= N. */
export function fpcFactor(n: number, populationSize: number): number {
  if (!(n >= 1 && populationSize >= n && Number.isFinite(populationSize))) {
    throw new Error(`fpcFactor: need 1 <= n <= N, got n = ${n}, N = ${populationSize}`);
  }
  return populationSize === 1 ? 0 : (populationSize - n) / (populationSize - 1);
}

/** n / f, the size a group would need without the correction to have the same variance (capped for a census). */
export function effectiveSize(n: number, populationSize: number): number {
  const f = fpcFactor(n, populationSize);
  return f === 0 ? CENSUS_SIZE : Math.min(CENSUS_SIZE, n / f);
}

function pFromZ(z: number, alternative: Alternative): number {
  if (Number.isNaN(z)) return 1;
  if (alternative === 'less') return normalCdf(z);
  if (alternative === 'greater') return normalSf(z);
  return Math.min(1, 2 * normalSf(Math.abs(z)));
}

/** z = d / se, with a zero standard error giving ±Infinity for a difference and 0 for none. */
function ratio(d: number, se: number): number {
  if (se > 0) return d / se;
  return d === 0 ? 0 : d > 0 ? Infinity : -Infinity;
}

/** One group of a corrected two-group test: agreeing x of n answering, out of populationSize eligible. */
export interface CorrectedGroup {
  x: number;
  n: number;
  populationSize: number;
}

/**
 * Pooled two-proportion z test with the finite-population correction; method 'two-proportion-z-fpc'. The interval
 * is Newcombe's hybrid score interval from the two corrected Wilson intervals.
 * @throws Error when counts are out of range or every answer in both groups is the same.
 */
export function twoProportionZFpc(
  first: CorrectedGroup,
  second: CorrectedGroup,
  options: { alternative?: Alternative; level?: number } = {},
): TestResult {
  const { x: x1, n: n1, populationSize: populationSize1 } = first;
  const { x: x2, n: n2, populationSize: populationSize2 } = second;
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  const pbar = (x1 + x2) / (n1 + n2);
  if (pbar === 0 || pbar === 1) throw new Error('twoProportionZFpc: every answer in both groups is the same, so the z test is undefined');
  const f1 = fpcFactor(n1, populationSize1);
  const f2 = fpcFactor(n2, populationSize2);
  const d = x1 / n1 - x2 / n2;
  const z = ratio(d, Math.sqrt(pbar * (1 - pbar) * (f1 / n1 + f2 / n2)));
  return {
    method: 'two-proportion-z-fpc',
    statistic: { symbol: 'z', value: z },
    p: pFromZ(z, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'difference in proportions', value: d },
    interval: newcombeInterval(x1, n1, x2, n2, { level, populationSize1, populationSize2 }),
    n: [n1, n2],
    warnings: [],
  };
}

/**
 * Score test of p = p0 with the finite-population correction; method 'one-sample-score-fpc'. The interval is the
 * corrected Wilson interval of the rate.
 * @throws Error when counts are out of range or p0 is not strictly between 0 and 1.
 */
export function oneSampleScoreFpc(
  x: number,
  n: number,
  populationSize: number,
  p0: number,
  options: { alternative?: Alternative; level?: number } = {},
): TestResult {
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  if (!(p0 > 0 && p0 < 1)) throw new Error(`oneSampleScoreFpc: p0 must be strictly between 0 and 1, got ${p0}`);
  const f = fpcFactor(n, populationSize);
  const d = x / n - p0;
  const z = ratio(d, Math.sqrt((p0 * (1 - p0) * f) / n));
  return {
    method: 'one-sample-score-fpc',
    statistic: { symbol: 'z', value: z },
    p: pFromZ(z, alternative),
    alternative,
    nullValue: p0,
    estimate: { name: 'proportion', value: x / n },
    interval: wilson(x, n, level, populationSize).interval,
    n: [n],
    warnings: [],
  };
}
