/**
 * Claim kind "every": each unit under the claim's `where` on one side of a fixed value ("every department is at or
 * above the 70% benchmark").
 *
 * Test: the intersection–union test (src/stats/intersection-union.ts; Berger 1982, Berger and Hsu 1996). The claim
 * holds only if each unit's rate is shown above (below) the value: one one-sided test per unit, as the target kind
 * runs it (the score test, with the finite-population correction where every unit's number eligible is known, or
 * the exact binomial test when fewer than 5 agreeing or not agreeing are expected at the value), each at level
 * alpha; the claim's p-value is the largest of them. A unit with too few respondents cannot be tested, so a claim
 * about every unit cannot be shown (p = 1) and the words name it.
 *
 * "Points the other way" needs some unit shown on the far side of the value: a union of one-sided tests the other
 * way, joined with Bonferroni's correction over the units (the smallest p-value times their number).
 */
import type { EveryClaim } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { InputError } from '../errors.js';
import { effectiveSize } from '../stats/finite-population.js';
import { intersectionUnion } from '../stats/intersection-union.js';
import { minDetectableGap } from '../stats/power-one-proportion.js';
import type { Alternative, TestResult } from '../stats/result.js';
import type { CompareContext } from './compare.js';
import { valueWords } from './labels.js';
import { unitsUnder } from './rank.js';
import { fpcWanted, rateSummary } from './rates.js';
import { needsExact, testAgainstValue } from './target.js';
import { shortfall } from './thresholds.js';
import type { EveryAnalysis, FpcChoice, RateSummary, UnitTest } from './types.js';

/** The largest of the units' smallest gaps from the value detectable with 80% power at `alpha`, and whose it is. */
export function everyDetectable(rates: readonly RateSummary[], p0: number, expect: EveryClaim['expect'], alpha: number, sided: 'one-sided' | 'two-sided'): { value: number; unit: string } | undefined {
  let worst: { value: number; unit: string } | undefined;
  for (const r of rates) {
    const corrected = r.fpc === true && r.population !== undefined;
    const gaps = minDetectableGap(r.n, p0, { alpha, power: 0.8, sided, ...(corrected ? { populationSize: r.population as number } : {}) });
    const d = expect === 'higher' ? gaps.increase : gaps.decrease;
    // A unit for which no gap in the claimed direction is detectable: none is, for the claim as a whole.
    if (d === null) return undefined;
    if (worst === undefined || d > worst.value) worst = { value: d, unit: r.label };
  }
  return worst;
}

