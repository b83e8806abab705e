/** Words for the "every" kind: each unit under where on one side of a fixed value. */
import type { EveryAnalysis, UnitTest } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, detectableLabel, differenceView, listWords, pView, plural, rateCautions, rateView, scopeText, sharedDigits, tooLittle, type ComposeContext, type Composed } from './common.js';

export function composeEvery(a: EveryAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const higher = claim.expect === 'higher';
  const unitWord = claim.units.toLowerCase();
  const unitsWord = plural(claim.units);
  const scope = scopeText(claim.where, claim.naming);
  const target = fmt.percent(claim.value);
  const valueLabel = claim.valueLabel ?? `the value of ${target}`;
  const valueName = valueLabel.includes(target) ? valueLabel : `${valueLabel} (${target})`;
  const head = {
    unitWord,
    unitsWord,
    scope,
    valueName,
    target,
    sideWord: higher ? 'above' : 'below',
    unitCount: fmt.count(a.unitCount),
    twoSided: claim.sided === 'two-sided',
  };
  const hypotheses = { null: t.render('every.null', head), alternative: t.render('every.alternative', head) };
  if (a.status === 'too-little-data' || !a.tests || !a.nearest || !a.difference || !a.test) {
    return tooLittle(a, ctx, `Each of the ${unitsWord}${scope ? ` (${scope})` : ''} against ${valueName}.`, hypotheses);
  }
  const alphaUsed = decision.effectiveAlpha ?? decision.alpha;
  const notShown = a.tests.filter((u) => (u.p ?? 1) >= alphaUsed).map((u) => u.rate.label);
  const rates = a.tests.map((u) => u.rate);
  const dg = sharedDigits(rates, [claim.value]);
  const nearest = a.nearest;
  const dv = differenceView(a.difference, Math.sign(a.difference.value));
  // A unit shown on the far side of the value, for "points the other way": the one with the smallest p that way.
  const wrong = a.tests.reduce<UnitTest>((best, u) => (u.pOpposite < best.pOpposite ? u : best), a.tests[0] as UnitTest);
  const wv = differenceView(wrong.difference, Math.sign(wrong.difference.value));
  const view: View = {
    ...head,
    target: fmt.percent(claim.value, dg),
    testedCount: fmt.count(a.tests.length),
    nearest: rateView(nearest.rate, dg),
    wrong: rateView(wrong.rate, dg),
    wrongSize: wv.size,
    wrongLower: wv.sizeLower,
    wrongUpper: wv.sizeUpper,
    wrongWord: wrong.difference.value < 0 ? 'below' : 'above',
    level: fmt.level(claim.confidence),
    gap: dv.signed,
    gapLower: dv.signedLower,
    gapUpper: dv.signedUpper,
    size: dv.size,
    sizeLower: dv.sizeLower,
    sizeUpper: dv.sizeUpper,
    nearestOnSide: a.observedSign > 0,
    nearestWord: a.difference.value < 0 ? 'below' : 'above',
    allShown: notShown.length === 0,
    notShown: listWords(notShown),
    notShownCount: fmt.count(notShown.length),
    oneNotShown: notShown.length === 1,
    untested: listWords(a.suppressedUnits),
    anyUntested: a.suppressedUnits.length > 0,
    oneUntested: a.suppressedUnits.length === 1,
    minRespondents: fmt.count(claim.minRespondents),
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    detectableUnit: a.detectableUnit ?? '',
    testName: a.methods.includes('binomial-exact') && !a.methods.some((m) => m.startsWith('one-sample-score')) ? 'exact binomial test' : a.methods.includes('binomial-exact') ? 'score test (the exact binomial test where a unit is small)' : 'score test',
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  // Every unit, nearest the value first: its rate, its gap from the value and its test's p-value (each interval is
  // in results.json; the nearest unit's is the row above). Kept to one line so that a long table stays readable.
  const row = (u: UnitTest): NumberRow => {
    const r = rateView(u.rate, dg);
    const g = differenceView(u.difference, Math.sign(u.difference.value));
    return { label: u.rate.label, value: `${r.rate} of ${r.n} respondents; ${g.signed} points, ${fmt.pPhrase(u.p ?? NaN)}` };
  };
  const numbers: NumberRow[] = [
    { label: claim.valueLabel ?? 'Fixed value', value: claim.valueWritten && claim.valueWritten !== target ? `${view.target as string} (written as ${claim.valueWritten})` : (view.target as string) },
    { label: `Nearest ${unitWord} to the value, ${nearest.rate.label}: its rate minus the value`, value: `${view.gap} points (interval ${view.gapLower} to ${view.gapUpper})` },
    { label: `Each ${unitWord}, nearest the value first`, value: `its rate; its rate minus the value; its test's p-value` },
    ...a.tests.map(row),
    { label: `${plural(claim.units).replace(/^./, (c) => c.toUpperCase())} not shown ${higher ? 'above' : 'below'} the value`, value: notShown.length > 0 ? listWords(notShown) : 'none' },
    ...(a.suppressedUnits.length > 0 ? [{ label: `Too few respondents to test (under ${claim.minRespondents})`, value: listWords(a.suppressedUnits) }] : []),
    ...commonRows(a, decision, ctx),
    { label: detectableLabel(`gap for the smallest ${unitWord}`, decision), value: view.detectable ? `about ${view.detectable} points (${view.detectableUnit as string})` : 'none within reach of these samples' },
  ];
  const cautions: string[] = [t.render('every.caution-scope', view)];
  const small = [...rates].sort((x, y) => x.n - y.n).slice(0, 1);
  cautions.push(...rateCautions(small, a.responseRate, t));
  if (a.methods.includes('binomial-exact')) cautions.push(t.render('target.caution-exact', view));
  const sorted = [...rates].sort((x, y) => (higher ? y.rate - x.rate : x.rate - y.rate));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: sorted.map((r) => ({ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
      reference: { value: claim.value, label: claim.valueLabel ?? target },
    },
    alt: `Chart of the agreement rate in each of ${sorted.length} ${unitsWord} with ${fmt.level(claim.confidence)} intervals, against a line at ${view.target as string} for ${valueLabel}; the nearest to the line is ${nearest.rate.label} (${rateView(nearest.rate, dg).rate}).`,
  };
  return {
    section: {
      compared: t.render('every.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`every.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('every.method', view),
    },
    key: t.render('every.key', view),
  };
}
