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
import { newcombeInterval } from '../stats/newcombe.js';
import { twoProportionZ } from '../stats/two-proportion-z.js';
import { fisherExact2x2 } from '../stats/fisher-exact-2x2.js';
import { cohensH } from '../stats/cohens-h.js';
import { minDetectableDifference } from '../stats/power-two-proportions.js';
import { effectiveSize, twoProportionZFpc } from '../stats/finite-population.js';
import type { FpcChoice, RateSummary } from './types.js';

/**
 * A selection's pooled rate with its Wilson interval, with the finite-population correction when eligible is known
 * and `correct` is true (the claim's one decision, see fpcWanted). The number eligible is kept either way, for the
 * response rate.
 */
export function rateSummary(label: string, pooled: Pooled, confidence: number, correct = true): RateSummary {
  const population = pooled.population !== undefined && pooled.population >= pooled.n ? pooled.population : undefined;
  const estimate = wilson(pooled.agree, pooled.n, confidence, correct ? population : undefined);
  return {
    label,
    n: pooled.n,
    agree: pooled.agree,
    rate: estimate.p,
    interval: estimate.interval,
    ...(population !== undefined ? { population } : {}),
    ...(correct && population !== undefined ? { fpc: true as const } : {}),
    approximate: pooled.approximate,
    ...suppressedOf(pooled),
  };
}

/** The selection's suppressed rows, for RateSummary.suppressed (nothing when none were). */
export function suppressedOf(pooled: Pooled): { suppressed?: { rows: number; of: number } } {
  return pooled.suppressed !== undefined && pooled.suppressed > 0 ? { suppressed: { rows: pooled.suppressed, of: pooled.cells } } : {};
}

/**
 * The finite-population correction is one decision per claim: on for every figure of its rates, or off for all.
 * Wanted when the source gives the number eligible and the claims file does not turn it off (finite_population_
 * correction: false, pack-wide or on the claim). `form` names the test when the claim's kind has no corrected
 * form, so that nothing of it is corrected. Undefined when there is nothing to say (no number eligible, nothing
 * written).
 */
export function fpcWanted(claim: { finitePopulation?: boolean }, cube: { hasPopulation: boolean }, form?: string): FpcChoice | undefined {
  if (!cube.hasPopulation) return claim.finitePopulation === true ? { used: false, why: 'no-population' } : undefined;
  if (claim.finitePopulation === false) return { used: false, why: 'off' };
  if (form !== undefined) return { used: false, why: 'no-form', form };
  return { used: true };
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
  /** The two rates as used: without the correction when it had to be dropped (Fisher's exact test). */
  first: RateSummary;
  second: RateSummary;
  /** The correction as applied to every figure here (undefined when the rates carry no number eligible). */
  fpc?: FpcChoice;
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
 * expected count is below 5; Newcombe's interval for the difference; Cohen's h; the detectable difference (unless
 * `options.detectable` is false, see AnalysisSettings.detectable).
 */
export function compareRates(
  firstIn: RateSummary,
  secondIn: RateSummary,
  expect: CompareExpect,
  sided: Sided,
  confidence: number,
  wanted?: FpcChoice,
  options: { detectable?: boolean } = {},
): TwoRates {
  const alternative = alternativeFor(expect, sided);
  const useFisher = smallExpected(firstIn.agree, firstIn.n, secondIn.agree, secondIn.n);
  // One decision for every figure: Fisher's exact test has no corrected form, so then nothing is corrected.
  let fpc = wanted;
  if (fpc?.used === true && useFisher) fpc = { used: false, why: 'no-form', form: "Fisher's exact test" };
  const N1 = firstIn.population;
  const N2 = secondIn.population;
  const corrected = fpc?.used === true && N1 !== undefined && N2 !== undefined;
  const plain = (r: RateSummary): RateSummary => {
    if (r.fpc !== true || corrected) return r;
    const again = rateSummary(r.label, { n: r.n, agree: r.agree, approximate: r.approximate, cells: 1, ...(r.population !== undefined ? { population: r.population } : {}) }, confidence, false);
    return { ...again, ...(r.suppressed !== undefined ? { suppressed: r.suppressed } : {}) };
  };
  const first = plain(firstIn);
  const second = plain(secondIn);
  const runTest = (alt: Alternative) =>
    useFisher
      ? fisherExact2x2(first.agree, first.n - first.agree, second.agree, second.n - second.agree, alt)
      : corrected
        ? twoProportionZFpc({ x: first.agree, n: first.n, populationSize: N1 }, { x: second.agree, n: second.n, populationSize: N2 }, { alternative: alt, level: confidence })
        : twoProportionZ(first.agree, first.n, second.agree, second.n, alt);
  const test = runTest(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : runTest(alternativeFor(expect, sided, true)).p;
  const diff = first.rate - second.rate;
  const interval = newcombeInterval(first.agree, first.n, second.agree, second.n, { level: confidence, ...(corrected ? { populationSize1: N1, populationSize2: N2 } : {}) });
  const testSided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  // The smallest gap these samples would detect with 80% power, in the direction the claim expects (for an
  // undirected claim, the larger of the two directions). Undefined when no gap in that direction is detectable.
  // With the correction each group counts as its effective size n / f (Cochran 1977, §3.3).
  let detectable: number | undefined;
  if (options.detectable !== false && second.rate >= 0 && second.rate <= 1) {
    const m1 = corrected ? effectiveSize(first.n, N1) : first.n;
    const m2 = corrected ? effectiveSize(second.n, N2) : second.n;
    const both = minDetectableDifference(m1, m2, second.rate, { alpha: 1 - confidence, power: 0.8, sided: testSided });
    const candidates = expect === 'lower' ? [both.decrease] : expect === 'higher' ? [both.increase] : [both.increase, both.decrease];
    const found = candidates.filter((d): d is number => d !== null);
    if (found.length > 0) detectable = Math.max(...found);
  }
  const rates = [first, second].filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  return {
    first,
    second,
    ...(fpc !== undefined ? { fpc: corrected ? fpc : fpc.used ? { used: false, why: 'no-population' as const } : fpc } : {}),
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    useFisher,
    difference: { value: diff, interval },
    cohensH: cohensH(first.rate, second.rate),
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    methods: [
      useFisher ? 'fisher-exact-2x2' : corrected ? 'two-proportion-z-fpc' : 'two-proportion-z',
      corrected ? 'wilson-fpc' : 'wilson',
      'newcombe-hybrid',
      'power-two-proportions',
      ...(corrected ? ['finite-population-correction'] : []),
    ],
  };
}
