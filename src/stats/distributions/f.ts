/**
 * The F distribution with d1 and d2 degrees of freedom (R: pf, qf).
 *
 * Source: P(F <= x) = I_w(d1/2, d2/2) with w = d1 x / (d1 x + d2) (Abramowitz & Stegun 1964, 26.6.2), the upper
 * tail I_{1-w}(d2/2, d1/2) computed directly by the continued fraction in special.ts, with 1 - w formed as
 * d2 / (d1 x + d2). Quantiles solve the tail equation by safeguarded Newton iteration on log P in log x (invert.ts).
 */
import { requireNumber, requirePositive, requireProbability } from './check.js';
import { LOG_MAX, LOG_MIN, fromLog, solveLogTail } from './invert.js';
import { regularizedBetaPair, type TailPair } from './special.js';

function check(x: number, d1: number, d2: number, fn: string): void {
  requireNumber(x, 'x', fn);
  requirePositive(d1, 'd1', fn);
  requirePositive(d2, 'd2', fn);
  if (d1 === Infinity || d2 === Infinity) throw new Error(`${fn}: degrees of freedom must be finite, got ${d1}, ${d2}`);
}

function pair(x: number, d1: number, d2: number): TailPair {
  if (x === Infinity) return { lower: 1, upper: 0, logSlope: -Infinity };
  const u = d1 * x;
  // w = u / (u + d2), 1 - w = d2 / (u + d2), with logs that survive overflow of u.
  const logw = -Math.log1p(d2 / u);
  const log1mw = -Math.log1p(u / d2);
  const w = u > d2 ? 1 / (1 + d2 / u) : u / (u + d2);
  const y = u > d2 ? (d2 / u) / (1 + d2 / u) : 1 / (1 + u / d2);
  return regularizedBetaPair(w, d1 / 2, d2 / 2, y, logw, log1mw);
}

/** P(F <= x) (R: pf(x, d1, d2)). */
export function fCdf(x: number, d1: number, d2: number): number {
  check(x, d1, d2, 'fCdf');
  if (x <= 0) return 0;
  return pair(x, d1, d2).lower;
}

/** P(F > x) (R: pf(x, d1, d2, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function fSf(x: number, d1: number, d2: number): number {
  check(x, d1, d2, 'fSf');
  if (x <= 0) return 1;
  return pair(x, d1, d2).upper;
}

function solve(target: number, d1: number, d2: number, lower: boolean): number {
  const f = (u: number) => {
    const pr = pair(Math.exp(u), d1, d2);
    const tail = lower ? pr.lower : pr.upper;
    // d I_w / d log x = w^a (1-w)^b / B(a, b)
    const d = Math.exp(pr.logSlope - Math.log(tail));
    return { logTail: Math.log(tail), slope: lower ? d : -d };
  };
  return fromLog(solveLogTail(f, Math.log(target), 0, lower, LOG_MIN, LOG_MAX));
}

/** The x with P(F <= x) = p (R: qf(p, d1, d2)). p = 0 gives 0, p = 1 gives +Infinity. */
export function fQuantile(p: number, d1: number, d2: number): number {
  requireProbability(p, 'p', 'fQuantile');
  check(0, d1, d2, 'fQuantile');
  if (p === 0) return 0;
  if (p === 1) return Infinity;
  return p <= 0.5 ? solve(p, d1, d2, true) : solve(1 - p, d1, d2, false);
}

/** The x with P(F > x) = q (R: qf(q, d1, d2, lower.tail = FALSE)), accurate for tiny q. */
export function fSfQuantile(q: number, d1: number, d2: number): number {
  requireProbability(q, 'q', 'fSfQuantile');
  check(0, d1, d2, 'fSfQuantile');
  if (q === 0) return Infinity;
  if (q === 1) return 0;
  return q <= 0.5 ? solve(q, d1, d2, false) : solve(1 - q, d1, d2, true);
}
