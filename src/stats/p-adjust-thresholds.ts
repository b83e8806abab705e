/**
 * The effective threshold of each claim under an adjustment for many claims: the per-claim alpha that the procedure
 * actually applied when it decided that claim. It is the companion of `adjustP` (src/stats/p-adjust.ts), built so that
 * for every claim
 *
 *     adjusted p < alpha   exactly when   raw p < effective threshold
 *
 * (the adjusted p-values are R's `p.adjust`; the verdicts compare them with alpha strictly, see src/verdicts/decide.ts).
 *
 * Each threshold is the textbook critical value of the step at which the procedure settled that claim:
 * - 'none': alpha. 'bonferroni': alpha / m.
 * - 'holm' (step-down, Holm 1979): steps k = 1, 2, ... over the p-values in ascending order, critical value
 *   alpha / (m − k + 1). A claim at rank k is decided at its own step when every earlier step passed (threshold
 *   alpha / (m − k + 1)); otherwise at the first step that failed, f (threshold alpha / (m − f + 1), which its own
 *   p-value, no smaller than the failing one, also exceeds).
 * - 'hochberg' (step-up, Hochberg 1988): the same critical values, stepped from the largest p-value down; the first
 *   step that passes, K, rejects every claim of rank k ≤ K. Those are decided at step K (threshold alpha / (m − K + 1));
 *   a claim of rank k > K is decided (not rejected) at its own step (threshold alpha / (m − k + 1)).
 * - 'benjamini-hochberg' (Benjamini & Hochberg 1995): as Hochberg with critical values alpha · k / m.
 * - 'benjamini-yekutieli' (Benjamini & Yekutieli 2001): as BH with alpha · k / (m · Σ_{j=1}^{m} 1/j).
 *
 * Claims may carry their own alpha (one minus their confidence level): each claim's steps are judged against its own
 * alpha, exactly as comparing its adjusted p-value with its alpha does. Ties are ranked in input order, as `adjustP`
 * and R's `order` do.
 *
 * Absent values: NaN p-values (claims not tested) are left out of m and get NaN back, as in `adjustP`.
 *
 * Complexity O(m²) in the worst case for the step procedures (m claims: a few hundred at most).
 *
 * @throws Error as `adjustP` for p-values outside [0, 1] or an n smaller than the count, and when an alpha is not in
 *   (0, 1) or the list of alphas does not match the p-values.
 * @example effectiveThresholds([0.01, 0.04, 0.03], 0.05, 'holm') // [0.05/3, 0.05/2, 0.05/2]
 */
import { presentPValues, type AdjustMethod, type AdjustOptions } from './p-adjust.js';

export function effectiveThresholds(
  p: readonly number[],
  alpha: number | readonly number[],
  method: AdjustMethod,
  options: AdjustOptions = {},
): number[] {
  const alphas = typeof alpha === 'number' ? p.map(() => alpha) : alpha.slice();
  if (alphas.length !== p.length) {
    throw new Error(`effectiveThresholds: ${alphas.length} alphas given for ${p.length} p-values; give one alpha or one per p-value`);
  }
  const { present, m } = presentPValues(p, options, 'effectiveThresholds');
  for (const i of present) {
    const a = alphas[i] as number;
    if (!(a > 0 && a < 1)) throw new Error(`effectiveThresholds: alpha ${i + 1} is ${a}; alpha must lie strictly between 0 and 1`);
  }
  const out = p.map(() => Number.NaN);
  const lp = present.length;
  if (lp === 0) return out;

  // Ascending order, ties in input order; rank k = 1..lp. `critical(k)` is the divisor of alpha at step k.
  const order = present.slice().sort((a, b) => (p[a] as number) - (p[b] as number) || a - b);
  const sorted = order.map((i) => p[i] as number);
  let critical: (k: number) => number;
  switch (method) {
    case 'none':
      critical = () => 1;
      break;
    case 'bonferroni':
      critical = () => m;
      break;
    case 'holm':
    case 'hochberg':
      critical = (k) => m - k + 1;
      break;
    case 'benjamini-hochberg':
    case 'benjamini-yekutieli': {
      let q = 1;
      if (method === 'benjamini-yekutieli') {
        q = 0;
        for (let j = 1; j <= m; j++) q += 1 / j;
      }
      critical = (k) => (q * m) / k;
      break;
    }
    default: {
      const never: never = method;
      throw new Error(`effectiveThresholds: unknown method ${String(never)}`);
    }
  }
  // A step passes for a claim with alpha `a` when critical · p < a: the same product `adjustP` forms.
  const passes = (j: number, a: number) => critical(j) * (sorted[j - 1] as number) < a;
  order.forEach((idx, r) => {
    const k = r + 1;
    const a = alphas[idx] as number;
    let step = k;
    if (method === 'holm') {
      // The first step up to k that fails decides; none fails: the claim's own step.
      for (let j = 1; j <= k; j++) {
        if (!passes(j, a)) {
          step = j;
          break;
        }
      }
    } else if (method !== 'none' && method !== 'bonferroni') {
      // Step-up: the highest step at or above k that passes decides; none passes: the claim's own step.
      for (let j = lp; j >= k; j--) {
        if (passes(j, a)) {
          step = j;
          break;
        }
      }
    }
    out[idx] = a / critical(step);
  });
  return out;
}
