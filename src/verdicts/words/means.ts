/** Words for the "means" kind: two selections' mean scores. */
import type { MeanSummary, MeansAnalysis } from '../../analyse/types.js';
import { cohensDIntervalAt } from '../../analyse/means.js';
import type { Interval } from '../../stats/result.js';
import { preciseLevel } from './adjusted.js';
import { filterLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, comparesPeriods, detectableLabel, pView, thresholdText, restOfGroupCaution, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

/** A mean score or a difference in scale points: two decimals, proper minus sign. */
export function scalePoints(value: number, options: { sign?: boolean; digits?: number } = {}): string {
  const text = fmt.coefficient(value, options.digits ?? 2);
  return options.sign && value > 0 && Number(text) !== 0 ? `+${text}` : text;
}

/** A mean with its interval at `digits` (shared with the mean it is compared with; alone, ends never print alike). */
function meanView(m: MeanSummary, shared?: number) {
  const digits = shared ?? fmt.coefficientDigits(m.mean, m.interval.lower, m.interval.upper);
  return { label: m.label, n: fmt.count(m.n), mean: scalePoints(m.mean, { digits }), lower: scalePoints(m.interval.lower, { digits }), upper: scalePoints(m.interval.upper, { digits }) };
}

const TEST_NAMES: Record<string, string> = {
  welch: "Welch's t test",
  student: "Student's t test (equal spreads assumed)",
  rank: 'Mann–Whitney rank-sum test (normal approximation, corrected for ties and continuity)',
};

function excludesZero(i: Interval): boolean {
  return i.lower > 0 || i.upper < 0;
}

/** Cohen's d with its interval, and the interval at the adjusted level where there is one, for means.cohens-d-row. */
function cohensDView(value: number, own: Interval, adjusted: Interval | undefined, ctx: ComposeContext) {
  const bounds = [own.lower, own.upper, ...(adjusted ? [adjusted.lower, adjusted.upper] : [])];
  let digits = fmt.coefficientDigits(value, ...bounds);
  // A bound that is not zero never prints as 0.00: whether no difference is inside must be readable.
  while (digits < 4 && bounds.some((b) => b !== 0 && Number(fmt.coefficient(b, digits)) === 0)) digits++;
  const signed = (v: number) => scalePoints(v, { sign: true, digits });
  return {
    d: scalePoints(value, { digits }),
    level: fmt.level(own.level),
    lower: signed(own.lower),
    upper: signed(own.upper),
    adjusted: adjusted !== undefined,
    adjustedLevel: adjusted ? preciseLevel(adjusted.level) : '',
    adjustedLower: adjusted ? signed(adjusted.lower) : '',
    adjustedUpper: adjusted ? signed(adjusted.upper) : '',
    claimsTested: ctx.claimsTested,
  };
}

export function composeMeans(a: MeansAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'lower' ? 'lower' : claim.expect === 'higher' ? 'higher' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'different';
  const focusLabel = a.focus?.label ?? a.compared?.focus ?? claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const againstLabel = a.against?.label ?? a.compared?.against ?? claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  const labelsOnly = { focus: { label: focusLabel }, against: { label: againstLabel }, expectWord, oneSided };
  const hypotheses = { null: t.render('means.null', labelsOnly), alternative: t.render('means.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.focus || !a.against || !a.difference || !a.test) {
    return tooLittle(a, ctx, `${focusLabel} against ${againstLabel}, mean scores${scopeText(claim.where, claim.naming) ? `, for ${scopeText(claim.where, claim.naming)}` : ''}.`, hypotheses);
  }
  const d = a.difference;
  // Cohen's d's interval also at the level that decided an adjusted verdict, beside the difference's.
  const dAdjusted =
    decision.adjustedInterval && a.cohensDInterval && ctx.adjusted && (decision.effectiveAlpha as number) < decision.alpha
      ? cohensDIntervalAt(a, decision.adjustedInterval.interval.level)
      : undefined;
  // One precision for the two means, their intervals and the difference, all in scale points (src/format/numbers.ts).
  const dDigits = fmt.comparedCoefficientDigits([a.focus.mean, a.focus.interval.lower, a.focus.interval.upper], [a.against.mean, a.against.interval.lower, a.against.interval.upper], [d.value, d.interval.lower, d.interval.upper]);
  // The other family of test as a check: does it reach the same verdict at the threshold that decided this one?
  const threshold = decision.effectiveAlpha ?? decision.alpha;
  const check = a.check
    ? {
        test: a.check.test,
        name: a.check.method === 'mann-whitney' ? 'Mann–Whitney rank-sum test' : "Welch's t test",
        agrees: a.check.test.p < threshold === a.test.p < threshold,
      }
    : undefined;
  const view: View = {
    check: check ? { name: check.name, pPhrase: fmt.pPhrase(check.test.p), agrees: check.agrees, threshold: thresholdText(threshold) } : false,
    checkDisagrees: check !== undefined && !check.agrees,
    detectable: a.detectable !== undefined ? scalePoints(a.detectable) : '',
    focus: meanView(a.focus, dDigits),
    against: meanView(a.against, dDigits),
    scope: scopeText(claim.where, claim.naming),
    expectWord,
    oneSided,
    rank: claim.test === 'rank',
    level: fmt.level(claim.confidence),
    diff: scalePoints(d.value, { sign: true, digits: dDigits }),
    diffLower: scalePoints(d.interval.lower, { sign: true, digits: dDigits }),
    diffUpper: scalePoints(d.interval.upper, { sign: true, digits: dDigits }),
    gap: scalePoints(Math.abs(d.value), { digits: dDigits }),
    diffWord: d.value < 0 ? 'lower' : 'higher',
    testName: TEST_NAMES[claim.test] ?? claim.test,
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const scale = a.scale ? ` (scale ${a.scale[0]} to ${a.scale[1]})` : '';
  const meanRow = (m: MeanSummary) => ({
    label: m.label,
    value: `mean ${meanView(m, dDigits).mean}${scale}, ${fmt.count(m.n)} respondents (interval ${meanView(m, dDigits).lower} to ${meanView(m, dDigits).upper}; SD ${scalePoints(m.sd, { digits: dDigits })})`,
  });
  const numbers: NumberRow[] = [
    meanRow(a.focus),
    meanRow(a.against),
    { label: 'Difference in means', value: `${view.diff} scale points (interval ${view.diffLower} to ${view.diffUpper})` },
    ...commonRows(a, decision, ctx),
    ...(a.cohensD !== undefined ? [{ label: "Effect size (Cohen's d)", value: a.cohensDInterval ? t.render('means.cohens-d-row', cohensDView(a.cohensD, a.cohensDInterval, dAdjusted, ctx)) : fmt.coefficient(a.cohensD) }] : []),
    ...(check ? [{ label: `${check.name} (check)`, value: `${fmt.pPhrase(check.test.p)}: ${check.agrees ? 'the same verdict' : 'a different verdict'} at p below ${thresholdText(threshold)}` }] : []),
    {
      label: detectableLabel('difference', decision),
      value: a.detectable !== undefined ? `about ${scalePoints(a.detectable)} scale points` : 'not computed',
    },
    ...(a.superiority !== undefined
      ? [{ label: 'Chance a respondent in the first group answers higher', value: `${fmt.percent(a.superiority)} (ties count half)` }]
      : []),
  ];
  const cautions: string[] = restOfGroupCaution(a.relation, claim, { focus: a.focus.n, against: a.against.n }, t);
  if (comparesPeriods(a, ctx.periodColumns)) cautions.push(t.render('caution.cohorts', {}));
  // Cohen's d's interval assumes equal spreads (Student's t); where, at the level that decided the verdict, it and the
  // interval for the difference disagree about whether no difference is inside, say which one goes with the verdict.
  const dDecisive = dAdjusted ?? a.cohensDInterval;
  const diffDecisive = decision.adjustedInterval?.interval ?? d.interval;
  if (dDecisive && excludesZero(dDecisive) !== excludesZero(diffDecisive)) {
    cautions.push(t.render('means.caution-d-interval', { ...view, dExcludes: excludesZero(dDecisive), dLevel: preciseLevel(dDecisive.level) }));
  }
  if (claim.test !== 'rank') cautions.push(t.render('means.caution-scale', view));
  if (check && !check.agrees) cautions.push(t.render('means.caution-disagree', view));
  for (const m of [a.focus, a.against]) {
    if (m.n < 30) cautions.push(t.render('means.caution-small', meanView(m)));
  }
  const chart: Chart = {
    data: {
      kind: 'means',
      bars: [a.focus, a.against].map((m) => ({ label: m.label, mean: m.mean, lower: m.interval.lower, upper: m.interval.upper, n: m.n })),
      axisTitle: 'Mean score',
      domain: a.scale ?? [Math.floor(Math.min(a.focus.interval.lower, a.against.interval.lower)), Math.ceil(Math.max(a.focus.interval.upper, a.against.interval.upper))],
    },
    alt: `Chart of mean scores with ${fmt.level(claim.confidence)} intervals: ${a.focus.label} ${scalePoints(a.focus.mean)} (${scalePoints(a.focus.interval.lower)} to ${scalePoints(a.focus.interval.upper)}), ${a.against.label} ${scalePoints(a.against.mean)} (${scalePoints(a.against.interval.lower)} to ${scalePoints(a.against.interval.upper)}).`,
  };
  return {
    section: {
      compared: t.render('means.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`means.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('means.method', view),
    },
    key: t.render('means.key', view),
  };
}
