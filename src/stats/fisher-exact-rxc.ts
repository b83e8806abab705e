/**
 * Fisher's exact test of independence for an r × c table of counts (Freeman–Halton extension).
 *
 * Conditional on both margins, a table has the multivariate hypergeometric probability
 *   P(x) = Π r_i! Π c_j! / (N! Π x_ij!).
 * The two-sided p-value is the total probability of the tables with the observed margins whose probability is at
 * most P(observed) · (1 + 1e-7), the tolerance R's fisher.test uses so that tables tied with the observed one are
 * not lost to rounding.
 *
 * Sources:
 * - Freeman G. H., Halton J. H. (1951) "Note on an exact treatment of contingency, goodness of fit and other
 *   problems of significance", Biometrika 38, 141–149 (the test).
 * - Mehta C. R., Patel N. R. (1983) "A network algorithm for performing Fisher's exact test in r × c contingency
 *   tables", JASA 78, 427–434 (the method): tables are built one column at a time; a node is the vector of row
 *   totals still to fill. At each node the largest and smallest probability any completion can reach are known
 *   exactly (computed once per node and remembered), and the total probability of all completions has the closed
 *   form N'! / (Π R_i! Π C_k!). A node whose every completion is at most as probable as the observed table is added
 *   whole; a node whose every completion is more probable is dropped; only the rest are expanded.
 *
 * Rows and columns are swapped when that makes the node vector shorter (the p-value does not change).
 * Work is bounded: past `maxSteps` partial tables visited the function throws FisherTooLargeError, and the caller should
 * fall back to the chi-square test (with its warning about small expected counts) or to a Monte Carlo estimate.
 *
 * Rows and columns with no observations are left out (they do not change the p-value), with a warning saying so.
 *
 * @throws Error for a table that is not rectangular, holds a count that is not a whole number >= 0, or has fewer
 *   than 2 rows or columns with observations; FisherTooLargeError when the work limit is reached.
 * @example fisherExactRxc([[3, 1], [1, 3]]).p // 34/70 = 0.4857 (Fisher's tea-tasting table, Agresti 2013 §3.5.2)
 */
import { checkTable } from './chi-square-independence.js';
import type { TestResult } from './result.js';

/** Default work limit, in partial tables visited (a few seconds of work at most). */
export const FISHER_DEFAULT_MAX_STEPS = 10_000_000;

export class FisherTooLargeError extends Error {
  readonly steps: number;
  constructor(steps: number, rows: number, cols: number, total: number) {
    super(
      `fisherExactRxc: the ${rows} × ${cols} table with ${total} observations needs more than ${steps} steps to ` +
        'enumerate; too large for the exact test, use the chi-square test instead',
    );
    this.name = 'FisherTooLargeError';
    this.steps = steps;
  }
}

export interface FisherRxcOptions {
  /** Work limit in partial tables visited; default FISHER_DEFAULT_MAX_STEPS. */
  maxSteps?: number;
}

export interface FisherRxcResult extends TestResult {
  /** Probability of the observed table given its margins. */
  tableProbability: number;
  /** Work done (partial tables visited), for diagnostics. */
  steps: number;
}

