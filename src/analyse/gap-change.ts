/**
 * A change claim with focus and against: the gap between two selections (focus minus against) in an earlier and a
 * later period ("the gap between part-time and full-time students narrowed since 2024").
 *
 * Each period's two selections are related as a compare claim's are (one inside the other: the larger taken without
 * the smaller; `against: rest`: everyone else under where), and each period is answered by a different cohort, so the
 * four rates are independent samples. The change in the gap, D = later gap - earlier gap, is tested with the z test
 * of src/stats/difference-of-differences.ts and reported with its hybrid score (MOVER-Wilson) interval:
 * - lower / higher / different: D below 0, above 0 or either way (focus minus against fell, rose, changed);
 * - narrowed / widened: the gap's size, |later gap| against |earlier gap| whichever selection is ahead, by the
 *   intersection-union test of gapSizeChange (always at the two-sided level; rules.ts refuses test: one-sided).
 * Each period's gap has Newcombe's interval (rates.ts). The finite-population correction has no form here, so no
 * figure of the claim carries it. The smallest detectable change is src/stats/power-gap-change.ts.
 */
import type { GapChangeClaim } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { relate } from '../data/select.js';
import { newcombeInterval } from '../stats/newcombe.js';
import { differenceOfDifferences, gapSizeChange, type Gap } from '../stats/difference-of-differences.js';
import { minDetectableGapChange } from '../stats/power-gap-change.js';
import { refuseOverlap, type CompareContext } from './compare.js';
import { twoPeriods } from './change.js';
import { filterLabel, restLabel, sign } from './labels.js';
import { alternativeFor, fpcWanted, rateSummary } from './rates.js';
import { shortfall, type Selected } from './thresholds.js';
import type { GapChangeAnalysis, GapInPeriod } from './types.js';

/** The test's name in results and method notes for each direction. */
export const GAP_FORM = 'the test of a change in a gap';

/** The expected sign of the estimate: D for lower/higher/different, the change in size for narrowed/widened. */
function expectSignOf(expect: GapChangeClaim['expect']): 1 | -1 | 0 {
  return expect === 'lower' || expect === 'narrowed' ? -1 : expect === 'higher' || expect === 'widened' ? 1 : 0;
}

export function analyseGapChange(written: GapChangeClaim, cube: Cube, ctx: CompareContext): GapChangeAnalysis {
  const { claim, column, from, to } = twoPeriods(written, cube, ctx, 'the gap in period');
  const naming = { ...claim.naming, period: column };
  const focusName = claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstName = claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  // The two selections in one period: the compare kind's rule for one inside the other.
  const inPeriod = (period: string): { relation: GapChangeAnalysis['relation']; focus: Selected; against: Selected } => {
    const related = relate(cube, { ...claim.where, ...claim.focus, [column]: period }, { ...claim.where, ...claim.against, [column]: period });
    refuseOverlap(related.relation, claim, ctx, ' (e.g. part-time and full-time students)');
    const at = (label: string) => filterLabel({ [column]: period }, naming).replace(/^/, `${label}, `);
    let focus: Pooled = related.focus;
    let against: Pooled = related.against;
    let fLabel = focusName;
    let aLabel = againstName;
    if (related.relation === 'focus-inside' && related.rest) {
      against = related.rest;
      aLabel = restLabel(claim);
    } else if (related.relation === 'against-inside' && related.rest) {
      focus = related.rest;
      fLabel = `the rest of ${focusName}`;
    }
    return { relation: related.relation, focus: { label: at(fLabel), pooled: focus }, against: { label: at(aLabel), pooled: against } };
  };
  const early = inPeriod(from);
  const late = inPeriod(to);
  const base = {
    kind: 'gap-change' as const,
    claim,
    periodColumn: column,
    periods: { from, to },
    relation: late.relation,
    expectSign: expectSignOf(claim.expect),
    methods: [] as string[],
  };
  const why = shortfall(claim, [early.focus, early.against, late.focus, late.against]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };
  const summary = (s: Selected) => rateSummary(s.label, s.pooled, claim.confidence, false);
  const gapOf = (p: typeof early): GapInPeriod => {
    const focus = summary(p.focus);
    const against = summary(p.against);
    return { focus, against, gap: focus.rate - against.rate, interval: newcombeInterval(focus.agree, focus.n, against.agree, against.n, { level: claim.confidence }) };
  };
  const earlier = gapOf(early);
  const later = gapOf(late);
  const counts = (g: GapInPeriod): Gap => ({ first: { x: g.focus.agree, n: g.focus.n }, second: { x: g.against.agree, n: g.against.n } });
  const four = [earlier.focus, earlier.against, later.focus, later.against];
  if (four.every((r) => r.agree === 0 || r.agree === r.n)) {
    // Every group answered all one way: the change in the gap has no standard error and no test.
    return { ...base, status: 'too-little-data', shortfall: 'every one of the four groups answered all one way (each rate 0% or 100%), so a change in the gap cannot be tested', observedSign: 0 };
  }
  const sizeClaim = claim.expect === 'narrowed' || claim.expect === 'widened';
  const alternative = sizeClaim ? 'two-sided' : alternativeFor(claim.expect as 'lower' | 'higher' | 'different', claim.sided);
  const d = differenceOfDifferences(counts(earlier), counts(later), { level: claim.confidence, alternative });
  let test = d;
  let pOpposite: number | undefined;
  let sizeTests: GapChangeAnalysis['sizeTests'];
  if (sizeClaim) {
    const s = gapSizeChange(counts(earlier), counts(later), claim.expect as 'narrowed' | 'widened', { level: claim.confidence });
    test = s.test;
    pOpposite = s.pOpposite;
    sizeTests = s.components;
  } else if (alternative !== 'two-sided') {
    pOpposite = differenceOfDifferences(counts(earlier), counts(later), { level: claim.confidence, alternative: alternative === 'less' ? 'greater' : 'less' }).p;
  }
  const sizeChange = Math.abs(later.gap) - Math.abs(earlier.gap);
  const se = Math.sqrt(four.reduce((s, r) => s + (r.rate * (1 - r.rate)) / r.n, 0));
  const detectable = ctx.detectable !== false ? minDetectableGapChange(se, { alpha: 1 - claim.confidence, sided: alternative === 'two-sided' ? 'two-sided' : 'one-sided' }) : undefined;
  const rates = four.filter((r) => r.population !== undefined).map((r) => r.n / (r.population as number));
  const smallest = claim.smallestDifference;
  const effect = sizeClaim ? sizeChange : d.estimate.value;
  const wanted = fpcWanted(claim, cube, GAP_FORM);
  return {
    ...base,
    status: 'tested',
    earlier,
    later,
    ...(wanted !== undefined ? { fpc: wanted } : {}),
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(effect),
    difference: { value: d.estimate.value, interval: d.interval as NonNullable<typeof d.interval> },
    sizeChange,
    ...(sizeTests !== undefined ? { sizeTests } : {}),
    ...(smallest !== undefined ? { threshold: { effect, smallest, unit: 'points' as const } } : {}),
    ...(detectable !== undefined ? { detectable } : {}),
    ...(rates.length > 0 ? { responseRate: Math.min(...rates) } : {}),
    methods: [test.method, ...(sizeClaim ? ['difference-of-differences-z'] : []), 'mover-wilson', 'wilson', 'newcombe-hybrid', 'power-gap-change'],
  };
}
