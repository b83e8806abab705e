/**
 * Building blocks for the claim kinds that compare two agreement rates (compare, change): a selection's rate with
 * its Wilson interval, the choice between the pooled two-proportion z test and Fisher's exact test, the Newcombe
 * interval for the difference, Cohen's h and the smallest difference the samples could detect with 80% power.
 *
 * Sources: Wilson (1927) and Cochran (1977, §3.3) for the interval with the finite-population correction;
 * Agresti (2013), Categorical Data Analysis, 3rd ed., §3.1 for the z test; Fisher (1935) for the exact test;
 * Newcombe (1998), Statistics in Medicine 17, 873–890, method 10 for the difference; Cohen (1988), ch. 6 for h;
 * Fleiss, Levin and Paik (2003), §4.2 for the detectable difference.
 */
import type { CompareExpect, Sided } from '../claims/types.js';
import type { Pooled } from '../data/types.js';
import type { Alternative, Interval, TestResult } from '../stats/result.js';
import { wilson } from '../stats/wilson.js';
import { newcombe } from '../stats/newcombe.js';
import { twoProportionZ } from '../stats/two-proportion-z.js';
import { fisherExact2x2 } from '../stats/fisher-exact-2x2.js';
import { cohensH } from '../stats/cohens-h.js';
import { minDetectableDifference } from '../stats/power-two-proportions.js';
import type { RateSummary } from './types.js';

/** A selection's pooled rate with its Wilson interval (with the finite-population correction when eligible is known). */
export function rateSummary(label: string, pooled: Pooled, confidence: number): RateSummary {
  const population = pooled.population !== undefined && pooled.population >= pooled.n ? pooled.population : undefined;
  const estimate = wilson(pooled.agree, pooled.n, confidence, population);
  return {
    label,
    n: pooled.n,
    agree: pooled.agree,
    rate: estimate.p,
    interval: estimate.interval,
    ...(population !== undefined ? { population } : {}),
    approximate: pooled.approximate,
    ...suppressedOf(pooled),
  };
}

/** The selection's suppressed rows, for RateSummary.suppressed (nothing when none were). */
export function suppressedOf(pooled: Pooled): { suppressed?: { rows: number; of: number } } {
  return pooled.suppressed !== undefined && pooled.suppressed > 0 ? { suppressed: { rows: pooled.suppressed, of: pooled.cells } } : {};
}

/**
 * The test's alternative for a claim's direction: 'less' when the first selection is expected lower, 'greater' when
 * higher; two-sided when the claim is two-sided or names no direction. `opposite` gives the other direction.
 */
export function alternativeFor(expect: CompareExpect, sided: Sided, opposite = false): Alternative {
  if (sided === 'two-sided' || expect === 'different') return 'two-sided';
  const lower = expect === 'lower' ? !opposite : opposite;
  return lower ? 'less' : 'greater';
}

/** +1 for 'higher', -1 for 'lower', 0 for 'different'. */
export function expectSignOf(expect: CompareExpect): 1 | -1 | 0 {
  return expect === 'lower' ? -1 : expect === 'higher' ? 1 : 0;
}

/** True when any expected cell count of the 2x2 table is below 5 (common practice for choosing Fisher's test). */
export function smallExpected(x1: number, n1: number, x2: number, n2: number): boolean {
  const total = n1 + n2;
  const agree = x1 + x2;
  const expected = [n1 * agree, n1 * (total - agree), n2 * agree, n2 * (total - agree)].map((v) => v / total);
  return expected.some((e) => e < 5);
}

export interface TwoRates {
  test: TestResult;
  /** One-sided p-value in the direction opposite to the claim (one-sided claims only). */
  pOpposite?: number;
  useFisher: boolean;
  /** first - second, with the Newcombe hybrid score interval. */
  difference: { value: number; interval: Interval };
  cohensH: number;
  /** Smallest gap detectable with 80% power in the claimed direction (the larger of the two when undirected). */
  detectable?: number;
  /** Lowest response rate among the two, where eligible is known. */
  responseRate?: number;
  methods: string[];
}

/**
 * Test the first rate against the second in the claim's direction: pooled z test, or Fisher's exact test when an
 * expected count is below 5; Newcombe's interval for the difference; Cohen's h; the detectable difference.
 */
export function compareRates(first: RateSummary, second: RateSummary, expect: CompareExpect, sided: Sided, confidence: number): TwoRates {
  const alternative = alternativeFor(expect, sided);
  const useFisher = smallExpected(first.agree, first.n, second.agree, second.n);
  const runTest = (alt: Alternative) =>
    useFisher
      ? fisherExact2x2(first.agree, first.n - first.agree, second.agree, second.n - second.agree, alt)
      : twoProportionZ(first.agree, first.n, second.agree, second.n, alt);
  const test = runTest(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : runTest(alternativeFor(expect, sided, true)).p;
  const diff = first.rate - second.rate;
  const interval = newcombe(first.agree, first.n, second.agree, second.n, confidence);
  const testSided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  // The smallest gap these samples would detect with 80% power, in the direction the claim expects (for an
  // undirected claim, the larger of the two directions). Undefined when no gap in that direction is detectable.
  let detectable: number | undefined;
  if (second.rate > 0 && second.rate < 1) {
    const both = minDetectableDifference(first.n, second.n, second.rate, 1 - confidence, 0.8, testSided);
    const candidates = expect === 'lower' ? [both.decrease] : expect === 'higher' ? [both.increase] : [both.increase, both.decrease];
    const found = candidates.filter((d): d is number => d !== null);
    if (found.length > 0) detectable = Math.max(...found);
  }
  const rates = [first, second].filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  return {
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    useFisher,
    difference: { value: diff, interval },
    cohensH: cohensH(first.rate, second.rate),
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    methods: [
      useFisher ? 'fisher-exact-2x2' : 'two-proportion-z',
      first.population !== undefined || second.population !== undefined ? 'wilson-fpc' : 'wilson',
      'newcombe-hybrid',
      'power-two-proportions',
    ],
  };
}
