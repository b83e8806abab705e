/**
 * Through the command line: where Cohen's d's interval (which assumes equal spreads, as Student's t does) and the
 * Welch interval for the difference (the test that decided the verdict) disagree about whether no difference is
 * inside, the claim's page says so. Invented respondents: a small group with widely spread answers against a large
 * group answering nearly alike, the case where the pooled and Welch standard errors differ most.
 *
 * Expected values are worked from the counts by hand (Welch 1947; Student's pooled t) and checked against the pack's
 * own figures in results.json, which tests/stats checks against R.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-cohens-d-'));

// Small group: 20 answers, codes 1, 2, 4, 5, 5 four times each (mean 3.4, SD about 1.67).
// Large group: 2,000 answers, 1,800 of 3, 100 of 2 and 100 of 4 (mean 3.0, SD about 0.32).
const small = [1, 2, 4, 5, 5].flatMap((c) => [c, c, c, c]);
const large = [...Array(1800).fill(3), ...Array(100).fill(2), ...Array(100).fill(4)] as number[];

let claim: {
  verdict: string;
  difference: { value: number; interval: { lower: number; upper: number } };
  cohensD: number;
  cohensDInterval: { lower: number; upper: number; level: number };
  cautions: string[];
};

beforeAll(() => {
  const rows = ['Id,Group,Q1', ...small.map((c, i) => `s${i},small,${c}`), ...large.map((c, i) => `l${i},large,${c}`)];
  writeFileSync(join(work, 'answers.csv'), rows.join('\n') + '\n');
  writeFileSync(
    join(work, 'claims.yaml'),
    `title: Spreads
organisation: Test
sources:
  answers: { file: answers.csv, shape: respondents, questions: [Q1] }
claims:
  - id: small-higher
    claim: The small group scores higher than the large group.
    kind: means
    where: { question: Q1 }
    focus: { Group: small }
    against: { Group: large }
    expect: higher
`,
  );
  const run = spawnSync(process.execPath, [join(root, 'bin/warrant.js'), 'build', join(work, 'claims.yaml'), '--out', join(work, 'out'), '--json'], { encoding: 'utf8', cwd: work });
  expect(run.status, run.stderr).toBe(0);
  const folder = (JSON.parse(run.stdout) as { folder: string }).folder;
  claim = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')).claims[0];
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe("Cohen's d's interval beside Welch's verdict", () => {
  it('finds the two intervals on different sides of zero for these groups', () => {
    const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
    const ss = (xs: number[]) => xs.reduce((s, x) => s + (x - mean(xs)) ** 2, 0);
    // Welch: SE = sqrt(s1²/n1 + s2²/n2); Student: SE = sp sqrt(1/n1 + 1/n2), sp² = (ss1 + ss2)/(n1 + n2 − 2).
    const welchSe = Math.sqrt(ss(small) / 19 / 20 + ss(large) / 1999 / 2000);
    const sp = Math.sqrt((ss(small) + ss(large)) / 2018);
    const diff = mean(small) - mean(large);
    expect(diff).toBeCloseTo(0.4, 12);
    expect(claim.difference.value).toBeCloseTo(diff, 12);
    expect(claim.cohensD).toBeCloseTo(diff / sp, 12);
    // Welch's t is about 1.07, well inside ±2.09 (t with about 19 degrees of freedom, 95%); the pooled t about 5.
    expect(diff / welchSe).toBeLessThan(1.2);
    expect(diff / (sp * Math.sqrt(1 / 20 + 1 / 2000))).toBeGreaterThan(4.5);
    expect(claim.difference.interval.lower).toBeLessThan(0);
    expect(claim.cohensDInterval.lower).toBeGreaterThan(0);
    expect(claim.cohensDInterval.level).toBe(0.95);
  });

  it("keeps Welch's verdict and says the two intervals disagree, so the result is borderline", () => {
    expect(claim.verdict).toBe('not-supported');
    expect(claim.cautions.join(' ')).toContain(
      "The interval for Cohen's d (95%) excludes no difference while the interval for the difference in scale points at the same level includes it: the first assumes the two groups have the same spread, the second comes from Welch's t test, which decided the verdict.",
    );
  });
});
