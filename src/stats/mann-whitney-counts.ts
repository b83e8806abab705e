/**
 * Wilcoxon–Mann–Whitney rank-sum test for two groups given as counts per answer code (histograms), e.g.
 * { 1: 3, 2: 10, 3: 25, 4: 40, 5: 22 } for each of two departments. Survey answers take few distinct values, so the
 * ranks are computed per code rather than per respondent: all answers with the same code share the average of the
 * ranks they occupy, and the tie correction sums t³ − t over the codes. The result is identical to expanding the
 * histograms into one value per respondent and calling mannWhitney (mann-whitney.ts), in time proportional to the
 * number of codes instead of the number of respondents.
 *
 * Sources:
 * - Mann H. B., Whitney D. R. (1947) "On a test of whether one of two random variables is stochastically larger
 *   than the other", Annals of Mathematical Statistics 18, 50–60.
 * - Lehmann E. L. (1975) Nonparametrics: Statistical Methods Based on Ranks, §1.4 (tie-corrected variance; the
 *   grouped-data form, where every tie group is one answer category).
 * Computed as R's wilcox.test(x, y, exact = FALSE, correct = TRUE) on the expanded answers.
 *
 * @throws Error when a count is negative, not a whole number or not finite, a code is not a finite number, a group
 *   is empty, or every answer in both groups has the same code.
 * @example mannWhitneyCounts({ 1: 2, 2: 1 }, { 2: 1, 3: 2 }) // same as mannWhitney([1, 1, 2], [2, 3, 3])
 */
import { normalCdf, normalSf } from './distributions/normal.js';
import type { MannWhitneyOptions, MannWhitneyResult } from './mann-whitney.js';

/** Counts per answer code; codes are numbers or numeric text ("4"). */
export type CodeCounts = Readonly<Record<string, number>> | ReadonlyMap<number, number>;

/** Checked (code, count) pairs with a positive count, sorted by code. */
export function codeEntries(counts: CodeCounts, which: string, who: string): Array<[number, number]> {
  const raw: Array<[string | number, number]> = counts instanceof Map ? [...counts.entries()] : Object.entries(counts);
  const out: Array<[number, number]> = [];
  for (const [k, c] of raw) {
    const code = Number(k);
    if (!Number.isFinite(code) || (typeof k === 'string' && k.trim() === '')) {
      throw new Error(`${who}: the ${which} group has an answer code "${String(k)}" that is not a number`);
    }
    if (!Number.isInteger(c) || c < 0) {
      throw new Error(`${who}: the ${which} group has ${c} answers with code ${code}; counts must be whole numbers >= 0`);
    }
    if (c > 0) out.push([code, c]);
  }
  out.sort((a, b) => a[0] - b[0]);
  for (let i = 1; i < out.length; i++) {
    if ((out[i] as [number, number])[0] === (out[i - 1] as [number, number])[0]) {
      throw new Error(`${who}: the ${which} group lists code ${(out[i] as [number, number])[0]} twice`);
    }
  }
  return out;
}

export function mannWhitneyCounts(x: CodeCounts, y: CodeCounts, options: Omit<MannWhitneyOptions, 'mu'> = {}): MannWhitneyResult {
  const who = 'mannWhitneyCounts';
  const alternative = options.alternative ?? 'two-sided';
  const correct = options.correct ?? true;
  const cx = new Map(codeEntries(x, 'first', who));
  const cy = new Map(codeEntries(y, 'second', who));
  let nx = 0;
  let ny = 0;
  for (const c of cx.values()) nx += c;
  for (const c of cy.values()) ny += c;
  if (nx === 0) throw new Error(`${who}: the first group has no answers`);
  if (ny === 0) throw new Error(`${who}: the second group has no answers`);
  const codes = [...new Set([...cx.keys(), ...cy.keys()])].sort((a, b) => a - b);
  const N = nx + ny;
  let below = 0;
  let rankSumX = 0;
  let tieTerm = 0;
  for (const code of codes) {
    const a = cx.get(code) ?? 0;
    const t = a + (cy.get(code) ?? 0);
    // Ranks below+1 .. below+t, average (2·below + t + 1) / 2.
    rankSumX += (a * (2 * below + t + 1)) / 2;
    tieTerm += t * t * t - t;
    below += t;
  }
  const W = rankSumX - (nx * (nx + 1)) / 2;
  const centred = W - (nx * ny) / 2;
  const variance = ((nx * ny) / 12) * (N + 1 - tieTerm / (N * (N - 1)));
  if (!(variance > 0)) throw new Error(`${who}: every answer in both groups has the same code, so there is nothing to rank`);
  const sigma = Math.sqrt(variance);
  const c = !correct ? 0 : alternative === 'two-sided' ? 0.5 * Math.sign(centred) : alternative === 'greater' ? 0.5 : -0.5;
  const z = (centred - c) / sigma;
  const p =
    alternative === 'less' ? normalCdf(z) : alternative === 'greater' ? normalSf(z) : Math.min(1, 2 * Math.min(normalCdf(z), normalSf(z)));
  const warnings: string[] = [];
  if (Math.min(nx, ny) < 10) warnings.push('A group has fewer than 10 answers, so the normal approximation behind this p-value is rough.');
  return {
    method: 'mann-whitney',
    statistic: { symbol: 'W', value: W },
    p,
    alternative,
    nullValue: 0,
    estimate: { name: 'probability of superiority', value: W / (nx * ny) },
    n: [nx, ny],
    warnings,
    z,
  };
}
