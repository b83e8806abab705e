/**
 * Score test of one proportion against a fixed rate p0 (for "we are still below the 80% target").
 *
 * Sources:
 * - E. B. Wilson (1927), JASA 22, 209-212 (the score statistic and the interval that inverts it).
 * - A. Agresti (2013), Categorical Data Analysis, 3rd ed., Wiley, section 1.4 (score test for a binomial
 *   parameter).
 * - Matches R's prop.test(x, n, p = p0) for one sample, with correct = FALSE (default here) or TRUE.
 *
 *     z = sign(phat - p0) * (|x - n p0| - c) / sqrt(n p0 (1 - p0)),   c = min(1/2, |x - n p0|) if corrected, else 0.
 *
 * p-values: two-sided 2 P(Z > |z|) (= P(chi-square_1 > z^2)), 'less' P(Z <= z), 'greater' P(Z > z).
 * The interval inverts the same test: Wilson (or its continuity-corrected form with the same c), two-sided at the
 * level, or one-sided ([0, U] for 'less', [L, 1] for 'greater') at the level.
 */
import type { Alternative, TestResult } from './result.js';
import { normalCdf, normalQuantile, normalSf } from './distributions/normal.js';
import { checkCounts, checkLevel } from './wilson.js';
import { correctedScoreBounds } from './wilson-cc.js';

export interface OneSampleScoreOptions {
  alternative?: Alternative;
  /** Confidence level of the interval (default 0.95). */
  level?: number;
  /** Yates continuity correction (default false). */
  correct?: boolean;
}

/**
 * Score test of H0: p = p0 for x agreeing of n; method 'one-sample-score'. The statistic is the signed z.
 *
 * @throws Error when counts or level are out of range, or p0 is not strictly between 0 and 1.
 */
export function oneSampleScoreTest(x: number, n: number, p0: number, options: OneSampleScoreOptions = {}): TestResult {
  const fn = 'oneSampleScoreTest';
  const alternative = options.alternative ?? 'two-sided';
  const level = options.level ?? 0.95;
  const correct = options.correct ?? false;
  checkCounts(x, n, fn);
  checkLevel(level, fn);
  if (!(p0 > 0 && p0 < 1)) throw new Error(`${fn}: the target rate p0 must be strictly between 0 and 1, got ${p0}`);

  const diff = x - n * p0;
  const c = correct ? Math.min(0.5, Math.abs(diff)) : 0;
  const z = (Math.sign(diff) * (Math.abs(diff) - c)) / Math.sqrt(n * p0 * (1 - p0));
  const p =
    alternative === 'two-sided' ? Math.min(1, 2 * normalSf(Math.abs(z))) : alternative === 'less' ? normalCdf(z) : normalSf(z);

  const zq = normalQuantile(alternative === 'two-sided' ? (1 + level) / 2 : level);
  const [lo, hi] = correctedScoreBounds(x, n, zq, c);
  const interval = {
    lower: alternative === 'less' ? 0 : lo,
    upper: alternative === 'greater' ? 1 : hi,
    level,
    method: correct ? 'wilson-cc' : 'wilson',
  };

  const warnings: string[] = [];
  if (n * p0 < 5 || n * (1 - p0) < 5) {
    warnings.push(
      'Fewer than 5 agreeing or 5 not agreeing answers are expected at the target rate, so the normal ' +
        'approximation is rough; the exact binomial test is safer here.',
    );
  }
  return {
    method: 'one-sample-score',
    statistic: { symbol: 'z', value: z },
    p,
    alternative,
    nullValue: p0,
    estimate: { name: 'proportion', value: x / n },
    interval,
    n: [n],
    warnings,
  };
}
