/**
 * Power of the test of zero correlation, and the smallest correlation it can detect, by Fisher's z approximation:
 * atanh(r) is about normal with mean atanh(rho) and variance 1 / (n - 3) (R. A. Fisher, Metron 1 (1921) 3-32;
 * J. Cohen, "Statistical Power Analysis for the Behavioral Sciences", 2nd ed., 1988, ch. 3, section 3.5).
 *   two-sided: power = Phi(sqrt(n - 3) |atanh rho| - z_{1-alpha/2}) + Phi(-sqrt(n - 3) |atanh rho| - z_{1-alpha/2})
 *   one-sided (in the direction of rho): power = Phi(sqrt(n - 3) |atanh rho| - z_{1-alpha})
 * Both tails are kept in the two-sided case, so the smallest detectable correlation is found by bisection rather than
 * by the usual one-tail closed form tanh((z_{1-alpha/2} + z_power) / sqrt(n - 3)), which it matches to within 1e-6
 * for any practical n.
 */
import { normalCdf, normalQuantile, normalSfQuantile } from './distributions/normal.js';

import type { PowerSettings, Sided } from './result.js';

export type { Sided };

function check(n: number, alpha: number): void {
  if (!Number.isInteger(n) || n < 4) throw new Error(`correlation power needs at least 4 units; got ${n}.`);
  if (!(alpha > 0 && alpha < 1)) throw new Error(`significance level ${alpha} is not between 0 and 1.`);
}

/**
 * Probability that the test of zero correlation at level alpha rejects when the true correlation is rho.
 * @throws Error when n < 4, alpha is not in (0, 1) or |rho| >= 1.
 */
export function correlationPower(rho: number, n: number, settings: PowerSettings = {}): number {
  const { alpha = 0.05, sided = 'two-sided' } = settings;
  check(n, alpha);
  if (!(Math.abs(rho) < 1)) throw new Error(`correlation ${rho} must be strictly between -1 and 1.`);
  const shift = Math.sqrt(n - 3) * Math.abs(Math.atanh(rho));
  if (sided === 'one-sided') return normalCdf(shift - normalSfQuantile(alpha));
  const crit = normalSfQuantile(alpha / 2);
  return normalCdf(shift - crit) + normalCdf(-shift - crit);
}

/**
 * Smallest |rho| detected with the given power by the test of zero correlation with n units at level alpha.
 * @throws Error when n < 4, alpha or power is not in (0, 1), or power <= alpha (nothing to detect).
 */
export function minDetectableCorrelation(n: number, settings: PowerSettings = {}): number {
  const { alpha = 0.05, power = 0.8, sided = 'two-sided' } = settings;
  check(n, alpha);
  if (!(power > 0 && power < 1)) throw new Error(`power ${power} is not between 0 and 1.`);
  if (power <= alpha) throw new Error(`power ${power} must exceed the significance level ${alpha}.`);
  const m = Math.sqrt(n - 3);
  if (sided === 'one-sided') return Math.tanh((normalSfQuantile(alpha) + normalQuantile(power)) / m);
  // Bisection on the z scale; power is increasing in |atanh rho|.
  let lo = 0;
  let hi = (normalSfQuantile(alpha / 2) + normalQuantile(power)) / m; // one-tail solution: power here >= target
  for (let i = 0; i < 200 && hi - lo > 1e-16 * hi; i++) {
    const mid = (lo + hi) / 2;
    const crit = normalSfQuantile(alpha / 2);
    const pw = normalCdf(mid * m - crit) + normalCdf(-mid * m - crit);
    if (pw < power) lo = mid;
    else hi = mid;
  }
  return Math.tanh((lo + hi) / 2);
}
