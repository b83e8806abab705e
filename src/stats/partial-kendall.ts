/**
 * Kendall's partial rank correlation of x and y controlling for one variable z (M. G. Kendall, "Partial rank
 * correlation", Biometrika 32 (1942) 277-283; Kendall & Gibbons, "Rank Correlation Methods", 5th ed., 1990, ch. 8):
 *
 *   tau_xy.z = (tau_xy - tau_xz tau_yz) / sqrt((1 - tau_xz^2)(1 - tau_yz^2)),
 *
 * here with each tau the tie-corrected tau-b (kendall.ts), which is what R's cor(method = "kendall") gives.
 *
 * No p-value and no interval: the sampling distribution of partial tau is not that of tau and has no standard
 * closed form (it was tabulated by simulation for small n; Kendall & Gibbons, ch. 8), so the coefficient is reported
 * as a descriptive check only. Defined for one control; with several controls there is no classic formula and the
 * caller leaves it out.
 */
import { kendall } from './kendall.js';

export interface PartialKendall {
  method: 'partial-kendall';
  estimate: { name: 'partial Kendall tau'; value: number };
  /** The three tau-b coefficients the partial tau is made from. */
  taus: { xy: number; xz: number; yz: number };
  n: number;
}

/**
 * @throws Error when lengths differ, a value is not finite, fewer than 3 triples are given, a variable is constant,
 *   or x or y is perfectly ordered with z (|tau_xz| = 1 or |tau_yz| = 1), where the partial tau is undefined.
 */
export function partialKendall(x: readonly number[], y: readonly number[], z: readonly number[]): PartialKendall {
  if (z.length !== x.length) throw new Error(`partial Kendall correlation: the control has ${z.length} values for ${x.length} pairs.`);
  const xy = kendall(x, y).estimate.value;
  const xz = kendall(x, z).estimate.value;
  const yz = kendall(y, z).estimate.value;
  const denominator = (1 - xz * xz) * (1 - yz * yz);
  if (!(denominator > 0)) {
    throw new Error(`partial Kendall correlation is undefined: ${Math.abs(xz) === 1 ? 'x' : 'y'} is in the same order as the control.`);
  }
  const value = (xy - xz * yz) / Math.sqrt(denominator);
  return {
    method: 'partial-kendall',
    estimate: { name: 'partial Kendall tau', value: Math.max(-1, Math.min(1, value)) },
    taus: { xy, xz, yz },
    n: x.length,
  };
}
