/**
 * Claim kind "means": the mean answer score of one selection against another's (answers coded, e.g. 1–5).
 *
 * Mean and standard deviation come from each selection's answer-code counts (respondent-level sources), without
 * expanding them per respondent. When one selection lies inside the other, the larger is replaced by its rest, as for
 * compare. Test: Welch's t test (default; Welch 1947), Student's pooled t test, or the Mann–Whitney rank-sum test on
 * the answers' ranks computed from the counts (normal approximation with tie and continuity corrections). The
 * difference in means is given in scale points with its two-sided Welch (or Student) t interval at the claim's
 * confidence, whatever the test, so the reader always sees the size of the gap; and as Cohen's d (over the pooled
 * standard deviation) with its interval by inverting the noncentral t (Steiger and Fouladi 1997).
 *
 * A numeric column of a summary source gives only a mean per group, not the spread a t test needs: such a claim is
 * refused with an InputError.
 *
 * The smallest difference that matters (claim.smallestDifference, a fraction) is read as a share of the answer
 * scale's range (highest code minus lowest code in the source): 0.05 on a 1–5 scale is 0.05 × 4 = 0.2 scale points.
 */
import type { MeansClaim } from '../claims/types.js';
import type { Cell, Cube, Pooled } from '../data/types.js';
import { matching, poolCells, relate } from '../data/select.js';
import { InputError } from '../errors.js';
import { cohensDInterval } from '../stats/cohens-d-interval.js';
import { tQuantile } from '../stats/distributions/t.js';
import { mannWhitneyCounts } from '../stats/mann-whitney-counts.js';
import type { Alternative, Interval, TestResult } from '../stats/result.js';
import { studentT, type GroupSummary, type TTestOptions } from '../stats/student-t.js';
import { summaryFromCounts } from '../stats/summary-counts.js';
import { welchT } from '../stats/welch-t.js';
import { refuseOverlap, type CompareContext } from './compare.js';
import { filterLabel, restLabel, sign } from './labels.js';
import { codeRange } from './measures.js';
import { shortfall } from './thresholds.js';
import type { MeanSummary, MeansAnalysis } from './types.js';

function alternativeFor(claim: MeansClaim, opposite = false): Alternative {
  if (claim.sided === 'two-sided' || claim.expect === 'different') return 'two-sided';
  const lower = claim.expect === 'lower' ? !opposite : opposite;
  return lower ? 'less' : 'greater';
}

/** Mean with its one-sample t interval at the given confidence. */
function meanSummary(label: string, g: GroupSummary, confidence: number): MeanSummary {
  const half = tQuantile(1 - (1 - confidence) / 2, g.n - 1) * (g.sd / Math.sqrt(g.n));
  return { label, n: g.n, mean: g.mean, sd: g.sd, interval: { lower: g.mean - half, upper: g.mean + half, level: confidence, method: 't' } };
}

