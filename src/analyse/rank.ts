/**
 * Claim kind "rank": one unit the highest (or lowest) of all the units under the claim's `where` ("Quarrendell has
 * the highest rate of the institutions in Glasvane Reach").
 *
 * Test: the intersection–union test (src/stats/intersection-union.ts; Berger 1982, Berger and Hsu 1996). The focus
 * is shown highest only if it is shown higher than each other unit: one one-sided two-proportion test per rival (the
 * pooled z test, or Fisher's exact test when an expected count is below 5, as for compare), each at level alpha; the
 * claim's p-value is the largest of them, and it is that one p-value that enters the adjustment for many claims. A
 * rival with too few respondents cannot be tested, so the claim cannot be shown (p = 1) and the words say which.
 * Intervals: Wilson per unit, Newcombe's hybrid score interval for each difference (focus minus rival). The closest
 * rival is the one nearest the focus's rate; the smallest lead is the difference from it.
 *
 * "Points the other way" needs another unit shown above (below) the focus: a union of one-sided tests the other way,
 * joined with Bonferroni's correction over the rivals (the smallest p-value times their number), since which rival
 * is not named in advance.
 */
import type { RankClaim } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { cellsByUnit, checkFilter, poolCells } from '../data/select.js';
import { InputError } from '../errors.js';
import { intersectionUnion } from '../stats/intersection-union.js';
import { minDetectableDifference } from '../stats/power-two-proportions.js';
import { effectiveSize } from '../stats/finite-population.js';
import { findName } from '../suggest.js';
import type { CompareContext } from './compare.js';
import { unitNamer, valueWords } from './labels.js';
import { compareRates, fpcWanted, rateSummary, smallExpected } from './rates.js';
import { shortfall } from './thresholds.js';
import type { FpcChoice, RankAnalysis, RateSummary, RivalResult } from './types.js';

/** The units under a claim's `where`: each value of the units column with its pooled counts, in the data's order. */
export function unitsUnder(cube: Cube, where: RankClaim['where'], column: string): Array<{ value: string; pooled: Pooled }> {
  checkFilter(cube, where);
  const out: Array<{ value: string; pooled: Pooled }> = [];
  for (const [value, cells] of cellsByUnit(cube, where, column)) out.push({ value, pooled: poolCells(cube, cells) });
  return out;
}

/** The smallest lead over a rival (proportion units) detectable with 80% power at `alpha`, in the claimed direction. */
export function rankDetectable(focus: RateSummary, rival: RateSummary, expect: RankClaim['expect'], alpha: number, sided: 'one-sided' | 'two-sided'): number | undefined {
  const corrected = focus.fpc === true && rival.fpc === true && focus.population !== undefined && rival.population !== undefined;
  const m1 = corrected ? effectiveSize(focus.n, focus.population as number) : focus.n;
  const m2 = corrected ? effectiveSize(rival.n, rival.population as number) : rival.n;
  const both = minDetectableDifference(m1, m2, rival.rate, { alpha, power: 0.8, sided });
  const d = expect === 'highest' ? both.increase : both.decrease;
  return d ?? undefined;
}

