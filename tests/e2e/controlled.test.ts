/**
 * End to end through the command line: association claims with controls (named third variables). A claims file goes
 * in; results.json and the PDF's text (read back with poppler's pdftotext) come out. Every figure on a controlled
 * claim's page is about the controlled relation, and each is checked against GNU R 4.2.2 on the same rows
 * (tests/fixtures/r/controlled.R -> controlled.json, data in tests/fixtures/r/controlled/): the partial r and its
 * test, the partial Spearman rho and Kendall's partial tau, each unit's residuals and the line through them. A
 * weighted claim without controls and units made of two columns keep working beside them.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPack, fold } from '../helpers/cli.js';
import { expectClose } from '../helpers/tolerance.js';
import { checkFigures } from '../helpers/pdf-figures.js';

const root = resolve(__dirname, '../..');
const data = join(root, 'tests/fixtures/r/controlled');
const R = JSON.parse(readFileSync(join(root, 'tests/fixtures/r/controlled.json'), 'utf8'));
const work = mkdtempSync(join(tmpdir(), 'warrant-controlled-'));

const STATEMENTS = {
  one: 'Brackenholt departments where more agree on Q01 also have more agreeing on Q02, allowing for Q03.',
  two: 'Across departments in both institutions, Q01 and Q02 go together, allowing for Q03 and Q04.',
  weighted: 'Weighted by respondents, Brackenholt departments where more agree on Q01 have more agreeing on Q02.',
};

const CLAIMS = `
title: Controlled associations
organisation: Test
sources:
  sector:
    file: ${join(data, 'summary.csv')}
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
claims:
  - id: one-control
    claim: ${STATEMENTS.one}
    kind: association
    source: sector
    where: { Year: 2026, Institution: Brackenholt College }
    units: Department
    x: { Question: Q01 }
    y: { Question: Q02 }
    x_label: Q01 agreement
    y_label: Q02 agreement
    controls: [{ label: agreement on Q03, where: { Question: Q03 } }]
    expect: positive
    test: one-sided
  - id: two-controls
    claim: ${STATEMENTS.two}
    kind: association
    source: sector
    where: { Year: 2026 }
    units: [Department, Institution]
    x: { Question: Q01 }
    y: { Question: Q02 }
    x_label: Q01 agreement
    y_label: Q02 agreement
    controls:
      - { label: agreement on Q03, where: { Question: Q03 } }
      - { label: agreement on Q04, where: { Question: Q04 } }
    expect: any
  - id: weighted
    claim: ${STATEMENTS.weighted}
    kind: association
    source: sector
    where: { Year: 2026, Institution: Brackenholt College }
    units: Department
    x: { Question: Q01 }
    y: { Question: Q02 }
    x_label: Q01 agreement
    y_label: Q02 agreement
    weighted: true
    expect: positive
`;

/** A coefficient as the pack prints it: fixed decimals, a minus sign (U+2212) for negatives (common practice). */
const coef = (v: number, digits = 2): string => `${v < 0 && Number(Math.abs(v).toFixed(digits)) !== 0 ? '\u2212' : ''}${Math.abs(v).toFixed(digits)}`;
/** A p-value as the pack prints it above 0.001: three significant figures. */
const pText = (p: number): string => Number(p.toPrecision(3)).toString();

let results: { claims: Array<Record<string, any>> };
let text: string;
/** The PDF's text with its layout kept (pdftotext -layout), for reading the numbers tables as rows. */
let layout: string;
const claim = (id: string) => results.claims.find((c) => c.id === id) as Record<string, any>;
/** A claim's own pages: from the last time its statement is printed (the summary names it first) to the next claim's. */
function section(from: string, to?: string): string {
  const start = text.lastIndexOf(fold(from));
  const end = to ? text.lastIndexOf(fold(to)) : text.indexOf('Cautions', start) + 2000;
  expect(start).toBeGreaterThan(0);
  expect(end).toBeGreaterThan(start);
  return text.slice(start, end);
}