export function analyseMeans(claim: MeansClaim, cube: Cube, ctx: CompareContext): MeansAnalysis {
  const place = { file: ctx.claimsFile, line: claim.place.line, column: claim.place.column };
  if (claim.measure.type !== 'mean') {
    throw new InputError({
      ...place,
      field: `claims.${claim.id}.measure`,
      found: claim.measure.type === 'column' ? claim.measure.column : 'agree',
      problem:
        claim.measure.type === 'column'
          ? `claim "${claim.id}" compares means of the column "${claim.measure.column}", but a summary source gives only each group's mean, not the spread of answers a test of means needs`
          : `claim "${claim.id}" compares mean scores but measures the agreement rate`,
      fix:
        claim.measure.type === 'column'
          ? 'use a source with one row per respondent (answers coded as numbers) and measure: mean, or compare agreement rates with kind: compare'
          : 'use measure: mean with a respondent-level source, or kind: compare for agreement rates',
    });
  }
  const focusFilter = { ...claim.where, ...claim.focus };
  const againstFilter = { ...claim.where, ...claim.against };
  const related = relate(cube, focusFilter, againstFilter);
  refuseOverlap(related.relation, claim, ctx);
  const fCells = matching(cube, focusFilter);
  const aCells = matching(cube, againstFilter);
  const without = (big: Cell[], small: Cell[]) => big.filter((c) => !small.includes(c));
  let focusCells = fCells;
  let againstCells = aCells;
  let focusLabel = claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  let againstLabel = claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  if (related.relation === 'focus-inside') {
    againstCells = without(aCells, fCells);
    againstLabel = restLabel(claim);
  } else if (related.relation === 'against-inside') {
    focusCells = without(fCells, aCells);
    focusLabel = `the rest of ${focusLabel}`;
  }
  const fp: Pooled = poolCells(cube, focusCells);
  const ap: Pooled = poolCells(cube, againstCells);
  const expectSign = claim.expect === 'lower' ? -1 : claim.expect === 'higher' ? 1 : 0;
  const base = { kind: 'means' as const, claim, relation: related.relation, expectSign: expectSign as 1 | -1 | 0, methods: [] as string[], compared: { focus: focusLabel, against: againstLabel } };
  const tooLittle = (why: string): MeansAnalysis => ({ ...base, status: 'too-little-data', shortfall: why, observedSign: 0 });
  for (const p of [fp, ap]) {
    if (p.n > 0 && !p.codes) {
      throw new InputError({
        ...place,
        field: `claims.${claim.id}.source`,
        found: claim.source,
        problem: `claim "${claim.id}" compares mean scores, but source "${claim.source}" holds counts per group, not answer codes`,
        fix: 'point the claim at a source with one row per respondent (answers coded as numbers)',
      });
    }
  }
  const why = shortfall(claim, [
    { label: focusLabel, pooled: fp },
    { label: againstLabel, pooled: ap },
  ]);
  if (why !== undefined) return tooLittle(why);
  const nOf = (p: Pooled) => Object.values(p.codes ?? {}).reduce((s, v) => s + v, 0);
  if (nOf(fp) < 2 || nOf(ap) < 2) return tooLittle(`fewer than 2 people gave a scored answer in ${nOf(fp) < 2 ? focusLabel : againstLabel}`);
  const gf = summaryFromCounts(fp.codes as Record<string, number>, 'first');
  const ga = summaryFromCounts(ap.codes as Record<string, number>, 'second');
  if (gf.sd === 0 && ga.sd === 0) return tooLittle(`every respondent in ${focusLabel} and in ${againstLabel} gave the same answer, so there is no spread to test against`);

  const alternative = alternativeFor(claim);
  const tTest = claim.test === 'student' ? studentT : welchT;
  const opts = (alt: Alternative): TTestOptions => ({ alternative: alt, level: claim.confidence });
  const run = (alt: Alternative): TestResult =>
    claim.test === 'rank' ? mannWhitneyCounts(fp.codes as Record<string, number>, ap.codes as Record<string, number>, { alternative: alt }) : tTest(gf, ga, opts(alt));
  const test = run(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : run(alternativeFor(claim, true)).p;
  const two = tTest(gf, ga, opts('two-sided'));
  const diff = gf.mean - ga.mean;
  const scale = codeRange(cube);
  const threshold =
    claim.smallestDifference !== undefined && scale !== undefined && scale[1] > scale[0]
      ? { effect: diff, smallest: claim.smallestDifference * (scale[1] - scale[0]), unit: 'scale points' as const }
      : undefined;
  const intervalMethod = claim.test === 'student' ? 'student-t' : 'welch-t';
  // The other family of test as a check, in the claim's own direction: the rank-sum test beside a t test (it does not
  // treat the codes as evenly spaced), Welch's t test beside the rank-sum test.
  const check =
    claim.test === 'rank'
      ? { method: 'welch-t' as const, test: welchT(gf, ga, opts(alternative)) }
      : { method: 'mann-whitney' as const, test: mannWhitneyCounts(fp.codes as Record<string, number>, ap.codes as Record<string, number>, { alternative }) };
  // Cohen's d: the difference in means over the pooled standard deviation (Cohen 1988, ch. 2), with its interval.
  const pooledSd = Math.sqrt(((gf.n - 1) * gf.sd * gf.sd + (ga.n - 1) * ga.sd * ga.sd) / (gf.n + ga.n - 2));
  const d = pooledSd > 0 ? diff / pooledSd : undefined;
  return {
    ...base,
    status: 'tested',
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(diff),
    focus: meanSummary(focusLabel, gf, claim.confidence),
    against: meanSummary(againstLabel, ga, claim.confidence),
    difference: { value: diff, interval: { ...two.interval, method: intervalMethod } },
    ...(scale !== undefined ? { scale } : {}),
    ...(claim.test === 'rank' ? { superiority: test.estimate.value } : {}),
    check,
    ...(d !== undefined ? { cohensD: d, cohensDInterval: cohensDInterval(d, gf.n, ga.n, claim.confidence) } : {}),
    ...(threshold !== undefined ? { threshold } : {}),
    methods: [...(claim.test === 'rank' ? ['mann-whitney', 'welch-t'] : [intervalMethod, 'mann-whitney']), ...(d !== undefined ? ['cohens-d-noncentral-t'] : []), 'power-two-means'],
  };
}

/**
 * Cohen's d's interval at another level than the claim's (the level that decided an adjusted verdict), from the same
 * method as `cohensDInterval`; undefined when d could not be computed.
 */
export function cohensDIntervalAt(a: MeansAnalysis, confidence: number): Interval | undefined {
  if (a.cohensD === undefined || !a.focus || !a.against) return undefined;
  return cohensDInterval(a.cohensD, a.focus.n, a.against.n, confidence);
}