export function analyseRank(claim: RankClaim, cube: Cube, ctx: CompareContext): RankAnalysis {
  const column = claim.units;
  const problem = (field: string, found: string, what: string, fix: string): InputError =>
    new InputError({ file: ctx.claimsFile, line: claim.place.line, column: claim.place.column, field: `claims.${claim.id}.${field}`, found, problem: `claim "${claim.id}" ${what}`, fix });
  if (cube.values[column] === undefined) {
    throw problem('units', column, `ranks the values of column "${column}", which its source does not have`, `name a column of the source whose values are the units, e.g. ${Object.keys(cube.values).slice(0, 3).join(', ')}`);
  }
  const focusCols = Object.keys(claim.focus);
  const focusValue = claim.focus[column];
  if (focusCols.length !== 1 || focusValue === undefined || typeof focusValue === 'object') {
    throw problem('focus', JSON.stringify(claim.focus), `must name one unit of column "${column}" as its focus`, `write focus: { ${column}: <one unit> }, and put any other filter in where`);
  }
  const all = unitsUnder(cube, claim.where, column);
  const values = all.map((u) => u.value);
  const focusName = findName(String(focusValue).trim(), values);
  if (focusName === undefined) {
    throw problem('focus', String(focusValue), `ranks "${String(focusValue)}", which is not among the units of column "${column}" its where selects (${values.join(', ') || 'none'})`, values.length > 0 ? `name one of ${values.join(', ')}, or widen where so that it selects ${String(focusValue)}` : 'widen where so that it selects some rows');
  }
  if (all.length < 2) {
    throw problem('where', String(all.length), `ranks a unit among ${all.length} unit of column "${column}": its where selects no other unit to rank it against`, `widen where so that it selects at least two values of ${column}`);
  }
  const name = unitNamer(claim.naming);
  const labelOf = (v: string): string => (v === focusName && claim.focusLabel !== undefined ? claim.focusLabel : name !== undefined ? valueWords(column, v, claim.naming) : v);
  const sign: 1 | -1 = claim.expect === 'highest' ? 1 : -1;
  const base = { kind: 'rank' as const, claim, expectSign: sign, methods: [] as string[], unitColumn: column, unitCount: all.length };
  const focusUnit = all.find((u) => u.value === focusName) as { value: string; pooled: Pooled };
  const focusShort = shortfall(claim, [{ label: labelOf(focusName), pooled: focusUnit.pooled }]);
  if (focusShort !== undefined) return { ...base, status: 'too-little-data', shortfall: focusShort, observedSign: 0, suppressedUnits: [] };
  const rivalsIn = all.filter((u) => u.value !== focusName);
  const suppressedUnits = rivalsIn.filter((u) => shortfall(claim, [{ label: labelOf(u.value), pooled: u.pooled }]) !== undefined).map((u) => labelOf(u.value));
  const tested = rivalsIn.filter((u) => !suppressedUnits.includes(labelOf(u.value)));
  if (tested.length === 0) {
    return { ...base, status: 'too-little-data', shortfall: `fewer than ${claim.minRespondents} people answered in every other unit (${suppressedUnits.join(', ')}), so there is nothing to rank ${labelOf(focusName)} against`, observedSign: 0, suppressedUnits };
  }
  // One decision for every figure: the correction needs every unit's number eligible, and Fisher's exact test
  // (used for any rival with an expected count below 5) has no corrected form.
  const anyFisher = tested.some((u) => smallExpected(focusUnit.pooled.agree, focusUnit.pooled.n, u.pooled.agree, u.pooled.n));
  let wanted: FpcChoice | undefined = fpcWanted(claim, cube, anyFisher ? "Fisher's exact test" : undefined);
  const hasPopulation = (p: Pooled) => p.population !== undefined && p.population >= p.n;
  if (wanted?.used === true && ![focusUnit, ...tested].every((u) => hasPopulation(u.pooled))) wanted = { used: false, why: 'no-population' };
  const correct = wanted?.used === true;
  const focus = rateSummary(labelOf(focusName), focusUnit.pooled, claim.confidence, correct);
  const direction = claim.expect === 'highest' ? 'higher' : 'lower';
  const rivals: RivalResult[] = tested.map((u) => {
    const rival = rateSummary(labelOf(u.value), u.pooled, claim.confidence, correct);
    const two = compareRates(focus, rival, direction, 'one-sided', claim.confidence, wanted, { detectable: false });
    return { rival: two.second, test: two.test, pOpposite: two.pOpposite as number, difference: two.difference, methods: two.methods };
  });
  const sided = claim.sided === 'two-sided' ? 'two-sided' : 'one-sided';
  // The closest rival: the one whose rate is nearest the focus's on the claimed side (or past it).
  const lead = (r: RivalResult) => sign * r.difference.value;
  const closest = rivals.reduce((a, b) => (lead(b) < lead(a) ? b : a));
  const iut = intersectionUnion(
    rivals.map((r) => r.test),
    { method: 'rank-iut', sided, missing: suppressedUnits.length, estimate: { name: 'smallest difference in proportions, focus minus a rival', value: closest.difference.value } },
  );
  const oppositeEach = rivals.map((r) => (sided === 'two-sided' ? Math.min(1, 2 * r.pOpposite) : r.pOpposite));
  const pOpposite = Math.min(1, rivals.length * Math.min(...oppositeEach));
  rivals.forEach((r, i) => (r.p = iut.componentP[i] as number));
  const ordered = [...rivals].sort((a, b) => lead(a) - lead(b));
  const units = [focus, ...rivals.map((r) => r.rival)].sort((a, b) => sign * (b.rate - a.rate));
  const alpha = 1 - claim.confidence;
  const detectable = ctx.detectable !== false ? rankDetectable(focus, closest.rival, claim.expect, alpha, sided) : undefined;
  const rates = [focus, ...rivals.map((r) => r.rival)].filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  const usedFisher = rivals.some((r) => r.methods.includes('fisher-exact-2x2'));
  const usedZ = rivals.some((r) => !r.methods.includes('fisher-exact-2x2'));
  return {
    ...base,
    status: 'tested',
    focus,
    rivals: ordered,
    closest,
    units,
    suppressedUnits,
    ...(wanted !== undefined ? { fpc: wanted } : {}),
    // Each unit's respondents once (the focus first, then the rivals nearest first), not the focus once per comparison.
    test: { ...iut.test, n: [focus.n, ...ordered.map((r) => r.rival.n)] },
    pOpposite,
    observedSign: lead(closest) > 0 ? 1 : lead(closest) < 0 ? -1 : 0,
    difference: closest.difference,
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    ...(claim.smallestDifference !== undefined ? { threshold: { effect: closest.difference.value, smallest: claim.smallestDifference, unit: 'points' as const } } : {}),
    methods: [
      'rank-iut',
      ...(usedZ ? [correct ? 'two-proportion-z-fpc' : 'two-proportion-z'] : []),
      ...(usedFisher ? ['fisher-exact-2x2'] : []),
      correct ? 'wilson-fpc' : 'wilson',
      'newcombe-hybrid',
      'power-two-proportions',
      ...(correct ? ['finite-population-correction'] : []),
    ],
  };
}
