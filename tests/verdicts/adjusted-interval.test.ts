/**
 * A claim whose verdict changes with the adjustment for many claims: built through the pipeline from a small
 * invented summary file, read back from the PDF with poppler's pdftotext. Its 95% interval excludes no difference,
 * but Holm's method across five claims holds its p-value to 0.05 / 5 = 0.01 (Holm 1979: the smallest of m p-values is
 * compared with alpha / m), so the verdict is "not supported"; the pack must print the 99% interval beside the 95% one
 * and say which is which, in the numbers table, the verdict paragraph and the summary.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type BuildResult } from '../../src/pipeline.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';
import { expectClose } from '../helpers/tolerance.js';

const work = mkdtempSync(join(tmpdir(), 'warrant-adjusted-'));
let built: BuildResult;
let text: string;

// Question Q1: 560 of 1,000 against 510 of 1,000 (a 5-point gap, two-sided p about 0.025); Q2-Q5: near-equal rates.
const rows = [
  ['North', 'Q1', 1000, 560], ['South', 'Q1', 1000, 510],
  ['North', 'Q2', 800, 400], ['South', 'Q2', 800, 404],
  ['North', 'Q3', 800, 600], ['South', 'Q3', 800, 596],
  ['North', 'Q4', 800, 500], ['South', 'Q4', 800, 505],
  ['North', 'Q5', 800, 300], ['South', 'Q5', 800, 302],
];
const claim = (q: string) => `  - id: north-${q.toLowerCase()}
    claim: North campus agrees more often than South on ${q}.
    kind: compare
    where: { Question: ${q} }
    focus: { Campus: North }
    against: { Campus: South }
    expect: higher
`;

beforeAll(async () => {
  writeFileSync(join(work, 'summary.csv'), `Campus,Question,Respondents,Agreeing\n${rows.map((r) => r.join(',')).join('\n')}\n`);
  writeFileSync(
    join(work, 'claims.yaml'),
    `title: Adjusted intervals\norganisation: Fernwick Students\ndata_date: 2026-01-15\nconfidence: 95%\nadjust: holm\nsources:\n  s:\n    file: summary.csv\n    shape: summary\n    respondents: Respondents\n    agree: Agreeing\nclaims:\n${['Q1', 'Q2', 'Q3', 'Q4', 'Q5'].map(claim).join('')}`,
  );
  built = await build({ claimsPath: join(work, 'claims.yaml'), outDir: join(work, 'out'), cwd: work });
  text = execFileSync('pdftotext', ['-enc', 'UTF-8', built.files.pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('an adjusted verdict beside its intervals', () => {
  it('is not supported after adjustment although its 95% interval excludes no difference', () => {
    const d = built.decisions[0]!;
    expect(d.p).toBeLessThan(0.05);
    expect(d.pAdjusted).toBeGreaterThan(0.05);
    expect(d.verdict).toBe('not-supported');
    expect(d.effectiveAlpha).toBeCloseTo(0.01, 15);
    const results = JSON.parse(readFileSync(built.files.results, 'utf8'));
    const c = results.claims[0];
    expect(c.interval.level).toBe(0.95);
    expect(c.interval.lower).toBeGreaterThan(0);
    // At the level that decided the verdict (99%) the interval includes no difference, as the verdict says. The
    // Newcombe interval itself is checked against R elsewhere (tests/stats).
    expect(c.adjustedInterval.level).toBeCloseTo(0.99, 12);
    const want = newcombeInterval(560, 1000, 510, 1000, { level: 0.99 });
    expectClose(c.adjustedInterval.lower, want.lower, 'closed', 'adjusted lower');
    expectClose(c.adjustedInterval.upper, want.upper, 'closed', 'adjusted upper');
    expect(c.adjustedInterval.lower).toBeLessThan(0);
    expect(c.stability.levels.find((l: { level: number }) => l.level === 0.95)).toEqual({ level: 0.95, adjusted: 'not-supported', unadjusted: 'supported' });
  });

  it('names both intervals and which is which in the table, the verdict paragraph and the summary', () => {
    const section = built.model.claims[0]!;
    const row = section.numbers.find((r) => r.label === 'Difference')!;
    expect(row.value).toMatch(/^\+5\.0 points \(95% interval \+0\.[0-9] to \+9\.[0-9], unadjusted; 99% interval −[0-9.]+ to \+[0-9.]+, adjusted for 5 claims\)$/);
    expect(section.verdictText).toMatch(/The 95% interval is not adjusted for testing 5 claims; at the level that decided the verdict \(99%, adjusted\) it runs from −[0-9.]+ to \+[0-9.]+ points\./);
    const summary = built.model.summary[0]!;
    expect(summary.keyFigure).toMatch(/; 99% interval adjusted for 5 claims: −[0-9.]+ to \+[0-9.]+$/);
    expect(summary.intervalLevel).toBe('95%');
    // And the PDF prints them.
    expect(text).toContain(row.value.replace(/\s+/g, ' '));
    expect(text).toContain('at the level that decided the verdict (99%, adjusted)');
  });

  it('leaves a claim that adjustment does not change without the summary addition', () => {
    const other = built.model.summary[1]!;
    expect(other.verdict).toBe('not-supported');
    expect(other.keyFigure).not.toMatch(/adjusted/);
  });
});
