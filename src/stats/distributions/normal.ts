/**
 * The standard normal distribution: cdf (R's pnorm), survival function computed directly (pnorm(z, lower.tail =
 * FALSE)), and quantiles (qnorm, and qnorm(q, lower.tail = FALSE)).
 *
 * Sources:
 * - Tails through erfc: W. J. Cody (1969), "Rational Chebyshev approximations for the error function",
 *   Mathematics of Computation 23, 631-637 (see special.ts).
 * - Quantiles: M. J. Wichura (1988), "Algorithm AS 241: The percentage points of the normal distribution",
 *   Applied Statistics 37(3), 477-484 (PPND16, about 16 significant digits).
 */
import { erfc } from './special.js';

const SQRT1_2 = Math.SQRT1_2;
const INV_SQRT_2PI = 0.398942280401432677939946059934;

function requireNumber(x: number, name: string, fn: string): void {
  if (typeof x !== 'number' || Number.isNaN(x)) throw new Error(`${fn}: ${name} must be a number, got ${String(x)}`);
}

function requireProbability(p: number, name: string, fn: string): void {
  requireNumber(p, name, fn);
  if (p < 0 || p > 1) throw new Error(`${fn}: ${name} must be a probability between 0 and 1, got ${p}`);
}

/** Standard normal density phi(z) = exp(-z^2/2) / sqrt(2 pi) (R: dnorm). */
export function normalPdf(z: number): number {
  requireNumber(z, 'z', 'normalPdf');
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}

/** P(Z <= z) for a standard normal Z (R: pnorm(z)). Accurate in relative terms far into the lower tail. */
export function normalCdf(z: number): number {
  requireNumber(z, 'z', 'normalCdf');
  return 0.5 * erfc(-z * SQRT1_2);
}

/** P(Z > z) for a standard normal Z (R: pnorm(z, lower.tail = FALSE)), computed directly, never as 1 - cdf. */
export function normalSf(z: number): number {
  requireNumber(z, 'z', 'normalSf');
  return 0.5 * erfc(z * SQRT1_2);
}

/**
 * AS 241 (PPND16): the normal deviate for a probability split as q = p - 0.5 and the smaller tail area
 * `tail` = min(p, 1 - p), given separately so that a tiny upper-tail probability never passes through 1 - q.
 */
function ppnd16(q: number, tail: number): number {
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (
      (q *
        (((((((r * 2509.0809287301226727 + 33430.575583588128105) * r + 67265.770927008700853) * r +
          45921.953931549871457) *
          r +
          13731.693765509461125) *
          r +
          1971.5909503065514427) *
          r +
          133.14166789178437745) *
          r +
          3.387132872796366608)) /
      (((((((r * 5226.495278852854561 + 28729.085735721942674) * r + 39307.89580009271061) * r +
        21213.794301586595867) *
        r +
        5394.1960214247511077) *
        r +
        687.1870074920579083) *
        r +
        42.313330701600911252) *
        r +
        1)
    );
  }
  let r = Math.sqrt(-Math.log(tail));
  let val: number;
  if (r <= 5) {
    r -= 1.6;
    val =
      (((((((r * 7.7454501427834140764e-4 + 0.0227238449892691845833) * r + 0.24178072517745061177) * r +
        1.27045825245236838258) *
        r +
        3.64784832476320460504) *
        r +
        5.7694972214606914055) *
        r +
        4.6303378461565452959) *
        r +
        1.42343711074968357734) /
      (((((((r * 1.05075007164441684324e-9 + 5.475938084995344946e-4) * r + 0.0151986665636164571966) * r +
        0.14810397642748007459) *
        r +
        0.68976733498510000455) *
        r +
        1.6763848301838038494) *
        r +
        2.05319162663775882187) *
        r +
        1);
  } else {
    r -= 5;
    val =
      (((((((r * 2.01033439929228813265e-7 + 2.71155556874348757815e-5) * r + 0.0012426609473880784386) * r +
        0.026532189526576123093) *
        r +
        0.29656057182850489123) *
        r +
        1.7848265399172913358) *
        r +
        5.4637849111641143699) *
        r +
        6.6579046435011037772) /
      (((((((r * 2.04426310338993978564e-15 + 1.4215117583164458887e-7) * r + 1.8463183175100546818e-5) * r +
        7.868691311456132591e-4) *
        r +
        0.0148753612908506148525) *
        r +
        0.13692988092273580531) *
        r +
        0.59983220655588793769) *
        r +
        1);
  }
  return q < 0 ? -val : val;
}

/**
 * The z with P(Z <= z) = p (R: qnorm(p)), by AS 241. p = 0 gives -Infinity and p = 1 gives +Infinity.
 * Throws on p outside [0, 1] or NaN.
 */
export function normalQuantile(p: number): number {
  requireProbability(p, 'p', 'normalQuantile');
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  const q = p - 0.5;
  // For p > 0.5, 1 - p is exact (Sterbenz), so the upper tail loses nothing here.
  return ppnd16(q, q <= 0 ? p : 1 - p);
}

/**
 * The z with P(Z > z) = q (R: qnorm(q, lower.tail = FALSE)), by AS 241 on the upper tail area itself, so that
 * q = 1e-300 gives z = 37.04... with full accuracy. q = 0 gives +Infinity and q = 1 gives -Infinity.
 */
export function normalSfQuantile(q: number): number {
  requireProbability(q, 'q', 'normalSfQuantile');
  if (q === 0) return Infinity;
  if (q === 1) return -Infinity;
  // z = -qnorm(q): the lower-tail split of q, negated.
  const d = q - 0.5;
  return -ppnd16(d, d <= 0 ? q : 1 - q);
}
