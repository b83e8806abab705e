/**
 * Confidence interval for Cohen's d, the difference between two means over their pooled standard deviation, by
 * inverting the noncentral t distribution.
 *
 * Source: J. H. Steiger and R. T. Fouladi (1997), Noncentrality interval estimation and the evaluation of statistical
 * models, in L. L. Harlow, S. A. Mulaik and J. H. Steiger (eds), What If There Were No Significance Tests?, Erlbaum,
 * 221–257; G. Cumming and S. Finch (2001), A primer on the understanding, use, and calculation of confidence
 * intervals that are based on central and noncentral distributions, Educational and Psychological Measurement 61,
 * 532–574. With normal scores of equal spread in both groups, Student's statistic t = d / √(1/n1 + 1/n2) follows a
 * noncentral t distribution with n1 + n2 − 2 degrees of freedom and noncentrality δ = d_true / √(1/n1 + 1/n2). The
 * interval for δ holds the values under which the observed t is not in either α/2 tail:
 *   lower: P(T > t_obs; δ_L) = α/2,   upper: P(T ≤ t_obs; δ_U) = α/2,
 * each solved for δ by regula falsi inside a bracket (both tails are monotone in δ), and scaled back by √(1/n1 + 1/n2).
 *
 * The interval is exact for Student's t test: it excludes 0 exactly when that test's two-sided p is below α. It
 * assumes equal spreads; Welch's test does not, so near the threshold the two may differ (means.ts says so).
 */
import { nctCdf, nctSf } from './distributions/nct.js';
import { normalQuantile } from './distributions/normal.js';

export interface CohensDInterval {
  lower: number;
  upper: number;
  level: number;
  method: 'cohens-d-noncentral-t';
}

/**
 * The root of an increasing function f on [lo, hi] with f(lo) < 0 < f(hi): regula falsi with the Illinois
 * modification (M. Dowell and P. Jarratt 1971, BIT 11, 168–174), which keeps the bracket and converges
 * superlinearly; stops when the bracket is within 1e-13 of the root's size.
 */
function solve(f: (x: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  let fhi = f(hi);
  let side = 0;
  for (let i = 0; i < 200; i++) {
    let x = (lo * fhi - hi * flo) / (fhi - flo);
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    const fx = f(x);
    if (fx === 0) return x;
    if (fx < 0) {
      lo = x;
      flo = fx;
      if (side === -1) fhi /= 2;
      side = -1;
    } else {
      hi = x;
      fhi = fx;
      if (side === 1) flo /= 2;
      side = 1;
    }
    if (hi - lo <= 1e-13 * Math.max(1, Math.abs(x))) break;
  }
  return 0.5 * (lo + hi);
}

/** A bracket [lo, hi] around the root of the increasing f, widened from a first guess until it holds the root. */
function bracket(f: (x: number) => number, guess: number, step: number): [number, number] {
  let lo = guess - step;
  let hi = guess + step;
  for (let i = 0; i < 60 && f(lo) >= 0; i++) lo -= step * 2 ** i;
  for (let i = 0; i < 60 && f(hi) <= 0; i++) hi += step * 2 ** i;
  return [lo, hi];
}

/**
 * The two-sided interval at confidence `level` for Cohen's d from its estimate `d` and the group sizes (each at least 2).
 */
export function cohensDInterval(d: number, n1: number, n2: number, level: number): CohensDInterval {
  const fn = 'cohensDInterval';
  if (!Number.isFinite(d)) throw new Error(`${fn}: d must be a finite number, got ${d}`);
  for (const [name, n] of [
    ['n1', n1],
    ['n2', n2],
  ] as const) {
    if (!(Number.isInteger(n) && n >= 2)) throw new Error(`${fn}: ${name} must be a whole number of at least 2, got ${n}`);
  }
  if (!(level > 0 && level < 1)) throw new Error(`${fn}: the confidence level must be between 0 and 1, got ${level}`);
  const scale = Math.sqrt(1 / n1 + 1 / n2);
  const df = n1 + n2 - 2;
  const t = d / scale;
  const half = (1 - level) / 2;
  // First guesses: t ± z (1 + t²/(2 df))^½, the normal approximation to the noncentral t's spread.
  const spread = normalQuantile(1 - half) * Math.sqrt(1 + (t * t) / (2 * df));
  // P(T > t; δ) rises with δ; P(T ≤ t; δ) falls with δ.
  const lowerEq = (delta: number): number => nctSf(t, df, delta) - half;
  const upperEq = (delta: number): number => half - nctCdf(t, df, delta);
  const deltaL = solve(lowerEq, ...bracket(lowerEq, t - spread, Math.max(0.5, spread / 4)));
  const deltaU = solve(upperEq, ...bracket(upperEq, t + spread, Math.max(0.5, spread / 4)));
  return { lower: deltaL * scale, upper: deltaU * scale, level, method: 'cohens-d-noncentral-t' };
}
