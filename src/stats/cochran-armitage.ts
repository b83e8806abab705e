/**
 * Cochran–Armitage test for a linear trend in proportions over ordered groups (e.g. the agreement rate over
 * survey years, or over bands of a rating).
 *
 * Sources:
 * - Cochran W. G. (1954) "Some methods for strengthening the common χ² tests", Biometrics 10, 417–451.
 * - Armitage P. (1955) "Tests for linear trends in proportions and frequencies", Biometrics 11, 375–386.
 * - Agresti A. (2013) Categorical Data Analysis, 3rd ed., §3.4.6–3.4.7.
 *
 * With agreeing counts x_i out of n_i at scores s_i, pooled rate p̄ = Σx / Σn and s̄ = Σ n_i s_i / Σ n,
 *   z = Σ x_i (s_i − s̄) / sqrt(p̄ (1 − p̄) Σ n_i (s_i − s̄)²),
 * and z² is the chi-square statistic (1 df) that R's prop.trend.test reports: there it is the regression sum of
 * squares of the weighted least-squares line of x_i / n_i on s_i with weights n_i / (p̄ (1 − p̄)). The slope of that
 * line, Σ n_i (s_i − s̄)(x_i/n_i − p̄) / Σ n_i (s_i − s̄)², is the fitted change in the rate per unit of score (per
 * year when the scores are years); the sign of z is the sign of the slope.
 *
 * Alternatives: 'two-sided' uses z² against chi-square(1) as R does; 'greater' (rate rises with score) and 'less'
 * (rate falls) use the one-sided normal tail of z.
 *
 * Interval for the slope (given `level`): the Wald interval slope ± z_{(1+level)/2} · se with the test's own standard
 * error se = sqrt(p̄ (1 − p̄) / Σ n_i (s_i − s̄)²): the weighted least-squares line above with its weights' scale taken
 * as known (R: summary(glm(freq ~ score, weights = n / (p̄ (1 − p̄))), dispersion = 1)), so that (slope / se)² is the
 * test statistic and the two-sided interval excludes 0 exactly when the two-sided test rejects at 1 − level (a
 * test-based interval, Miettinen 1976, Am J Epidemiol 103, 226–235). It uses the spread at the pooled rate, which is
 * accurate for the modest changes survey rates show; with rates near 0 or 1 in some periods and far from them in
 * others, each period's own spread would give a somewhat different width.
 *
 * @throws Error when fewer than 2 groups, lengths differ, a count is not a whole number with 0 <= x <= n and n > 0,
 *   a score is not finite, all scores are equal, or the pooled rate is 0 or 1 (no variation to test).
 * @example cochranArmitage([83, 90, 129, 70], [86, 93, 136, 82]).statistic.value // 8.2249 (R ?prop.trend.test)
 */
import { chisqSf } from './distributions/chisq.js';
import { normalCdf, normalSf, normalSfQuantile } from './distributions/normal.js';
import type { Alternative, TestResult } from './result.js';

export interface TrendOptions {
  /** Score of each group (default 1, 2, ..., k), e.g. the survey years. */
  scores?: readonly number[];
  alternative?: Alternative;
  /** Confidence level of the two-sided interval for the slope (see above); no interval when absent. */
  level?: number;
}

export interface TrendResult extends TestResult {
  statistic: { symbol: string; value: number };
  df: number;
  /** Signed z statistic (positive when the rate rises with the score); z² is the chi-square statistic. */
  z: number;
  /** Fitted change in the rate per unit of score (the slope of the weighted least-squares line). */
  slope: number;
  /** Fitted rate at score 0 (intercept of the same line). */
  intercept: number;
  /** Pooled rate over all groups. */
  pooledRate: number;
  /** Standard error of the slope at the pooled rate (the test's own): slope / se is z. */
  se: number;
}

export function cochranArmitage(
  agree: readonly number[],
  respondents: readonly number[],
  options: TrendOptions = {},
): TrendResult {
  const k = agree.length;
  const scores = options.scores ?? agree.map((_, i) => i + 1);
  const alternative = options.alternative ?? 'two-sided';
  if (k < 2) throw new Error(`cochranArmitage: ${k} group(s) given; at least 2 ordered groups are needed`);
  if (respondents.length !== k || scores.length !== k) {
    throw new Error(
      `cochranArmitage: ${k} agreeing counts, ${respondents.length} respondent counts and ${scores.length} scores; ` +
        'give one of each per group',
    );
  }
  let sumN = 0;
  let sumX = 0;
  let sumNS = 0;
  for (let i = 0; i < k; i++) {
    const x = agree[i] as number;
    const n = respondents[i] as number;
    const s = scores[i] as number;
    if (!Number.isInteger(n) || n <= 0) {
      throw new Error(`cochranArmitage: group ${i + 1} has ${n} respondents; each group needs a whole number > 0`);
    }
    if (!Number.isInteger(x) || x < 0 || x > n) {
      throw new Error(`cochranArmitage: group ${i + 1} has ${x} agreeing of ${n}; need a whole number from 0 to ${n}`);
    }
    if (!Number.isFinite(s)) throw new Error(`cochranArmitage: score ${i + 1} is ${s}; scores must be finite numbers`);
    sumN += n;
    sumX += x;
    sumNS += n * s;
  }
  const pBar = sumX / sumN;
  if (pBar === 0 || pBar === 1) {
    throw new Error(
      `cochranArmitage: ${pBar === 0 ? 'no one' : 'everyone'} agreed in every group, so there is no variation to test for a trend`,
    );
  }
  const sBar = sumNS / sumN;
  let sxx = 0; // Σ n (s − s̄)²
  let sxy = 0; // Σ x (s − s̄) = Σ n (s − s̄)(x/n − p̄)
  for (let i = 0; i < k; i++) {
    const d = (scores[i] as number) - sBar;
    sxx += (respondents[i] as number) * d * d;
    sxy += (agree[i] as number) * d;
  }
  if (!(sxx > 0)) throw new Error('cochranArmitage: every group has the same score; give the groups distinct scores');
  const slope = sxy / sxx;
  const z = sxy / Math.sqrt(pBar * (1 - pBar) * sxx);
  const chi2 = z * z;
  const p = alternative === 'two-sided' ? chisqSf(chi2, 1) : alternative === 'greater' ? normalSf(z) : normalCdf(z);
  const level = options.level;
  if (level !== undefined && !(level > 0 && level < 1)) throw new Error(`cochranArmitage: level ${level} must lie strictly between 0 and 1`);
  const se = Math.sqrt((pBar * (1 - pBar)) / sxx);
  const half = level === undefined ? 0 : normalSfQuantile((1 - level) / 2) * se;
  const warnings: string[] = [];
  const smallest = Math.min(...respondents.map((n) => Math.min(n * pBar, n * (1 - pBar))));
  if (smallest < 5) {
    warnings.push(
      'Some groups are small for the normal approximation (fewer than 5 expected agreeing or not agreeing), so the p-value is approximate.',
    );
  }
  return {
    method: 'cochran-armitage-trend',
    statistic: { symbol: 'X²', value: chi2 },
    df: 1,
    p,
    alternative,
    nullValue: 0,
    estimate: { name: 'change in rate per unit of score', value: slope },
    ...(level !== undefined ? { interval: { lower: slope - half, upper: slope + half, level, method: 'trend-wald' } } : {}),
    n: respondents.slice(),
    warnings,
    z,
    slope,
    intercept: pBar - slope * sBar,
    pooledRate: pBar,
    se,
  };
}
