/** Words for the "association" kind: two measures across units. */
import type { AssociationAnalysis } from '../../analyse/types.js';
import type { Measure } from '../../claims/types.js';
import * as fmt from '../../format/numbers.js';
import { filterLabel } from '../../analyse/labels.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, detectableLabel, listWords, plural, pView, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

export function composeAssociation(a: AssociationAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const expectWord = claim.expect === 'positive' ? 'higher' : claim.expect === 'negative' ? 'lower' : '';
  const oneSided = a.test ? a.test.alternative !== 'two-sided' : claim.sided === 'one-sided' && claim.expect !== 'any';
  const xLabel = claim.xLabel ?? filterLabel(claim.x, claim.naming);
  const yLabel = claim.yLabel ?? filterLabel(claim.y, claim.naming);
  const { unitName, unitsName } = unitWords(claim.units);
  const controlled = claim.controls && claim.controls.length > 0 ? listWords(claim.controls.map((c) => c.label)) : '';
  const labelsOnly = { xLabel, yLabel, unitsName, expectWord, oneSided, controlled };
  const hypotheses = { null: t.render('association.null', labelsOnly), alternative: t.render('association.alternative', labelsOnly) };
  if (a.status === 'too-little-data' || !a.test || !a.fit) {
    return tooLittle(a, ctx, `${xLabel} against ${yLabel} across ${unitsName}.`, hypotheses);
  }
  const r = a.test.estimate.value;
  const iv = a.test.interval;
  const rDigits = fmt.coefficientDigits(r, iv?.lower ?? NaN, iv?.upper ?? NaN);
  const view: View = {
    ...labelsOnly,
    unitName,
    aUnitName: `${indefiniteArticle(unitName)} ${unitName}`,
    UnitsName: unitsName.charAt(0).toUpperCase() + unitsName.slice(1),
    rName: controlled ? 'partial r' : 'r',
    controlCount: claim.controls?.length ?? 0,
    controlPronoun: (claim.controls?.length ?? 0) > 1 ? 'their' : 'its',
    oneControl: a.partialKendall !== undefined,
    weighted: a.weighted === true,
    unitCount: a.points.length,
    scope: scopeText(claim.where, claim.naming),
    xTotal: fmt.count(a.totals?.x ?? 0),
    yTotal: fmt.count(a.totals?.y ?? 0),
    level: fmt.level(claim.confidence),
    // Decimals chosen so that r and its interval's ends never print alike (src/format/numbers.ts).
    r: fmt.coefficient(r, rDigits),
    rLower: fmt.coefficient(iv?.lower ?? NaN, rDigits),
    rUpper: fmt.coefficient(iv?.upper ?? NaN, rDigits),
    directionWord: r < 0 ? 'lower' : 'higher',
    detectable: fmt.coefficient(a.detectable ?? NaN),
    adjustName: ctx.adjustName,
    minRespondents: ctx.minRespondents,
    ...pView(decision, ctx),
  };
  const bothRates = (claim.xMeasure?.type ?? 'agree') === 'agree' && (claim.yMeasure?.type ?? 'agree') === 'agree';
  // With controls the line is through the residuals, drawn and printed in each measure's own residual units.
  const xr = residualUnit(claim.xMeasure);
  const yr = residualUnit(claim.yMeasure);
  const lineRow: NumberRow = controlled
    ? {
        label: `Least-squares line after allowing for ${controlled} (residuals)`,
        value: `residual ${yLabel} = ${fmt.plain(shownSlope(a, xr, yr), slopeDigits(shownSlope(a, xr, yr)))} × residual ${xLabel} (${yr.unit} per ${xr.one}); R² = ${fmt.coefficient(a.fit.rSquared)}`,
      }
    : {
        label: 'Least-squares line',
        value: bothRates
          ? `${yLabel} = ${fmt.plain(a.fit.intercept * 100, 1)} + ${fmt.plain(a.fit.slope, 2)} × ${xLabel} (in %); R² = ${fmt.coefficient(a.fit.rSquared)}`
          : `${yLabel} = ${fmt.plain(a.fit.intercept, 3)} + ${fmt.plain(a.fit.slope, 3)} × ${xLabel}; R² = ${fmt.coefficient(a.fit.rSquared)}`,
      };
  const numbers: NumberRow[] = [
    { label: 'Units', value: unitsUsedText(a, unitsName) },
    {
      label: controlled ? `Partial correlation (after allowing for ${controlled})` : a.weighted ? 'Correlation (Pearson r, weighted by respondents)' : 'Correlation (Pearson r)',
      value: `${view.r} (interval ${view.rLower} to ${view.rUpper})`,
    },
    ...rankRows(a, controlled, t),
    lineRow,
    ...(a.weightedCheck
      ? [{ label: 'Correlation weighted by respondents (check)', value: `${fmt.coefficient(a.weightedCheck.estimate.value)} (interval ${fmt.coefficient(a.weightedCheck.interval?.lower ?? NaN)} to ${fmt.coefficient(a.weightedCheck.interval?.upper ?? NaN)}; ${fmt.pPhrase(a.weightedCheck.p)})` }]
      : []),
    ...commonRows(a, decision, ctx),
    { label: detectableLabel('correlation', decision), value: `about ${view.detectable}` },
  ];
  // Cautions follow the result: no "tend to have" when no association was shown.
  const found = decision.verdict === 'supported' || decision.verdict === 'opposite';
  const sizes = a.points.map((p) => Math.min(p.nx, p.ny));
  const fewest = Math.min(...sizes);
  const cview = { ...view, found, fewest: fmt.count(fewest), most: fmt.count(Math.max(...sizes)), weightedR: a.weightedCheck ? fmt.coefficient(a.weightedCheck.estimate.value) : '' };
  const cautions = [t.render('caution.causation', cview), t.render('caution.ecological', cview)];
  // Both measures come from the same respondents in each unit (one source, one scope): a general tendency to agree
  // lifts both together and can create or inflate a correlation across units.
  cautions.push(t.render('association.caution-same-respondents', cview));
  if (fewest < 50 || a.weightedCheck) cautions.push(t.render('association.caution-small-units', cview));
  if (controlled) cautions.push(t.render('association.caution-controls', view));
  if (a.weighted) cautions.push(t.render('association.caution-weighted', view));
  if (a.points.length < 10) cautions.push(t.render('caution.few-units', view));
  if (a.suppressedUnits.length > 0) {
    cautions.push(t.render('caution.suppressed-units', { ...view, count: a.suppressedUnits.length, one: a.suppressedUnits.length === 1, names: a.suppressedUnits.join(', ') }));
  }
  const chart: Chart = controlled ? residualChart(a, { xLabel, yLabel, controlled, unitsName, xr, yr, view }) : {
    data: {
      kind: 'scatter',
      points: a.points.map((p) => ({ label: p.unit, x: p.x, y: p.y, n: Math.min(p.nx, p.ny) })),
      xTitle: `${xLabel} (${measureWords(claim.xMeasure)})`,
      yTitle: `${yLabel} (${measureWords(claim.yMeasure)})`,
      fit: { intercept: a.fit.intercept, slope: a.fit.slope },
      note: `${view.rName} = ${view.r}; ${unitsUsedText(a, unitsName)}`,
      percent: bothRates,
    },
    alt: `Scatter chart of ${a.points.length} ${unitsName}: ${xLabel} across, ${yLabel} up, with the least-squares line; ${view.rName} = ${view.r} (interval ${view.rLower} to ${view.rUpper}).`,
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


/**
 * What one unit and several units are called: "department" / "departments" for one column; for several, the
 * combinations of their values ("department and institution combination(s)").
 */
/**
 * "a" or "an" before a unit's name, by its first sound as usually spelt: "an institution", "a department", "a
 * university", "a unit", "an undergraduate course" (common practice; a leading "u" sounded "you" takes "a").
 */
export function indefiniteArticle(word: string): 'a' | 'an' {
  return /^(?:[aeio]|u(?!ni|s[aeiu]|r[aeiou]|t[aeiou]))/i.test(word.trim()) ? 'an' : 'a';
}

export function unitWords(written: string | readonly string[]): { unitName: string; unitsName: string } {
  const columns = typeof written === 'string' ? [written] : written;
  if (columns.length === 1) return { unitName: (columns[0] as string).toLowerCase(), unitsName: plural(columns[0] as string) };
  const both = listWords(columns.map((c) => c.toLowerCase()));
  return { unitName: `${both} combination`, unitsName: `${both} combinations` };
}

/** "36 departments" or "36 of 40 departments (4 with fewer than the minimum respondents left out)". */
function unitsUsedText(a: AssociationAnalysis, unitsName: string): string {
  const left = a.suppressedUnits.length;
  if (left === 0) return `${a.points.length} ${unitsName}`;
  return `${a.points.length} of ${a.points.length + left} ${unitsName} (${left} under ${a.claim.minRespondents} respondents left out)`;
}


/**
 * The scatter of residuals for a controlled claim: each unit's x and y less what the controls predict, in the
 * measures' residual units, with the line through them (the partial line) and the partial r in its note.
 */
function residualChart(
  a: AssociationAnalysis,
  w: { xLabel: string; yLabel: string; controlled: string; unitsName: string; xr: ResidualUnit; yr: ResidualUnit; view: View },
): Chart {
  const fit = a.fit as NonNullable<AssociationAnalysis['fit']>;
  return {
    data: {
      kind: 'scatter',
      points: a.points.map((p) => ({
        label: p.unit,
        x: (p.xResidual as number) * w.xr.scale,
        y: (p.yResidual as number) * w.yr.scale,
        n: Math.min(p.nx, p.ny),
      })),
      xTitle: `${w.xLabel}, after removing ${w.controlled} (residual, ${w.xr.unit})`,
      yTitle: `${w.yLabel}, after removing ${w.controlled} (residual, ${w.yr.unit})`,
      fit: { intercept: fit.intercept * w.yr.scale, slope: (fit.slope * w.yr.scale) / w.xr.scale },
      note: `${String(w.view.rName)} = ${String(w.view.r)}; ${unitsUsedText(a, w.unitsName)}`,
      percent: false,
    },
    alt:
      `Scatter chart of ${a.points.length} ${w.unitsName} after removing ${w.controlled}: ${w.xLabel} across and ${w.yLabel} up, ` +
      `each as the residual from its straight-line fit on ${w.controlled}, with the least-squares line through the residuals; ` +
      `${String(w.view.rName)} = ${String(w.view.r)} (interval ${String(w.view.rLower)} to ${String(w.view.rUpper)}).`,
  };
}

/** The rank checks' rows: Spearman and Kendall, partial when the claim has controls, or why one is left out. */
function rankRows(a: AssociationAnalysis, controlled: string, t: ComposeContext['templates']): NumberRow[] {
  const rows: NumberRow[] = [];
  const after = controlled ? `, after allowing for ${controlled}` : '';
  const leftOut = (check: 'spearman' | 'kendall') => a.rankChecksLeftOut?.find((l) => l.check === check);
  if (a.spearman) {
    rows.push({
      label: controlled ? `Partial Spearman's rho (check on ranks${after})` : "Spearman's rho (check on ranks)",
      value: t.render('association.spearman-line', { rho: fmt.coefficient(a.spearman.estimate.value), pPhrase: fmt.pPhrase(a.spearman.p) }),
    });
  } else if (leftOut('spearman')) {
    rows.push({ label: controlled ? `Partial Spearman's rho (check on ranks${after})` : "Spearman's rho (check on ranks)", value: leftOutWords(leftOut('spearman')!, a, t) });
  }
  if (a.kendall) {
    rows.push({ label: "Kendall's tau-b (check on pairs of units)", value: t.render('association.kendall-line', { tau: fmt.coefficient(a.kendall.estimate.value), pPhrase: fmt.pPhrase(a.kendall.p) }) });
  } else if (a.partialKendall) {
    rows.push({
      label: `Kendall's partial tau (check on pairs of units${after})`,
      value: t.render('association.partial-kendall-line', { tau: fmt.coefficient(a.partialKendall.estimate.value) }),
    });
  } else if (leftOut('kendall')) {
    rows.push({ label: controlled ? `Kendall's partial tau (check on pairs of units${after})` : "Kendall's tau-b (check on pairs of units)", value: leftOutWords(leftOut('kendall')!, a, t) });
  }
  return rows;
}

/** Why a rank check is not shown, in words (template association.rank-check-left-out). */
function leftOutWords(l: NonNullable<AssociationAnalysis['rankChecksLeftOut']>[number], a: AssociationAnalysis, t: ComposeContext['templates']): string {
  return t.render('association.rank-check-left-out', {
    tied: l.reason === 'undefined',
    explained: l.reason === 'undefined-partial',
    several: l.reason === 'several-controls',
    controlCount: a.claim.controls.length,
  });
}

/** The partial line's slope in the units the pack prints and the chart draws (y's residual units per x's). */
export function shownSlope(a: AssociationAnalysis, xr: ResidualUnit = residualUnit(a.claim.xMeasure), yr: ResidualUnit = residualUnit(a.claim.yMeasure)): number {
  return ((a.fit?.slope ?? NaN) * yr.scale) / xr.scale;
}

/** Decimals for a slope: three significant figures, and at least three decimals. */
function slopeDigits(v: number): number {
  if (!(Math.abs(v) > 0) || !Number.isFinite(v)) return 3;
  return Math.min(8, Math.max(3, 2 - Math.floor(Math.log10(Math.abs(v)))));
}

/** The units a residual is shown in, for results.json: "points per point", "scale points per point"... */
export function shownSlopeUnit(a: AssociationAnalysis): string {
  return `${residualUnit(a.claim.yMeasure).unit} per ${residualUnit(a.claim.xMeasure).one}`;
}

export interface ResidualUnit {
  /** Multiplier from the measure's own units to the units shown. */
  scale: number;
  /** The units, plural ("points") and for one ("point"). */
  unit: string;
  one: string;
}

/** The units of a measure's residual: percentage points for an agreement rate, scale points for a mean score. */
function residualUnit(m: Measure | undefined): ResidualUnit {
  if (m === undefined || m.type === 'agree') return { scale: 100, unit: 'points', one: 'point' };
  if (m.type === 'mean') return { scale: 1, unit: 'scale points', one: 'scale point' };
  return { scale: 1, unit: m.column, one: m.column };
}

/** What an axis measures, for its title. */
function measureWords(m: Measure | undefined): string {
  if (m === undefined || m.type === 'agree') return '% agreeing';
  if (m.type === 'mean') return 'mean score';
  return m.column;
}
