/**
 * Through the command line: the pack never says one thing on one page and another elsewhere. Small invented
 * releases (written here, fictional units) are built into packs and read back with pdftotext; each test names the
 * two places that must agree.
 *
 * - The words about the adjustment for many claims follow the adjustment actually made: none with `adjust: none` or
 *   with a single claim tested (the cover already said "None: each claim is judged on its own p-value"), and a false
 *   discovery rate for Benjamini–Hochberg (Benjamini and Hochberg (1995), JRSS B 57, 289–300: the expected share of
 *   false findings among those declared, not the chance of even one), as the pack's own method note says.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildPack } from '../helpers/cli.js';

const work = mkdtempSync(join(tmpdir(), 'warrant-coherence-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** An invented summary release: four units, two questions. */
const SUMMARY = ['Unit,Question,Respondents,Agreeing', 'Alderholt,Q1,400,236', 'Birchmere,Q1,400,210', 'Alderholt,Q2,300,180', 'Birchmere,Q2,300,150', ''].join('\n');

function header(adjust: string): string {
  return `title: Coherence check
organisation: Alderholt Learners Council
data_date: 2026-03-01
confidence: 95%
adjust: ${adjust}
sources:
  s:
    file: summary.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
`;
}

function compareClaim(id: string, question: string): string {
  return `  - id: ${id}
    claim: Alderholt agrees more than Birchmere on ${question}.
    kind: compare
    source: s
    where: { Question: ${question} }
    focus: { Unit: Alderholt }
    against: { Unit: Birchmere }
    expect: higher
`;
}

function build(name: string, yaml: string) {
  const dir = join(work, name);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'summary.csv'), SUMMARY);
  return buildPack(dir, yaml);
}

describe('the adjustment for many claims is described as made', () => {
  it('adjust: none with two claims: no page says the p-values were adjusted', () => {
    const pack = build('none', header('none') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('Adjustment for many claims None: each claim is judged on its own p-value');
    expect(t).not.toContain('after adjusting for testing 2 claims together');
    expect(t).not.toContain('adjusted for this with no adjustment');
    expect(t).not.toContain('No adjustment does this');
    expect(t).not.toContain('after adjusting for the other claims tested');
    expect(t).not.toContain('only the p-values are adjusted');
    expect(t).toContain('no adjustment was made for testing 2 claims together');
    expect(t).toContain('2 claims were tested together and their p-values were not adjusted for it (the claims file sets adjust: none)');
    expect(t).toContain('This pack makes none (the claims file sets adjust: none): each claim is judged on its own p-value against 5%');
    // R 4.x prop.test(c(236, 210), c(400, 400), correct = FALSE): p = 0.064, not supported; prop.test(c(180, 150),
    // c(300, 300), correct = FALSE): p = 0.0138, supported on its own p-value (its advice is the sentence checked above).
    expect(pack.results.claims.map((c) => c.verdict)).toEqual(['not-supported', 'supported']);
    expect(pack.results.claims[1]!.p).toBeCloseTo(0.01382302, 6);
  }, 60_000);

  it('one claim under Holm: nothing is adjusted, and no page says it was', () => {
    const pack = build('single', header('holm') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).not.toContain('after adjusting for testing 1 claims');
    expect(t).not.toContain('1 claims were tested together');
    expect(t).not.toContain('after adjusting for the other claims tested');
    expect(t).not.toContain("Holm's method does this");
    expect(t).toContain('This pack makes none, as only one claim was tested');
  }, 60_000);

  it('Benjamini–Hochberg: the glossary speaks of a false discovery rate, as the method note does', () => {
    const pack = build('bh', header('benjamini-hochberg') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('the share of supported claims that are false findings stays within the stated level');
    expect(t).not.toContain('the chance of even one false finding across the whole pack');
    expect(t).toContain('on average, the share of false findings among the supported claims is kept at 5%');
    expect(t).toContain('The Benjamini–Hochberg method does this');
  }, 60_000);

  it("Holm's method with two claims keeps the family-wise words", () => {
    const pack = build('holm', header('holm') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('after adjusting for testing 2 claims together');
    expect(t).toContain("the chance of even one false finding across the whole pack is kept at 5% (one minus the confidence level) or less. Holm's method does this");
    expect(t).toContain("the p-values were adjusted for this with Holm's method");
  }, 60_000);
});
