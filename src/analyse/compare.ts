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
import type { Cube } from '../data/types.js';
import { relate, type Relation } from '../data/select.js';
import { InputError } from '../errors.js';
import type { AnalysisSettings, CompareAnalysis } from './types.js';
import { compareRates, expectSignOf, fpcWanted, rateSummary } from './rates.js';
import { filterLabel, restLabel, sign } from './labels.js';
import { shortfall } from './thresholds.js';

export interface CompareContext extends AnalysisSettings {
  /** The claims file as shown to the user, for error messages. */
  claimsFile: string;
}

/**
 * Stops a two-selection claim (compare, means, equivalence) whose selections match the same rows, or share some rows
 * without one containing the other: the same people would be counted on both sides. `example` follows "make the two
 * selections separate" in the fix.
 */
export function refuseOverlap(
  relation: Relation,
  claim: { id: string; place: { line: number; column: number }; againstRest?: boolean },
  ctx: CompareContext,
  example = '',
): asserts relation is Exclude<Relation, 'overlap' | 'same'> {
  if (relation !== 'overlap' && relation !== 'same') return;
  if (claim.againstRest === true) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.against`,
      found: 'rest',
      problem: `claim "${claim.id}" compares its focus with everyone else its where selects, but the focus already takes in everyone, so there is no rest`,
      fix: 'narrow the focus (e.g. one campus or department), or widen where so that it selects more than the focus',
    });
  }
  throw new InputError({
    file: ctx.claimsFile,
    line: claim.place.line,
    column: claim.place.column,
    field: `claims.${claim.id}.against`,
    problem:
      relation === 'same'
        ? `claim "${claim.id}" compares a selection with itself: focus and against match the same rows`
        : `claim "${claim.id}" compares two selections that share some rows but neither contains the other, so the same people would be counted on both sides`,
    fix: `make the two selections separate${example}, or make one contain the other (a unit against its region)`,
  });
}

export function analyseCompare(claim: CompareClaim, cube: Cube, ctx: CompareContext): CompareAnalysis {
  const focusFilter = { ...claim.where, ...claim.focus };
  const againstFilter = { ...claim.where, ...claim.against };
  const related = relate(cube, focusFilter, againstFilter);
  const expectSign = expectSignOf(claim.expect);
  refuseOverlap(related.relation, claim, ctx, ' (e.g. two different departments)');
  const focusLabel = claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstName = claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  let focusPooled = related.focus;
  let againstPooled = related.against;
  let againstLabel = againstName;
  let focusName = focusLabel;
  if (related.relation === 'focus-inside' && related.rest) {
    againstPooled = related.rest;
    againstLabel = restLabel(claim);
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
    compared: { focus: focusName, against: againstLabel },
  };
  const why = shortfall(claim, [
    { label: focusName, pooled: focusPooled },
    { label: againstLabel, pooled: againstPooled },
  ]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };

  const wanted = fpcWanted(claim, cube);
  const rates = compareRates(
    rateSummary(focusName, focusPooled, claim.confidence, wanted?.used === true),
    rateSummary(againstLabel, againstPooled, claim.confidence, wanted?.used === true),
    claim.expect,
    claim.sided,
    claim.confidence,
    wanted,
    { detectable: ctx.detectable !== false },
  );
  return {
    ...base,
    status: 'tested',
    focus: rates.first,
    against: rates.second,
    ...(rates.fpc !== undefined ? { fpc: rates.fpc } : {}),
    test: rates.test,
    ...(rates.pOpposite !== undefined ? { pOpposite: rates.pOpposite } : {}),
    observedSign: sign(rates.difference.value),
    difference: rates.difference,
    cohensH: rates.cohensH,
    ...(rates.detectable !== undefined ? { detectable: rates.detectable } : {}),
    ...(rates.responseRate !== undefined ? { responseRate: rates.responseRate } : {}),
    methods: rates.methods,
  };
}

/**
 * The same claim's analysis at another confidence level, for its verdict only (verdict stability, which decides each
 * claim again at 90, 95 and 99%). What `decide` reads of a compare analysis does not depend on the level: the test
 * and its p-values (the z test, Fisher's exact test and the corrected z test take the level only for their
 * intervals), the direction of the difference, the shortfall and the smallest difference that matters; the level
 * enters the verdict only as alpha, read from the claim. So the verdict at another level is decided on the same
 * figures, with the claim at that level, instead of analysing the claim again (tests/analyse/compare-levels.test.ts
 * checks the two agree). The intervals and detectable difference are still those of the analysis's own level: use
 * analyseCompare for anything but the verdict.
 */
export function compareAtLevel(a: CompareAnalysis, confidence: number): CompareAnalysis {
  return { ...a, claim: { ...a.claim, confidence } };
}
