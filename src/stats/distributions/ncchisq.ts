/**
 * The noncentral chi-square distribution's upper tail (R: pchisq(x, df, ncp, lower.tail = FALSE)), for the power of
 * chi-square tests.
 *
 * Source: the Poisson mixture of central chi-squares, P(X > x) = Σ_j e^(−λ/2) (λ/2)^j / j! · Q((df + 2j)/2, x/2)
 * (N. L. Johnson, S. Kotz and N. Balakrishnan 1995, Continuous Univariate Distributions, vol. 2, 2nd ed., ch. 29,
 * eq. 29.2). The sum starts at the Poisson mode and runs outward in both directions until the remaining Poisson
 * weight is below 1e-17 of the total, so every term is a directly computed upper tail (no 1 − cdf).
 */
import { requireNumber, requirePositive } from './check.js';
import { logGamma, regularizedGammaPair } from './special.js';

/** P(X > x) for noncentral chi-square with df degrees of freedom and noncentrality ncp ≥ 0. */
export function ncChisqSf(x: number, df: number, ncp: number): number {
  const fn = 'ncChisqSf';
  requireNumber(x, 'x', fn);
  requirePositive(df, 'df', fn);
  if (!(ncp >= 0 && Number.isFinite(ncp))) throw new Error(`${fn}: ncp must be finite and not negative, got ${ncp}`);
  if (x <= 0) return 1;
  const half = ncp / 2;
  const tail = (j: number) => regularizedGammaPair(df / 2 + j, x / 2).upper;
  if (half === 0) return tail(0);
  const weight = (j: number) => Math.exp(-half + j * Math.log(half) - logGamma(j + 1));
  const mode = Math.floor(half);
  let sum = weight(mode) * tail(mode);
  let mass = weight(mode);
  // Downward from the mode, then upward, stopping when the weights left are negligible.
  for (let j = mode - 1; j >= 0; j--) {
    const w = weight(j);
    sum += w * tail(j);
    mass += w;
    if (w < 1e-17 * mass) break;
  }
  for (let j = mode + 1; ; j++) {
    const w = weight(j);
    sum += w * tail(j);
    mass += w;
    if (w < 1e-17 * mass || j > mode + 100000) break;
  }
  return Math.min(1, sum);
}
