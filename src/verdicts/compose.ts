/**
 * Words for one claim: the claim's analysis and decision in, a ClaimSection and a summary row out. Every sentence is
 * a template (templates/); this file only builds the values the templates need, formatted for people.
 */
import type { Analysis, AssociationAnalysis, CompareAnalysis, RateSummary } from '../analyse/types.js';
import { filterLabel } from '../analyse/labels.js';
import type { Filter } from '../claims/types.js';
import * as fmt from '../format/numbers.js';
import type { Chart, ClaimSection, NumberRow, SummaryRow } from '../render/model.js';
import type { Decision } from './decide.js';
import type { Templates, View } from './templates.js';

export interface ComposeContext {
  templates: Templates;
  /** How many claims were tested together (the adjustment's family). */
  claimsTested: number;
  /** The adjustment's name in words, e.g. "Holm's method". */
  adjustName: string;
  /** True when an adjustment other than none was applied and more than one claim was tested. */
  adjusted: boolean;
  minRespondents: number;
  /** The column that holds survey years, if known, to spot year-on-year claims. */
  periodColumns: string[];
}

function rateView(r: RateSummary) {
  return { label: r.label, n: fmt.count(r.n), rate: fmt.percent(r.rate), lower: fmt.percent(r.interval.lower), upper: fmt.percent(r.interval.upper) };
}

function scopeText(where: Filter): string {
  return Object.keys(where).length > 0 ? filterLabel(where) : '';
}

function pView(decision: Decision, ctx: ComposeContext) {
  return {
    pPhrase: fmt.pPhrase(decision.p ?? NaN),
    pAdjustedPhrase: `adjusted ${fmt.pPhrase(decision.pAdjusted ?? NaN)}`,
    adjusted: ctx.adjusted,
    claimsTested: ctx.claimsTested,
  };
}

function commonRows(a: Analysis, decision: Decision, ctx: ComposeContext): NumberRow[] {
  const rows: NumberRow[] = [];
  if (a.test?.statistic) {
    const df = a.test.df === undefined ? '' : `, ${Array.isArray(a.test.df) ? a.test.df.join(' and ') : fmt.plain(a.test.df, 1)} degrees of freedom`;
    rows.push({ label: 'Test statistic', value: `${a.test.statistic.symbol} = ${fmt.statistic(a.test.statistic.value)}${df}` });
  }
  rows.push({ label: `p-value (${a.test?.alternative === 'two-sided' ? 'two-sided' : 'one-sided'})`, value: fmt.pValue(decision.p ?? NaN) });
  if (ctx.adjusted) rows.push({ label: `p-value adjusted for ${ctx.claimsTested} claims`, value: fmt.pValue(decision.pAdjusted ?? NaN) });
  const level = fmt.level(a.claim.confidence);
  const written = a.claim.confidenceWritten;
  // Say what was understood when the claims file wrote the level another way (0.95, 95), so nobody is surprised.
  const understood = written === 'default' ? ' (the default)' : written.replace(/\s+/g, '') === level ? '' : ` (written as ${written})`;
  rows.push({ label: 'Confidence level', value: `${level}${understood}` });
  return rows;
}

function tooLittle(a: Analysis, decision: Decision, ctx: ComposeContext, compared: string, hypotheses: ClaimSection['hypotheses']): {
  section: Omit<ClaimSection, 'id' | 'statement' | 'verdictLabel' | 'verdict'>;
  key: string;
} {
  const view = { shortfall: a.shortfall ?? 'too few people answered', minRespondents: ctx.minRespondents };
  return {
    section: {
      compared,
      hypotheses,
      numbers: [{ label: 'Result', value: 'Withheld: too few respondents' }],
      verdictText: ctx.templates.render('too-little-data', view),
      cautions: [],
      methodLine: 'No test was run.',
    },
    key: ctx.templates.render('too-little-data.key', view),
  };
}