export function fisherExactRxc(table: readonly (readonly number[])[], options: FisherRxcOptions = {}): FisherRxcResult {
  const checked = checkTable(table, 'fisherExactRxc', true);
  const maxSteps = options.maxSteps ?? FISHER_DEFAULT_MAX_STEPS;
  const { total } = checked;

  // Orient so that the node vector (one entry per row) is the shorter dimension.
  let x: number[][] = checked.table;
  let rowSums = checked.rowSums;
  let colSums = checked.colSums;
  if (checked.rows > checked.cols) {
    x = colSums.map((_, j) => x.map((row) => row[j] as number));
    [rowSums, colSums] = [colSums, rowSums];
  }
  // Columns in ascending order of total: the two largest come last, where bounds have closed forms, and the
  // early stages, which are enumerated, hold few tables. Column order does not change the p-value.
  colSums = colSums.slice().sort((a, b) => a - b);
  const r = rowSums.length;
  const c = colSums.length;

  const lf = logFactorials(total);
  const lfa = (k: number): number => lf[k] as number;

  // log P(x) = K + S(x), S(x) = −Σ log x_ij!.
  const K = rowSums.reduce((a, v) => a + lfa(v), 0) + colSums.reduce((a, v) => a + lfa(v), 0) - lfa(total);
  let sObs = 0;
  for (const row of x) for (const v of row) sObs -= lfa(v);
  // Tables with P <= P_obs (1 + 1e-7) count.
  const threshold = sObs + Math.log1p(1e-7);

  // Suffix sums of the log factorials of column totals.
  const colLfSuffix = new Array<number>(c + 1).fill(0);
  for (let j = c - 1; j >= 0; j--) colLfSuffix[j] = (colLfSuffix[j + 1] as number) + lfa(colSums[j] as number);

  let steps = 0;
  const tick = (): void => {
    if (++steps > maxSteps) throw new FisherTooLargeError(maxSteps, checked.rows, checked.cols, total);
  };

  /** Every way to split `need` into r parts with part i at most cap[i]; calls visit(parts, −Σ log part!). */
  const compositions = (cap: readonly number[], need: number, visit: (parts: number[], s: number) => void): void => {
    const parts = new Array<number>(r).fill(0);
    const capSuffix = new Array<number>(r + 1).fill(0);
    for (let i = r - 1; i >= 0; i--) capSuffix[i] = (capSuffix[i + 1] as number) + (cap[i] as number);
    const go = (i: number, left: number, s: number): void => {
      if (i === r - 1) {
        if (left > (cap[i] as number)) return;
        parts[i] = left;
        tick();
        visit(parts, s - lfa(left));
        return;
      }
      const lo = Math.max(0, left - (capSuffix[i + 1] as number));
      const hi = Math.min(cap[i] as number, left);
      for (let v = lo; v <= hi; v++) {
        parts[i] = v;
        go(i + 1, left - v, s - lfa(v));
      }
    };
    go(0, need, 0);
  };

  /**
   * Exact largest and smallest S over the completions of the last two columns from remaining row totals R.
   * With the last column forced (R − x), S = Σ g_i(x_i), g_i(x) = −log x! − log (R_i − x)!, concave in x.
   * Largest: concave separable maximisation under Σ x = C, 0 <= x <= R, solved exactly by greedy marginal
   * allocation (Ibaraki T., Katoh N. (1988) Resource Allocation Problems, §4.1).
   * Smallest: a concave function is minimised at a vertex of {0 <= x <= R, Σ x = C}, where every x_i but one
   * (x_f) is 0 or R_i; there g_i = −log R_i!, so S = −Σ log R_i! + log binom(R_f, x_f), with x_f = C − (a sum of a
   * subset of the other R_i). Subset sums are found by dynamic programming.
   */
  const lastTwoBounds = (R: readonly number[]): [number, number] => {
    const C = colSums[c - 2] as number;
    let base = 0;
    for (const v of R) base -= lfa(v);
    // Largest: start at 0, give each unit to the row with the largest marginal gain log((R_i − x_i)/(x_i + 1)).
    const xs = new Array<number>(r).fill(0);
    for (let u = 0; u < C; u++) {
      let best = -1;
      let gain = -Infinity;
      for (let i = 0; i < r; i++) {
        const xi = xs[i] as number;
        const ri = R[i] as number;
        if (xi >= ri) continue;
        const g = Math.log((ri - xi) / (xi + 1));
        if (g > gain) {
          gain = g;
          best = i;
        }
      }
      xs[best] = (xs[best] as number) + 1;
    }
    let mx = 0;
    for (let i = 0; i < r; i++) mx -= lfa(xs[i] as number) + lfa((R[i] as number) - (xs[i] as number));
    // Smallest.
    let least = Infinity;
    for (let f = 0; f < r; f++) {
      const rf = R[f] as number;
      const reach = new Uint8Array(C + 1);
      reach[0] = 1;
      for (let i = 0; i < r; i++) {
        if (i === f) continue;
        const ri = R[i] as number;
        if (ri === 0) continue;
        for (let s = C; s >= ri; s--) if (reach[s - ri]) reach[s] = 1;
      }
      for (let s = Math.max(0, C - rf); s <= C; s++) {
        if (!reach[s]) continue;
        const xf = C - s;
        const logBinom = lfa(rf) - lfa(xf) - lfa(rf - xf);
        if (logBinom < least) least = logBinom;
        if (least === 0) break;
      }
      if (least === 0) break;
    }
    return [mx, base + least];
  };

  // Largest and smallest S over all completions of columns j..c−1 from remaining row totals R, remembered per
  // node. Rows are exchangeable in the remaining problem, so the key is the sorted R.
  const radix = total + 1;
  const numericKeys = Math.pow(radix, r) < Number.MAX_SAFE_INTEGER;
  const memo: Array<Map<number | string, [number, number]>> = colSums.map(() => new Map());
  const keyOf = (R: readonly number[]): number | string => {
    const sorted = R.slice().sort((a, b) => a - b);
    if (!numericKeys) return sorted.join(',');
    let key = 0;
    for (const v of sorted) key = key * radix + v;
    return key;
  };
  const restBounds = (j: number, R: readonly number[]): [number, number] => {
    if (j === c - 1) {
      let s = 0;
      for (const v of R) s -= lfa(v);
      return [s, s];
    }
    const table = memo[j] as Map<number | string, [number, number]>;
    const key = keyOf(R);
    const known = table.get(key);
    if (known) return known;
    let result: [number, number];
    if (j === c - 2) {
      result = lastTwoBounds(R);
    } else {
      let best = -Infinity;
      let worst = Infinity;
      const next = new Array<number>(r);
      compositions(R, colSums[j] as number, (parts, s) => {
        for (let i = 0; i < r; i++) next[i] = (R[i] as number) - (parts[i] as number);
        const [mx, mn] = restBounds(j + 1, next);
        if (s + mx > best) best = s + mx;
        if (s + mn < worst) worst = s + mn;
      });
      result = [best, worst];
    }
    table.set(key, result);
    return result;
  };

  // For the last two columns: every completion's S, ascending, and running sums of exp(S − shift).
  interface Tail {
    s: Float64Array;
    cumulative: Float64Array;
    shift: number;
  }
  const tails = new Map<number | string, Tail>();
  const lastTwoTail = (R: readonly number[]): Tail => {
    const key = keyOf(R);
    const known = tails.get(key);
    if (known) return known;
    const values: number[] = [];
    compositions(R, colSums[c - 2] as number, (parts, s) => {
      let v = s;
      for (let i = 0; i < r; i++) v -= lfa((R[i] as number) - (parts[i] as number));
      values.push(v);
    });
    values.sort((a, b) => a - b);
    const shift = values[values.length - 1] as number;
    const sorted = Float64Array.from(values);
    const cumulative = new Float64Array(sorted.length);
    let run = 0;
    sorted.forEach((v, i) => {
      run += Math.exp(v - shift);
      cumulative[i] = run;
    });
    const tail: Tail = { s: sorted, cumulative, shift };
    tails.set(key, tail);
    return tail;
  };

  // log of Σ over completions of Π 1/x! = log N'! − Σ log R_i! − Σ_{k>=j} log C_k!.
  const logAllCompletions = (j: number, R: readonly number[]): number => {
    let n = 0;
    let s = 0;
    for (const v of R) {
      n += v;
      s -= lfa(v);
    }
    return lfa(n) + s - (colLfSuffix[j] as number);
  };

  let p = 0;
  const walk = (j: number, R: number[], past: number): void => {
    const [mx, mn] = restBounds(j, R);
    if (past + mx <= threshold) {
      p += Math.exp(K + past + logAllCompletions(j, R));
      return;
    }
    if (past + mn > threshold) return;
    if (j === c - 2) {
      // Two columns left: many nodes share the same remaining row totals but differ in the past, so the
      // completions of each are listed once, sorted, with running sums, and each node is one binary search.
      const tail = lastTwoTail(R);
      const limit = threshold - past;
      let lo = 0;
      let hi = tail.s.length; // first index with s > limit
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if ((tail.s[mid] as number) <= limit) lo = mid + 1;
        else hi = mid;
      }
      if (lo > 0) p += Math.exp(K + past + tail.shift) * (tail.cumulative[lo - 1] as number);
      return;
    }
    // Only reached before the last two columns.
    compositions(R, colSums[j] as number, (parts, s) => {
      const next = R.map((v, i) => v - (parts[i] as number));
      walk(j + 1, next, past + s);
    });
  };
  walk(0, rowSums.slice(), 0);

  const tableProbability = Math.exp(K + sObs);
  const warnings: string[] = checked.dropped.slice();
  return {
    method: 'fisher-exact-rxc',
    p: Math.min(1, p),
    alternative: 'two-sided',
    nullValue: 0,
    estimate: { name: 'Cramér’s V', value: cramersV(checked.table, checked.rowSums, checked.colSums, total) },
    n: checked.rowSums.slice(),
    warnings,
    tableProbability,
    steps,
  };
}

/** log k! for k = 0..n, by compensated (Kahan) running sums of log k, so the error stays near ε · log n!. */
function logFactorials(n: number): Float64Array {
  const out = new Float64Array(n + 1);
  let sum = 0;
  let carry = 0;
  for (let k = 2; k <= n; k++) {
    const y = Math.log(k) - carry;
    const t = sum + y;
    carry = t - sum - y;
    sum = t;
    out[k] = sum;
  }
  return out;
}

function cramersV(
  table: readonly (readonly number[])[],
  rowSums: readonly number[],
  colSums: readonly number[],
  total: number,
): number {
  let x2 = 0;
  table.forEach((row, i) =>
    row.forEach((o, j) => {
      const e = ((rowSums[i] as number) * (colSums[j] as number)) / total;
      x2 += ((o - e) * (o - e)) / e;
    }),
  );
  return Math.min(1, Math.sqrt(x2 / (total * (Math.min(rowSums.length, colSums.length) - 1))));
}