export function analyseEvery(claim: EveryClaim, cube: Cube, ctx: CompareContext): EveryAnalysis {
  const column = claim.units;
  const p0 = claim.value;
  const problem = (field: string, found: string, what: string, fix: string): InputError =>
    new InputError({ file: ctx.claimsFile, line: claim.place.line, column: claim.place.column, field: `claims.${claim.id}.${field}`, found, problem: `claim "${claim.id}" ${what}`, fix });
  if (!(p0 > 0 && p0 < 1)) {
    throw problem('value', claim.valueWritten, `sets a value of ${claim.valueWritten}, which no rate can be tested against (it must lie strictly between 0% and 100%)`, 'give the value as a percentage between 0% and 100%, e.g. `value: 70%`');
  }
  if (cube.values[column] === undefined) {
    throw problem('units', column, `holds the values of column "${column}" to the value, but its source has no such column`, `name a column of the source whose values are the units, e.g. ${Object.keys(cube.values).slice(0, 3).join(', ')}`);
  }
  const all = unitsUnder(cube, claim.where, column);
  if (all.length < 2) {
    throw problem(
      'units',
      String(all.length),
      `claims something of every value of column "${column}", but its where selects ${all.length === 0 ? 'no rows' : `only one (${all[0]?.value ?? ''})`}`,
      all.length === 0 ? 'widen where so that it selects some rows' : `for one unit use kind: target with select: { ${column}: ${all[0]?.value ?? ''} }; or widen where so that it selects several values of ${column}`,
    );
  }
  const labelOf = (v: string): string => (claim.naming?.values !== undefined ? valueWords(column, v, claim.naming) : v);
  const sign: 1 | -1 = claim.expect === 'higher' ? 1 : -1;
  const base = { kind: 'every' as const, claim, expectSign: sign, methods: [] as string[], unitColumn: column, unitCount: all.length };
  const suppressedUnits = all.filter((u) => shortfall(claim, [{ label: labelOf(u.value), pooled: u.pooled }]) !== undefined).map((u) => labelOf(u.value));
  const testedUnits = all.filter((u) => !suppressedUnits.includes(labelOf(u.value)));
  if (testedUnits.length === 0) {
    return { ...base, status: 'too-little-data', shortfall: `fewer than ${claim.minRespondents} people answered in every ${column} (${suppressedUnits.join(', ')})`, observedSign: 0, suppressedUnits };
  }
  // One decision for every figure: the correction needs every unit's number eligible, and the exact binomial test
  // (for any unit with fewer than 5 expected either way) has no corrected form.
  const anyExact = testedUnits.some((u) => needsExact(u.pooled.n, p0));
  let wanted: FpcChoice | undefined = fpcWanted(claim, cube, anyExact ? 'the exact binomial test' : undefined);
  const hasPopulation = (p: Pooled) => p.population !== undefined && p.population >= p.n;
  if (wanted?.used === true && !testedUnits.every((u) => hasPopulation(u.pooled))) wanted = { used: false, why: 'no-population' };
  const correct = wanted?.used === true;
  const alternative: Alternative = claim.expect === 'higher' ? 'greater' : 'less';
  const back: Alternative = claim.expect === 'higher' ? 'less' : 'greater';
  const tests: UnitTest[] = testedUnits.map((u) => {
    const rate = rateSummary(labelOf(u.value), u.pooled, claim.confidence, correct);
    const exact = needsExact(rate.n, p0);
    const run = (alt: Alternative): TestResult => testAgainstValue(rate, p0, { exact, corrected: correct, level: claim.confidence }, alt);
    const diff = rate.rate - p0;
    return {
      rate,
      test: run(alternative),
      pOpposite: run(back).p,
      difference: { value: diff, interval: { ...rate.interval, lower: rate.interval.lower - p0, upper: rate.interval.upper - p0 } },
      exact,
    };
  });
  const sided = claim.sided === 'two-sided' ? 'two-sided' : 'one-sided';
  // The unit nearest the wrong side of the value (smallest gap in the claimed direction).
  const gapOf = (u: UnitTest) => sign * u.difference.value;
  const nearest = tests.reduce((a, b) => (gapOf(b) < gapOf(a) ? b : a));
  const iut = intersectionUnion(
    tests.map((u) => u.test),
    { method: 'every-iut', sided, missing: suppressedUnits.length, estimate: { name: 'smallest difference from the comparison value', value: nearest.difference.value } },
  );
  tests.forEach((u, i) => (u.p = iut.componentP[i] as number));
  const oppositeEach = tests.map((u) => (sided === 'two-sided' ? Math.min(1, 2 * u.pOpposite) : u.pOpposite));
  const pOpposite = Math.min(1, tests.length * Math.min(...oppositeEach));
  const ordered = [...tests].sort((a, b) => gapOf(a) - gapOf(b));
  const detectable = ctx.detectable !== false ? everyDetectable(tests.map((u) => u.rate), p0, claim.expect, 1 - claim.confidence, sided) : undefined;
  // The unit whose sample asks the largest gap: the fewest respondents, counted as the correction counts them.
  const effective = (r: RateSummary) => (r.fpc === true && r.population !== undefined ? effectiveSize(r.n, r.population) : r.n);
  const smallest = tests.map((u) => u.rate).reduce((x, y) => (effective(y) < effective(x) ? y : x));
  const rates = tests.map((u) => u.rate).filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  const anyScore = tests.some((u) => !u.exact);
  return {
    ...base,
    status: 'tested',
    tests: ordered,
    nearest,
    suppressedUnits,
    ...(wanted !== undefined ? { fpc: wanted } : {}),
    // Each unit's respondents, nearest the value first (the order of the page's table).
    test: { ...iut.test, n: ordered.map((u) => u.rate.n) },
    pOpposite,
    observedSign: gapOf(nearest) > 0 ? 1 : gapOf(nearest) < 0 ? -1 : 0,
    difference: nearest.difference,
    ...(detectable !== undefined ? { detectable: detectable.value } : {}),
    detectableUnit: detectable?.unit ?? smallest.label,
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    ...(claim.smallestDifference !== undefined ? { threshold: { effect: nearest.difference.value, smallest: claim.smallestDifference, unit: 'points' as const } } : {}),
    methods: [
      'every-iut',
      ...(anyScore ? [correct ? 'one-sample-score-fpc' : 'one-sample-score'] : []),
      ...(anyExact ? ['binomial-exact'] : []),
      correct ? 'wilson-fpc' : 'wilson',
      'power-one-proportion',
      ...(correct ? ['finite-population-correction'] : []),
    ],
  };
}
