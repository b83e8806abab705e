/**
 * The binomial distribution: X successes in n independent trials with success probability p (R: dbinom, pbinom,
 * qbinom).
 *
 * Sources:
 * - Probability mass by C. Loader (2000), "Fast and accurate computation of binomial probabilities": the
 *   saddle-point form exp(stirlerr(n) - stirlerr(k) - stirlerr(n - k) - bd0(k, np) - bd0(n - k, nq)) /
 *   sqrt(2 pi k (n - k) / n), accurate in relative terms for any n.
 * - Tails as regularized incomplete beta functions (Abramowitz & Stegun 1964, 26.5.24):
 *   P(X > k) = I_p(k + 1, n - k) and P(X <= k) = I_{1-p}(n - k, k + 1), each computed directly (special.ts).
 */
import { requireCount, requireInteger, requireProbability } from './check.js';
import { deviance, regularizedBetaPair, stirlingRemainder } from './special.js';

function checkParams(n: number, p: number, fn: string): void {
  requireCount(n, 'n', fn);
  requireProbability(p, 'p', fn);
}

/** Loader's dbinom_raw: P(X = k) for integer 0 <= k <= n, with q = 1 - p given separately. */
export function binomPmfRaw(k: number, n: number, p: number, q: number): number {
  if (p === 0) return k === 0 ? 1 : 0;
  if (q === 0) return k === n ? 1 : 0;
  if (k === 0) {
    if (n === 0) return 1;
    return Math.exp(p < 0.1 ? -deviance(n, n * q) - n * p : n * Math.log(q));
  }
  if (k === n) {
    return Math.exp(q < 0.1 ? -deviance(n, n * p) - n * q : n * Math.log(p));
  }
  if (k < 0 || k > n) return 0;
  const lc =
    stirlingRemainder(n) -
    stirlingRemainder(k) -
    stirlingRemainder(n - k) -
    deviance(k, n * p) -
    deviance(n - k, n * q);
  const lf = Math.log(2 * Math.PI) + Math.log(k) + Math.log1p(-k / n);
  return Math.exp(lc - 0.5 * lf);
}

/** P(X = k) (R: dbinom(k, n, p)). k must be a whole number; outside 0..n gives 0. */
export function binomPmf(k: number, n: number, p: number): number {
  requireInteger(k, 'k', 'binomPmf');
  checkParams(n, p, 'binomPmf');
  if (k < 0 || k > n) return 0;
  return binomPmfRaw(k, n, p, 1 - p);
}

/** P(X <= k) (R: pbinom(k, n, p)). k must be a whole number. */
export function binomCdf(k: number, n: number, p: number): number {
  requireInteger(k, 'k', 'binomCdf');
  checkParams(n, p, 'binomCdf');
  if (k < 0) return 0;
  if (k >= n) return 1;
  if (p === 0) return 1;
  if (p === 1) return 0;
  // P(X <= k) = 1 - I_p(k + 1, n - k)
  return regularizedBetaPair(p, k + 1, n - k, 1 - p).upper;
}

/** P(X > k) (R: pbinom(k, n, p, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function binomSf(k: number, n: number, p: number): number {
  requireInteger(k, 'k', 'binomSf');
  checkParams(n, p, 'binomSf');
  if (k < 0) return 1;
  if (k >= n) return 0;
  if (p === 0) return 0;
  if (p === 1) return 1;
  return regularizedBetaPair(p, k + 1, n - k, 1 - p).lower;
}

/**
 * The smallest k with P(X <= k) >= q (R: qbinom(q, n, p)). The target is lowered by 64 machine epsilons so that
 * a q computed as a cdf value maps back to its own k (the fuzz R uses; common practice for discrete quantiles).
 */
export function binomQuantile(q: number, n: number, p: number): number {
  requireProbability(q, 'q', 'binomQuantile');
  checkParams(n, p, 'binomQuantile');
  if (q === 0 || p === 0) return 0;
  if (q === 1 || p === 1) return n;
  const target = q * (1 - 64 * Number.EPSILON);
  // Start from the mean and walk; the walk is short because the step is one standard deviation at first.
  const sd = Math.sqrt(n * p * (1 - p));
  let k = Math.min(n, Math.max(0, Math.round(n * p)));
  let step = Math.max(1, Math.floor(sd));
  // Find a k with cdf(k) >= target, then bisect down to the smallest.
  let lo = -1; // cdf(lo) < target (lo = -1 means cdf = 0)
  let hi: number; // cdf(hi) >= target
  if (binomCdf(k, n, p) >= target) {
    hi = k;
    for (;;) {
      const c = hi - step;
      if (c < 0) break;
      if (binomCdf(c, n, p) >= target) {
        hi = c;
        step *= 2;
      } else {
        lo = c;
        break;
      }
    }
  } else {
    lo = k;
    for (;;) {
      const c = Math.min(n, lo + step);
      if (binomCdf(c, n, p) >= target) {
        hi = c;
        break;
      }
      lo = c;
      step *= 2;
    }
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (binomCdf(mid, n, p) >= target) hi = mid;
    else lo = mid;
  }
  return hi;
}
