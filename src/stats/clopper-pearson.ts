/**
 * Clopper-Pearson ("exact") interval for one proportion.
 *
 * Sources:
 * - C. J. Clopper and E. S. Pearson (1934), "The use of confidence or fiducial limits illustrated in the case of the
 *   binomial", Biometrika 26, 404-413.
 * - R. G. Newcombe (1998), Statistics in Medicine 17, 857-872, method 5.
 *
 * The lower bound L solves P(X >= x | L) = a, the upper bound U solves P(X <= x | U) = a, where a is the tail
 * probability ((1 - level)/2 for a two-sided interval). Through the binomial-beta relation these are beta quantiles:
 *
 *     I_L(x, n - x + 1) = a,        I_{1-U}(n - x, x + 1) = a   (so U = 1 - that root),
 *
 * with I the regularized incomplete beta function. Both are found by bisection on I to full double precision
 * (geometric steps while the bracket spans more than a factor of 2, so tiny bounds keep their relative accuracy).
 * L = 0 when x = 0 and U = 1 when x = n.
 */
import type { RateEstimate } from './result.js';
import { regularizedBeta } from './distributions/special.js';
import { checkCounts, checkLevel } from './wilson.js';

export interface ClopperPearsonOptions {
  /** Confidence level, between 0 and 1 (default 0.95). */
  level?: number;
}

/** The t in (0, 1) with I_t(a, b) = target, for 0 < target < 1 (increasing in t). */
function betaQuantile(target: number, a: number, b: number): number {
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 2000; i++) {
    const mid = lo > 0 && hi / lo > 2 ? Math.sqrt(lo * hi) : lo === 0 ? hi / 2 : lo + (hi - lo) / 2;
    if (mid <= lo || mid >= hi) break;
    if (regularizedBeta(mid, a, b) < target) lo = mid;
    else hi = mid;
  }
  return lo === 0 ? hi : lo + (hi - lo) / 2;
}

/** Lower Clopper-Pearson bound with tail probability `tail` (0 when x = 0). */
export function clopperPearsonLower(x: number, n: number, tail: number): number {
  return x === 0 ? 0 : betaQuantile(tail, x, n - x + 1);
}

/** Upper Clopper-Pearson bound with tail probability `tail` (1 when x = n). */
export function clopperPearsonUpper(x: number, n: number, tail: number): number {
  return x === n ? 1 : 1 - betaQuantile(tail, n - x, x + 1);
}

/**
 * Two-sided Clopper-Pearson interval for x of n at `level`; method 'clopper-pearson'.
 *
 * @throws Error when counts are not whole numbers, n is not positive, x is outside 0..n, or the level is outside
 *   (0, 1).
 * @example clopperPearsonInterval(1, 29) // 0.0009 to 0.1776 (Newcombe 1998, Table I)
 */
export function clopperPearsonInterval(x: number, n: number, options: ClopperPearsonOptions = {}): RateEstimate {
  const fn = 'clopperPearsonInterval';
  const level = options.level ?? 0.95;
  checkCounts(x, n, fn, true);
  checkLevel(level, fn);
  const tail = (1 - level) / 2;
  return {
    x,
    n,
    p: x / n,
    interval: {
      lower: clopperPearsonLower(x, n, tail),
      upper: clopperPearsonUpper(x, n, tail),
      level,
      method: 'clopper-pearson',
    },
  };
}
