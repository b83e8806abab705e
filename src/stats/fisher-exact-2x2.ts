/**
 * Fisher's exact test for two rates (a 2x2 table), for small groups where the z test's approximation is rough.
 *
 * Sources:
 * - R. A. Fisher (1935), "The logic of inductive inference", Journal of the Royal Statistical Society 98, 39-82.
 * - A. Agresti (2013), Categorical Data Analysis, 3rd ed., section 3.5.
 * - Two-sided p-value by the rule of R's fisher.test: with the margins fixed, the number agreeing in group 1 is
 *   hypergeometric under H0; p is the sum of the probabilities of all tables no more likely than the one observed,
 *   with a relative allowance of 1e-7: sum of P(X = k) for P(X = k) <= P(X = x1) (1 + 1e-7).
 *   'less' (p1 below p2) is P(X <= x1), 'greater' is P(X >= x1).
 *
 * The table is given by its cells, as R's matrix(c(a, c, b, d), 2):
 *
 *                 agreeing   not agreeing
 *     group 1        a            b
 *     group 2        c            d
 *
 * so x1 = a of n1 = a + b and x2 = c of n2 = c + d. Estimate: p1 - p2, with Newcombe's hybrid score interval
 * (newcombe.ts; one-sided at the level for a one-sided alternative), so that every rate comparison reports a gap
 * in the reader's units. The conditional odds ratio is not reported.
 */
import type { Alternative, TestResult } from './result.js';
import { hyperCdf, hyperPmf, hyperSf } from './distributions/hypergeometric.js';
import { newcombeInterval } from './newcombe.js';
import { checkCounts, checkLevel } from './wilson.js';

export interface FisherExact2x2Options {
  alternative?: Alternative;
  /** Confidence level of the interval (default 0.95). */
  level?: number;
}

const REL_ERR = 1 + 1e-7;

/**
 * Fisher's exact test of H0: p1 = p2 for the table [[a, b], [c, d]] (a of a + b agreeing in group 1, c of c + d in
 * group 2); method 'fisher-exact-2x2'. The fifth argument is the alternative or an options object.
 *
 * @throws Error when a cell is negative or not a whole number, a group is empty, or the level is outside (0, 1).
 */
export function fisherExact2x2(
  a: number,
  b: number,
  c: number,
  d: number,
  alternativeOrOptions: Alternative | FisherExact2x2Options = {},
): TestResult {
  const fn = 'fisherExact2x2';
  const options = typeof alternativeOrOptions === 'string' ? { alternative: alternativeOrOptions } : alternativeOrOptions;
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  for (const [name, v] of [['a', a], ['b', b], ['c', c], ['d', d]] as const) {
    if (!(Number.isInteger(v) && v >= 0)) throw new Error(`${fn}: cell ${name} must be a whole number of 0 or more, got ${v}`);
  }
  const x1 = a;
  const n1 = a + b;
  const x2 = c;
  const n2 = c + d;
  checkCounts(x1, n1, fn, true);
  checkCounts(x2, n2, fn, true);
  checkLevel(level, fn);

  // R's dhyper(x, m, n, k): m agreeing in all, n not agreeing in all, k drawn (group 1).
  const m = x1 + x2;
  const nn = n1 + n2 - m;
  const k = n1;
  const lo = Math.max(0, k - nn);
  const hi = Math.min(k, m);
  let p: number;
  if (alternative === 'less') {
    p = x1 >= hi ? 1 : hyperCdf(x1, m, nn, k);
  } else if (alternative === 'greater') {
    p = x1 <= lo ? 1 : hyperSf(x1 - 1, m, nn, k);
  } else {
    const d = hyperPmf(x1, m, nn, k) * REL_ERR;
    let sum = 0;
    for (let i = lo; i <= hi; i++) {
      const pi = hyperPmf(i, m, nn, k);
      if (pi <= d) sum += pi;
    }
    p = Math.min(1, sum);
  }

  const twoSidedLevel = alternative === 'two-sided' ? level : 2 * level - 1;
  const iv = newcombeInterval(x1, n1, x2, n2, { level: twoSidedLevel });
  return {
    method: 'fisher-exact-2x2',
    p,
    alternative,
    nullValue: 0,
    estimate: { name: 'difference in proportions', value: x1 / n1 - x2 / n2 },
    interval: {
      lower: alternative === 'less' ? -1 : iv.lower,
      upper: alternative === 'greater' ? 1 : iv.upper,
      level,
      method: iv.method,
    },
    n: [n1, n2],
    warnings: [],
  };
}
