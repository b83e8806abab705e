/**
 * Student's t distribution with df > 0 degrees of freedom (R: pt, qt), df = Infinity meaning the standard normal.
 *
 * Source: the tail as a regularized incomplete beta, P(T > t) = I_x(df/2, 1/2) / 2 with x = df / (df + t^2)
 * (Abramowitz & Stegun 1964, 26.7.1 and 26.5.27), both tails computed directly by the continued fraction in
 * special.ts. Quantiles solve the tail equation by safeguarded Newton iteration on log P in log t (invert.ts).
 */
import { requireNumber, requirePositive, requireProbability } from './check.js';
import { LOG_MAX, LOG_MIN, fromLog, solveLogTail } from './invert.js';
import { normalCdf, normalSf, normalQuantile, normalSfQuantile } from './normal.js';
import { regularizedBetaPair, type TailPair } from './special.js';

/**
 * P(|T| > |t|) / 2 split as the pair of I_x(df/2, 1/2) (the far tail beyond |t|, doubled) and its complement, with
 * x = df/(df + t^2) and y = t^2/(df + t^2) formed without overflow for huge |t|.
 */
function tailPair(t: number, df: number): TailPair {
  const at = Math.abs(t);
  if (at === Infinity) return { lower: 0, upper: 1, logSlope: -Infinity };
  let x: number, y: number, logx: number, logy: number;
  if (at * at > df) {
    const r = Math.sqrt(df) / at; // x = r^2 / (1 + r^2), y = 1 / (1 + r^2)
    const r2 = r * r;
    x = r2 / (1 + r2);
    y = 1 / (1 + r2);
    logx = 2 * Math.log(r) - Math.log1p(r2);
    logy = -Math.log1p(r2);
  } else {
    const s = (at * at) / df; // x = 1 / (1 + s), y = s / (1 + s)
    x = 1 / (1 + s);
    y = s / (1 + s);
    logx = -Math.log1p(s);
    logy = at === 0 ? -Infinity : Math.log(s) - Math.log1p(s);
  }
  return regularizedBetaPair(x, df / 2, 0.5, y, logx, logy);
}

function check(t: number, df: number, fn: string): void {
  requireNumber(t, 't', fn);
  requirePositive(df, 'df', fn);
}

/** P(T <= t) (R: pt(t, df)). */
export function tCdf(t: number, df: number): number {
  check(t, df, 'tCdf');
  if (df === Infinity) return normalCdf(t);
  const pair = tailPair(t, df);
  return t < 0 ? 0.5 * pair.lower : 0.5 + 0.5 * pair.upper;
}

/** P(T > t) (R: pt(t, df, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function tSf(t: number, df: number): number {
  check(t, df, 'tSf');
  if (df === Infinity) return normalSf(t);
  const pair = tailPair(t, df);
  return t > 0 ? 0.5 * pair.lower : 0.5 + 0.5 * pair.upper;
}

/** The t > 0 with P(T > t) = q for 0 < q < 1/2. */
function upperTailQuantile(q: number, df: number): number {
  const logTarget = Math.log(q);
  const f = (u: number) => {
    const pair = tailPair(Math.exp(u), df);
    const sf = 0.5 * pair.lower;
    // d sf / d log t = -x^a y^b / B(a, b), with a = df/2, b = 1/2
    return { logTail: Math.log(sf), slope: -Math.exp(pair.logSlope - Math.log(sf)) };
  };
  // First guess: the normal quantile, or the power-law tail P(T > t) ~ C t^-df when that is further out.
  const z = Math.max(normalSfQuantile(q), 1e-3);
  const u0 = Math.log(z);
  return fromLog(solveLogTail(f, logTarget, u0, false, LOG_MIN, LOG_MAX));
}

/** The t with P(T <= t) = p (R: qt(p, df)). p = 0 gives -Infinity, p = 1 gives +Infinity. */
export function tQuantile(p: number, df: number): number {
  requireProbability(p, 'p', 'tQuantile');
  requirePositive(df, 'df', 'tQuantile');
  if (df === Infinity) return normalQuantile(p);
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  return p < 0.5 ? -upperTailQuantile(p, df) : upperTailQuantile(1 - p, df);
}

/** The t with P(T > t) = q (R: qt(q, df, lower.tail = FALSE)), accurate for tiny q. */
export function tSfQuantile(q: number, df: number): number {
  requireProbability(q, 'q', 'tSfQuantile');
  requirePositive(df, 'df', 'tSfQuantile');
  if (df === Infinity) return normalSfQuantile(q);
  if (q === 0) return Infinity;
  if (q === 1) return -Infinity;
  if (q === 0.5) return 0;
  return q < 0.5 ? upperTailQuantile(q, df) : -upperTailQuantile(1 - q, df);
}
