/** Words for the "compare" kind: two selections' agreement rates. */
import type { CompareAnalysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import { filterLabel } from '../../analyse/labels.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, fisherIntervalCaution, comparesPeriods, detectableLabel, differenceView, pView, rateCautions, rateRow, rateView, restOfGroupCaution, sharedDigits, scopeText, tooLittle, twoRateTestName, type ComposeContext, type Composed } from './common.js';

export function composeCompare(a: CompareAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'lower' ? 'lower' : claim.expect === 'higher' ? 'higher' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'different';
  const focusLabel = a.focus?.label ?? a.compared?.focus ?? claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstLabel = a.against?.label ?? a.compared?.against ?? claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  const labelsOnly = { focus: { label: focusLabel }, against: { label: againstLabel }, expectWord, oneSided };
  const hypotheses = { null: t.render('compare.null', labelsOnly), alternative: t.render('compare.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.focus || !a.against || !a.difference || !a.test) {
    const compared = `${focusLabel} against ${againstLabel}${scopeText(claim.where, claim.naming) ? `, for ${scopeText(claim.where, claim.naming)}` : ''}.`;
    return tooLittle(a, ctx, compared, hypotheses);
  }
  const d = a.difference;
  const dv = differenceView(d, a.observedSign);
  // One precision for the two rates, in the sentence, the key figure and the table (src/format/numbers.ts).
  const dg = sharedDigits([a.focus, a.against]);
  const view: View = {
    focus: rateView(a.focus, dg),
    against: rateView(a.against, dg),
    scope: scopeText(claim.where, claim.naming),
    expectWord,
    oneSided,
    level: fmt.level(claim.confidence),
    diff: dv.signed,
    diffLower: dv.signedLower,
    diffUpper: dv.signedUpper,
    gap: dv.size,
    gapLower: dv.sizeLower,
    gapUpper: dv.sizeUpper,
    diffWord: d.value < 0 ? 'lower' : 'higher',
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    testName: twoRateTestName(a.methods),
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    rateRow(a.focus, a.focus.label, dg),
    rateRow(a.against, a.against.label, dg),
    { label: 'Difference', value: `${view.diff} points (interval ${view.diffLower} to ${view.diffUpper})` },
    ...commonRows(a, decision, ctx),
    { label: "Effect size (Cohen's h)", value: fmt.coefficient(a.cohensH ?? NaN) },
    { label: detectableLabel('difference', decision), value: view.detectable ? `about ${view.detectable} points` : 'none within reach of these samples' },
  ];
  const cautions: string[] = restOfGroupCaution(a.relation, claim, { focus: a.focus.n, against: a.against.n }, t);
  if (comparesPeriods(a, ctx.periodColumns)) cautions.push(t.render('caution.cohorts', {}));
  cautions.push(...rateCautions([a.focus, a.against], a.responseRate, t));
  if (a.methods.includes('fisher-exact-2x2')) cautions.push(t.render('caution.fisher', {}), ...fisherIntervalCaution(a, decision, t));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: [a.focus, a.against].map((r) => ({ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
    },
    alt: `Chart of agreement rates with ${fmt.level(claim.confidence)} intervals: ${a.focus.label} ${rateView(a.focus, dg).rate} (${rateView(a.focus, dg).lower} to ${rateView(a.focus, dg).upper}), ${a.against.label} ${rateView(a.against, dg).rate} (${rateView(a.against, dg).lower} to ${rateView(a.against, dg).upper}).`,
  };
  return {
    section: {
      compared: t.render('compare.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`compare.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('compare.method', view),
    },
    key: t.render('compare.key', view),
  };
}

