/** Words for a change claim with focus and against: the gap between two selections in an earlier and a later period. */
import type { GapChangeAnalysis, GapInPeriod } from '../../analyse/types.js';
import { filterLabel, restLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { scopeOf } from './change.js';
import { commonRows, detectableLabel, differenceView, pView, rateCautions, rateRow, rateView, restOfGroupCaution, sharedDigits, tooLittle, type ComposeContext, type Composed } from './common.js';

/** The test in words, for the method line. */
export function gapTestName(methods: string[]): string {
  return methods.includes('gap-size-iut') ? 'Intersection–union test on the gap’s size (two z tests, each at the two-sided level)' : 'z test of the change in the gap (a difference of two differences)';
}

/**
 * For a claim that the gap narrowed or widened: the numbers table's one test statistic (the change in the gap's z)
 * replaced by the two one-sided tests that must both find their way, each with its z and p-value (at the two-sided
 * level), named in plain words with the side they were read on; the claim's p-value is the larger of the two.
 */
function withSizeTests(rows: NumberRow[], a: GapChangeAnalysis, expect: string, focusName: string, againstName: string): NumberRow[] {
  const tests = a.sizeTests;
  if (tests === undefined) return rows;
  const [change, sum] = tests;
  const ahead = sum.alternative === 'greater' ? focusName : againstName;
  const side = (alt: 'less' | 'greater') => (alt === 'less' ? 'below zero' : 'above zero');
  const zp = (c: typeof change) => `z = ${fmt.statistic(c.z)}, p = ${fmt.pValue(c.p)}`;
  const narrowed = expect === 'narrowed';
  const two: NumberRow[] = [
    {
      label: narrowed ? 'First test: the gap moved back towards zero' : 'First test: the gap moved further from zero',
      value: `change in the gap ${side(change.alternative)}, with ${ahead} ahead: ${zp(change)}`,
    },
    {
      label: narrowed ? 'Second test: it did not cross to the other side by as much' : 'Second test: the gaps lie on the side it moved to',
      value: `the two gaps added together ${side(sum.alternative)}: ${zp(sum)}`,
    },
  ];
  const at = rows.findIndex((r) => r.label === 'Test statistic');
  return at < 0 ? [...two, ...rows] : [...rows.slice(0, at), ...two, ...rows.slice(at + 1)];
}

export function composeGapChange(a: GapChangeAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expect = claim.expect;
  const focusName = claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstName = claim.againstRest === true || a.relation === 'focus-inside' ? restLabel(claim) : claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  const sizeClaim = expect === 'narrowed' || expect === 'widened';
  const oneSided = !sizeClaim && (a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && expect !== 'different');
  const expectVerb = expect === 'lower' ? 'fell' : expect === 'higher' ? 'rose' : expect === 'narrowed' ? 'narrowed' : expect === 'widened' ? 'widened' : '';
  const scope = scopeOf(a);
  const words = {
    focusName,
    againstName,
    fromPeriod: a.periods.from,
    toPeriod: a.periods.to,
    scope,
    expectVerb,
    oneSided,
    sizeClaim,
    narrowed: expect === 'narrowed',
    widened: expect === 'widened',
  };
  const hypotheses = { null: t.render('gap-change.null', words), alternative: t.render('gap-change.alternative', words) };
  if (a.status === 'too-little-data' || !a.earlier || !a.later || !a.difference || !a.test) {
    return tooLittle(a, ctx, t.render('gap-change.compared', { ...words, earlierN: '', laterN: '' }), hypotheses);
  }
  const d = a.difference;
  const dv = differenceView(d, a.observedSign);
  const four = [a.earlier.focus, a.earlier.against, a.later.focus, a.later.against];
  const dg = sharedDigits(four);
  const gapDigits = fmt.pointsDigits(a.earlier.gap, a.later.gap, a.earlier.interval.lower, a.earlier.interval.upper, a.later.interval.lower, a.later.interval.upper);
  const gapView = (g: GapInPeriod) => ({
    focus: rateView(g.focus, dg),
    against: rateView(g.against, dg),
    n: fmt.count(g.focus.n + g.against.n),
    gap: fmt.points(g.gap, { sign: true, digits: gapDigits }),
    gapLower: fmt.points(g.interval.lower, { sign: true, digits: gapDigits }),
    gapUpper: fmt.points(g.interval.upper, { sign: true, digits: gapDigits }),
    size: fmt.pointsSize(g.gap, gapDigits),
  });
  const sizeChange = a.sizeChange ?? 0;
  const earlierV = gapView(a.earlier);
  const laterV = gapView(a.later);
  const view: View = {
    ...words,
    earlier: earlierV,
    later: laterV,
    earlierN: fmt.count(a.earlier.focus.n + a.earlier.against.n),
    laterN: fmt.count(a.later.focus.n + a.later.against.n),
    level: fmt.level(claim.confidence),
    change: dv.signed,
    changeLower: dv.signedLower,
    changeUpper: dv.signedUpper,
    observedVerb: sizeClaim ? (sizeChange < 0 ? 'narrowed' : sizeChange > 0 ? 'widened' : 'kept its size') : d.value < 0 ? 'fell' : 'rose',
    sizeVerb: sizeChange < 0 ? 'narrowed' : sizeChange > 0 ? 'widened' : 'kept its size',
    sizeChange: fmt.pointsSize(sizeChange, gapDigits),
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    testName: gapTestName(a.methods),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  view.describe = t.render('gap-change.describe', view);
  const numbers: NumberRow[] = [
    rateRow(a.earlier.focus, a.earlier.focus.label, dg),
    rateRow(a.earlier.against, a.earlier.against.label, dg),
    rateRow(a.later.focus, a.later.focus.label, dg),
    rateRow(a.later.against, a.later.against.label, dg),
    { label: `Gap in ${a.periods.from}`, value: `${earlierV.gap} points (interval ${earlierV.gapLower} to ${earlierV.gapUpper})` },
    { label: `Gap in ${a.periods.to}`, value: `${laterV.gap} points (interval ${laterV.gapLower} to ${laterV.gapUpper})` },
    { label: 'Change in the gap', value: `${view.change} points (interval ${view.changeLower} to ${view.changeUpper})` },
    ...(sizeClaim ? [{ label: 'Change in the gap’s size', value: `${sizeChange < 0 ? '−' : sizeChange > 0 ? '+' : ''}${view.sizeChange} points (${view.sizeVerb})` }] : []),
    ...withSizeTests(commonRows(a, decision, ctx), a, expect, focusName, againstName),
    { label: detectableLabel('change in the gap', decision), value: view.detectable ? `about ${view.detectable} points` : 'none within reach of these samples' },
  ];
  const cautions: string[] = [t.render('caution.cohorts', {})];
  cautions.push(...restOfGroupCaution(a.relation, claim, { focus: a.later.focus.n, against: a.later.against.n }, t));
  cautions.push(...rateCautions(four, a.responseRate, t));
  if (a.test.warnings.length > 0) cautions.push(t.render('caution.gap-small-counts', {}));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: four.map((r) => ({ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
    },
    alt: `Chart of agreement rates with ${fmt.level(claim.confidence)} intervals${scope ? ` for ${scope}` : ''}: ${four.map((r) => `${r.label} ${rateView(r, dg).rate} (${rateView(r, dg).lower} to ${rateView(r, dg).upper})`).join(', ')}.`,
  };
  return {
    section: {
      compared: t.render('gap-change.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`gap-change.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('gap-change.method', view),
    },
    key: t.render('gap-change.key', view),
  };
}
