import { describe, expect, it } from 'vitest';
import { analyseAssociation } from '../../src/analyse/association.js';
import type { AssociationClaim } from '../../src/claims/types.js';
import { InputError } from '../../src/errors.js';
import { decide } from '../../src/verdicts/decide.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { Templates } from '../../src/verdicts/templates.js';
import { indefiniteArticle } from '../../src/verdicts/words/association.js';
import { expectClose } from '../helpers/tolerance.js';
import { base, codes, ctx, cubeOf, n, ourAlternative, ref } from './kinds-b-fixture.js';

// Reference: GNU R 4.2 cor.test (Pearson and Spearman, exact = FALSE), partial correlation as cor() of lm()
// residuals with t on n - 2 - k df and a Fisher z interval, weighted correlation by cov.wt, lm() for the line; with a
// control, partial Spearman as cor() of lm() residuals of the ranks, Kendall's partial tau from cor(method =
// "kendall"), the residuals from lm() and the partial line as lm() of residual on residual (tests/fixtures/r/kinds-b.R).

const A = ref.association;
const sum = (v: number[]) => v.reduce((s, x) => s + x, 0);
const cube = cubeOf(
  A.units.flatMap((u, i) => [
    { dims: { Dept: u, Q: 'Q1' }, n: A.nx[i] as number, agree: A.ax[i] as number },
    { dims: { Dept: u, Q: 'Q2' }, n: A.ny[i] as number, agree: A.ay[i] as number },
    { dims: { Dept: u, Q: 'Q3' }, n: A.nz[i] as number, agree: A.az[i] as number },
    { dims: { Dept: u, Q: 'Q4' }, n: sum(A.ycodes[i] as number[]), agree: 0, codes: codes(A.ycodes[i] as number[]) },
  ]),
);

function claim(over: Partial<AssociationClaim> = {}): AssociationClaim {
  return {
    ...base,
    id: 'a',
    kind: 'association',
    units: ['Dept'],
    x: { Q: 'Q1' },
    y: { Q: 'Q2' },
    xLabel: 'resources',
    yLabel: 'satisfaction',
    xMeasure: { type: 'agree' },
    yMeasure: { type: 'agree' },
    controls: [],
    weighted: false,
    expect: 'any',
    ...over,
  };
}
const control = { filter: { Q: 'Q3' }, measure: { type: 'agree' as const }, label: 'teaching' };
const expectFor = (alt: string) => (alt === 'less' ? 'negative' : alt === 'greater' ? 'positive' : 'any') as AssociationClaim['expect'];
const sidedFor = (alt: string) => (alt === 'two.sided' ? 'two-sided' : 'one-sided') as AssociationClaim['sided'];
const words = (a: ReturnType<typeof analyseAssociation>, d: ReturnType<typeof decide>) =>
  composeClaim(a, d, { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] });

