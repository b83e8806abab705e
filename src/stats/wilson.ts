/**
 * Wilson score interval for one proportion, optionally with the finite-population correction.
 *
 * Sources:
 * - E. B. Wilson (1927), "Probable inference, the law of succession, and statistical inference", Journal of the
 *   American Statistical Association 22, 209-212.
 * - R. G. Newcombe (1998), "Two-sided confidence intervals for the single proportion: comparison of seven methods",
 *   Statistics in Medicine 17, 857-872, method 3.
 * - W. G. Cochran (1977), Sampling Techniques, 3rd ed., Wiley, section 3.3: for a simple random sample of n from a
 *   population of N, the variance of the sample proportion is (N - n)/(N - 1) * p(1 - p)/n.
 *
 * The interval is the set of rates p that a two-sided score test would not reject:
 *
 *     (phat - p)^2 <= z^2 * f * p(1 - p) / n,   f = (N - n)/(N - 1) with a population size N, else f = 1,
 *
 * whose roots, with k = z^2 f / n, are
 *
 *     upper = (phat + k/2 + sqrt(k) * sqrt(phat(1 - phat) + k/4)) / (1 + k),
 *     lower = phat^2 / ((1 + k) * upper)   (the product of the roots, free of cancellation).
 *
 * With f = 1 this is Wilson's interval; with N = n (everyone answered) it collapses to phat.
 */
import type { RateEstimate } from './result.js';
import { normalQuantile } from './distributions/normal.js';

export interface WilsonOptions {
  /** Confidence level, between 0 and 1 (default 0.95). */
  level?: number;
  /** Number eligible (cohort size), for the finite-population correction. Must be at least n. */
  populationSize?: number;
}

/** Checks counts for the rate methods; `integer` demands whole numbers (exact methods). Throws a plain Error. */
export function checkCounts(x: number, n: number, fn: string, integer = false): void {
  if (!Number.isFinite(n) || n <= 0) throw new Error(`${fn}: the number who answered (n) must be above 0, got ${n}`);
  if (!Number.isFinite(x) || x < 0 || x > n) {
    throw new Error(`${fn}: the agreeing count (x) must be between 0 and n = ${n}, got ${x}`);
  }
  if (integer && (!Number.isInteger(x) || !Number.isInteger(n))) {
    throw new Error(`${fn}: counts must be whole numbers for this exact method, got x = ${x}, n = ${n}`);
  }
}

/** Checks a confidence level (strictly between 0 and 1). */
export function checkLevel(level: number, fn: string): void {
  if (!(level > 0 && level < 1)) throw new Error(`${fn}: the confidence level must be between 0 and 1, got ${level}`);
}

/** Finite-population factor (N - n)/(N - 1), checked. */
export function finitePopulationFactor(n: number, populationSize: number, fn: string): number {
  if (!Number.isFinite(populationSize) || populationSize < n || populationSize < 2) {
    throw new Error(
      `${fn}: the population size must be at least the number who answered (n = ${n}) and at least 2, ` +
        `got ${populationSize}`,
    );
  }
  return (populationSize - n) / (populationSize - 1);
}

/**
 * Wilson bounds for a given k = z^2 f / n (see the file comment). Exported for the one-sided uses of the
 * Newcombe interval and the score test.
 */
export function wilsonBounds(x: number, n: number, k: number): [number, number] {
  const p = x / n;
  if (k === 0) return [p, p];
  const upper = x === n ? 1 : (p + k / 2 + Math.sqrt(k) * Math.sqrt(p * (1 - p) + k / 4)) / (1 + k);
  const lower = x === 0 ? 0 : (p * p) / ((1 + k) * upper);
  return [Math.max(0, lower), Math.min(1, upper)];
}

/**
 * Wilson score interval for x agreeing out of n (two-sided, at `level`), with the finite-population correction
 * when `populationSize` is given (method 'wilson-fpc', else 'wilson').
 *
 * @throws Error when n is not positive, x is outside 0..n, the level is outside (0, 1), or the population is
 *   smaller than n.
 * @example wilsonInterval(81, 263) // interval 0.2553 to 0.3662 (Newcombe 1998, Table I)
 */
export function wilsonInterval(x: number, n: number, options: WilsonOptions = {}): RateEstimate {
  const fn = 'wilsonInterval';
  const level = options.level ?? 0.95;
  checkCounts(x, n, fn);
  checkLevel(level, fn);
  const f = options.populationSize === undefined ? 1 : finitePopulationFactor(n, options.populationSize, fn);
  const z = normalQuantile((1 + level) / 2);
  const [lower, upper] = wilsonBounds(x, n, (z * z * f) / n);
  return {
    x,
    n,
    p: x / n,
    interval: { lower, upper, level, method: options.populationSize === undefined ? 'wilson' : 'wilson-fpc' },
  };
}

/** Positional form of {@link wilsonInterval}: wilson(x, n, level, populationSize). */
export function wilson(x: number, n: number, level = 0.95, populationSize?: number): RateEstimate {
  return wilsonInterval(x, n, populationSize === undefined ? { level } : { level, populationSize });
}
