/**
 * The change in the gap between two groups from one period to another: the difference of two independent differences
 * of proportions, D = (p1b - p2b) - (p1a - p2a), where group 1 and group 2 are answered by different people and each
 * period by a different cohort, so the four rates are independent samples.
 *
 * Test: a z test of D = 0 with the unpooled (Wald) standard error from the four samples' own variances,
 *
 *     se = sqrt( sum_i p_i (1 - p_i) / n_i ),   z = D / se,
 *
 * the large-sample (Wald) test for a linear combination of independent proportions, the variance of a sum of
 * independent estimates (A. Agresti (2013), Categorical Data Analysis, 3rd ed., Wiley, section 3.1 for one difference;
 * section cited from memory). No pooled form exists here: under D = 0 the four rates need not be equal, so each
 * sample keeps its own variance.
 *
 * Interval: the hybrid score interval for a linear contrast built from the four Wilson intervals (the method of
 * variance estimates recovery, G. Y. Zou and A. Donner (2008), "Construction of confidence limits about effect
 * measures: a general approach", Statistics in Medicine 27, 1693-1702, section 3; for one difference it is Newcombe's
 * method 10, newcombe.ts). With coefficients c_i (+1, -1, -1, +1) and (l_i, u_i) the Wilson bounds:
 *
 *     lower = D - sqrt( sum_i (c_i p_i - min(c_i l_i, c_i u_i))^2 ),
 *     upper = D + sqrt( sum_i (max(c_i l_i, c_i u_i) - c_i p_i)^2 ),
 *
 * kept within [-2, 2]. Like Newcombe's interval it keeps close to its coverage for small groups and rates near 0 or
 * 100%, where the Wald interval does not; the z test stays the Wald one, as no score test for a difference of
 * differences has a closed form. The interval is two-sided at `level` whatever the alternative.
 */
import type { Alternative, Interval, TestResult } from './result.js';
import { normalCdf, normalQuantile, normalSf } from './distributions/normal.js';
import { checkCounts, checkLevel, wilsonBounds } from './wilson.js';

/** One sample: x agreeing of n. */
export interface Counts {
  x: number;
  n: number;
}

/** A gap between two groups in one period: first's rate minus second's. */
export interface Gap {
  first: Counts;
  second: Counts;
}

export interface ContrastOptions {
  /** Confidence level of the interval (default 0.95). */
  level?: number;
  /** 'greater': the later gap is above the earlier one (D > 0); 'less': below. Default 'two-sided'. */
  alternative?: Alternative;
}

/**
 * A linear contrast sum_i c_i p_i of independent proportions with its Wald standard error and its hybrid (MOVER)
 * Wilson interval at `level`. The bounds are clipped to the contrast's possible range.
 *
 * @throws Error when counts or level are out of range.
 */
export function proportionContrast(samples: readonly Counts[], coefficients: readonly number[], level: number, fn = 'proportionContrast'): { estimate: number; se: number; interval: Interval } {
  if (samples.length !== coefficients.length || samples.length === 0) throw new Error(`${fn}: one coefficient for each sample is needed`);
  checkLevel(level, fn);
  for (const s of samples) checkCounts(s.x, s.n, fn);
  const z = normalQuantile((1 + level) / 2);
  let estimate = 0;
  let variance = 0;
  let below = 0;
  let above = 0;
  let range = 0;
  samples.forEach((s, i) => {
    const c = coefficients[i] as number;
    const p = s.x / s.n;
    const [l, u] = wilsonBounds(s.x, s.n, (z * z) / s.n);
    estimate += c * p;
    variance += (c * c * p * (1 - p)) / s.n;
    below += (c * p - Math.min(c * l, c * u)) ** 2;
    above += (Math.max(c * l, c * u) - c * p) ** 2;
    range += Math.abs(c);
  });
  const interval: Interval = {
    lower: Math.max(-range / 2, estimate - Math.sqrt(below)),
    upper: Math.min(range / 2, estimate + Math.sqrt(above)),
    level,
    method: 'mover-wilson',
  };
  return { estimate, se: Math.sqrt(variance), interval };
}

/** The four samples in the order of the coefficients (+1, -1, -1, +1): later first, later second, earlier first, earlier second. */
function samplesOf(earlier: Gap, later: Gap): Counts[] {
  return [later.first, later.second, earlier.first, earlier.second];
}

/** p-value of z for an alternative; upper tails computed directly. */
function pOf(z: number, alternative: Alternative): number {
  return alternative === 'two-sided' ? Math.min(1, 2 * normalSf(Math.abs(z))) : alternative === 'less' ? normalCdf(z) : normalSf(z);
}

/**
 * z test of "the gap did not change" (D = 0) with the MOVER-Wilson interval for D; method 'difference-of-differences-z'.
 * Estimate: D = (later first - later second) - (earlier first - earlier second).
 *
 * @throws Error when counts or level are out of range, or when every one of the four samples answered all one way
 *   (each rate 0 or 1), where the standard error is 0 and the test undefined.
 * @example differenceOfDifferences({ first: { x: 40, n: 100 }, second: { x: 60, n: 100 } }, { first: { x: 55, n: 100 }, second: { x: 62, n: 100 } })
 */
