/**
 * The smallest change in a gap between two groups (a difference of two independent differences of proportions) that
 * the z test of difference-of-differences.ts would find with the given power: (z_a + z_power) se, with z_a the
 * normal quantile at 1 - alpha/2 (two-sided) or 1 - alpha (one-sided) and se the standard error from the four
 * groups' observed rates, sqrt(sum p (1 - p) / n). The usual normal-approximation power formula for a z test with a
 * known standard error (J. Cohen (1988), Statistical Power Analysis for the Behavioral Sciences, 2nd ed., ch. 12;
 * from memory), with the variance held at the observed rates (common practice for a detectable difference).
 */
import type { PowerSettings } from './result.js';
import { normalQuantile } from './distributions/normal.js';

/**
 * @throws Error when se is not positive or alpha and power are out of range.
 * @example minDetectableGapChange(0.05) // (1.959964 + 0.841621) * 0.05 = 0.1400793
 */
export function minDetectableGapChange(se: number, settings: PowerSettings = {}): number {
  const alpha = settings.alpha ?? 0.05;
  const power = settings.power ?? 0.8;
  if (!(se > 0) || !Number.isFinite(se)) throw new Error(`minDetectableGapChange: the standard error must be above 0, got ${se}`);
  if (!(alpha > 0 && alpha < 1)) throw new Error(`minDetectableGapChange: alpha must be between 0 and 1, got ${alpha}`);
  if (!(power > 0 && power < 1)) throw new Error(`minDetectableGapChange: power must be between 0 and 1, got ${power}`);
  const za = normalQuantile(1 - ((settings.sided ?? 'two-sided') === 'two-sided' ? alpha / 2 : alpha));
  return (za + normalQuantile(power)) * se;
}
