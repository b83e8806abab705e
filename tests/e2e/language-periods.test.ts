/**
 * End to end through the command line: trends that rise then fall (the chi-square for departure from a straight
 * line) and the finite-population correction as one decision for every figure of a claim. Claims file in,
 * results.json and the PDF's text (poppler's pdftotext) out, every number checked against GNU R on the same counts
 * (tests/fixtures/r/language-periods.R -> language-periods.json, data in tests/fixtures/r/language/periods.csv).
 */

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPack, fold, type BuiltPack } from '../helpers/cli.js';
import { expectClose } from '../helpers/tolerance.js';

const root = resolve(__dirname, '../..');
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
    claim: Agreement at Brackenholt has moved over five years, one way or the other.
    kind: trend
    where: { Institution: Brackenholt College, Question: Q01 }
    last: 5
    expect: any
  - id: vellmoor-rising
    claim: Agreement at Vellmoor has moved over five years, one way or the other.
    kind: trend
    where: { Institution: Vellmoor Institute, Question: Q01 }
    last: 5
    expect: any
`;

const build = (name: string, yaml: string): BuiltPack => buildPack(work, yaml, { name, out: `out-${name}` });

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
    claim: Brackenholt and Vellmoor students differ in how often they agree on Q01.
    kind: compare
    where: { Year: 2026, Question: Q01 }
    focus: { Institution: Brackenholt College }
    against: { Institution: Vellmoor Institute }
    expect: different${extra}
`;
  const EQUIVALENCE = `
  - id: brackenholt-like-vellmoor
    claim: Brackenholt and Vellmoor students agree on Q01 within 10 points of each other.
    kind: equivalence
    where: { Year: 2026, Question: Q01 }
    focus: { Institution: Brackenholt College }
    against: { Institution: Vellmoor Institute }
    margin: 10 points
`;
  /** The number eligible in 2026 on Q01, read from the fixture's rows. */
  const eligible2026 = (institution: string): number => {
    const rows = readFileSync(join(root, 'tests/fixtures/r/language/periods.csv'), 'utf8').trim().split('\n').slice(1).map((l) => l.split(','));
    return Number(rows.find((r) => r[0] === `"${institution}"` && r[1] === '2026' && r[2] === '"Q01"')?.[5]);
  };
  let on: ReturnType<typeof build>;
  let off: ReturnType<typeof build>;
  let claimOff: ReturnType<typeof build>;
  beforeAll(() => {
    on = build('fpc-on', `${HEAD}claims:${compare('')}${EQUIVALENCE}`);
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
    // The numbers table says so too, with the numbers eligible the correction works from; results.json records it.
    const [b, v] = [eligible2026('Brackenholt College'), eligible2026('Vellmoor Institute')];
    expect(b).toBeGreaterThan(0);
    expect(on.text).toContain(`Finite-population correction used in every figure; ${b.toLocaleString('en-GB')} eligible in Brackenholt College, ${v.toLocaleString('en-GB')} in Vellmoor Institute`);
    expect(c.finitePopulationCorrection).toEqual({ used: true });
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
    expect(off.text).toContain(`Finite-population correction not used (turned off); ${eligible2026('Brackenholt College').toLocaleString('en-GB')} eligible in Brackenholt College`);
    expect(c.finitePopulationCorrection).toEqual({ used: false, why: 'off' });
    expect(off.text).not.toMatch(/finite-? ?population correction in every figure/);
  });

  it('turned off on the claim only: the same figures as off pack-wide', () => {
    const c = claimOff.results.claims[0] as Record<string, any>;
    expectClose(c.p, R.plain.p, 'p', 'R prop.test(correct = FALSE)');
    expect(claimOff.text).toContain('Finite-population correction not used (turned off)');
  });

  it('an equivalence claim on the same two groups uses it in every figure too, so both claims read the same spread', () => {
    const c = on.results.claims.find((x) => x.id === 'brackenholt-like-vellmoor') as Record<string, any>;
    const cmp = on.results.claims.find((x) => x.id === 'brackenholt-below-vellmoor') as Record<string, any>;
    expect(c.finitePopulationCorrection).toEqual({ used: true });
    expectClose(c.p, R.fpc.tost_p, 'p', 'TOST with f1 and f2 on the unpooled variance, written out in R');
    expectClose(c.interval.lower, R.fpc.tost_lower, 'closed', '90% interval with f, written out in R');
    expectClose(c.interval.upper, R.fpc.tost_upper, 'closed', '90% interval with f, written out in R');
    // Each rate's interval and the difference's interval are the compare claim's, which R checked above.
    expect(c.selections.map((s: { interval: unknown }) => s.interval)).toEqual(cmp.selections.map((s: { interval: unknown }) => s.interval));
    expectClose(c.difference.interval.lower, R.fpc.diff_lower, 'closed', 'Newcombe hybrid from the corrected Wilson limits');
    expectClose(c.difference.interval.upper, R.fpc.diff_upper, 'closed', 'Newcombe hybrid from the corrected Wilson limits');
    expect(on.text).not.toContain('the equivalence test has no corrected form');
    // The source line gives the response rate of the two groups (it said "not computed for a claim across units").
    expect(on.text).not.toContain('not computed for a claim across units');
  });

  it('a trend (no corrected form) uses it in no figure and says so', () => {
    const c = trend.results.claims[0] as Record<string, any>;
    expect(c.selections.every((s: { interval: { method: string } }) => s.interval.method === 'wilson')).toBe(true);
    expect(c.finitePopulationCorrection).toEqual({ used: false, why: 'no-form', form: 'the trend test' });
    // The numbers table says so plainly, with the numbers eligible it would have worked from (from the fixture's rows).
    const rows = readFileSync(join(root, 'tests/fixtures/r/language/periods.csv'), 'utf8').trim().split('\n').slice(1).map((l) => l.split(','));
    const eligible = rows.filter((r) => r[0] === '"Brackenholt College"' && r[2] === '"Q01"').map((r) => [r[1] as string, Number(r[5])] as const);
    expect(eligible).toHaveLength(5);
    const [first, ...rest] = eligible;
    expect(trend.text).toContain(
      `Finite-population correction not used in any figure (the trend test has no corrected form); ${first![1].toLocaleString('en-GB')} eligible in ${first![0]}, ${rest.map(([y, n]) => `${n.toLocaleString('en-GB')} in ${y}`).join(', ')}`,
    );
  });
});
