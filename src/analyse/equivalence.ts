/**
 * Claim kind "equivalence": "no real difference" between two selections' agreement rates, within a stated margin.
 *
 * A test that fails to find a difference is not evidence of no difference; equivalence needs its own test. Two
 * one-sided tests (TOST; Schuirmann (1987), J. Pharmacokinetics and Biopharmaceutics 15, 657–680; Wellek (2010),
 * Testing Statistical Hypotheses of Equivalence and Noninferiority, ch. 6) each reject at alpha = 1 − confidence
 * exactly when the (1 − 2 alpha) Wald interval for the difference lies inside (−margin, +margin). The claim's p-value
 * is the larger of the two one-sided p-values, and it is the one adjusted for many claims.
 *
 * Verdicts (src/verdicts/decide.ts): supported when both one-sided tests reject; "points the other way" when the
 * rates are clearly further apart than the margin (Newcombe's hybrid score interval at the claim's confidence lies
 * entirely beyond +margin or −margin); otherwise not supported, because the interval reaches beyond the margin.
 * The smallest difference that matters does not apply: the margin plays that part.
 *
 * Where the number eligible is known, every figure carries the finite-population correction (Cochran (1977),
 * Sampling Techniques, §3.3), as a compare claim's do: the two one-sided tests' standard error, each rate's Wilson
 * interval and Newcombe's interval for the difference. Otherwise a compare claim and an equivalence claim on the
 * same two selections would read different spreads from the same data, and the pack could call a gap of the margin
 * both ruled out (on the compare claim's page) and not ruled out (on this one).
 */
import type { EquivalenceClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { relate } from '../data/select.js';
import { InputError } from '../errors.js';
import { newcombeInterval } from '../stats/newcombe.js';
import { tostTwoProportions } from '../stats/tost-two-proportions.js';
import { refuseOverlap, type CompareContext } from './compare.js';
import { filterLabel, restLabel, sign } from './labels.js';
import { fpcWanted, rateSummary } from './rates.js';
import { shortfall } from './thresholds.js';
import type { EquivalenceAnalysis } from './types.js';

export function analyseEquivalence(claim: EquivalenceClaim, cube: Cube, ctx: CompareContext): EquivalenceAnalysis {
  const place = { file: ctx.claimsFile, line: claim.place.line, column: claim.place.column };
  if (!(claim.margin > 0 && claim.margin < 1)) {
    throw new InputError({
      ...place,
      field: `claims.${claim.id}.margin`,
      found: String(claim.margin),
      problem: `claim "${claim.id}" needs a margin between 0 and 100 points`,
      fix: 'write the largest difference that would still count as "no real difference", e.g. margin: 5 points',
    });
  }
  const related = relate(cube, { ...claim.where, ...claim.focus }, { ...claim.where, ...claim.against });
  refuseOverlap(related.relation, claim, ctx);
  let focusPooled = related.focus;
  let againstPooled = related.against;
  let focusLabel = claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  let againstLabel = claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  if (related.relation === 'focus-inside' && related.rest) {
    againstPooled = related.rest;
    againstLabel = restLabel(claim);
  } else if (related.relation === 'against-inside' && related.rest) {
    focusPooled = related.rest;
    focusLabel = `the rest of ${focusLabel}`;
  }
  // One decision for every figure, as for compare: where the number eligible is known (and the claims file does not
  // turn it off) the test, each rate's interval and the difference's interval all carry the finite-population
  // correction, so that a compare claim on the same two selections and this one read the same spread.
  const wanted = fpcWanted(claim, cube);
  const population = (p: { n: number; population?: number }): number | undefined => (p.population !== undefined && p.population >= p.n ? p.population : undefined);
  const N1 = population(focusPooled);
  const N2 = population(againstPooled);
  const corrected = wanted?.used === true && N1 !== undefined && N2 !== undefined;
  const fpc = wanted === undefined ? undefined : corrected || wanted.used === false ? wanted : { used: false as const, why: 'no-population' as const };
  const base = { kind: 'equivalence' as const, claim, relation: related.relation, expectSign: 0 as const, methods: [] as string[], compared: { focus: focusLabel, against: againstLabel }, ...(fpc !== undefined ? { fpc } : {}) };
  const why = shortfall(claim, [
    { label: focusLabel, pooled: focusPooled },
    { label: againstLabel, pooled: againstPooled },
  ]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };
  const x1 = Math.round(focusPooled.agree);
  const x2 = Math.round(againstPooled.agree);
  const n1 = focusPooled.n;
  const n2 = againstPooled.n;
  if ((x1 === 0 || x1 === n1) && (x2 === 0 || x2 === n2)) {
    return {
      ...base,
      status: 'too-little-data',
      shortfall: `everyone in ${focusLabel} and in ${againstLabel} answered alike, so the spread the test needs is missing`,
      observedSign: 0,
    };
  }
  const alpha = Number((1 - claim.confidence).toFixed(12));
  const populations = corrected ? { populationSize1: N1, populationSize2: N2 } : {};
  const test = tostTwoProportions(x1, n1, x2, n2, claim.margin, { alpha, ...populations });
  const focus = rateSummary(focusLabel, { ...focusPooled, agree: x1 }, claim.confidence, corrected);
  const against = rateSummary(againstLabel, { ...againstPooled, agree: x2 }, claim.confidence, corrected);
  const diff = focus.rate - against.rate;
  const interval = newcombeInterval(x1, n1, x2, n2, { level: claim.confidence, ...populations });
  const rates = [focus, against].filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  return {
    ...base,
    status: 'tested',
    test,
    observedSign: sign(diff),
    focus,
    against,
    difference: { value: diff, interval },
    ...(test.interval ? { equivalenceInterval: test.interval } : {}),
    beyondMargin: interval.lower > claim.margin || interval.upper < -claim.margin,
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    methods: ['tost-two-proportions', corrected ? 'wilson-fpc' : 'wilson', 'newcombe-hybrid', ...(corrected ? ['finite-population-correction'] : [])],
  };
}