describe('association against R', () => {
  for (const r of A.pearson) {
    it(`Pearson with a Spearman check, ${r.alternative}`, () => {
      const a = analyseAssociation(claim({ expect: expectFor(r.alternative), sided: sidedFor(r.alternative) }), cube, ctx);
      expect(a.test?.alternative).toBe(ourAlternative(r.alternative));
      expectClose(a.test?.estimate.value ?? NaN, r.r, 'closed', 'r');
      expectClose(a.test?.p ?? NaN, r.p, 'p', 'p');
      expectClose(a.test?.interval?.lower ?? NaN, n(r.lower), 'bound', 'lower');
      const s = A.spearman.find((x) => x.alternative === r.alternative);
      expectClose(a.spearman?.estimate.value ?? NaN, s?.rho ?? NaN, 'closed', 'rho');
      expectClose(a.spearman?.p ?? NaN, s?.p ?? NaN, 'p', 'Spearman p');
      expectClose(a.fit?.slope ?? NaN, A.fit.slope, 'closed', 'slope');
    });
  }
  for (const r of A.partial) {
    it(`partial correlation controlling for one measure, ${r.alternative}`, () => {
      const a = analyseAssociation(claim({ controls: [control], expect: expectFor(r.alternative), sided: sidedFor(r.alternative) }), cube, ctx);
      expect(a.test?.method).toBe('partial-pearson');
      expect(a.test?.df).toBe(r.df);
      expectClose(a.test?.estimate.value ?? NaN, r.r, 'closed', 'partial r');
      expectClose(a.test?.statistic?.value ?? NaN, r.statistic, 'statistic', 't');
      expectClose(a.test?.p ?? NaN, r.p, 'p', 'p');
      expectClose(a.test?.interval?.lower ?? NaN, n(r.lower), 'bound', 'lower');
      expectClose(a.test?.interval?.upper ?? NaN, n(r.upper), 'bound', 'upper');
      // The rank checks are partial too, and the line is the partial one (through the residuals).
      const s = A.partial_spearman.find((x) => x.alternative === r.alternative);
      expect(a.spearman?.method).toBe('partial-spearman');
      expectClose(a.spearman?.estimate.value ?? NaN, s?.rho ?? NaN, 'closed', 'partial rho');
      expectClose(a.spearman?.p ?? NaN, s?.p ?? NaN, 'p', 'partial Spearman p');
      expect(a.kendall).toBeUndefined();
      expectClose(a.partialKendall?.estimate.value ?? NaN, A.partial_kendall, 'closed', 'partial tau');
      a.points.forEach((p, i) => {
        expectClose(p.xResidual ?? NaN, A.x_residual[i] as number, 'closed', `x residual ${p.unit}`);
        expectClose(p.yResidual ?? NaN, A.y_residual[i] as number, 'closed', `y residual ${p.unit}`);
      });
      expectClose(a.fit?.slope ?? NaN, A.partial_fit.slope, 'closed', 'partial slope');
      expectClose(a.fit?.slope ?? NaN, A.partial_fit.slope_with_z, 'closed', "x's coefficient with z in the model");
      expectClose(a.fit?.rSquared ?? NaN, A.partial_fit.r_squared, 'closed', 'partial R²');
      expect(Math.abs(a.fit?.intercept ?? NaN)).toBeLessThan(1e-15);
      expect(a.methods).toEqual(['partial-pearson', 'partial-line', 'power-correlation', 'partial-spearman', 'partial-kendall']);
    });
  }
  for (const r of A.weighted) {
    it(`weighted by respondents, ${r.alternative}`, () => {
      const a = analyseAssociation(claim({ weighted: true, expect: expectFor(r.alternative), sided: sidedFor(r.alternative) }), cube, ctx);
      expectClose(a.test?.estimate.value ?? NaN, r.r, 'closed', 'weighted r');
      expectClose(a.test?.p ?? NaN, r.p, 'p', 'p');
      expect(a.weighted).toBe(true);
    });
  }
  it('mean score from answer codes as a measure, with and without a control', () => {
    const plain = analyseAssociation(claim({ y: { Q: 'Q4' }, yMeasure: { type: 'mean' } }), cube, ctx);
    A.y_mean.forEach((v, i) => expectClose(plain.points[i]?.y ?? NaN, v, 'closed', `mean ${A.units[i]}`));
    const r = A.mean_pearson[0] as (typeof A.mean_pearson)[number];
    expectClose(plain.test?.estimate.value ?? NaN, r.r, 'closed', 'r');
    expectClose(plain.test?.p ?? NaN, r.p, 'p', 'p');
    const ctrl = analyseAssociation(claim({ y: { Q: 'Q4' }, yMeasure: { type: 'mean' }, controls: [control] }), cube, ctx);
    const rp = A.mean_partial[0] as (typeof A.mean_partial)[number];
    expectClose(ctrl.test?.estimate.value ?? NaN, rp.r, 'closed', 'partial r');
    expectClose(ctrl.test?.p ?? NaN, rp.p, 'p', 'p');
    // The partial line: x's coefficient in R lm(mean ~ x + z); drawn and printed in scale points per point of x.
    expectClose(ctrl.fit?.slope ?? NaN, A.mean_partial_slope, 'closed', 'R lm(ym ~ x + z) coefficient of x');
    const w = words(ctrl, decide(ctrl, ctrl.test?.p));
    const chart = w.section.chart?.data;
    if (chart?.kind !== 'scatter') throw new Error('expected a scatter chart');
    expect(chart.yTitle).toBe('satisfaction, after removing teaching (residual, scale points)');
    expect(chart.xTitle).toBe('resources, after removing teaching (residual, points)');
    expectClose(chart.fit?.slope ?? NaN, A.mean_partial_slope / 100, 'closed', 'plotted slope, scale points per point');
    const line = w.section.numbers.find((r) => r.label.startsWith('Least-squares line after allowing for teaching'));
    expect(line?.value).toContain('(scale points per point)');
  });
});