beforeAll(() => {
  const built = buildPack(work, CLAIMS);
  ({ results, text } = built);
  layout = execFileSync('pdftotext', ['-enc', 'UTF-8', '-layout', join(built.folder, 'pack.pdf'), '-'], { encoding: 'utf8' });
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('one control: every figure is about the controlled relation (R 4.2.2)', () => {
  const r = () => R.one_control;
  it('the fixture is the case the page used to mislead on: strong plain r, near-zero partial r', () => {
    expect(R.r_version).toMatch(/^R version 4\.2\.2/);
    expect(r().plain_r).toBeGreaterThan(0.6);
    expect(Math.abs(r().r)).toBeLessThan(0.1);
  });
  it('partial r, its t test on n - 3 df and its one-sided Fisher z interval: R cor() of lm() residuals, pt()', () => {
    const c = claim('one-control');
    expect(c.method).toBe('partial-pearson');
    expect(c.units).toHaveLength(r().n);
    expectClose(c.estimate.value, r().r, 'statistic', 'R cor(resid(lm))');
    expect(c.df).toBe(r().df);
    expectClose(c.statistic.value, r().t, 'statistic', 'R t');
    expectClose(c.p, r().p, 'p', 'R pt, greater');
    expectClose(c.interval.lower, r().lower, 'bound', 'R Fisher z lower');
    expect(c.interval.upper).toBe(1);
  });
  it('rank checks are partial: partial Spearman (R lm() on rank()) and Kendall partial tau (R cor(kendall))', () => {
    const a = claim('one-control');
    expect(a.controls).toEqual(['agreement on Q03']);
    expect(a.rankChecks.map((x: { method: string }) => x.method)).toEqual(['partial-spearman', 'partial-kendall']);
    expectClose(a.rankChecks[0].estimate, r().spearman, 'closed', 'R partial Spearman');
    expectClose(a.rankChecks[0].p, r().spearman_p, 'p', 'R pt on the partial Spearman');
    expectClose(a.rankChecks[1].estimate, r().kendall, 'closed', 'R Kendall partial tau');
    expect(a.rankChecks[1].p).toBeNull();
    expect(a.rankChecksLeftOut).toEqual([]);
  });
  it('residuals and the partial line: R resid(lm()), lm() of residual on residual, and x in lm(y ~ x + z)', () => {
    const c = claim('one-control');
    const byName = new Map<string, { xResidual: number; yResidual: number }>(c.units.map((u: any) => [u.unit, u]));
    (r().units as string[]).forEach((name, i) => {
      expectClose(byName.get(name)?.xResidual ?? NaN, r().x_residual[i], 'closed', `x residual of ${name}`);
      expectClose(byName.get(name)?.yResidual ?? NaN, r().y_residual[i], 'closed', `y residual of ${name}`);
    });
    expect(c.line.of).toBe('residuals');
    expectClose(c.line.slope, r().slope, 'closed', 'R lm slope of residuals');
    expectClose(c.line.slope, r().slope_with_controls, 'closed', 'R lm(y ~ x + z) coefficient of x');
    expectClose(c.line.rSquared, r().r_squared, 'closed', 'R summary(lm)$r.squared');
    expect(Math.abs(c.line.intercept)).toBeLessThan(1e-12);
    // Two agreement rates: the slope the pack prints (points per point) is the slope of the proportions.
    expect(c.line.shownSlope.unit).toBe('points per point');
    expectClose(c.line.shownSlope.value, r().slope, 'closed', 'R lm slope, in points per point');
  });
  it('the hypotheses name the control', () => {
    const h = claim('one-control').hypotheses;
    expect(h.null).toBe(
      'Across departments, once agreement on Q03 is allowed for, there is no linear association between Q01 agreement and Q02 agreement (the partial correlation is zero).',
    );
    expect(h.alternative).toMatch(/^Across departments, after allowing for agreement on Q03, higher Q01 agreement goes with higher Q02 agreement/);
  });
  it('the PDF prints the partial figures at R values, the residual chart with its own axis titles and unit names', () => {
    const s = section(STATEMENTS.one, STATEMENTS.two);
    expect(s).toContain(`after allowing for agreement on Q03 is partial r = ${coef(r().r)}`);
    expect(s).toContain(`Partial correlation (after allowing for agreement on Q03) ${coef(r().r)} (95% interval ${coef(r().lower)} to 1.00`);
    expect(s).toContain(`Partial Spearman's rho (check on ranks, after allowing for agreement on Q03) ${coef(r().spearman)} (p = ${pText(r().spearman_p)})`);
    expect(s).toContain(`Kendall's partial tau (check on pairs of units, after allowing for agreement on Q03) ${coef(r().kendall)} (a description only: partial tau has no standard test, so no p-value is given)`);
    expect(s).toContain(`Least-squares line after allowing for agreement on Q03 (residuals) residual Q02 agreement = ${coef(r().slope, 4)} × residual Q01 agreement (points per point); R² = ${coef(r().r_squared)}`);
    expect(s).toContain(`partial r = ${coef(r().r)}; 19 of 20 departments (1 under 10 respondents left out)`);
    expect(s).toContain('Q02 agreement, after removing agreement on Q03 (residual, points)');
    expect(s).toContain('Q01 agreement, after removing agreement on Q03 (residual, points)');
    expect(s).toContain('The correlation is calculated after allowing for agreement on Q03, which removes only its straight');
    expect(s).toContain('1 department had fewer than 10 respondents on a measure and was left out: Ecology.');
    // 19 units: every point is named on the chart.
    for (const name of r().units as string[]) expect(s).toContain(name);
    // Nothing unpartialled: no plain r, no plain rank checks, no line of the raw values.
    expect(s).not.toContain(coef(r().plain_r));
    expect(s).not.toMatch(/Spearman's rho \(check on ranks\)|Kendall's tau-b|Least-squares line (?!after)|controlling for/);
  });
});

describe('two controls, units of two columns (R 4.2.2)', () => {
  const r = () => R.two_controls;
  it('partial r on n - 4 df, partial Spearman with both controls; Kendall partial tau left out, saying why', () => {
    const c = claim('two-controls');
    expect(c.units).toHaveLength(r().n);
    expect(c.df).toBe(r().df);
    expectClose(c.estimate.value, r().r, 'statistic', 'R cor(resid(lm))');
    expectClose(c.p, r().p, 'p', 'R pt, two-sided');
    expectClose(c.interval.lower, r().lower, 'bound', 'R Fisher z lower');
    expectClose(c.interval.upper, r().upper, 'bound', 'R Fisher z upper');
    expect(c.rankChecks).toHaveLength(1);
    expectClose(c.rankChecks[0].estimate, r().spearman, 'closed', 'R partial Spearman, two controls');
    expectClose(c.rankChecks[0].p, r().spearman_p, 'p', 'R pt on the partial Spearman');
    expect(c.rankChecksLeftOut).toEqual([{ check: 'kendall', reason: 'several-controls' }]);
    expectClose(c.line.slope, r().slope_with_controls, 'closed', 'R lm(y ~ x + z1 + z2) coefficient of x');
    const u = c.units.find((x: { unit: string }) => x.unit === 'Zoology, Vellmoor Institute');
    const i = (r().units as string[]).indexOf('Zoology, Vellmoor Institute');
    expectClose(u.yResidual, r().y_residual[i], 'closed', 'R resid(lm) of a two-column unit');
  });
  it('the PDF says why Kendall is not shown, and does not name 38 points', () => {
    const s = section(STATEMENTS.two, STATEMENTS.weighted);
    expect(s).toContain(
      "Kendall's partial tau (check on pairs of units, after allowing for agreement on Q03 and agreement on Q04) not shown: Kendall's partial tau has a standard form for one control only, and this claim names 2",
    );
    expect(s).toContain(`Partial Spearman's rho (check on ranks, after allowing for agreement on Q03 and agreement on Q04) ${coef(r().spearman)} (p = ${pText(r().spearman_p)})`);
    expect(s).toContain('Q02 agreement, after removing agreement on Q03 and agreement on Q04 (residual, points)');
    expect(s).not.toContain('Zoology, Vellmoor Institute');
  });
});

describe('weighted, no controls: unchanged (R 4.2.2 cov.wt, cor.test)', () => {
  it('weighted r and the plain rank checks', () => {
    const c = claim('weighted');
    expectClose(c.estimate.value, R.weighted.r, 'statistic', 'R cov.wt correlation');
    expectClose(c.p, R.weighted.p, 'p', 'R pt on the weighted r, greater');
    expect(c.controls).toEqual([]);
    expect(c.line.of).toBe('values');
    const [rho, tau] = c.rankChecks;
    expect([rho.method, tau.method]).toEqual(['spearman', 'kendall-tau-b']);
    expectClose(rho.estimate, R.weighted.spearman, 'closed', 'R cor.test spearman');
    expectClose(tau.estimate, R.weighted.kendall, 'closed', 'R cor.test kendall');
    expect(c.units.every((u: Record<string, unknown>) => !('xResidual' in u))).toBe(true);
    const s = section(STATEMENTS.weighted);
    expect(s).toContain(`Spearman's rho (check on ranks) ${coef(R.weighted.spearman)}`);
    expect(s).not.toContain('after removing');
  });
});

describe('results.json carries the partial figures', () => {
  it('every figure in the three numbers tables is in the claim\'s results.json entry at the printed precision', () => {
    const { rows, figures } = checkFigures(layout, results as unknown as { settings: unknown; claims: Array<{ id: string }> });
    expect(new Set(rows.map((r) => r.claim))).toEqual(new Set(['one-control', 'two-controls', 'weighted']));
    expect(figures.filter((f) => !f.found).map((f) => `${f.claim} | ${f.label} | ${f.text}`)).toEqual([]);
    // The partial rank checks and the partial line are among them.
    const labels = rows.filter((r) => r.claim === 'one-control').map((r) => r.label).join(' | ');
    expect(labels).toMatch(/Partial Spearman's rho/);
    expect(labels).toMatch(/Kendall's partial tau/);
    expect(labels).toMatch(/Least-squares line after allowing for/);
    expect(figures.length).toBeGreaterThan(30);
  });
  // (Not the line: with a unit's residuals in the entry, a three-decimal slope can match one of them by chance.)
  it('and the check can fail: without the rank checks, the partial rank figures go unfound', () => {
    for (const field of ['rankChecks']) {
      const cut = { ...results, claims: results.claims.map(({ [field]: _gone, ...rest }) => ({ ...rest, id: rest.id as string })) };
      const missing = checkFigures(layout, cut as unknown as { settings: unknown; claims: Array<{ id: string }> }).figures.filter((f) => !f.found && f.claim !== 'weighted');
      expect(missing.length, `without ${field}`).toBeGreaterThan(0);
    }
  });
});
