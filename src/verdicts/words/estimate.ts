/** Words for the "estimate" kind: one selection's rate or mean score with its margin of error; no test. */
import type { EstimateAnalysis } from '../../analyse/types.js';
import { filterLabel } from '../../analyse/labels.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { fpcWords, rateCautions, rateView, tooLittle, type ComposeContext, type Composed } from './common.js';

/** A mean score, two decimals. */
function score(v: number): string {
  return fmt.plain(v, 2);
}

export function composeEstimate(a: EstimateAnalysis, _decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const label = a.rate?.label ?? a.mean?.label ?? a.value?.label ?? claim.selectLabel ?? filterLabel({ ...claim.where, ...claim.select }, claim.naming);
  const hypotheses = { null: t.render('estimate.null', {}), alternative: t.render('estimate.alternative', {}) };
  if (a.status === 'too-little-data' || (!a.rate && !a.mean && !a.value)) {
    return tooLittle(a, ctx, `${label}.`, hypotheses);
  }
  const level = fmt.level(claim.confidence);
  const understood = claim.confidenceWritten === 'default' ? ' (the default)' : claim.confidenceWritten.replace(/\s+/g, '') === level ? '' : ` (written as ${claim.confidenceWritten})`;
  let view: View;
  let numbers: NumberRow[];
  let chart: Chart | undefined;
  const cautions: string[] = [];
  if (a.rate) {
    const r = a.rate;
    const margin = Math.max(r.rate - r.interval.lower, r.interval.upper - r.rate);
    view = { label, measureRate: true, n: fmt.count(r.n), value: rateView(r).rate, lower: rateView(r).lower, upper: rateView(r).upper, margin: fmt.pointsSize(margin), level, fpc: r.population !== undefined, population: r.population !== undefined ? fmt.count(r.population) : '' };
    numbers = [
      { label: 'Agreement rate', value: `${view.value} of ${view.n} respondents` },
      { label: `${level} interval`, value: `${view.lower} to ${view.upper} (up to ${view.margin} points either side)` },
      ...(r.population !== undefined ? [{ label: 'Eligible', value: `${fmt.count(r.population)} (${fmt.percent(r.n / r.population)} answered)` }] : []),
      ...(a.fpc !== undefined ? [{ label: 'Finite-population correction', value: fpcWords(a.fpc) }] : []),
      { label: 'Confidence level', value: `${level}${understood}` },
    ];
    chart = {
      data: { kind: 'rates', axisTitle: 'Agreeing (%)', digits: fmt.percentDigits(r.rate, r.interval.lower, r.interval.upper), bars: [{ label: r.label, rate: r.rate, lower: r.interval.lower, upper: r.interval.upper, n: r.n }] },
      alt: `Chart of the agreement rate in ${r.label}: ${view.value} with a ${level} interval of ${view.lower} to ${view.upper}.`,
    };
    // An estimate is a level, so non-response bears on it directly: say how many did not answer whenever any did not
    // (or that the number eligible is unknown), not only below the 50% response rate the other kinds use.
    const rr = r.population !== undefined && r.population > 0 ? r.n / r.population : undefined;
    if (rr === undefined || rr < 1) {
      cautions.push(
        t.render('estimate.caution-nonresponse', {
          known: rr !== undefined,
          missing: rr !== undefined ? fmt.percent(1 - rr) : '',
          answered: fmt.count(r.n),
          population: r.population !== undefined ? fmt.count(r.population) : '',
          fpc: r.population !== undefined,
        }),
      );
    }
    cautions.push(...rateCautions([r], undefined, t));
  } else if (a.mean) {
    const m = a.mean;
    view = { label, measureMean: true, n: fmt.count(m.n), value: score(m.mean), lower: score(m.interval.lower), upper: score(m.interval.upper), margin: score((m.interval.upper - m.interval.lower) / 2), sd: score(m.sd), level };
    numbers = [
      { label: 'Mean score', value: `${view.value} from ${view.n} answers` },
      { label: `${level} interval`, value: `${view.lower} to ${view.upper} (${view.margin} either side)` },
      { label: 'Standard deviation', value: String(view.sd) },
      { label: 'Confidence level', value: `${level}${understood}` },
    ];
    if (m.n < 50) cautions.push(t.render('estimate.caution-small-mean', view));
    cautions.push(t.render('estimate.caution-scale', view));
  } else {
    const v = a.value as NonNullable<EstimateAnalysis['value']>;
    view = { label, measureColumn: true, column: v.column, n: fmt.count(v.n), value: fmt.plain(v.value, 3), level };
    numbers = [
      { label: v.column, value: `${view.value} (weighted by ${view.n} respondents)` },
      { label: 'Interval', value: 'not available: the data give one figure per row and no spread' },
    ];
  }
  return {
    section: {
      compared: t.render('estimate.compared', view),
      hypotheses,
      numbers,
      ...(chart ? { chart } : {}),
      verdictText: t.render('estimate.estimate', view),
      cautions,
      methodLine: t.render('estimate.method', view),
    },
    key: t.render('estimate.key', view),
  };
}
