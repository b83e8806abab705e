/**
 * Dot product in twice the working precision: the "Dot2" algorithm of Ogita, Rump & Oishi, "Accurate sum and dot
 * product", SIAM Journal on Scientific Computing 26 (2005) 1955-1988, Algorithm 5.3. Each product is split exactly
 * into a sum of two doubles (Dekker's TwoProduct with Veltkamp's splitting, T. J. Dekker, "A floating-point technique
 * for extending the available precision", Numerische Mathematik 18 (1971) 224-242) and each addition into its rounded
 * value and its error (Knuth's TwoSum). The result is as accurate as if computed in double-double and then rounded.
 */

const SPLITTER = 134217729; // 2^27 + 1

/**
 * a * b exactly as out[0] + out[1] (Dekker's TwoProduct with Veltkamp's splitting; no overflow handling: inputs here
 * are far from the limits). Also used by the double-double columns of least-squares.ts.
 */
export function twoProduct(a: number, b: number, out: Float64Array | [number, number]): void {
  const p = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  out[0] = p;
  out[1] = al * bl - (p - ah * bh - al * bh - ah * bl);
}

/** sum_i a[i] * b[i], accurate to about one rounding of the exact value unless the sum cancels by more than 1e16. */
export function accurateDot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error(`accurateDot: lengths differ (${a.length} and ${b.length}).`);
  const pr: [number, number] = [0, 0];
  let s = 0;
  let c = 0;
  for (let i = 0; i < a.length; i++) {
    twoProduct(a[i]!, b[i]!, pr);
    const h = pr[0];
    const t = s + h;
    const z = t - s;
    c += s - (t - z) + (h - z) + pr[1];
    s = t;
  }
  return s + c;
}