export function differenceOfDifferences(earlier: Gap, later: Gap, options: ContrastOptions = {}): TestResult {
  const fn = 'differenceOfDifferences';
  const level = options.level ?? 0.95;
  const alternative = options.alternative ?? 'two-sided';
  const samples = samplesOf(earlier, later);
  const c = proportionContrast(samples, [1, -1, -1, 1], level, fn);
  if (!(c.se > 0)) {
    throw new Error(`${fn}: every one of the four groups answered all one way (each rate 0% or 100%), so the standard error is 0 and the z test is undefined`);
  }
  const z = c.estimate / c.se;
  return {
    method: 'difference-of-differences-z',
    statistic: { symbol: 'z', value: z },
    p: pOf(z, alternative),
    alternative,
    nullValue: 0,
    estimate: { name: 'change in the difference of proportions', value: c.estimate },
    interval: { ...c.interval, level },
    n: samples.map((s) => s.n),
    warnings: samples.some((s) => Math.min(s.x, s.n - s.x) < 5) ? ['a group has fewer than 5 agreeing or 5 not agreeing, where the z test is only approximate'] : [],
  };
}

/**
 * One of the two one-sided z tests behind a claim that a gap narrowed or widened: of the change in the gap (D, later
 * minus earlier) or of the sum of the two gaps (S, later plus earlier), the direction it must find, its z and its
 * one-sided p-value doubled (each test is held to the two-sided level; capped at 1).
 */
export interface GapSizeComponent {
  of: 'change' | 'sum';
  alternative: 'less' | 'greater';
  z: number;
  p: number;
}

/**
 * Whether the gap's size changed: "narrowed" is |later gap| < |earlier gap|, "widened" |later gap| > |earlier gap|,
 * whichever group is ahead. With D = later - earlier and S = later + earlier, |later| < |earlier| exactly when D and
 * S have opposite signs (later^2 - earlier^2 = D S), and |later| > |earlier| when they share a sign. Tested as an
 * intersection-union test (R. L. Berger (1982), "Multiparameter hypothesis testing and acceptance sampling",
 * Technometrics 24, 295-300; R. L. Berger and J. C. Hsu (1996), Statistical Science 11, 283-319): the size changed the
 * claimed way when both one-sided z tests reject with the signs of one of the two regions. Each region's p-value is
 * the larger of its two one-sided p-values; the two regions are joined by doubling the smaller (a Bonferroni step,
 * because the region is not named in advance), so the test holds its level for any gaps, including an earlier gap
 * near zero or much less precise than the later one. That makes it the two z tests each at the two-sided level.
 *
 * @returns test: method 'gap-size-iut', its p-value for the claimed change of size, estimate |later| - |earlier|
 *   and the interval for D; pOpposite: the p-value for the other one (narrowed <-> widened); d and s: the z tests of
 *   D and S (two-sided p-values); components: the two one-sided tests of the claimed region that decide its p-value
 *   (of D, then of S), each with its z and its one-sided p-value doubled (capped at 1), so that the claim's p-value
 *   is the larger of the two; the region is the one with the smaller p-value (on a tie, the one on the side S lies).
 */
export function gapSizeChange(
  earlier: Gap,
  later: Gap,
  claimed: 'narrowed' | 'widened',
  options: { level?: number } = {},
): {
  test: TestResult;
  p: number;
  pOpposite: number;
  d: TestResult;
  s: { estimate: number; se: number; z: number; p: number; interval: Interval };
  components: [GapSizeComponent, GapSizeComponent];
} {
  const fn = 'gapSizeChange';
  const level = options.level ?? 0.95;
  const d = differenceOfDifferences(earlier, later, { level });
  const sum = proportionContrast(samplesOf(earlier, later), [1, -1, 1, -1], level, fn);
  const zd = d.statistic?.value as number;
  const zs = sum.estimate / sum.se;
  const [dUp, dDown, sUp, sDown] = [normalSf(zd), normalCdf(zd), normalSf(zs), normalCdf(zs)];
  const narrowed = Math.min(1, 2 * Math.min(Math.max(dDown, sUp), Math.max(dUp, sDown)));
  const widened = Math.min(1, 2 * Math.min(Math.max(dUp, sUp), Math.max(dDown, sDown)));
  // The claimed region's two tests: narrowed is D < 0 with S > 0 (the focus ahead) or D > 0 with S < 0; widened is
  // D and S of one sign. Each region is named by the side S lies on.
  const regionUp = claimed === 'narrowed' ? Math.max(dDown, sUp) : Math.max(dUp, sUp);
  const regionDown = claimed === 'narrowed' ? Math.max(dUp, sDown) : Math.max(dDown, sDown);
  const up = regionUp < regionDown || (regionUp === regionDown && zs >= 0);
  const dAlt: 'less' | 'greater' = (claimed === 'narrowed') === up ? 'less' : 'greater';
  const doubled = (q: number): number => Math.min(1, 2 * q);
  const components: [GapSizeComponent, GapSizeComponent] = [
    { of: 'change', alternative: dAlt, z: zd, p: doubled(dAlt === 'less' ? dDown : dUp) },
    { of: 'sum', alternative: up ? 'greater' : 'less', z: zs, p: doubled(up ? sUp : sDown) },
  ];
  const laterGap = later.first.x / later.first.n - later.second.x / later.second.n;
  const earlierGap = earlier.first.x / earlier.first.n - earlier.second.x / earlier.second.n;
  const test: TestResult = {
    ...d,
    method: 'gap-size-iut',
    p: claimed === 'narrowed' ? narrowed : widened,
    estimate: { name: 'change in the size of the difference of proportions', value: Math.abs(laterGap) - Math.abs(earlierGap) },
  };
  return {
    test,
    p: claimed === 'narrowed' ? narrowed : widened,
    pOpposite: claimed === 'narrowed' ? widened : narrowed,
    d,
    s: { estimate: sum.estimate, se: sum.se, z: zs, p: pOf(zs, 'two-sided'), interval: sum.interval },
    components,
  };
}
