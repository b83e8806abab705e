/**
 * Adjustment of p-values for many claims tested together.
 *
 * Methods, each computed exactly as R's `p.adjust` (stats package) computes it:
 * - 'bonferroni': min(1, m·p).
 * - 'holm': step-down, Holm S. (1979) "A simple sequentially rejective multiple test procedure",
 *   Scandinavian Journal of Statistics 6, 65–70. Controls the family-wise error rate.
 * - 'hochberg': step-up, Hochberg Y. (1988) "A sharper Bonferroni procedure for multiple tests of significance",
 *   Biometrika 75, 800–802. Controls the family-wise error rate under independence or positive dependence.
 * - 'benjamini-hochberg': Benjamini Y., Hochberg Y. (1995) "Controlling the false discovery rate", Journal of the
 *   Royal Statistical Society B 57, 289–300. Controls the false discovery rate.
 * - 'benjamini-yekutieli': Benjamini Y., Yekutieli D. (2001) "The control of the false discovery rate in multiple
 *   testing under dependency", Annals of Statistics 29, 1165–1188. As BH with the factor Σ_{k=1}^{m} 1/k, valid
 *   under any dependence.
 * - 'none': the raw p-values, copied.
 *
 * Absent values: an entry that is NaN stands for a claim that was not tested (R's NA). It is left out of the
 * count m, the others are adjusted among themselves, and NaN is returned at the same position, so the caller keeps
 * positions aligned with its claims and can see which were not tested. Any other value outside [0, 1] throws.
 *
 * Complexity O(m log m).
 *
 * @throws Error when a p-value is not NaN and not in [0, 1], or when `options.n` is smaller than the number of
 *   present p-values.
 * @example adjustP([0.01, 0.04, 0.03], 'holm') // [0.03, 0.06, 0.06]
 */

export type AdjustMethod =
  | 'holm'
  | 'hochberg'
  | 'benjamini-hochberg'
  | 'benjamini-yekutieli'
  | 'bonferroni'
  | 'none';

export const ADJUST_METHODS: readonly AdjustMethod[] = [
  'holm',
  'hochberg',
  'benjamini-hochberg',
  'benjamini-yekutieli',
  'bonferroni',
  'none',
];

export interface AdjustOptions {
  /**
   * Number of comparisons m, when more claims were tested than the p-values passed (R's `n` argument).
   * Default: the number of present (non-NaN) p-values. Must be at least that number.
   */
  n?: number;
}

/**
 * The positions of the p-values present (NaN marks a claim not tested) and the number of tests m (options.n, or the
 * count present), after checking both; shared by `adjustP` and `effectiveThresholds`, whose name `who` gives the
 * messages.
 * @throws Error for a p-value outside [0, 1] or an n smaller than the count present.
 */
export function presentPValues(p: readonly number[], options: AdjustOptions, who: string): { present: number[]; m: number } {
  const present: number[] = [];
  p.forEach((v, i) => {
    if (Number.isNaN(v)) return;
    if (!(v >= 0 && v <= 1)) {
      throw new Error(`${who}: p-value ${i + 1} is ${v}; every p-value must lie in [0, 1] (or be NaN when absent)`);
    }
    present.push(i);
  });
  const lp = present.length;
  const m = options.n ?? lp;
  if (!Number.isInteger(m) || m < lp) {
    throw new Error(`${who}: n = ${m} is smaller than the ${lp} p-values given; n must be a whole number >= ${lp}`);
  }
  return { present, m };
}

export function adjustP(p: readonly number[], method: AdjustMethod, options: AdjustOptions = {}): number[] {
  const { present, m } = presentPValues(p, options, 'adjustP');
  const out = p.map(() => Number.NaN);
  const lp = present.length;
  if (lp === 0) return out;
  const values = present.map((i) => p[i] as number);

  let adjusted: number[];
  switch (method) {
    case 'none':
      adjusted = values.slice();
      break;
    case 'bonferroni':
      adjusted = values.map((v) => Math.min(1, m * v));
      break;
    case 'holm': {
      // Ascending order; the k-th smallest (k = 1..lp) is multiplied by (m - k + 1), then a running maximum.
      const order = stableOrder(values, 'ascending');
      adjusted = new Array<number>(lp);
      let running = 0;
      order.forEach((idx, k) => {
        running = Math.max(running, (m - k) * (values[idx] as number));
        adjusted[idx] = Math.min(1, running);
      });
      break;
    }
    case 'hochberg':
    case 'benjamini-hochberg':
    case 'benjamini-yekutieli': {
      // Descending order; position i runs lp, lp-1, ..., 1 (the rank from the bottom), then a running minimum.
      const order = stableOrder(values, 'descending');
      let q = 1;
      if (method === 'benjamini-yekutieli') {
        q = 0;
        for (let k = 1; k <= m; k++) q += 1 / k;
      }
      adjusted = new Array<number>(lp);
      let running = Infinity;
      order.forEach((idx, j) => {
        const i = lp - j;
        const v = values[idx] as number;
        const factor = method === 'hochberg' ? m + 1 - i : (q * m) / i;
        running = Math.min(running, factor * v);
        adjusted[idx] = Math.min(1, running);
      });
      break;
    }
    default: {
      const never: never = method;
      throw new Error(`adjustP: unknown method ${String(never)}`);
    }
  }
  present.forEach((pos, k) => {
    out[pos] = adjusted[k] as number;
  });
  return out;
}

/** Indices sorting `values`, ties kept in input order (as R's `order`, which is stable). */
function stableOrder(values: readonly number[], direction: 'ascending' | 'descending'): number[] {
  const idx = values.map((_, i) => i);
  const sign = direction === 'ascending' ? 1 : -1;
  idx.sort((a, b) => sign * ((values[a] as number) - (values[b] as number)) || a - b);
  return idx;
}
