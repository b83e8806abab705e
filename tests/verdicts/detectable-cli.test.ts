/**
 * Through the command line: the smallest detectable difference is computed at the threshold that decided each
 * verdict (Holm's method over four claims: 0.05 / 4 when the first step fails), and mean-score claims report the
 * Mann–Whitney check, Cohen's d and their own detectable difference.
 *
 * Reference: tests/fixtures/r/detectable-adjusted.R (R 4.2.2): prop.test, t.test, wilcox.test, Holm's steps,
 * power.prop.test solved for p2 at the Holm threshold (tol = 1e-12), the normal-approximation power of the
 * two-sample test solved by uniroot, and power.t.test for comparison.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const work = mkdtempSync(join(tmpdir(), 'warrant-detectable-'));
const R = JSON.parse(readFileSync(join(root, 'tests/fixtures/r/detectable-adjusted.json'), 'utf8')) as {
  claims: Array<{ id: string; p: number; threshold: number; detectable: number; detectableAt05: number; mannWhitneyP?: number; cohensD?: number; cohensDInterval?: [number, number]; cohensDAdjustedInterval?: [number, number]; powerTTestDelta?: number }>;
};
let claims: Array<Record<string, any>>;
let text: string;

beforeAll(() => {
  const run = spawnSync(process.execPath, [bin, 'build', join(root, 'tests/fixtures/detectable/claims.yaml'), '--out', join(work, 'out'), '--json'], { encoding: 'utf8', cwd: root });
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  const folder = (JSON.parse(run.stdout) as { folder: string }).folder;
  claims = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')).claims;
  text = execFileSync('pdftotext', ['-enc', 'UTF-8', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('smallest detectable difference at the adjusted threshold', () => {
  it('holds each claim to the Holm threshold R finds and computes the detectable difference there (R power.prop.test)', () => {
    for (const ref of R.claims) {
      const c = claims.find((x) => x.id === ref.id)!;
      expect(rel(c.p, ref.p), `${ref.id} p`).toBeLessThan(1e-9);
      expect(rel(c.effectiveAlpha, ref.threshold), `${ref.id} threshold`).toBeLessThan(1e-12);
      expect(c.effectiveAlpha).toBeCloseTo(0.05 / 4, 15);
      expect(rel(c.detectable, ref.detectable), `${ref.id} detectable`).toBeLessThan(1e-9);
      // Larger than at the unadjusted 0.05, which understated what the sample needed.
      expect(c.detectable).toBeGreaterThan(ref.detectableAt05 * 1.1);
    }
  });

  it('says "would be detected 80% of the time" at that threshold, never "reliably"', () => {
    expect(text).toContain('would be detected 80% of the time at the threshold that decided this verdict (p below 0.0125 after adjusting for 4 claims)');
    expect(text).toContain('Smallest difference detected 80% of the time (at p below 0.0125)');
    expect(text).not.toMatch(/reliably/i);
  });
});

describe('mean-score claims', () => {
  const ref = () => R.claims.find((c) => c.id === 'scores-q4')!;
  const c = () => claims.find((x) => x.id === 'scores-q4')!;

  it('reports the Mann–Whitney check beside Welch (R wilcox.test, exact = FALSE, correct = TRUE) and Cohen\'s d', () => {
    expect(c().check.method).toBe('mann-whitney');
    expect(rel(c().check.p, ref().mannWhitneyP!)).toBeLessThan(1e-9);
    expect(rel(c().cohensD, ref().cohensD!)).toBeLessThan(1e-9);
    expect(text).toContain(`Effect size (Cohen's d) ${(ref().cohensD! < 0 ? '−' : '') + Math.abs(ref().cohensD!).toFixed(2)}`);
    expect(text).toMatch(/Mann–Whitney rank-sum test \(check\) p = 0\.273: the same verdict at p below 0\.0125/);
  });

  it("gives Cohen's d's interval at 95% and at the level that decided the verdict (R uniroot on pt(t, df, ncp))", () => {
    const own = c().cohensDInterval;
    const adjusted = c().cohensDAdjustedInterval;
    const [rl, ru] = ref().cohensDInterval!;
    const [al, au] = ref().cohensDAdjustedInterval!;
    expect(rel(own.lower, rl)).toBeLessThan(1e-9);
    expect(rel(own.upper, ru)).toBeLessThan(1e-9);
    expect(rel(adjusted.lower, al)).toBeLessThan(1e-9);
    expect(rel(adjusted.upper, au)).toBeLessThan(1e-9);
    expect(adjusted.level).toBeCloseTo(1 - 0.05 / 4, 12);
    // Not supported, and both intervals hold 0, as the verdict says.
    expect(rl < 0 && ru > 0 && al < 0 && au > 0).toBe(true);
    const f = (v: number) => `${v < 0 ? '−' : '+'}${Math.abs(v).toFixed(2)}`;
    expect(text).toContain(`(95% interval ${f(rl)} to ${f(ru)}, unadjusted; 98.8% interval ${f(al)} to ${f(au)}, adjusted for 4 claims)`);
  });

  it('gives the smallest detectable difference in scale points (R uniroot; within 0.5% of power.t.test)', () => {
    expect(rel(c().detectable, ref().detectable)).toBeLessThan(1e-9);
    expect(rel(c().detectable, ref().powerTTestDelta!)).toBeLessThan(5e-3);
    expect(text).toContain(`about ${ref().detectable.toFixed(2)} scale points`);
  });

  it('writes each group as "mean 3.xx (scale 1 to 5), 400 respondents", not "of 400"', () => {
    expect(text).toMatch(/mean \d\.\d\d \(scale 1 to 5\), 400 respondents \(interval/);
    expect(text).not.toMatch(/on a scale of 1 to 5 of/);
  });
});
