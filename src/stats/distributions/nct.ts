/**
 * The noncentral t distribution with df > 0 degrees of freedom and noncentrality ncp (R: pt(t, df, ncp)), for the
 * confidence interval of a standardized difference in means (cohens-d-interval.ts).
 *
 * Source: the mixture series of R. V. Lenth (1989), Algorithm AS 243: Cumulative distribution function of the
 * non-central t distribution, Applied Statistics 38, 185–189 (after W. C. Guenther 1978). For t ≥ 0, with
 * x = t² / (t² + df) and λ = ncp² / 2,
 *   P(T ≤ t) = Φ(−ncp) + ½ Σ_j [p_j I_x(j + ½, df/2) + q_j I_x(j + 1, df/2)],
 *   p_j = e^(−λ) λ^j / j!,   q_j = ncp e^(−λ) λ^j / (√2 Γ(j + 3/2)).
 * At t = ∞ every I_x is 1 and P = 1, so ½ Σ (p_j + q_j) = Φ(ncp), and the upper tail is the same series over the
 * complements, P(T > t) = ½ Σ [p_j (1 − I_x(j + ½, df/2)) + q_j (1 − I_x(j + 1, df/2))], each complement computed
 * directly (special.ts), never 1 − cdf. For t < 0 the reflection P(T ≤ t; ncp) = P(T > −t; −ncp) is used.
 * The sum starts at the Poisson mode and runs outward until the weights left are below 1e-17 of those summed (as in
 * ncchisq.ts). With ncp < 0 the q_j are negative and the series alternates in sign between its two parts; the
 * result is then a difference of sums no larger than Φ(|ncp|), accurate to about 1e-16 / P in relative terms.
 */
import { requireNumber, requirePositive } from './check.js';
import { normalCdf } from './normal.js';
import { logGamma, regularizedBetaPair } from './special.js';
import { tCdf, tSf } from './t.js';

/**
 * ½ Σ over the mixture at t > 0: the lower sum (of I_x terms) or the upper (of 1 − I_x terms). Each family of
 * incomplete betas (a = j + ½ and a = j + 1, b = df/2) is computed once at the Poisson mode by its continued fraction
 * and carried to the other j by the recurrence I_x(a + 1, b) = I_x(a, b) − g(a), g(a) = Γ(a + b) / (Γ(a + 1) Γ(b))
 * x^a y^b (Abramowitz & Stegun 1964, 26.5.16), g evaluated directly on the log scale at each step.
 */
function mixture(t: number, df: number, ncp: number, which: 'lower' | 'upper'): number {
  const t2 = t * t;
  const x = t2 / (t2 + df);
  const y = df / (t2 + df);
  const logx = Math.log(x);
  const logy = Math.log(y);
  const b = df / 2;
  const lgb = logGamma(b);
  const lambda = (ncp * ncp) / 2;
  const logLambda = Math.log(lambda);
  const logNcp = Math.log(Math.abs(ncp));
  const sign = ncp < 0 ? -1 : 1;
  /** g(a): the step between I_x(a, b) and I_x(a + 1, b). */
  const g = (a: number): number => Math.exp(logGamma(a + b) - logGamma(a + 1) - lgb + a * logx + b * logy);
  const weights = (j: number): { p: number; q: number } => {
    // λ^0 is 1 even when λ underflows to 0 (log λ = −∞).
    const jLogLambda = j === 0 ? 0 : j * logLambda;
    return {
      p: Math.exp(-lambda + jLogLambda - logGamma(j + 1)),
      q: Math.exp(logNcp - lambda + jLogLambda - 0.5 * Math.LN2 - logGamma(j + 1.5)),
    };
  };
  const mode = Math.floor(lambda);
  const atMode = (a: number): number => {
    const pair = regularizedBetaPair(x, a, b, y, logx, logy);
    return which === 'lower' ? pair.lower : pair.upper;
  };
  // Moving up one step, the lower I loses g(a) and its complement gains it; moving down, the reverse.
  const up = which === 'lower' ? -1 : 1;
  let sum = 0;
  let mass = 0;
  // Downward from the mode (inclusive), then upward from the mode + 1.
  let iHalf = atMode(mode + 0.5);
  let iOne = atMode(mode + 1);
  const modeHalf = iHalf;
  const modeOne = iOne;
  for (let j = mode; j >= 0; j--) {
    if (j < mode) {
      iHalf -= up * g(j + 0.5);
      iOne -= up * g(j + 1);
    }
    const w = weights(j);
    sum += w.p * iHalf + sign * w.q * iOne;
    mass += w.p + w.q;
    if (j < mode && !(w.p + w.q >= 1e-17 * mass)) break;
  }
  iHalf = modeHalf;
  iOne = modeOne;
  for (let j = mode + 1; ; j++) {
    iHalf += up * g(j - 0.5);
    iOne += up * g(j);
    const w = weights(j);
    sum += w.p * iHalf + sign * w.q * iOne;
    mass += w.p + w.q;
    if (!(w.p + w.q >= 1e-17 * mass) || j > mode + 1_000_000) break;
  }
  if (!Number.isFinite(sum)) throw new Error(`nct: the series did not converge at t = ${t}, df = ${df}, ncp = ${ncp}`);
  return 0.5 * sum;
}

function check(t: number, df: number, ncp: number, fn: string): void {
  requireNumber(t, 't', fn);
  requirePositive(df, 'df', fn);
  if (!Number.isFinite(df)) throw new Error(`${fn}: df must be finite, got ${df}`);
  requireNumber(ncp, 'ncp', fn);
  if (!Number.isFinite(ncp)) throw new Error(`${fn}: ncp must be finite, got ${ncp}`);
}

/** P(T > t) for t ≥ 0 (see the file comment). */
function upperAtOrAboveZero(t: number, df: number, ncp: number): number {
  if (t === Infinity) return 0;
  if (t === 0) return normalCdf(ncp);
  return Math.min(1, Math.max(0, mixture(t, df, ncp, 'upper')));
}

/** P(T ≤ t) for t ≥ 0. */
function lowerAtOrAboveZero(t: number, df: number, ncp: number): number {
  if (t === Infinity) return 1;
  if (t === 0) return normalCdf(-ncp);
  return Math.min(1, Math.max(0, normalCdf(-ncp) + mixture(t, df, ncp, 'lower')));
}

/** P(T ≤ t) (R: pt(t, df, ncp)). */
export function nctCdf(t: number, df: number, ncp: number): number {
  check(t, df, ncp, 'nctCdf');
  if (ncp === 0) return tCdf(t, df);
  return t >= 0 ? lowerAtOrAboveZero(t, df, ncp) : upperAtOrAboveZero(-t, df, -ncp);
}

/** P(T > t) (R: pt(t, df, ncp, lower.tail = FALSE)), computed directly. */
export function nctSf(t: number, df: number, ncp: number): number {
  check(t, df, ncp, 'nctSf');
  if (ncp === 0) return tSf(t, df);
  return t >= 0 ? upperAtOrAboveZero(t, df, ncp) : lowerAtOrAboveZero(-t, df, -ncp);
}
