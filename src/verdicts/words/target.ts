/** Words for the "target" kind: one selection's agreement rate against a fixed value. */
import type { TargetAnalysis } from '../../analyse/types.js';
import { filterLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, detectableLabel, differenceView, pView, rateCautions, rateRow, rateView, sharedDigits, tooLittle, type ComposeContext, type Composed } from './common.js';

/** True when the fixed value's label says it is a benchmark from elsewhere rather than a target set locally. */
function isBenchmark(label: string | undefined): boolean {
  return label !== undefined && /benchmark|national|sector|average|published|comparator/i.test(label);
}

export function composeTarget(a: TargetAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'lower' ? 'below' : claim.expect === 'higher' ? 'above' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'different';
  const label = a.rate?.label ?? claim.selectLabel ?? filterLabel({ ...claim.where, ...claim.select }, claim.naming);
  const target = fmt.percent(claim.value);
  const valueLabel = claim.valueLabel ?? `the value of ${target}`;
  // "the 80% target" (and "the value of 80%", said when the claim names none) already names the value; "the national
  // benchmark" gets it added: "the national benchmark (72%)".
  const valueName = valueLabel.includes(target) ? valueLabel : `${valueLabel} (${target})`;
  const head = { label, target, valueLabel, valueName, expectWord, oneSided };
  const hypotheses = { null: t.render('target.null', head), alternative: t.render('target.alternative', head) };
  if (a.status === 'too-little-data' || !a.rate || !a.difference || !a.test) {
    return tooLittle(a, ctx, `${label} against ${valueLabel}.`, hypotheses);
  }
  const d = a.difference;
  const dv = differenceView(d, a.observedSign);
  const exact = a.methods.includes('binomial-exact');
  // The rate and the value it is held to at one precision (src/format/numbers.ts); names keep the value as written.
  const dg = sharedDigits([a.rate], [claim.value]);
  const view: View = {
    ...head,
    target: fmt.percent(claim.value, dg),
    rate: rateView(a.rate, dg),
    level: fmt.level(claim.confidence),
    gap: dv.signed,
    gapLower: dv.signedLower,
    gapUpper: dv.signedUpper,
    size: dv.size,
    sizeLower: dv.sizeLower,
    sizeUpper: dv.sizeUpper,
    observedWord: d.value < 0 ? 'below' : 'above',
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    testName: exact ? 'Exact binomial test against the fixed value' : 'Score test against the fixed value',
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    rateRow(a.rate, a.rate.label, dg),
    ...(a.exactInterval
      ? [{ label: 'Exact interval for the rate (Clopper–Pearson)', value: `${fmt.percent(a.exactInterval.lower, fmt.percentDigits(a.exactInterval.lower, a.exactInterval.upper))} to ${fmt.percent(a.exactInterval.upper, fmt.percentDigits(a.exactInterval.lower, a.exactInterval.upper))}${a.rate.population !== undefined ? ', without the finite-population correction' : ''}` }]
      : []),
    { label: claim.valueLabel ?? 'Fixed value', value: claim.valueWritten && claim.valueWritten !== target ? `${view.target as string} (written as ${claim.valueWritten})` : (view.target as string) },
    { label: 'Gap to the value', value: `${view.gap} points (interval ${view.gapLower} to ${view.gapUpper})` },
    ...commonRows(a, decision, ctx),
    { label: detectableLabel('gap', decision), value: view.detectable ? `about ${view.detectable} points` : 'none within reach of this sample' },
  ];
  const cautions: string[] = [t.render(isBenchmark(claim.valueLabel) ? 'target.caution-benchmark' : 'target.caution-target', view)];
  cautions.push(...rateCautions([a.rate], a.responseRate, t));
  if (exact) cautions.push(t.render('target.caution-exact', view));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: [{ label: a.rate.label, rate: a.rate.rate, lower: a.rate.interval.lower, upper: a.rate.interval.upper, n: a.rate.n }],
      reference: { value: claim.value, label: claim.valueLabel ?? target },
    },
    alt: `Chart of the agreement rate in ${a.rate.label}, ${rateView(a.rate, dg).rate} with a ${fmt.level(claim.confidence)} interval of ${rateView(a.rate, dg).lower} to ${rateView(a.rate, dg).upper}, against a line at ${view.target as string} for ${valueLabel}.`,
  };
  return {
    section: {
      compared: t.render('target.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`target.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('target.method', view),
    },
    key: t.render('target.key', view),
  };
}
