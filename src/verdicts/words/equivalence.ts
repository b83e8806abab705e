/** Words for the "equivalence" kind: two rates within a margin of each other. */
import type { EquivalenceAnalysis } from '../../analyse/types.js';
import { filterLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, comparesPeriods, pView, rateCautions, rateRow, rateView, restOfGroupCaution, sharedDigits, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

export function composeEquivalence(a: EquivalenceAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const margin = fmt.pointsSize(claim.margin);
  const focusLabel = a.focus?.label ?? a.compared?.focus ?? claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstLabel = a.against?.label ?? a.compared?.against ?? claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  const labelsOnly = { focus: { label: focusLabel }, against: { label: againstLabel }, margin };
  const hypotheses = { null: t.render('equivalence.null', labelsOnly), alternative: t.render('equivalence.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.focus || !a.against || !a.difference || !a.test || !a.equivalenceInterval) {
    return tooLittle(a, ctx, `${focusLabel} against ${againstLabel}, within ±${margin} points${scopeText(claim.where, claim.naming) ? `, for ${scopeText(claim.where, claim.naming)}` : ''}.`, hypotheses);
  }
  const d = a.difference;
  const e = a.equivalenceInterval;
  const alpha = 1 - claim.confidence;
  const digits = fmt.pointsDigits(d.value, d.interval.lower, d.interval.upper, e.lower, e.upper);
  // One precision for the two rates (src/format/numbers.ts); the margin at the differences' decimals.
  const dg = sharedDigits([a.focus, a.against]);
  const view: View = {
    focus: rateView(a.focus, dg),
    against: rateView(a.against, dg),
    scope: scopeText(claim.where, claim.naming),
    margin: fmt.pointsSize(claim.margin, digits),
    level: fmt.level(claim.confidence),
    tostLevel: fmt.level(e.level),
    alpha: fmt.level(alpha),
    // Decimals chosen so that neither interval's ends print alike, nor the difference onto an end (src/format).
    diff: fmt.points(d.value, { sign: true, digits }),
    diffLower: fmt.points(d.interval.lower, { sign: true, digits }),
    diffUpper: fmt.points(d.interval.upper, { sign: true, digits }),
    tostLower: fmt.points(e.lower, { sign: true, digits }),
    tostUpper: fmt.points(e.upper, { sign: true, digits }),
    adjustName: ctx.adjustName,
    fpc: a.methods.includes('wilson-fpc'),
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    rateRow(a.focus, a.focus.label, dg),
    rateRow(a.against, a.against.label, dg),
    { label: 'Difference', value: `${view.diff} points (${view.level} interval ${view.diffLower} to ${view.diffUpper})` },
    { label: 'Margin', value: `±${view.margin as string} points` },
    { label: `Interval set against the margin (${view.tostLevel})`, value: `${view.tostLower} to ${view.tostUpper} points` },
    ...commonRows(a, decision, ctx),
  ];
  const cautions: string[] = restOfGroupCaution(a.relation, claim, { focus: a.focus.n, against: a.against.n }, t);
  if (comparesPeriods(a, ctx.periodColumns)) cautions.push(t.render('caution.cohorts', {}));
  cautions.push(...rateCautions([a.focus, a.against], a.responseRate, t));
  const chart: Chart = {
    data: { kind: 'difference', value: d.value, lower: e.lower, upper: e.upper, margin: claim.margin, axisTitle: `Difference, ${a.focus.label} minus ${a.against.label} (points)`, intervalLabel: `${view.tostLevel} interval (1 − 2α)` },
    alt: `Chart of the difference of ${view.diff} points with its ${view.tostLevel} interval (${view.tostLower} to ${view.tostUpper}) against a band of ±${margin} points.`,
  };
  return {
    section: {
      compared: t.render('equivalence.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`equivalence.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('equivalence.method', view),
    },
    key: t.render('equivalence.key', view),
  };
}
