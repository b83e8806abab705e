/**
 * Arithmetic mean, numerically careful.
 *
 * The sum uses Neumaier's improvement of Kahan compensated summation (A. Neumaier, "Rundungsfehleranalyse einiger
 * Verfahren zur Summation endlicher Summen", ZAMM 54 (1974) 39-51), and the mean is then corrected by a second pass
 * over the deviations, m = m0 + sum(x - m0) / n, as recommended by Chan, Golub & LeVeque, "Algorithms for computing the
 * sample variance: analysis and recommendations", The American Statistician 37 (1983) 242-247.
 */

/** Throws unless xs is a non-empty list of finite numbers. `what` names the data in the message. */
export function requireFinite(xs: readonly number[], what: string, minLength = 1): void {
  if (xs.length < minLength) {
    throw new Error(`${what} needs at least ${minLength} value${minLength === 1 ? '' : 's'}; got ${xs.length}.`);
  }
  for (let i = 0; i < xs.length; i++) {
    const v = xs[i]!;
    if (!Number.isFinite(v)) throw new Error(`${what}: value ${i + 1} is ${String(v)}, not a finite number.`);
  }
}

/**
 * Sum with Neumaier compensation: the rounding error of each addition is carried in a second accumulator, so the
 * result is accurate to about one rounding of the exact sum for any order of terms. O(n).
 */
export function compensatedSum(xs: readonly number[]): number {
  let s = 0;
  let c = 0;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i]!;
    const t = s + x;
    c += Math.abs(s) >= Math.abs(x) ? s - t + x : x - t + s;
    s = t;
  }
  return s + c;
}

/**
 * Mean of xs: compensated sum divided by n, then corrected by the compensated mean of the deviations.
 * @throws Error when xs is empty or holds a value that is not finite.
 * @example mean([1, 2, 3, 4]) // 2.5
 */
export function mean(xs: readonly number[]): number {
  requireFinite(xs, 'mean');
  const n = xs.length;
  const m0 = compensatedSum(xs) / n;
  let s = 0;
  let c = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i]! - m0;
    const t = s + x;
    c += Math.abs(s) >= Math.abs(x) ? s - t + x : x - t + s;
    s = t;
  }
  return m0 + (s + c) / n;
}
