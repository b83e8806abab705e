/**
 * End to end through the command line: trends that rise then fall (the chi-square for departure from a straight
 * line) and the finite-population correction as one decision for every figure of a claim. Claims file in,
 * results.json and the PDF's text (poppler's pdftotext) out, every number checked against GNU R on the same counts
 * (tests/fixtures/r/language-periods.R -> language-periods.json, data in tests/fixtures/r/language/periods.csv).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const R = JSON.parse(readFileSync(join(root, 'tests/fixtures/r/language-periods.json'), 'utf8'));
const work = mkdtempSync(join(tmpdir(), 'warrant-periods-'));

const HEAD = `
title: Periods and cohorts
organisation: Test
adjust: none
sources:
  sector:
    file: ${join(root, 'tests/fixtures/r/language/periods.csv')}
    shape: summary
    respondents: Respondents
    agree: Agreeing
    population: Eligible
    period: Year
`;

const CLAIMS = `
claims:
  - id: brackenholt-rising
    claim: Agreement at Brackenholt has risen steadily over five years.
    kind: trend
    where: { Institution: Brackenholt College, Question: Q01 }
    last: 5
    expect: any
  - id: vellmoor-rising
    claim: Agreement at Vellmoor has risen steadily over five years.
    kind: trend
    where: { Institution: Vellmoor Institute, Question: Q01 }
    last: 5
    expect: any
`;

function fold(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

function build(name: string, yaml: string): { results: { claims: Array<Record<string, any>> }; text: string } {
  writeFileSync(join(work, `${name}.yaml`), yaml);
  const r = spawnSync(process.execPath, [bin, 'build', `${name}.yaml`, '--out', `out-${name}`, '--quiet'], { cwd: work, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const dir = join(work, `out-${name}`);
  const pack = join(dir, readdirSync(dir).find((d) => d !== 'latest') as string);
  return {
    results: JSON.parse(readFileSync(join(pack, 'results.json'), 'utf8')),
    text: fold(execFileSync('pdftotext', ['-enc', 'UTF-8', join(pack, 'pack.pdf'), '-'], { encoding: 'utf8' })),
  };
}

let trend: ReturnType<typeof build>;

beforeAll(() => {
  trend = build('trend', HEAD + CLAIMS);
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('trends that rise then fall', () => {
  it('the trend statistic is R prop.trend.test; the departure is R prop.test minus prop.trend.test on k - 2 df', () => {
    const c = trend.results.claims.find((x) => x.id === 'brackenholt-rising') as Record<string, any>;
    expectClose(c.statistic.value, R.bent.trend, 'statistic', 'R prop.trend.test X-squared');
    expect(trend.text).toMatch(new RegExp(`Departure from a straight line X² = ${R.bent.statistic.toFixed(2)}, ${R.bent.df} degrees of freedom, p < 0.001`));
    // The verdict paragraph says the straight line does not describe the periods.
    expect(c.verdictText).toContain('The straight line does not describe these periods');
    expect(trend.text).toContain(fold(c.verdictText));
  });

  it('a steady rise leaves no departure to speak of, and the verdict says nothing about it', () => {
    const c = trend.results.claims.find((x) => x.id === 'vellmoor-rising') as Record<string, any>;
    expectClose(c.statistic.value, R.steady.trend, 'statistic', 'R prop.trend.test X-squared');
    expect(c.verdictText).not.toContain('straight line does not describe');
    expect(trend.text).toContain(`Departure from a straight line X² = ${R.steady.statistic.toFixed(2)}, ${R.steady.df} degrees of freedom, p = ${R.steady.p.toFixed(3)}`);
  });
});

describe('the finite-population correction, one decision for every figure', () => {
  const compare = (extra: string) => `
  - id: brackenholt-below-vellmoor
    claim: Fewer Brackenholt students agree on Q01 than Vellmoor students.
    kind: compare
    where: { Year: 2026, Question: Q01 }
    focus: { Institution: Brackenholt College }
    against: { Institution: Vellmoor Institute }
    expect: different${extra}
`;
  let on: ReturnType<typeof build>;
  let off: ReturnType<typeof build>;
  let claimOff: ReturnType<typeof build>;
  beforeAll(() => {
    on = build('fpc-on', `${HEAD}claims:${compare('')}`);
    off = build('fpc-off', `${HEAD.replace('adjust: none', 'adjust: none\nfinite_population_correction: false')}claims:${compare('')}`);
    claimOff = build('fpc-claim-off', `${HEAD}claims:${compare('\n    finite_population_correction: false')}`);
  }, 180_000);

  it('by default (the number eligible given) the test, both intervals, the difference interval and the detectable difference all use it', () => {
    const c = on.results.claims[0] as Record<string, any>;
    expect(c.method).toBe('two-proportion-z-fpc');
    expectClose(c.statistic.value, R.fpc.z, 'closed', 'z with f1/n1 + f2/n2, written out in R');
    expectClose(c.p, R.fpc.p, 'p', 'R 2 * pnorm(-|z|)');
    expectClose(c.selections[0].interval.lower, R.fpc.lower1, 'closed', 'Wilson with f, roots written out in R');
    expectClose(c.selections[0].interval.upper, R.fpc.upper1, 'closed', 'Wilson with f');
    expectClose(c.selections[1].interval.lower, R.fpc.lower2, 'closed', 'Wilson with f');
    expectClose(c.selections[1].interval.upper, R.fpc.upper2, 'closed', 'Wilson with f');
    expectClose(c.interval.lower, R.fpc.diff_lower, 'closed', 'Newcombe hybrid from the corrected Wilson limits');
    expectClose(c.interval.upper, R.fpc.diff_upper, 'closed', 'Newcombe hybrid from the corrected Wilson limits');
    expectClose(c.detectable, R.fpc.detectable, 1e-9, 'R uniroot on the power formula with n / f');
    expect(on.text).toMatch(/; finite-? ?population correction in every figure; 95% confidence/);
    expect(on.text).toContain('Cochran, W. G. (1977). Sampling Techniques');
  });

  it('turned off pack-wide, no figure uses it: R prop.test and plain Wilson', () => {
    const c = off.results.claims[0] as Record<string, any>;
    expect(c.method).toBe('two-proportion-z');
    expectClose(c.statistic.value, R.plain.z, 'closed', 'pooled z');
    expectClose(c.p, R.plain.p, 'p', 'R prop.test(correct = FALSE)');
    expectClose(c.selections[0].interval.lower, R.plain.lower1, 'closed', 'Wilson without f');
    expectClose(c.interval.lower, R.plain.diff_lower, 'closed', 'Newcombe hybrid');
    expectClose(c.interval.upper, R.plain.diff_upper, 'closed', 'Newcombe hybrid');
    expectClose(c.detectable, R.plain.detectable, 1e-9, 'R uniroot on the power formula');
    expect(off.text).toContain('Finite-population correction not used (turned off)');
    expect(off.text).not.toMatch(/finite-? ?population correction in every figure/);
  });

  it('turned off on the claim only: the same figures as off pack-wide', () => {
    const c = claimOff.results.claims[0] as Record<string, any>;
    expectClose(c.p, R.plain.p, 'p', 'R prop.test(correct = FALSE)');
    expect(claimOff.text).toContain('Finite-population correction not used (turned off)');
  });

  it('a trend (no corrected form) uses it in no figure and says so', () => {
    const c = trend.results.claims[0] as Record<string, any>;
    expect(c.selections.every((s: { interval: { method: string } }) => s.interval.method === 'wilson')).toBe(true);
    expect(trend.text).toContain('Finite-population correction in no figure (the trend test has no corrected form)');
  });
});
