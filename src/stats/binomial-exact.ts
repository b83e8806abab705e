/**
 * Exact binomial test of one proportion against a fixed rate p0, with the Clopper-Pearson interval.
 *
 * Sources:
 * - C. J. Clopper and E. S. Pearson (1934), Biometrika 26, 404-413 (interval).
 * - A. Agresti (2013), Categorical Data Analysis, 3rd ed., section 1.4 (exact test).
 * - Two-sided p-value by the rule of R's binom.test: the sum of the probabilities of all outcomes no more likely
 *   than the one observed, with a relative allowance of 1e-7 for rounding:
 *       p = sum over k of P(X = k) for P(X = k) <= P(X = x) * (1 + 1e-7).
 *   One-sided: 'less' P(X <= x), 'greater' P(X >= x).
 * The interval is two-sided at the level, or one-sided ([0, U] for 'less', [L, 1] for 'greater') at the level.
 */
import type { Alternative, TestResult } from './result.js';
import { binomCdf, binomPmf, binomSf } from './distributions/binomial.js';
import { clopperPearsonLower, clopperPearsonUpper } from './clopper-pearson.js';
import { checkCounts, checkLevel } from './wilson.js';

export interface BinomialExactOptions {
  alternative?: Alternative;
  /** Confidence level of the interval (default 0.95). */
  level?: number;
}

const REL_ERR = 1 + 1e-7;

/** P(X <= k), 0 for k < 0. */
function cdf(k: number, n: number, p: number): number {
  return k < 0 ? 0 : k >= n ? 1 : binomCdf(k, n, p);
}
/** P(X > k), 0 for k >= n. */
function sf(k: number, n: number, p: number): number {
  return k >= n ? 0 : k < 0 ? 1 : binomSf(k, n, p);
}

function twoSidedP(x: number, n: number, p0: number): number {
  const d = binomPmf(x, n, p0);
  const m = n * p0;
  if (x === m) return 1;
  if (x < m) {
    let y = 0;
    for (let i = Math.ceil(m); i <= n; i++) if (binomPmf(i, n, p0) <= d * REL_ERR) y++;
    return Math.min(1, cdf(x, n, p0) + sf(n - y, n, p0));
  }
  let y = 0;
  for (let i = 0; i <= Math.floor(m); i++) if (binomPmf(i, n, p0) <= d * REL_ERR) y++;
  return Math.min(1, cdf(y - 1, n, p0) + sf(x - 1, n, p0));
}

/**
 * Exact binomial test of H0: p = p0 for x agreeing of n; method 'binomial-exact'. The statistic is the count x.
 *
 * @throws Error when counts are not whole numbers or out of range, the level is outside (0, 1), or p0 is not
 *   strictly between 0 and 1.
 */
export function binomialExactTest(x: number, n: number, p0: number, options: BinomialExactOptions = {}): TestResult {
  const fn = 'binomialExactTest';
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  checkCounts(x, n, fn, true);
  checkLevel(level, fn);
  if (!(p0 > 0 && p0 < 1)) throw new Error(`${fn}: the target rate p0 must be strictly between 0 and 1, got ${p0}`);

  const p =
    alternative === 'less' ? cdf(x, n, p0) : alternative === 'greater' ? sf(x - 1, n, p0) : twoSidedP(x, n, p0);
  const tail = alternative === 'two-sided' ? (1 - level) / 2 : 1 - level;
  return {
    method: 'binomial-exact',
    statistic: { symbol: 'x', value: x },
    p,
    alternative,
    nullValue: p0,
    estimate: { name: 'proportion', value: x / n },
    interval: {
      lower: alternative === 'less' ? 0 : clopperPearsonLower(x, n, tail),
      upper: alternative === 'greater' ? 1 : clopperPearsonUpper(x, n, tail),
      level,
      method: 'clopper-pearson',
    },
    n: [n],
    warnings: [],
  };
}