describe('association: words and verdict paths', () => {
  it('supported with controls names them in the verdict and the cautions', () => {
    const a = analyseAssociation(claim({ controls: [control], expect: 'positive', sided: 'one-sided' }), cube, ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('supported');
    const w = words(a, d);
    expect(w.section.verdictText).toMatch(/after allowing for teaching, those with higher resources/);
    expect(w.section.hypotheses.null).toBe(
      'Across depts, once teaching is allowed for, there is no linear association between resources and satisfaction (the partial correlation is zero).',
    );
    expect(w.section.hypotheses.alternative).toMatch(/^Across depts, after allowing for teaching, higher resources goes with higher satisfaction/);
    expect(w.section.cautions.join(' ')).toMatch(/after allowing for teaching, which removes only its straight-line effect/);
    expect(w.section.cautions.join(' ')).toMatch(/higher resources \(after allowing for teaching\) tend to have a higher satisfaction/);
    expect(w.section.cautions.join(' ')).toMatch(/does not show that one measure causes the other/);
    // Every figure is about the controlled relation: no unpartialled rank check, no line of the raw values.
    const rows = Object.fromEntries(w.section.numbers.map((r) => [r.label, r.value]));
    expect(rows["Partial Spearman's rho (check on ranks, after allowing for teaching)"]).toMatch(/^0\.95 \(/);
    expect(rows["Kendall's partial tau (check on pairs of units, after allowing for teaching)"]).toMatch(/^0\.86 \(a description only: partial tau has no standard test/);
    expect(rows["Least-squares line after allowing for teaching (residuals)"]).toMatch(/^residual satisfaction = 1\.\d{3} × residual resources \(points per point\); R² = /);
    expect(Object.keys(rows).filter((l) => /^Spearman|^Kendall's tau-b|^Least-squares line$/.test(l))).toEqual([]);
    // The chart: residuals in points, their own axis titles, the partial line.
    const chart = w.section.chart?.data;
    if (chart?.kind !== 'scatter') throw new Error('expected a scatter chart');
    expect(chart.percent).toBe(false);
    expect(chart.xTitle).toBe('resources, after removing teaching (residual, points)');
    expect(chart.yTitle).toBe('satisfaction, after removing teaching (residual, points)');
    chart.points.forEach((p, i) => expectClose(p.x, (A.x_residual[i] as number) * 100, 'closed', `plotted x residual ${p.label}`));
    expectClose(chart.fit?.slope ?? NaN, A.partial_fit.slope, 'closed', 'plotted slope (points per point)');
    expect(chart.note).toMatch(/^partial r = 0\.\d+; 10 depts$/);
  });
  it('with two controls Kendall\'s partial tau is left out, and the page says why', () => {
    const second = { filter: { Q: 'Q4' }, measure: { type: 'mean' as const }, label: 'overall score' };
    const a = analyseAssociation(claim({ controls: [control, second] }), cube, ctx);
    expect(a.partialKendall).toBeUndefined();
    expect(a.kendall).toBeUndefined();
    expect(a.rankChecksLeftOut).toEqual([{ check: 'kendall', reason: 'several-controls' }]);
    const rows = Object.fromEntries(words(a, decide(a, a.test?.p)).section.numbers.map((r) => [r.label, r.value]));
    expect(rows["Kendall's partial tau (check on pairs of units, after allowing for teaching and overall score)"]).toBe(
      "not shown: Kendall's partial tau has a standard form for one control only, and this claim names 2",
    );
    expect(a.spearman?.method).toBe('partial-spearman');
  });
  it('opposite when the claim expected a negative association', () => {
    const a = analyseAssociation(claim({ expect: 'negative', sided: 'one-sided' }), cube, ctx);
    expect(decide(a, a.test?.p).verdict).toBe('opposite');
  });
  it('weighted wording says so', () => {
    const a = analyseAssociation(claim({ weighted: true }), cube, ctx);
    const d = decide(a, a.test?.p);
    expect(words(a, d).section.cautions.join(' ')).toMatch(/weighted by their respondents/);
  });
  it('not supported when x is unrelated to y (x against a shuffled copy of itself)', () => {
    // Units paired with another unit's rate: r computed by R below is close to zero.
    const shuffled = cubeOf(
      A.units.flatMap((u, i) => [
        { dims: { Dept: u, Q: 'Q1' }, n: 100, agree: [50, 52, 48, 51, 49, 50, 53, 47, 50, 50][i] as number },
        { dims: { Dept: u, Q: 'Q2' }, n: 100, agree: [60, 40, 55, 45, 58, 42, 50, 51, 49, 50][i] as number },
      ]),
    );
    const a = analyseAssociation(claim(), shuffled, ctx);
    expect(decide(a, a.test?.p).verdict).toBe('not-supported');
  });
  it('too little data with fewer units than needed; small units are named', () => {
    const small = cubeOf(
      ['A', 'B', 'C', 'D'].flatMap((u, i) => [
        { dims: { Dept: u, Q: 'Q1' }, n: i === 0 ? 5 : 40, agree: 3 + i * 5 },
        { dims: { Dept: u, Q: 'Q2' }, n: 40, agree: 10 + i * 4 },
      ]),
    );
    const a = analyseAssociation(claim(), small, ctx);
    expect(a.status).toBe('too-little-data');
    expect(a.suppressedUnits).toEqual(['A']);
    expect(decide(a, undefined).verdict).toBe('too-little-data');
  });
  it('refuses weights with controls, and a numeric column the source lacks', () => {
    expect(() => analyseAssociation(claim({ weighted: true, controls: [control] }), cube, ctx)).toThrow(InputError);
    expect(() => analyseAssociation(claim({ yMeasure: { type: 'column', column: 'Ratio' } }), cube, ctx)).toThrow(/no numeric column/);
  });
});

describe('the article before a unit\'s name (common practice: by its first sound)', () => {
  it('says "an institution" and "a department", "a university", "a unit", "an undergraduate course"', () => {
    expect(indefiniteArticle('institution')).toBe('an');
    expect(indefiniteArticle('department and institution combination')).toBe('a');
    expect(indefiniteArticle('university')).toBe('a');
    expect(indefiniteArticle('unit')).toBe('a');
    expect(indefiniteArticle('undergraduate course')).toBe('an');
    expect(indefiniteArticle('Engineering faculty')).toBe('an');
    expect(indefiniteArticle('subject')).toBe('a');
  });
});
