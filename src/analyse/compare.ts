/**
 * Claim kind "compare": the agreement rate of one selection against another's.
 *
 * Rates are pooled over respondents. When one selection lies inside the other (a unit against a region that contains
 * it), the larger one is replaced by its rest, so that the unit is not compared with itself. Two selections that
 * share only some rows cannot be compared with these tests: that is an input error.
 *
 * Test: pooled two-proportion z test, or Fisher's exact test when an expected count is below 5. Intervals: Wilson
 * per rate (with the finite-population correction where the number eligible is known), Newcombe's hybrid score
 * interval for the difference. Cohen's h as a scale-free effect size; the smallest difference the samples could
 * detect with 80% power, for claims that are not supported.
 */
import type { CompareClaim } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { relate } from '../data/select.js';
import { InputError } from '../errors.js';
import type { Alternative } from '../stats/result.js';
import { wilson } from '../stats/wilson.js';
import { newcombe } from '../stats/newcombe.js';
import { twoProportionZ } from '../stats/two-proportion-z.js';
import { fisherExact2x2 } from '../stats/fisher-exact-2x2.js';
import { cohensH } from '../stats/cohens-h.js';
import { minDetectableDifference } from '../stats/power-two-proportions.js';
import type { AnalysisSettings, CompareAnalysis, RateSummary } from './types.js';
import { filterLabel, sign } from './labels.js';
import { shortfall } from './thresholds.js';

export interface CompareContext extends AnalysisSettings {
  /** The claims file as shown to the user, for error messages. */
  claimsFile: string;
}

function rateSummary(label: string, pooled: Pooled, confidence: number): RateSummary {
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
  };
}

function alternativeFor(claim: CompareClaim, opposite = false): Alternative {
  if (claim.sided === 'two-sided' || claim.expect === 'different') return 'two-sided';
  const lower = claim.expect === 'lower' ? !opposite : opposite;
  return lower ? 'less' : 'greater';
}

/** True when any expected cell count of the 2x2 table is below 5 (common practice for choosing Fisher's test). */
function smallExpected(x1: number, n1: number, x2: number, n2: number): boolean {
  const total = n1 + n2;
  const agree = x1 + x2;
  const expected = [n1 * agree, n1 * (total - agree), n2 * agree, n2 * (total - agree)].map((v) => v / total);
  return expected.some((e) => e < 5);
}

export function analyseCompare(claim: CompareClaim, cube: Cube, ctx: CompareContext): CompareAnalysis {
  const focusFilter = { ...claim.where, ...claim.focus };
  const againstFilter = { ...claim.where, ...claim.against };
  const related = relate(cube, focusFilter, againstFilter);
  const expectSign = claim.expect === 'lower' ? -1 : claim.expect === 'higher' ? 1 : 0;
  if (related.relation === 'overlap' || related.relation === 'same') {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.against`,
      problem:
        related.relation === 'same'
          ? `claim "${claim.id}" compares a selection with itself: focus and against match the same rows`
          : `claim "${claim.id}" compares two selections that share some rows but neither contains the other, so the same people would be counted on both sides`,
      fix: 'make the two selections separate (e.g. two different departments), or make one contain the other (a unit against its region)',
    });
  }
  const focusLabel = claim.focusLabel ?? filterLabel(claim.focus);
  const againstName = claim.againstLabel ?? filterLabel(claim.against);
  let focusPooled = related.focus;
  let againstPooled = related.against;
  let againstLabel = againstName;
  let focusName = focusLabel;
  if (related.relation === 'focus-inside' && related.rest) {
    againstPooled = related.rest;
    againstLabel = `the rest of ${againstName}`;
  } else if (related.relation === 'against-inside' && related.rest) {
    focusPooled = related.rest;
    focusName = `the rest of ${focusLabel}`;
  }
  const relation = related.relation;
  const base = {
    kind: 'compare' as const,
    claim,
    relation,
    expectSign: expectSign as 1 | -1 | 0,
    methods: [] as string[],
  };
  const why = shortfall(claim, [
    { label: focusName, pooled: focusPooled },
    { label: againstLabel, pooled: againstPooled },
  ]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };

  const focus = rateSummary(focusName, focusPooled, claim.confidence);
  const against = rateSummary(againstLabel, againstPooled, claim.confidence);
  const alternative = alternativeFor(claim);
  const useFisher = smallExpected(focus.agree, focus.n, against.agree, against.n);
  const runTest = (alt: Alternative) =>
    useFisher
      ? fisherExact2x2(focus.agree, focus.n - focus.agree, against.agree, against.n - against.agree, alt)
      : twoProportionZ(focus.agree, focus.n, against.agree, against.n, alt);
  const test = runTest(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : runTest(alternativeFor(claim, true)).p;
  const diff = focus.rate - against.rate;
  const interval = newcombe(focus.agree, focus.n, against.agree, against.n, claim.confidence);
  const sided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  // The smallest gap these samples would detect with 80% power, in the direction the claim expects (for an
  // undirected claim, the larger of the two directions). Null when no gap in that direction is detectable.
  const detectableBoth = minDetectableDifference(focus.n, against.n, against.rate, 1 - claim.confidence, 0.8, sided);
  const candidates =
    claim.expect === 'lower' ? [detectableBoth.decrease] : claim.expect === 'higher' ? [detectableBoth.increase] : [detectableBoth.increase, detectableBoth.decrease];
  const found = candidates.filter((d): d is number => d !== null);
  const detectable = found.length > 0 ? Math.max(...found) : undefined;
  const rates = [focus, against].filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  return {
    ...base,
    status: 'tested',
    focus,
    against,
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(diff),
    difference: { value: diff, interval },
    cohensH: cohensH(focus.rate, against.rate),
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    methods: [
      useFisher ? 'fisher-exact-2x2' : 'two-proportion-z',
      focus.population !== undefined || against.population !== undefined ? 'wilson-fpc' : 'wilson',
      'newcombe-hybrid',
      'power-two-proportions',
    ],
  };
}
