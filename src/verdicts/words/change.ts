/** Words for the "change" kind: one selection's agreement rate in an earlier and a later period. */
import type { ChangeAnalysis } from '../../analyse/types.js';
import type { Naming } from '../../claims/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, fisherIntervalCaution, detectableLabel, differenceView, pView, rateCautions, rateRow, rateView, scopeText, sharedDigits, tooLittle, twoRateTestName, type ComposeContext, type Composed } from './common.js';

/** Where-filters other than the period column, as a phrase ("Tarnquill, Q09"). */
export function scopeOf(a: { claim: { where: ChangeAnalysis['claim']['where']; naming?: Naming }; periodColumn: string }): string {
  return scopeText(Object.fromEntries(Object.entries(a.claim.where).filter(([k]) => k !== a.periodColumn)), a.claim.naming);
}

export function composeChange(a: ChangeAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectVerb = claim.expect === 'lower' ? 'fell' : claim.expect === 'higher' ? 'rose' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'different';
  const scope = scopeOf(a);
  const periods = { fromPeriod: a.periods.from, toPeriod: a.periods.to, scope, expectVerb, oneSided };
  const hypotheses = { null: t.render('change.null', periods), alternative: t.render('change.alternative', periods) };
  if (a.status === 'too-little-data' || !a.later || !a.earlier || !a.difference || !a.test) {
    const compared = `${a.periods.from} to ${a.periods.to}${scope ? `, for ${scope}` : ''}.`;
    return tooLittle(a, ctx, compared, hypotheses);
  }
  const d = a.difference;
  const dv = differenceView(d, a.observedSign);
  // One precision for the two periods' rates, in the sentence, the key figure and the table (src/format/numbers.ts).
  const dg = sharedDigits([a.earlier, a.later]);
  const view: View = {
    ...periods,
    later: rateView(a.later, dg),
    earlier: rateView(a.earlier, dg),
    level: fmt.level(claim.confidence),
    change: dv.signed,
    changeLower: dv.signedLower,
    changeUpper: dv.signedUpper,
    size: dv.size,
    sizeLower: dv.sizeLower,
    sizeUpper: dv.sizeUpper,
    observedVerb: d.value < 0 ? 'fell' : 'rose',
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    testName: twoRateTestName(a.methods),
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    // Periods run earliest first, in the table as in the chart.
    rateRow(a.earlier, a.periods.from, dg),
    rateRow(a.later, a.periods.to, dg),
    { label: 'Change', value: `${view.change} points (interval ${view.changeLower} to ${view.changeUpper})` },
    ...commonRows(a, decision, ctx),
    { label: "Effect size (Cohen's h)", value: fmt.coefficient(a.cohensH ?? NaN) },
    { label: detectableLabel('change', decision), value: view.detectable ? `about ${view.detectable} points` : 'none within reach of these samples' },
  ];
  const cautions: string[] = [t.render('caution.cohorts', {})];
  cautions.push(...rateCautions([a.later, a.earlier], a.responseRate, t));
  if (a.methods.includes('fisher-exact-2x2')) cautions.push(t.render('caution.fisher', {}), ...fisherIntervalCaution(a, decision, t));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: [a.earlier, a.later].map((r, i) => ({ label: i === 0 ? a.periods.from : a.periods.to, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
    },
    alt: `Chart of agreement rates with ${fmt.level(claim.confidence)} intervals${scope ? ` for ${scope}` : ''}: ${a.periods.from} ${rateView(a.earlier, dg).rate} (${rateView(a.earlier, dg).lower} to ${rateView(a.earlier, dg).upper}), ${a.periods.to} ${rateView(a.later, dg).rate} (${rateView(a.later, dg).lower} to ${rateView(a.later, dg).upper}).`,
  };
  return {
    section: {
      compared: t.render('change.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`change.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('change.method', view),
    },
    key: t.render('change.key', view),
  };
}
