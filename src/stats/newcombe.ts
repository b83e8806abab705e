/**
 * Newcombe's hybrid score interval for the difference of two independent proportions, p1 - p2.
 *
 * Source: R. G. Newcombe (1998), "Interval estimation for the difference between independent proportions:
 * comparison of eleven methods", Statistics in Medicine 17, 873-890, method 10. With (l1, u1) and (l2, u2) the
 * Wilson intervals for each rate at the same level and d = p1 - p2:
 *
 *     lower = d - sqrt((p1 - l1)^2 + (u2 - p2)^2),    upper = d + sqrt((u1 - p1)^2 + (p2 - l2)^2).
 *
 * With a population size for a group, that group's Wilson interval carries the finite-population correction
 * (see wilson.ts; W. G. Cochran (1977), Sampling Techniques, section 3.3); the method is then
 * 'newcombe-hybrid-fpc'. A one-sided bound at level c is the matching bound of the two-sided interval at 2c - 1.
 */
import type { Interval } from './result.js';
import { normalQuantile } from './distributions/normal.js';
import { checkCounts, checkLevel, finitePopulationFactor, wilsonBounds } from './wilson.js';

export interface NewcombeOptions {
  /** Confidence level, between 0 and 1 (default 0.95). */
  level?: number;
  /** Number eligible in group 1, for the finite-population correction. */
  populationSize1?: number;
  /** Number eligible in group 2, for the finite-population correction. */
  populationSize2?: number;
}

/**
 * Newcombe hybrid score interval for p1 - p2 = x1/n1 - x2/n2, two-sided at `level`.
 *
 * @throws Error when counts, level or population sizes are out of range.
 * @example newcombeInterval(56, 70, 48, 80) // 0.0524 to 0.3339 (Newcombe 1998, Table II)
 */
export function newcombeInterval(x1: number, n1: number, x2: number, n2: number, options: NewcombeOptions = {}): Interval {
  const fn = 'newcombeInterval';
  const level = options.level ?? 0.95;
  checkCounts(x1, n1, fn);
  checkCounts(x2, n2, fn);
  checkLevel(level, fn);
  const f1 = options.populationSize1 === undefined ? 1 : finitePopulationFactor(n1, options.populationSize1, fn);
  const f2 = options.populationSize2 === undefined ? 1 : finitePopulationFactor(n2, options.populationSize2, fn);
  const z = normalQuantile((1 + level) / 2);
  const [l1, u1] = wilsonBounds(x1, n1, (z * z * f1) / n1);
  const [l2, u2] = wilsonBounds(x2, n2, (z * z * f2) / n2);
  const p1 = x1 / n1;
  const p2 = x2 / n2;
  const d = p1 - p2;
  const fpc = options.populationSize1 !== undefined || options.populationSize2 !== undefined;
  return {
    lower: Math.max(-1, d - Math.hypot(p1 - l1, u2 - p2)),
    upper: Math.min(1, d + Math.hypot(u1 - p1, p2 - l2)),
    level,
    method: fpc ? 'newcombe-hybrid-fpc' : 'newcombe-hybrid',
  };
}