function composeCompare(a: CompareAnalysis, decision: Decision, ctx: ComposeContext) {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'lower' ? 'lower' : claim.expect === 'higher' ? 'higher' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'different';
  const focusLabel = a.focus?.label ?? claim.focusLabel ?? filterLabel(claim.focus);
  const againstLabel = a.against?.label ?? claim.againstLabel ?? filterLabel(claim.against);
  const labelsOnly = { focus: { label: focusLabel }, against: { label: againstLabel }, expectWord, oneSided };
  const hypotheses = { null: t.render('compare.null', labelsOnly), alternative: t.render('compare.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.focus || !a.against || !a.difference || !a.test) {
    const compared = `${focusLabel} against ${againstLabel}${scopeText(claim.where) ? `, for ${scopeText(claim.where)}` : ''}.`;
    return tooLittle(a, decision, ctx, compared, hypotheses);
  }
  const d = a.difference;
  const view: View = {
    focus: rateView(a.focus),
    against: rateView(a.against),
    scope: scopeText(claim.where),
    expectWord,
    oneSided,
    level: fmt.level(claim.confidence),
    diff: fmt.points(d.value, { sign: true }),
    diffLower: fmt.points(d.interval.lower, { sign: true }),
    diffUpper: fmt.points(d.interval.upper, { sign: true }),
    gap: fmt.pointsSize(d.value),
    gapLower: fmt.pointsSize(a.observedSign < 0 ? d.interval.upper : d.interval.lower),
    gapUpper: fmt.pointsSize(a.observedSign < 0 ? d.interval.lower : d.interval.upper),
    diffWord: d.value < 0 ? 'lower' : 'higher',
    detectable: a.detectable !== undefined ? fmt.pointsSize(a.detectable) : '',
    testName: a.methods.includes('fisher-exact-2x2') ? "Fisher's exact test" : 'Pooled two-proportion z test',
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    { label: `${a.focus.label}`, value: `${fmt.percent(a.focus.rate)} agreed of ${fmt.count(a.focus.n)} (interval ${fmt.percent(a.focus.interval.lower)} to ${fmt.percent(a.focus.interval.upper)})` },
    { label: `${a.against.label}`, value: `${fmt.percent(a.against.rate)} agreed of ${fmt.count(a.against.n)} (interval ${fmt.percent(a.against.interval.lower)} to ${fmt.percent(a.against.interval.upper)})` },
    { label: 'Difference', value: `${view.diff} points (interval ${view.diffLower} to ${view.diffUpper})` },
    ...commonRows(a, decision, ctx),
    { label: "Effect size (Cohen's h)", value: fmt.coefficient(a.cohensH ?? NaN) },
    { label: 'Smallest difference detectable (80% power)', value: view.detectable ? `about ${view.detectable} points` : 'none within reach of these samples' },
  ];
  const cautions: string[] = [];
  if (a.relation !== 'separate') {
    const inner = a.relation === 'focus-inside' ? claim.focusLabel ?? filterLabel(claim.focus) : claim.againstLabel ?? filterLabel(claim.against);
    const outer = a.relation === 'focus-inside' ? claim.againstLabel ?? filterLabel(claim.against) : claim.focusLabel ?? filterLabel(claim.focus);
    const restN = a.relation === 'focus-inside' ? a.against.n : a.focus.n;
    cautions.push(t.render('caution.rest-of-group', { inner, outer, restN: fmt.count(restN) }));
  }
  if (ctx.periodColumns.some((c) => c in claim.focus && c in claim.against)) cautions.push(t.render('caution.cohorts', {}));
  for (const r of [a.focus, a.against]) {
    if (r.n < 50) cautions.push(t.render('caution.small-sample', { n: fmt.count(r.n), label: r.label, onePerson: fmt.pointsSize(1 / r.n) }));
  }
  if (a.responseRate !== undefined && a.responseRate < 0.5) cautions.push(t.render('caution.response-rate', { rate: fmt.percent(a.responseRate) }));
  if (a.focus.approximate || a.against.approximate) cautions.push(t.render('caution.rounded', {}));
  if (a.methods.includes('fisher-exact-2x2')) cautions.push(t.render('caution.fisher', {}));
  if (ctx.adjusted) cautions.push(t.render('caution.not-adjusted-interval', view));
  const chart: Chart = {
    data: {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      bars: [a.focus, a.against].map((r) => ({ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
    },
    alt: `Chart of agreement rates with ${fmt.level(claim.confidence)} intervals: ${a.focus.label} ${fmt.percent(a.focus.rate)} (${fmt.percent(a.focus.interval.lower)} to ${fmt.percent(a.focus.interval.upper)}), ${a.against.label} ${fmt.percent(a.against.rate)} (${fmt.percent(a.against.interval.lower)} to ${fmt.percent(a.against.interval.upper)}).`,
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

function plural(units: string): string {
  const lower = units.toLowerCase();
  if (/(s|x|ch|sh)$/.test(lower)) return `${lower}es`;
  if (/[^aeiou]y$/.test(lower)) return `${lower.slice(0, -1)}ies`;
  return `${lower}s`;
}

function composeAssociation(a: AssociationAnalysis, decision: Decision, ctx: ComposeContext) {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'positive' ? 'higher' : claim.expect === 'negative' ? 'lower' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'any';
  const xLabel = claim.xLabel ?? filterLabel(claim.x);
  const yLabel = claim.yLabel ?? filterLabel(claim.y);
  const unitName = claim.units.toLowerCase();
  const unitsName = plural(claim.units);
  const labelsOnly = { xLabel, yLabel, unitsName, expectWord, oneSided };
  const hypotheses = { null: t.render('association.null', labelsOnly), alternative: t.render('association.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.test || !a.fit) {
    return tooLittle(a, decision, ctx, `${xLabel} against ${yLabel} across ${unitsName}.`, hypotheses);
  }
  const r = a.test.estimate.value;
  const iv = a.test.interval;
  const view: View = {
    ...labelsOnly,
    unitName,
    unitCount: a.points.length,
    scope: scopeText(claim.where),
    xTotal: fmt.count(a.totals?.x ?? 0),
    yTotal: fmt.count(a.totals?.y ?? 0),
    level: fmt.level(claim.confidence),
    r: fmt.coefficient(r),
    rLower: fmt.coefficient(iv?.lower ?? NaN),
    rUpper: fmt.coefficient(iv?.upper ?? NaN),
    directionWord: r < 0 ? 'lower' : 'higher',
    detectable: fmt.coefficient(a.detectable ?? NaN),
    adjustName: ctx.adjustName,
    minRespondents: ctx.minRespondents,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    { label: 'Units', value: `${a.points.length} ${unitsName}` },
    { label: 'Correlation (Pearson r)', value: `${view.r} (interval ${view.rLower} to ${view.rUpper})` },
    { label: 'Least-squares line', value: `${yLabel} = ${fmt.plain(a.fit.intercept * 100, 1)} + ${fmt.plain(a.fit.slope, 2)} × ${xLabel} (in %); R² = ${fmt.coefficient(a.fit.rSquared)}` },
    ...commonRows(a, decision, ctx),
    { label: 'Smallest correlation detectable (80% power)', value: `about ${view.detectable}` },
  ];
  const cautions = [t.render('caution.causation', view), t.render('caution.ecological', view)];
  if (a.points.length < 10) cautions.push(t.render('caution.few-units', view));
  if (a.suppressedUnits.length > 0) {
    cautions.push(t.render('caution.suppressed-units', { ...view, count: a.suppressedUnits.length, names: a.suppressedUnits.join(', ') }));
  }
  if (ctx.adjusted) cautions.push(t.render('caution.not-adjusted-interval', view));
  const chart: Chart = {
    data: {
      kind: 'scatter',
      points: a.points.map((p) => ({ label: p.unit, x: p.x, y: p.y, n: Math.min(p.nx, p.ny) })),
      xTitle: `${xLabel} (% agreeing)`,
      yTitle: `${yLabel} (% agreeing)`,
      fit: { intercept: a.fit.intercept, slope: a.fit.slope },
      note: `r = ${view.r}`,
      percent: true,
    },
    alt: `Scatter chart of ${a.points.length} ${unitsName}: ${xLabel} across, ${yLabel} up, with the least-squares line; r = ${view.r} (interval ${view.rLower} to ${view.rUpper}).`,
  };
  return {
    section: {
      compared: t.render('association.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`association.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('association.method', view),
    },
    key: t.render('association.key', view),
  };
}

export function composeClaim(a: Analysis, decision: Decision, ctx: ComposeContext): { section: ClaimSection; summary: SummaryRow } {
  const built = a.kind === 'compare' ? composeCompare(a, decision, ctx) : composeAssociation(a, decision, ctx);
  const verdictLabel = ctx.templates.render(`verdict.${decision.verdict}`, {});
  const head = { id: a.claim.id, statement: a.claim.statement, verdict: decision.verdict, verdictLabel };
  return { section: { ...head, ...built.section }, summary: { ...head, keyFigure: built.key } };
}
