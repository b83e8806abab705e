/**
 * Claim kind "target": one selection's agreement rate against a fixed value (a target, or a benchmark figure
 * published elsewhere).
 *
 * Test: the one-sample score test (Wilson 1927; Agresti 2013, Categorical Data Analysis, 3rd ed., §1.4; R's
 * prop.test with correct = FALSE), or the exact binomial test when fewer than 5 agreeing or 5 not agreeing answers
 * are expected at the fixed value (n p0 < 5 or n (1 − p0) < 5, common practice). The rate's interval is Wilson's, with
 * the finite-population correction where the number eligible is known (Cochran 1977, Sampling Techniques, §3.3); the
 * gap to the fixed value is that interval shifted by the value, as the value itself carries no uncertainty here.
 * The smallest gap detectable with 80% power is from Lachin (1981), in src/stats/power-one-proportion.ts.
 */
import type { TargetClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { pool } from '../data/select.js';
import { InputError } from '../errors.js';
import { binomialExactTest } from '../stats/binomial-exact.js';
import { clopperPearsonInterval } from '../stats/clopper-pearson.js';
import { oneSampleScoreTest } from '../stats/one-sample-score.js';
import { minDetectableGap } from '../stats/power-one-proportion.js';
import type { Alternative, TestResult } from '../stats/result.js';
import type { CompareContext } from './compare.js';
import { filterLabel, sign } from './labels.js';
import { alternativeFor, expectSignOf, fpcWanted, rateSummary } from './rates.js';
import { oneSampleScoreFpc } from '../stats/finite-population.js';
import { shortfall } from './thresholds.js';
import type { RateSummary, TargetAnalysis } from './types.js';

/** True when the exact binomial test is used instead of the score test (fewer than 5 expected either way). */
export function needsExact(n: number, p0: number): boolean {
  return n * p0 < 5 || n * (1 - p0) < 5;
}

/**
 * One rate tested against a fixed value: the exact binomial test when `exact` (see needsExact), else the score test,
 * with the finite-population correction when `corrected` (the rate's population is then known).
 */
export function testAgainstValue(rate: RateSummary, p0: number, how: { exact: boolean; corrected: boolean; level: number }, alternative: Alternative): TestResult {
  const options = { alternative, level: how.level };
  if (how.exact) return binomialExactTest(rate.agree, rate.n, p0, options);
  if (how.corrected) return oneSampleScoreFpc(rate.agree, rate.n, rate.population as number, p0, options);
  return oneSampleScoreTest(rate.agree, rate.n, p0, options);
}

export function analyseTarget(claim: TargetClaim, cube: Cube, ctx: CompareContext): TargetAnalysis {
  const p0 = claim.value;
  if (!(p0 > 0 && p0 < 1)) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.value`,
      found: claim.valueWritten,
      problem: `claim "${claim.id}" sets a value of ${claim.valueWritten}, which no rate can be tested against (it must lie strictly between 0% and 100%)`,
      fix: 'give the value as a percentage between 0% and 100%, e.g. `value: 80%`',
    });
  }
  const label = claim.selectLabel ?? filterLabel({ ...claim.where, ...claim.select }, claim.naming);
  const pooled = pool(cube, { ...claim.where, ...claim.select });
  const base = { kind: 'target' as const, claim, expectSign: expectSignOf(claim.expect), methods: [] as string[] };
  const why = shortfall(claim, [{ label, pooled }]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };

  const exact = needsExact(pooled.n, p0);
  // One decision for every figure: the exact binomial test has no corrected form, so then nothing is corrected.
  const wanted = fpcWanted(claim, cube, exact ? 'the exact binomial test' : undefined);
  const rate = rateSummary(label, pooled, claim.confidence, wanted?.used === true);
  const corrected = rate.fpc === true && rate.population !== undefined;
  const fpc = wanted?.used === true && !corrected ? { used: false, why: 'no-population' as const } : wanted;
  const alternative = alternativeFor(claim.expect, claim.sided);
  const run = (alt: Alternative): TestResult => testAgainstValue(rate, p0, { exact, corrected, level: claim.confidence }, alt);
  const test = run(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : run(alternativeFor(claim.expect, claim.sided, true)).p;
  const diff = rate.rate - p0;
  const sided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  const gaps = minDetectableGap(rate.n, p0, { alpha: 1 - claim.confidence, power: 0.8, sided, ...(corrected && rate.population !== undefined ? { populationSize: rate.population } : {}) });
  const candidates = claim.expect === 'lower' ? [gaps.decrease] : claim.expect === 'higher' ? [gaps.increase] : [gaps.increase, gaps.decrease];
  const found = candidates.filter((d): d is number => d !== null);
  const detectable = found.length > 0 ? Math.max(...found) : undefined;
  // The exact test's own interval is one-sided for a one-sided claim; the pack shows the two-sided one beside Wilson's.
  const exactInterval = exact ? clopperPearsonInterval(rate.agree, rate.n, { level: claim.confidence }).interval : undefined;
  return {
    ...base,
    status: 'tested',
    rate,
    ...(fpc !== undefined ? { fpc } : {}),
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(diff),
    difference: { value: diff, interval: { ...rate.interval, lower: rate.interval.lower - p0, upper: rate.interval.upper - p0 } },
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rate.population !== undefined ? { responseRate: rate.n / rate.population } : {}),
    ...(exactInterval !== undefined ? { exactInterval } : {}),
    // The smallest difference that matters applies to the gap from the fixed value (src/verdicts/decide.ts).
    ...(claim.smallestDifference !== undefined ? { threshold: { effect: diff, smallest: claim.smallestDifference, unit: 'points' as const } } : {}),
    methods: [
      exact ? 'binomial-exact' : corrected ? 'one-sample-score-fpc' : 'one-sample-score',
      corrected ? 'wilson-fpc' : 'wilson',
      ...(exact ? ['clopper-pearson'] : []),
      'power-one-proportion',
      ...(corrected ? ['finite-population-correction'] : []),
    ],
  };
}
