/**
 * Wilcoxon–Mann–Whitney rank-sum test for two independent groups (e.g. answers coded 1–5 in two departments),
 * with the normal approximation, the tie correction to the variance and a continuity correction.
 *
 * Sources:
 * - Wilcoxon F. (1945) "Individual comparisons by ranking methods", Biometrics Bulletin 1, 80–83.
 * - Mann H. B., Whitney D. R. (1947) "On a test of whether one of two random variables is stochastically larger
 *   than the other", Annals of Mathematical Statistics 18, 50–60.
 * - Lehmann E. L. (1975) Nonparametrics: Statistical Methods Based on Ranks, §1.4 (tie-corrected variance).
 * Computed as R's wilcox.test(x, y, exact = FALSE, correct = TRUE): ranks of c(x − μ₀, y) with ties given their
 * average rank, W = Σ ranks of x − n₁(n₁+1)/2 (the Mann–Whitney U for the first group),
 * σ² = n₁n₂/12 · ((n₁+n₂+1) − Σ(t³ − t) / ((n₁+n₂)(n₁+n₂−1))) over tie groups of size t, and
 * z = (W − n₁n₂/2 − c) / σ with c = 0.5·sign(W − n₁n₂/2) two-sided, +0.5 for 'greater', −0.5 for 'less'.
 * 'greater' means the first group tends to take larger values (shifted by more than μ₀).
 *
 * The estimate is W / (n₁n₂), the probability that a value from the first group exceeds one from the second,
 * ties counting one half (the "probability of superiority"; 0.5 means no tendency either way).
 *
 * @throws Error when a group is empty, a value or μ₀ is not finite, or every value is tied (σ = 0).
 */
import { normalCdf, normalSf } from './distributions/normal.js';
import type { Alternative, TestResult } from './result.js';

export interface MannWhitneyOptions {
  alternative?: Alternative;
  /** Location shift under the null hypothesis (default 0). */
  mu?: number;
  /** Continuity correction (default true, as R). */
  correct?: boolean;
}

export interface MannWhitneyResult extends TestResult {
  statistic: { symbol: string; value: number };
  /** Normal deviate after the continuity correction. */
  z: number;
}

export function mannWhitney(
  x: readonly number[],
  y: readonly number[],
  options: MannWhitneyOptions = {},
): MannWhitneyResult {
  const alternative = options.alternative ?? 'two-sided';
  const mu = options.mu ?? 0;
  const correct = options.correct ?? true;
  const nx = x.length;
  const ny = y.length;
  if (nx === 0) throw new Error('mannWhitney: the first group has no values');
  if (ny === 0) throw new Error('mannWhitney: the second group has no values');
  if (!Number.isFinite(mu)) throw new Error(`mannWhitney: the null shift mu is ${mu}; give a finite number`);
  const pooled: Array<{ v: number; first: boolean }> = [];
  x.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new Error(`mannWhitney: value ${i + 1} of the first group is ${v}; values must be finite`);
    pooled.push({ v: v - mu, first: true });
  });
  y.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new Error(`mannWhitney: value ${i + 1} of the second group is ${v}; values must be finite`);
    pooled.push({ v, first: false });
  });
  pooled.sort((a, b) => a.v - b.v);

  // Average ranks over runs of ties; Σ(t³ − t) over the runs.
  const N = nx + ny;
  let rankSumX = 0;
  let tieTerm = 0;
  for (let start = 0; start < N; ) {
    let end = start + 1;
    while (end < N && (pooled[end] as { v: number }).v === (pooled[start] as { v: number }).v) end++;
    const t = end - start;
    const rank = (start + 1 + end) / 2; // average of ranks start+1 .. end
    for (let k = start; k < end; k++) if ((pooled[k] as { first: boolean }).first) rankSumX += rank;
    tieTerm += t * t * t - t;
    start = end;
  }
  const W = rankSumX - (nx * (nx + 1)) / 2;
  const centred = W - (nx * ny) / 2;
  const variance = ((nx * ny) / 12) * (N + 1 - tieTerm / (N * (N - 1)));
  if (!(variance > 0)) {
    throw new Error('mannWhitney: every value is the same in both groups, so there is nothing to rank');
  }
  const sigma = Math.sqrt(variance);
  const c = !correct ? 0 : alternative === 'two-sided' ? 0.5 * Math.sign(centred) : alternative === 'greater' ? 0.5 : -0.5;
  const z = (centred - c) / sigma;
  const p =
    alternative === 'less'
      ? normalCdf(z)
      : alternative === 'greater'
        ? normalSf(z)
        : Math.min(1, 2 * Math.min(normalCdf(z), normalSf(z)));
  const warnings: string[] = [];
  if (Math.min(nx, ny) < 10) {
    warnings.push('A group has fewer than 10 values, so the normal approximation behind this p-value is rough.');
  }
  return {
    method: 'mann-whitney',
    statistic: { symbol: 'W', value: W },
    p,
    alternative,
    nullValue: mu,
    estimate: { name: 'probability of superiority', value: W / (nx * ny) },
    n: [nx, ny],
    warnings,
    z,
  };
}
