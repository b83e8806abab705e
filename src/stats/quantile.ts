/**
 * Sample quantiles by the continuous definitions 4-9 of Hyndman & Fan, "Sample quantiles in statistical packages",
 * The American Statistician 50 (1996) 361-365. Type 7 (the default, p(k) = (k - 1)/(n - 1)) is the default of R's
 * quantile(); type 6 is the one of many survey handbooks. Each type is x_j + g (x_{j+1} - x_j) with
 * j = floor(alpha + p (n + 1 - alpha - beta)) and g the fractional part, (alpha, beta) depending on the type
 * (Hyndman & Fan, section 3).
 */
import { requireFinite } from './mean.js';

export type QuantileType = 4 | 5 | 6 | 7 | 8 | 9;

/** Hyndman & Fan's (alpha, beta) for p(k) = (k - alpha) / (n + 1 - alpha - beta). */
function plottingPosition(type: QuantileType): [number, number] {
  switch (type) {
    case 4:
      return [0, 1];
    case 5:
      return [0.5, 0.5];
    case 6:
      return [0, 0];
    case 7:
      return [1, 1];
    case 8:
      return [1 / 3, 1 / 3];
    case 9:
      return [3 / 8, 3 / 8];
  }
}

/** Quantile of already-sorted finite data. */
function quantileSorted(sorted: readonly number[], p: number, type: QuantileType): number {
  const n = sorted.length;
  if (type === 7) {
    // h = (n - 1) p; computed directly to avoid the rounding of n p + 1 - p.
    const h = (n - 1) * p;
    const lo = Math.floor(h);
    const g = h - lo;
    const a = sorted[lo]!;
    if (g === 0 || lo + 1 >= n) return a;
    const b = sorted[lo + 1]!;
    return b === a ? a : (1 - g) * a + g * b;
  }
  const fuzz = 4 * Number.EPSILON;
  const [alpha, beta] = plottingPosition(type);
  const nppm = alpha + p * (n + 1 - alpha - beta);
  const j = Math.floor(nppm + fuzz);
  let g = nppm - j;
  if (Math.abs(g) < fuzz) g = 0;
  const lower = sorted[Math.min(Math.max(j, 1), n) - 1]!;
  const upper = sorted[Math.min(Math.max(j + 1, 1), n) - 1]!;
  if (g === 0 || lower === upper) return lower;
  return (1 - g) * lower + g * upper;
}

/**
 * Quantiles of xs at the probabilities ps (each in [0, 1]).
 * @throws Error when xs is empty, holds a non-finite value, or a probability is outside [0, 1].
 * @example quantile([1, 2, 3, 4], [0.25]) // [1.75] (type 7)
 */
export function quantiles(xs: readonly number[], ps: readonly number[], type: QuantileType = 7): number[] {
  requireFinite(xs, 'quantile');
  for (const p of ps) {
    if (!(p >= 0 && p <= 1)) throw new Error(`quantile: probability ${String(p)} is outside [0, 1].`);
  }
  const sorted = [...xs].sort((a, b) => a - b);
  return ps.map((p) => quantileSorted(sorted, p, type));
}

/** One quantile; see quantiles(). */
export function quantile(xs: readonly number[], p: number, type: QuantileType = 7): number {
  return quantiles(xs, [p], type)[0]!;
}

/** Median (the 0.5 quantile; every continuous type gives the usual middle value or mean of the two middle values). */
export function median(xs: readonly number[]): number {
  return quantile(xs, 0.5, 7);
}
