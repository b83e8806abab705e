/**
 * The hypergeometric distribution with R's parameters: x white balls among k drawn without replacement from an
 * urn of m white and n black balls (R: dhyper(x, m, n, k), phyper).
 *
 * Sources:
 * - Probability mass as a ratio of three binomial probabilities with a common p = k / (m + n), each by Loader's
 *   saddle-point form (C. Loader 2000, "Fast and accurate computation of binomial probabilities"):
 *   P(X = x) = b(x; m, p) b(k - x; n, p) / b(k; m + n, p).
 * - Tails by summing the pmf ratios P(X = x - 1) / P(X = x) = x (n - k + x) / ((k - x + 1)(m - x + 1)) from x
 *   toward the far end of the tail, always on the side of the mean where the tail is the smaller one, so that each
 *   tail is computed directly in relative terms (the summation of positive terms, as in Feller 1968, ch. II.6).
 */
import { requireCount, requireInteger } from './check.js';
import { binomPmfRaw } from './binomial.js';

function checkParams(m: number, n: number, k: number, fn: string): void {
  requireCount(m, 'm (white balls)', fn);
  requireCount(n, 'n (black balls)', fn);
  requireCount(k, 'k (balls drawn)', fn);
  if (k > m + n) throw new Error(`${fn}: k (balls drawn) = ${k} exceeds m + n = ${m + n}`);
}

function pmfRaw(x: number, m: number, n: number, k: number): number {
  if (x < Math.max(0, k - n) || x > Math.min(k, m)) return 0;
  if (k === 0) return x === 0 ? 1 : 0;
  const total = m + n;
  const p = k / total;
  const q = (total - k) / total;
  const p1 = binomPmfRaw(x, m, p, q);
  const p2 = binomPmfRaw(k - x, n, p, q);
  const p3 = binomPmfRaw(k, total, p, q);
  return (p1 * p2) / p3;
}

/** P(X = x) (R: dhyper(x, m, n, k)). */
export function hyperPmf(x: number, m: number, n: number, k: number): number {
  requireInteger(x, 'x', 'hyperPmf');
  checkParams(m, n, k, 'hyperPmf');
  return pmfRaw(x, m, n, k);
}

/** P(X <= x) by summing downward from x: pmf(x) (1 + r_x + r_x r_(x-1) + ...). Accurate when x is below the mean. */
function lowerSum(x: number, m: number, n: number, k: number): number {
  const lo = Math.max(0, k - n);
  if (x < lo) return 0;
  let sum = 0;
  let term = 1;
  for (let j = x; j > lo; j--) {
    term *= (j * (n - k + j)) / ((k - j + 1) * (m - j + 1));
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return pmfRaw(x, m, n, k) * (1 + sum);
}

/** P(X <= x), with the smaller tail always summed directly. */
function tails(x: number, m: number, n: number, k: number): { lower: number; upper: number } {
  const lo = Math.max(0, k - n);
  const hi = Math.min(k, m);
  if (x < lo) return { lower: 0, upper: 1 };
  if (x >= hi) return { lower: 1, upper: 0 };
  // X > x for white balls is (black drawn) <= k - x - 1 for the swapped urn.
  if (x * (m + n) > k * m) {
    const upper = lowerSum(k - x - 1, n, m, k);
    return { lower: 1 - upper, upper };
  }
  const lower = lowerSum(x, m, n, k);
  return { lower, upper: 1 - lower };
}

/** P(X <= x) (R: phyper(x, m, n, k)). */
export function hyperCdf(x: number, m: number, n: number, k: number): number {
  requireInteger(x, 'x', 'hyperCdf');
  checkParams(m, n, k, 'hyperCdf');
  return tails(x, m, n, k).lower;
}

/** P(X > x) (R: phyper(x, m, n, k, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function hyperSf(x: number, m: number, n: number, k: number): number {
  requireInteger(x, 'x', 'hyperSf');
  checkParams(m, n, k, 'hyperSf');
  return tails(x, m, n, k).upper;
}
