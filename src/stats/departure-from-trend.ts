/**
 * Chi-square for departure from a linear trend in proportions: how far the rates of k ordered groups stray from the
 * straight line that the Cochran–Armitage test fits (a rise then a fall, or a jump in one period).
 *
 * Sources:
 * - Armitage P. (1955) "Tests for linear trends in proportions and frequencies", Biometrics 11, 375–386: the
 *   k − 1 degree-of-freedom chi-square of the k × 2 table splits into the trend chi-square (1 df) and the remainder,
 *   the chi-square for departure from linearity on k − 2 df.
 * - Agresti A. (2013) Categorical Data Analysis, 3rd ed., §3.4.7 (the same partition of Pearson's statistic).
 *
 * With x_i agreeing of n_i and pooled rate p̄, Pearson's statistic for the k × 2 table (R's prop.test without a
 * continuity correction) is X²_overall = Σ n_i (x_i/n_i − p̄)² / (p̄ (1 − p̄)); the trend statistic X²_trend is z² of
 * the Cochran–Armitage test (R's prop.trend.test); the departure is X²_overall − X²_trend on k − 2 df, its p-value
 * the chi-square upper tail. A small p-value says the straight line does not describe the groups.
 *
 * @throws Error when fewer than 3 groups (with 2 the line passes through both rates: nothing is left to depart), or
 *   for the inputs cochranArmitage refuses.
 * @example departureFromTrend([83, 90, 129, 70], [86, 93, 136, 82]).statistic.value // 4.3755 on 2 df (R 4.2.2: prop.test 12.6004 − prop.trend.test 8.2249)
 */
import { cochranArmitage } from './cochran-armitage.js';
import { chisqSf } from './distributions/chisq.js';
import type { TestResult } from './result.js';

export interface DepartureResult extends TestResult {
  statistic: { symbol: string; value: number };
  df: number;
  /** Pearson's chi-square for the k × 2 table (k − 1 df): the rates all equal or not. */
  overall: number;
  /** The Cochran–Armitage trend chi-square (1 df) that is taken out of it. */
  trend: number;
}

export function departureFromTrend(agree: readonly number[], respondents: readonly number[], scores?: readonly number[]): DepartureResult {
  const k = agree.length;
  if (k < 3) throw new Error(`departureFromTrend: ${k} group(s) given; at least 3 are needed for a departure from a straight line`);
  const ca = cochranArmitage(agree, respondents, scores !== undefined ? { scores } : {});
  const pBar = ca.pooledRate;
  let overall = 0;
  for (let i = 0; i < k; i++) {
    const n = respondents[i] as number;
    const d = (agree[i] as number) / n - pBar;
    overall += n * d * d;
  }
  overall /= pBar * (1 - pBar);
  const trend = ca.statistic.value;
  // The remainder of a partition: never below zero, but rounding can leave -1e-15 when every rate is on the line.
  const departure = Math.max(0, overall - trend);
  const df = k - 2;
  return {
    method: 'departure-from-trend',
    statistic: { symbol: 'X²', value: departure },
    df,
    p: chisqSf(departure, df),
    alternative: 'two-sided',
    nullValue: 0,
    estimate: { name: 'chi-square for departure from a straight line', value: departure },
    n: respondents.slice(),
    warnings: ca.warnings,
    overall,
    trend,
  };
}
