/**
 * Power of the two-sample test of a difference in mean scores, and the smallest difference it would detect, by the
 * normal approximation with each group's own spread (the large-sample form of Welch's t test):
 *
 *     SE = sqrt(sd1² / n1 + sd2² / n2)
 *     two-sided: power(δ) = Φ(δ / SE − z_{1−α/2}) + Φ(−δ / SE − z_{1−α/2})
 *     one-sided: power(δ) = Φ(δ / SE − z_{1−α})
 *
 * Source: J. Cohen (1988), Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 2 (the
 * normal approximation to the power of the t test); S.-C. Chow, J. Shao and H. Wang (2008), Sample Size Calculations
 * in Clinical Research, 2nd ed., section 3.2 (unequal variances). For the group sizes the pack tests (tens of
 * respondents or more) it is within a few parts in a thousand of the noncentral-t power (R's power.t.test for equal
 * groups). Both tails are kept in the two-sided case, so the smallest difference is found by bisection.
 */
import { normalCdf, normalSfQuantile } from './distributions/normal.js';
import { smallestGapReaching } from './smallest-gap.js';

import type { Sided } from './result.js';

export type { Sided };

export interface TwoMeansPower {
  sd1: number;
  n1: number;
  sd2: number;
  n2: number;
  /** Significance level, in (0, 1). */
  alpha: number;
  sided: Sided;
}

function standardError(o: Omit<TwoMeansPower, 'alpha' | 'sided'>, fn: string): number {
  if (!(o.n1 >= 2 && o.n2 >= 2)) throw new Error(`${fn}: each group needs at least 2 answers, got n1 = ${o.n1}, n2 = ${o.n2}`);
  if (!(o.sd1 >= 0 && o.sd2 >= 0 && Number.isFinite(o.sd1) && Number.isFinite(o.sd2))) throw new Error(`${fn}: spreads must be finite and not negative, got ${o.sd1}, ${o.sd2}`);
  const se = Math.sqrt((o.sd1 * o.sd1) / o.n1 + (o.sd2 * o.sd2) / o.n2);
  if (!(se > 0)) throw new Error(`${fn}: both groups answered all alike (no spread), so power is undefined`);
  return se;
}

/** Probability of rejecting at level alpha when the true difference in means is `delta` (in the tested direction). */
export function powerTwoMeans(delta: number, o: TwoMeansPower): number {
  const se = standardError(o, 'powerTwoMeans');
  if (!(o.alpha > 0 && o.alpha < 1)) throw new Error(`powerTwoMeans: alpha must be between 0 and 1, got ${o.alpha}`);
  const shift = Math.abs(delta) / se;
  if (o.sided === 'one-sided') return normalCdf(shift - normalSfQuantile(o.alpha));
  const crit = normalSfQuantile(o.alpha / 2);
  return normalCdf(shift - crit) + normalCdf(-shift - crit);
}

/** Smallest difference in means (answer-scale units) detected with the given power at level alpha. */
export function minDetectableMeanDifference(o: TwoMeansPower & { power: number }): number {
  const se = standardError(o, 'minDetectableMeanDifference');
  if (!(o.power > o.alpha && o.power < 1)) throw new Error(`minDetectableMeanDifference: power must lie between alpha and 1, got ${o.power}`);
  // The detectable difference is below (z_{α/2} + z_{power} + 1) standard errors: bracket generously and bisect.
  const max = se * (normalSfQuantile(o.alpha / 2) + normalSfQuantile(1 - o.power) + 10);
  return smallestGapReaching((d) => powerTwoMeans(d, o), max, o.power) as number;
}
