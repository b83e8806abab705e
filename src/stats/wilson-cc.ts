/**
 * Continuity-corrected Wilson score interval for one proportion.
 *
 * Source: R. G. Newcombe (1998), "Two-sided confidence intervals for the single proportion: comparison of seven
 * methods", Statistics in Medicine 17, 857-872, method 4:
 *
 *     L = (2np + z^2 - 1 - z sqrt(z^2 - 2 - 1/n + 4p(nq + 1))) / (2(n + z^2)),  L = 0 when p = 0,
 *     U = (2np + z^2 + 1 + z sqrt(z^2 + 2 - 1/n + 4p(nq - 1))) / (2(n + z^2)),  U = 1 when p = 1.
 *
 * These equal the Wilson bounds computed at p -/+ 1/(2n), which is how they are evaluated here (the form R's
 * prop.test uses, with a correction c = 1/2 or smaller; c = 0 gives the plain Wilson bounds).
 */
import type { RateEstimate } from './result.js';
import { normalQuantile } from './distributions/normal.js';
import { checkCounts, checkLevel } from './wilson.js';

export interface WilsonCcOptions {
  /** Confidence level, between 0 and 1 (default 0.95). */
  level?: number;
}

/**
 * Score bounds for x of n at normal quantile z with continuity correction c (0 <= c <= 1/2), each clamped to
 * [0, 1]. Exported for the one-sample score test, whose correction is min(1/2, |x - n p0|) as in R.
 */
export function correctedScoreBounds(x: number, n: number, z: number, c: number): [number, number] {
  const p = x / n;
  const a = (z * z) / (2 * n);
  const bound = (pc: number, sign: 1 | -1): number =>
    (pc + a + sign * z * Math.sqrt((pc * (1 - pc)) / n + a / (2 * n))) / (1 + 2 * a);
  const pcUpper = p + c / n;
  const pcLower = p - c / n;
  const upper = pcUpper >= 1 ? 1 : bound(pcUpper, 1);
  const lower = pcLower <= 0 ? 0 : bound(pcLower, -1);
  return [Math.max(0, lower), Math.min(1, upper)];
}

/**
 * Continuity-corrected Wilson interval (Newcombe 1998, method 4), two-sided at `level`; method 'wilson-cc'.
 *
 * @throws Error when n is not positive, x is outside 0..n, or the level is outside (0, 1).
 * @example wilsonCcInterval(15, 148) // 0.0598 to 0.1644 (Newcombe 1998, Table I)
 */
export function wilsonCcInterval(x: number, n: number, options: WilsonCcOptions = {}): RateEstimate {
  const fn = 'wilsonCcInterval';
  const level = options.level ?? 0.95;
  checkCounts(x, n, fn);
  checkLevel(level, fn);
  const z = normalQuantile((1 + level) / 2);
  const [lower, upper] = correctedScoreBounds(x, n, z, 0.5);
  return { x, n, p: x / n, interval: { lower, upper, level, method: 'wilson-cc' } };
}
