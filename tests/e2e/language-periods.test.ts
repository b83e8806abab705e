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
