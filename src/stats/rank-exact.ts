/**
 * Exact permutation p-values of Spearman's rho and Kendall's tau for a few units without ties.
 *
 * Under no association every pairing of the y ranks with the x ranks is equally likely, so the p-value is the share
 * of the n! permutations whose statistic is at least as extreme as the one seen: for Spearman, S = sum of squared
 * rank differences (small S goes with positive rho); for Kendall, the number of concordant pairs C. Both statistics'
 * null distributions are symmetric, so the two-sided p-value is twice the smaller tail, capped at 1.
 *
 * Sources: M. G. Kendall and J. D. Gibbons (1990), Rank Correlation Methods, 5th ed., Arnold, ch. 5-6 (exact
 * distributions by enumeration); D. J. Best and D. E. Roberts (1975), "Algorithm AS 89: the upper tail probabilities
 * of Spearman's rho", Applied Statistics 24, 377-379 (exact evaluation for n <= 9, as R's cor.test uses). Checked
 * against R's cor.test with its default exact p-values (tests/fixtures/r/rank-exact.R).
 *
 * The t and normal approximations (spearman.ts, kendall.ts) are far off with few units: four units in perfect order
 * give t = infinity and p < 0.001, where the exact two-sided p-value is 2/24 = 0.083. With ties, or more than
 * EXACT_MAX_UNITS units, those approximations are used.
 */
import type { Alternative } from './result.js';

/** Exact p-values are enumerated up to this many units (9! = 362,880 orderings, counted once per n and kept). */
export const EXACT_MAX_UNITS = 9;

interface Distribution {
  /** count of permutations by S = sum (i - p(i))^2 */
  s: number[];
  /** count of permutations by concordant pairs C */
  c: number[];
  total: number;
}

const cache = new Map<number, Distribution>();

/** The null distributions of S and C over all n! orderings (Heap's algorithm). */
function distribution(n: number): Distribution {
  const known = cache.get(n);
  if (known) return known;
  const maxS = (n * (n * n - 1)) / 3;
  const maxC = (n * (n - 1)) / 2;
  const s = new Array<number>(maxS + 1).fill(0);
  const c = new Array<number>(maxC + 1).fill(0);
  const p = Array.from({ length: n }, (_, i) => i);
  const count = (): void => {
    let ss = 0;
    let cc = 0;
    for (let i = 0; i < n; i++) {
      const d = i - (p[i] as number);
      ss += d * d;
      for (let j = i + 1; j < n; j++) if ((p[i] as number) < (p[j] as number)) cc++;
    }
    s[ss] = (s[ss] as number) + 1;
    c[cc] = (c[cc] as number) + 1;
  };
  const k = new Array<number>(n).fill(0);
  count();
  let total = 1;
  for (let i = 1; i < n; ) {
    if ((k[i] as number) < i) {
      const j = i % 2 === 0 ? 0 : (k[i] as number);
      const t = p[j] as number;
      p[j] = p[i] as number;
      p[i] = t;
      count();
      total++;
      k[i] = (k[i] as number) + 1;
      i = 1;
    } else {
      k[i] = 0;
      i++;
    }
  }
  const d = { s, c, total };
  cache.set(n, d);
  return d;
}

/** Shares of the distribution at or below, and at or above, the observed value. */
function tails(counts: number[], observed: number, total: number): { below: number; above: number } {
  let below = 0;
  let above = 0;
  counts.forEach((k, v) => {
    if (v <= observed) below += k;
    if (v >= observed) above += k;
  });
  return { below: below / total, above: above / total };
}

function ranks(v: readonly number[]): number[] {
  const order = v.map((_, i) => i).sort((a, b) => (v[a] as number) - (v[b] as number));
  const r = new Array<number>(v.length);
  order.forEach((i, k) => (r[i] = k));
  return r;
}

/**
 * Exact p-values for Spearman's rho and Kendall's tau, or undefined when they are not computed here (fewer than 3
 * or more than EXACT_MAX_UNITS pairs, or ties in either measure). `alternative` 'greater' is a positive association.
 */
export function exactRankPValues(x: readonly number[], y: readonly number[], alternative: Alternative): { spearman: number; kendall: number } | undefined {
  const n = x.length;
  if (n !== y.length || n < 3 || n > EXACT_MAX_UNITS) return undefined;
  if (new Set(x).size < n || new Set(y).size < n) return undefined;
  const rx = ranks(x);
  const ry = ranks(y);
  let sObs = 0;
  let cObs = 0;
  for (let i = 0; i < n; i++) {
    const d = (rx[i] as number) - (ry[i] as number);
    sObs += d * d;
    for (let j = i + 1; j < n; j++) if (Math.sign((rx[i] as number) - (rx[j] as number)) === Math.sign((ry[i] as number) - (ry[j] as number))) cObs++;
  }
  const dist = distribution(n);
  const s = tails(dist.s, sObs, dist.total);
  const c = tails(dist.c, cObs, dist.total);
  // Positive association: small S, many concordant pairs.
  const pick = (positive: number, negative: number): number =>
    alternative === 'greater' ? positive : alternative === 'less' ? negative : Math.min(1, 2 * Math.min(positive, negative));
  return { spearman: pick(s.below, s.above), kendall: pick(c.above, c.below) };
}
