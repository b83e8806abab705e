import { describe, expect, it } from 'vitest';
import { analyseCrosstab } from '../../src/analyse/crosstab.js';
import type { CrosstabClaim } from '../../src/claims/types.js';
import { decide } from '../../src/verdicts/decide.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';
import { base, ctx, cubeOf, find, ref, type CrosstabCase } from './kinds-b-fixture.js';

// Reference: GNU R 4.2 chisq.test(correct = FALSE) (statistic, p, stdres), fisher.test, Cramér's V from the
// uncorrected statistic (tests/fixtures/r/kinds-b.R).

function claim(columns: string, minRespondents = 10): CrosstabClaim {
  return { ...base, id: 'x', kind: 'crosstab', rows: ['Campus'], columns: columns === 'agreement' || columns === 'answers' ? columns : [columns], expect: 'related', minRespondents };
}

/** A summary-shaped cube: per row, agreeing and respondents (columns: agreement). */
function agreementCube(c: CrosstabCase) {
  const rows = [...c.rows.map((r, i) => ({ r, t: c.table[i] as number[] })), ...c.extra_rows.map((e) => ({ r: e.row, t: e.counts }))];
  return cubeOf(rows.map(({ r, t }) => ({ dims: { Campus: r }, agree: t[0] as number, n: (t[0] as number) + (t[1] as number) })));
}

/** A cube split by another column: one cell per row and column value. */
function splitCube(c: CrosstabCase) {
  return cubeOf(c.rows.flatMap((r, i) => c.columns.map((col, j) => ({ dims: { Campus: r, Mode: col }, n: (c.table[i] as number[])[j] as number, agree: 0 }))));
}

describe('crosstab: chi-square, Fisher and residuals against R', () => {
  it('related table: supported, chi-square without Yates, residuals and V match R, small row left out', () => {
    const c = find(ref.crosstab, 'campus-agreement-related');
    const a = analyseCrosstab(claim('agreement'), agreementCube(c), ctx);
    expect(a.status).toBe('tested');
    expect(a.test?.method).toBe('chi-square-independence');
    expectClose(a.test?.statistic?.value ?? NaN, c.statistic, 'statistic', 'X²');
    expectClose(a.test?.p ?? NaN, c.p, 'p', 'p-value');
    expect(a.test?.df).toBe(c.df);
    expectClose(a.cramersV ?? NaN, c.cramers_v, 'closed', "Cramér's V");
    expect(a.suppressedRows).toEqual(['Campus D']);
    expect(a.rowLabels).toEqual(c.rows);
    // Campus A +3.48, Campus B −3.48 on the agreeing column; Campus C 0.
    expect(a.notable.map((x) => x.row).sort()).toEqual(['Campus A', 'Campus B']);
    for (const cell of a.notable) {
      const i = c.rows.indexOf(cell.row);
      expectClose(cell.residual, (c.stdres[i] as number[])[0] as number, 'closed', `residual ${cell.row}`);
    }
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('supported');
    const words = composeClaim(a, d, { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] });
    expect(words.section.verdictText).toMatch(/Campus A has more respondents agreeing than independence would give/);
    expect(words.section.verdictText).toMatch(/Campus B has fewer respondents agreeing/);
    expect(words.section.cautions.join(' ')).toMatch(/Campus D/);
    expect(JSON.stringify(words)).not.toMatch(/\b3 agreeing|\b7 respondents/);
    expect(words.section.chart?.data.kind).toBe('stacked');
  });

  it('unrelated table: not supported', () => {
    const c = find(ref.crosstab, 'campus-agreement-unrelated');
    const a = analyseCrosstab(claim('agreement'), agreementCube(c), ctx);
    expectClose(a.test?.p ?? NaN, c.p, 'p', 'p-value');
    expect(a.notable).toEqual([]);
    expect(decide(a, a.test?.p).verdict).toBe('not-supported');
  });

  it('2 × 3 table split by another column with small expected counts: Fisher r × c, as R fisher.test', () => {
    const c = find(ref.crosstab, 'mode-by-site-small');
    const a = analyseCrosstab({ ...claim('Mode', 5), rows: ['Campus'] }, splitCube(c), { ...ctx, minRespondents: 5 });
    expect(c.min_expected).toBeLessThan(5);
    expect(a.test?.method).toBe('fisher-exact-rxc');
    expectClose(a.test?.p ?? NaN, c.fisher_p as number, 'p', 'Fisher p');
    expectClose(a.cramersV ?? NaN, c.cramers_v, 'closed', "Cramér's V");
    expect(a.methods).toEqual(['fisher-exact-rxc', 'chi-square-independence', 'power-chi-square']);
    expect(decide(a, a.test?.p).verdict).toBe('not-supported');
  });

  it('2 × 2 table with an expected count below 5: Fisher 2 × 2, as R fisher.test', () => {
    const c = find(ref.crosstab, 'two-sites-small');
    const a = analyseCrosstab(claim('agreement', 10), agreementCube(c), ctx);
    expect(a.test?.method).toBe('fisher-exact-2x2');
    expectClose(a.test?.p ?? NaN, c.fisher_p as number, 'p', 'Fisher p');
    expect(decide(a, a.test?.p).verdict).toBe('supported');
  });

  it('Yates correction only when asked', () => {
    const c = find(ref.crosstab, 'campus-agreement-related');
    const cube = cubeOf(c.rows.slice(0, 2).map((r, i) => ({ dims: { Campus: r }, agree: (c.table[i] as number[])[0] as number, n: 200 })));
    expect(analyseCrosstab(claim('agreement'), cube, ctx).test?.method).toBe('chi-square-independence');
    expect(analyseCrosstab(claim('agreement'), cube, ctx, { yates: true }).test?.method).toBe('chi-square-independence-yates');
  });

  it('too little data when fewer than 2 rows have enough respondents', () => {
    const cube = cubeOf([
      { dims: { Campus: 'A' }, n: 40, agree: 20 },
      { dims: { Campus: 'B' }, n: 6, agree: 2 },
    ]);
    const a = analyseCrosstab(claim('agreement'), cube, ctx);
    expect(a.status).toBe('too-little-data');
    expect(a.shortfall).toMatch(/only 1 of the campus values/);
    expect(a.suppressedRows).toEqual(['B']);
    expect(decide(a, undefined).verdict).toBe('too-little-data');
  });
});
