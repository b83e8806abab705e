/**
 * Shared root finder for the continuous quantile functions: solves log T(u) = log target for a tail probability T
 * that is monotone in u (u = log x for positive variates), by Newton's method on the log scale, safeguarded by a
 * bracket that is widened until it holds the root and bisected whenever a Newton step leaves it.
 *
 * Source: safeguarded Newton iteration as in W. H. Press et al. (2007), Numerical Recipes, 3rd ed., section 9.4
 * ("rtsafe"); working on log T makes the function nearly linear in the far tails, so a few steps reach full accuracy.
 */

export interface LogTail {
  /** log of the tail probability at u. */
  logTail: number;
  /** derivative of log T with respect to u. */
  slope: number;
}

/**
 * Find u with logTail(u) = logTarget. `increasing` says whether T rises with u. u0 is a first guess; `lowest` and
 * `highest` bound the search (the domain of u). Returns the bound itself if the target lies beyond it.
 */
export function solveLogTail(
  f: (u: number) => LogTail,
  logTarget: number,
  u0: number,
  increasing: boolean,
  lowest: number,
  highest: number,
): number {
  const sign = increasing ? 1 : -1;
  // g(u) = sign * (log T(u) - logTarget) is increasing in u.
  const g = (u: number): { value: number; slope: number } => {
    const r = f(u);
    return { value: sign * (r.logTail - logTarget), slope: sign * r.slope };
  };
  let u = Math.min(Math.max(u0, lowest), highest);
  let r = g(u);
  if (r.value === 0) return u;
  // Bracket: lo has g < 0, hi has g > 0.
  let lo: number;
  let hi: number;
  let step = 1;
  if (r.value < 0) {
    lo = u;
    hi = u;
    for (;;) {
      hi = Math.min(hi + step, highest);
      const rh = g(hi);
      if (rh.value >= 0 || Number.isNaN(rh.value)) break;
      lo = hi;
      if (hi === highest) return highest;
      step *= 2;
    }
  } else {
    hi = u;
    lo = u;
    for (;;) {
      lo = Math.max(lo - step, lowest);
      const rl = g(lo);
      if (rl.value <= 0 || Number.isNaN(rl.value)) break;
      hi = lo;
      if (lo === lowest) return lowest;
      step *= 2;
    }
  }
  if (!(u > lo && u < hi)) u = 0.5 * (lo + hi);
  for (let iter = 0; iter < 400; iter++) {
    r = g(u);
    if (r.value === 0) return u;
    if (r.value < 0) lo = u;
    else hi = u;
    let next = u - r.value / r.slope;
    if (!(next > lo && next < hi) || !Number.isFinite(next)) next = 0.5 * (lo + hi);
    const done = Math.abs(next - u) <= 2e-16 * Math.max(1, Math.abs(u)) || hi - lo <= 2e-16 * Math.max(1, Math.abs(u));
    u = next;
    if (done) return u;
  }
  return u;
}

/** log of the smallest positive (subnormal) double and of the largest double: the search range for u = log x. */
export const LOG_MIN = Math.log(Number.MIN_VALUE);
export const LOG_MAX = Math.log(Number.MAX_VALUE);

/** x = exp(u), with the ends of the search range meaning 0 and +Infinity (a quantile beyond double range). */
export function fromLog(u: number): number {
  if (u <= LOG_MIN) return 0;
  if (u >= LOG_MAX) return Infinity;
  return Math.exp(u);
}
