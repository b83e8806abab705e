/** Words for the "trend" kind: an agreement rate over three or more ordered periods. */
import type { TrendAnalysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { scopeOf } from './change.js';
import { commonRows, detectableLabel, intervalSizes, pView, rateCautions, rateRow, sharedDigits, tooLittle, type ComposeContext, type Composed } from './common.js';

export function composeTrend(a: TrendAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'rising' ? 'rising' : claim.expect === 'falling' ? 'falling' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'any';
  const scope = scopeOf(a);
  const first = a.periods[0] ?? '';
  const last = a.periods[a.periods.length - 1] ?? '';
  const head = { scope, first, last, periodCount: a.periods.length, periodList: a.periods.join(', '), expectWord, oneSided };
  const hypotheses = { null: t.render('trend.null', head), alternative: t.render('trend.alternative', head) };
  if (a.status === 'too-little-data' || !a.rates || a.slope === undefined || !a.fitted || !a.test) {
    return tooLittle(a, ctx, `${a.periods.join(', ')}${scope ? `, for ${scope}` : ''}.`, hypotheses);
  }
  const rates = a.rates;
  const totalN = rates.reduce((s, r) => s + r.n, 0);
  // The fitted change per period with its interval, at decimals that keep the three apart (src/format/numbers.ts).
  const iv = a.test.interval;
  const slopeDigits = iv ? fmt.pointsDigits(a.slope, iv.lower, iv.upper) : 1;
  const fittedFirst = a.fitted[0] as number;
  const fittedLast = a.fitted[a.fitted.length - 1] as number;
  // One precision for every period's rate and the fitted line's ends: sentences set them side by side.
  const dg = sharedDigits(rates, [fittedFirst, fittedLast]);
  // The fitted line's two ends at decimals whose printed gap agrees with the printed change beside them
  // ("59.76% to 59.95% (+0.2 points)", not "59.8% to 59.9% (+0.2 points)").
  const fittedChange = fmt.points(fittedLast - fittedFirst, { sign: true });
  let fitDigits = dg;
  while (fitDigits < 3) {
    const shown = (v: number): number => Number((v * 100).toFixed(fitDigits)) / 100;
    if (fmt.points(shown(fittedLast) - shown(fittedFirst), { sign: true }) === fittedChange) break;
    fitDigits++;
  }
  const view: View = {
    ...head,
    level: fmt.level(claim.confidence),
    totalN: fmt.count(totalN),
    minN: fmt.count(Math.min(...rates.map((r) => r.n))),
    maxN: fmt.count(Math.max(...rates.map((r) => r.n))),
    firstRate: fmt.percent((rates[0] as (typeof rates)[number]).rate, dg),
    lastRate: fmt.percent((rates[rates.length - 1] as (typeof rates)[number]).rate, dg),
    slope: fmt.points(a.slope, { sign: true, digits: slopeDigits }),
    slopeSize: fmt.pointsSize(a.slope, slopeDigits),
    slopeLower: iv ? fmt.points(iv.lower, { sign: true, digits: slopeDigits }) : '',
    slopeUpper: iv ? fmt.points(iv.upper, { sign: true, digits: slopeDigits }) : '',
    // As sizes, low to high, for a sentence that has already said "rose" or "fell".
    sizeLower: iv ? intervalSizes(iv, a.slope < 0 ? -1 : 1, (v, sign) => (sign ? fmt.points(v, { sign: true, digits: slopeDigits }) : fmt.pointsSize(v, slopeDigits))).lower : '',
    sizeUpper: iv ? intervalSizes(iv, a.slope < 0 ? -1 : 1, (v, sign) => (sign ? fmt.points(v, { sign: true, digits: slopeDigits }) : fmt.pointsSize(v, slopeDigits))).upper : '',
    hasInterval: iv !== undefined,
    fittedFirst: fmt.percent(fittedFirst, fitDigits),
    fittedLast: fmt.percent(fittedLast, fitDigits),
    fittedChange,
    observedWord: a.slope < 0 ? 'fell' : 'rose',
    detectable: a.detectable !== undefined ? fmt.pointsSizeNonZero(a.detectable) : '',
    fpc: a.methods.includes('wilson-fpc'),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    ...rates.map((r) => rateRow(r, r.label, dg)),
    { label: 'Fitted change per period', value: iv ? `${view.slope} points (interval ${view.slopeLower} to ${view.slopeUpper})` : `${view.slope} points` },
    { label: `Fitted rate, ${first} to ${last}`, value: `${view.fittedFirst} to ${view.fittedLast} (${view.fittedChange} points)` },
    ...commonRows(a, decision, ctx),
    { label: detectableLabel('steady change', decision), value: `about ${view.detectable} points per period` },
    ...(a.departure !== undefined
      ? [{ label: 'Departure from a straight line', value: `X² = ${fmt.statistic(a.departure.statistic)}, ${a.departure.df} ${a.departure.df === 1 ? 'degree' : 'degrees'} of freedom, ${fmt.pPhrase(a.departure.p)}` }]
      : []),
  ];
  // When the periods stray from the line more than chance would explain, the verdict paragraph says so: the fitted
  // change per period then misdescribes them (not adjusted for many claims: it qualifies this claim's own line).
  const bent = a.departure !== undefined && a.departure.p < 1 - claim.confidence;
  const d = a.departure;
  const bentText =
    bent && d !== undefined
      ? ` ${t.render('trend.departure', {
          statistic: fmt.statistic(d.statistic),
          dfText: `${d.df} ${d.df === 1 ? 'degree' : 'degrees'} of freedom`,
          pPhrase: fmt.pPhrase(d.p),
          rateList: rates.map((r) => `${fmt.percent(r.rate, dg)} in ${r.label}`).join(', '),
        })}`
      : '';
  const cautions: string[] = [t.render('trend.caution-cohorts', {})];
  if (!bent) cautions.push(t.render('trend.caution-straight-line', { periodCount: a.periods.length }));
  cautions.push(...rateCautions(rates, a.responseRate, t));
  const chart: Chart = {
    data: {
      kind: 'periods',
      axisTitle: 'Agreeing (%)',
      points: rates.map((r) => ({ period: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n })),
      fit: a.fitted.slice(),
    },
    alt: `Chart of the agreement rate in each period with ${fmt.level(claim.confidence)} intervals${scope ? ` for ${scope}` : ''}: ${rates.map((r) => `${r.label} ${fmt.percent(r.rate, dg)}`).join(', ')}; the fitted straight line goes from ${view.fittedFirst} to ${view.fittedLast}.`,
  };
  return {
    section: {
      compared: t.render('trend.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: `${t.render(`trend.${decision.verdict}`, view)}${bentText}`,
      cautions,
      methodLine: t.render('trend.method', view),
    },
    key: t.render('trend.key', view),
  };
}
