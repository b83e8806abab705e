/**
 * The chi-square distribution with df > 0 degrees of freedom (R: pchisq, qchisq).
 *
 * Source: P(X <= x) = P(df/2, x/2), the regularized lower incomplete gamma (Abramowitz & Stegun 1964, 26.4.19),
 * with the upper tail Q(df/2, x/2) computed directly by the continued fraction in special.ts. Quantiles solve the
 * tail equation by safeguarded Newton iteration on log P in log x (invert.ts), started from the Wilson-Hilferty
 * approximation (E. B. Wilson & M. M. Hilferty 1931, "The distribution of chi-square", PNAS 17, 684-688).
 */
import { requireNumber, requirePositive, requireProbability } from './check.js';
import { LOG_MAX, LOG_MIN, fromLog, solveLogTail } from './invert.js';
import { normalSfQuantile } from './normal.js';
import { logGamma, regularizedGammaPair } from './special.js';

function check(x: number, df: number, fn: string): void {
  requireNumber(x, 'x', fn);
  requirePositive(df, 'df', fn);
  if (df === Infinity) throw new Error(`${fn}: df must be finite, got Infinity`);
}

/** P(X <= x) (R: pchisq(x, df)). */
export function chisqCdf(x: number, df: number): number {
  check(x, df, 'chisqCdf');
  if (x <= 0) return 0;
  return regularizedGammaPair(df / 2, x / 2).lower;
}

/** P(X > x) (R: pchisq(x, df, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function chisqSf(x: number, df: number): number {
  check(x, df, 'chisqSf');
  if (x <= 0) return 1;
  return regularizedGammaPair(df / 2, x / 2).upper;
}

/** Solve for x given a target tail area: the lower tail if `lower`, else the upper tail. */
function solve(target: number, df: number, lower: boolean): number {
  const a = df / 2;
  const f = (u: number) => {
    const pair = regularizedGammaPair(a, Math.exp(u) / 2);
    const tail = lower ? pair.lower : pair.upper;
    const d = Math.exp(pair.logSlope - Math.log(tail)); // d log P / d log x = (x/2)^a e^(-x/2) / (Gamma(a) P)
    return { logTail: Math.log(tail), slope: lower ? d : -d };
  };
  // Wilson-Hilferty: x = df (1 - 2/(9 df) + z sqrt(2/(9 df)))^3, with z the upper normal quantile.
  const z = lower ? -normalSfQuantile(target) : normalSfQuantile(target);
  const c = 2 / (9 * df);
  const w = 1 - c + z * Math.sqrt(c);
  let x0 = w > 0.05 ? df * w * w * w : NaN;
  if (lower && !(x0 > 0 && x0 < df)) {
    // Small-x limit P ~ (x/2)^a / Gamma(a + 1).
    x0 = 2 * Math.exp((Math.log(target) + logGamma(a + 1)) / a);
  }
  if (!(x0 > 0) || !Number.isFinite(x0)) x0 = df;
  const u = solveLogTail(f, Math.log(target), Math.log(x0), lower, LOG_MIN, LOG_MAX);
  return fromLog(u);
}

/** The x with P(X <= x) = p (R: qchisq(p, df)). p = 0 gives 0, p = 1 gives +Infinity. */
export function chisqQuantile(p: number, df: number): number {
  requireProbability(p, 'p', 'chisqQuantile');
  check(0, df, 'chisqQuantile');
  if (p === 0) return 0;
  if (p === 1) return Infinity;
  return p <= 0.5 ? solve(p, df, true) : solve(1 - p, df, false);
}

/** The x with P(X > x) = q (R: qchisq(q, df, lower.tail = FALSE)), accurate for tiny q. */
export function chisqSfQuantile(q: number, df: number): number {
  requireProbability(q, 'q', 'chisqSfQuantile');
  check(0, df, 'chisqSfQuantile');
  if (q === 0) return Infinity;
  if (q === 1) return 0;
  return q <= 0.5 ? solve(q, df, false) : solve(1 - q, df, true);
}
