/**
 * Lag-1 sample autocorrelation as defined for the NIST Statistical Reference Datasets (univariate summary
 * statistics, NIST/ITL 1999):
 *   r(1) = sum_{i=2..n} (y_i - m)(y_{i-1} - m) / sum_{i=1..n} (y_i - m)^2,
 * both sums about the overall mean m and with no n/(n-1) factor (as in Box & Jenkins, "Time Series Analysis",
 * 1976, eq. 2.1.12).
 */
import { compensatedSum, mean, requireFinite } from './mean.js';

/**
 * @throws Error when fewer than two values are given, a value is not finite, or all values are equal.
 */
export function lag1Autocorrelation(ys: readonly number[]): number {
  requireFinite(ys, 'lag-1 autocorrelation', 2);
  const m = mean(ys);
  const d = ys.map((y) => y - m);
  const num: number[] = [];
  const den: number[] = [];
  for (let i = 0; i < d.length; i++) {
    den.push(d[i]! * d[i]!);
    if (i > 0) num.push(d[i]! * d[i - 1]!);
  }
  const denominator = compensatedSum(den);
  if (denominator === 0) throw new Error('lag-1 autocorrelation is undefined: all values are equal.');
  return compensatedSum(num) / denominator;
}
