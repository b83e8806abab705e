/** Words for the "rank" kind: one unit the highest (or lowest) of the units under where. */
import type { RankAnalysis, RivalResult } from '../../analyse/types.js';
import { filterLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, detectableLabel, differenceView, listWords, pView, plural, rateCautions, rateRow, rateView, scopeText, sharedDigits, tooLittle, type ComposeContext, type Composed } from './common.js';

export function composeRank(a: RankAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const highest = claim.expect === 'highest';
  const unitWord = claim.units.toLowerCase();
  const unitsWord = plural(claim.units);
  const focusLabel = a.focus?.label ?? claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const scope = scopeText(claim.where, claim.naming);
  const rivalCount = a.unitCount - 1;
  const head = {
    focusLabel,
    unitWord,
    unitsWord,
    scope,
    extreme: highest ? 'highest' : 'lowest',
    aboveWord: highest ? 'above' : 'below',
    rivalCount: fmt.count(rivalCount),
    twoSided: claim.sided === 'two-sided',
  };
  const hypotheses = { null: t.render('rank.null', head), alternative: t.render('rank.alternative', head) };
  if (a.status === 'too-little-data' || !a.focus || !a.rivals || !a.closest || !a.units || !a.difference || !a.test) {
    return tooLittle(a, ctx, `${focusLabel} against the other ${unitsWord}${scope ? ` (${scope})` : ''}.`, hypotheses);
  }
  const alphaUsed = decision.effectiveAlpha ?? decision.alpha;
  const notSeparated = a.rivals.filter((r) => (r.p ?? 1) >= alphaUsed).map((r) => r.rival.label);
  const dg = sharedDigits(a.units);
  const d = a.difference;
  const dv = differenceView(d, Math.sign(d.value));
  const closest = a.closest;
  // A rival shown on the far side of the focus, for "points the other way": the one with the smallest p that way.
  const ahead = a.rivals.reduce<RivalResult>((best, r) => (r.pOpposite < best.pOpposite ? r : best), a.rivals[0] as RivalResult);
  // As sizes (the rival's lead over the focus), the interval's ends read low to high whichever side it lies on.
  const av = differenceView(ahead.difference, Math.sign(ahead.difference.value));
  const observedTop = a.observedSign > 0;
  const view: View = {
    ...head,
    focus: rateView(a.focus, dg),
    closest: rateView(closest.rival, dg),
    ahead: rateView(ahead.rival, dg),
    aheadSize: av.size,
    aheadLower: av.sizeLower,
    aheadUpper: av.sizeUpper,
    level: fmt.level(claim.confidence),
    lead: dv.signed,
    leadLower: dv.signedLower,
    leadUpper: dv.signedUpper,
    size: dv.size,
    sizeLower: dv.sizeLower,
    sizeUpper: dv.sizeUpper,
    observedTop,
    allSeparated: notSeparated.length === 0,
    notSeparated: listWords(notSeparated),
    notSeparatedCount: fmt.count(notSeparated.length),
    oneNotSeparated: notSeparated.length === 1,
    untested: listWords(a.suppressedUnits),
    anyUntested: a.suppressedUnits.length > 0,
    minRespondents: fmt.count(claim.minRespondents),
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    testName: a.methods.includes('fisher-exact-2x2') && !a.methods.some((m) => m.startsWith('two-proportion-z')) ? "Fisher's exact test" : a.methods.includes('fisher-exact-2x2') ? "z test (Fisher's exact test where a count is small)" : 'pooled two-proportion z test',
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  // Every rival, nearest first: its rate, the difference from the focus and its test's p-value (each interval is in
  // results.json; the closest rival's is the row above). Kept to one line so that a long table stays readable.
  const rivalRow = (r: RivalResult): NumberRow => {
    const v = differenceView(r.difference, Math.sign(r.difference.value));
    const rv = rateView(r.rival, dg);
    return { label: r.rival.label, value: `${rv.rate} of ${rv.n} respondents; ${v.signed} points, ${fmt.pPhrase(r.p ?? NaN)}` };
  };
  const numbers: NumberRow[] = [
    rateRow(a.focus, `${a.focus.label} (the claim's ${unitWord})`, dg),
    {
      // A rival ahead of the focus: its row is the one furthest ahead, not a smallest lead.
      label: (highest ? closest.difference.value < 0 : closest.difference.value > 0)
        ? `Difference from the ${unitWord} furthest ${highest ? 'above' : 'below'} it, ${a.focus.label} minus ${closest.rival.label}`
        : `Smallest difference, ${a.focus.label} minus ${closest.rival.label} (the closest rival)`,
      value: `${view.lead} points (interval ${view.leadLower} to ${view.leadUpper})`,
    },
    { label: `Each other ${unitWord}, closest first`, value: `its rate; ${a.focus.label} minus it; the test's p-value` },
    ...a.rivals.map(rivalRow),
    { label: 'Rivals not separated', value: notSeparated.length > 0 ? listWords(notSeparated) : 'none' },
    ...(a.suppressedUnits.length > 0 ? [{ label: `Too few respondents to test (under ${claim.minRespondents})`, value: listWords(a.suppressedUnits) }] : []),
    ...commonRows(a, decision, ctx),
    { label: detectableLabel(`lead over ${closest.rival.label}`, decision), value: view.detectable ? `about ${view.detectable} points` : 'none within reach of these samples' },
  ];
  const cautions: string[] = [t.render('rank.caution-scope', view)];
  cautions.push(...rateCautions([a.focus, closest.rival], a.responseRate, t));
  if (a.methods.includes('fisher-exact-2x2')) cautions.push(t.render('caution.fisher', {}));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      digits: dg,
      bars: a.units.map((r) => ({ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
      highlight: a.focus.label,
    },
    alt: `Chart of the agreement rate in each of ${a.units.length} ${unitsWord}, ${highest ? 'highest' : 'lowest'} first, with ${fmt.level(claim.confidence)} intervals; ${a.focus.label} (${rateView(a.focus, dg).rate}) is marked, and the closest rival, ${closest.rival.label}, has ${rateView(closest.rival, dg).rate}.`,
  };
  return {
    section: {
      compared: t.render('rank.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`rank.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('rank.method', view),
    },
    key: t.render('rank.key', view),
  };
}
