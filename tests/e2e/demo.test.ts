/**
 * End to end: the demo claims file and data in, a PDF evidence pack out, read back with poppler's pdftotext and
 * pdfinfo (independent of pdfkit), and results.json checked against its shipped schema.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Ajv } from 'ajv';
import { build, type BuildResult } from '../../src/pipeline.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-e2e-'));
let first: BuildResult;
let text: string;

/** pdftotext breaks lines and may hyphenate nothing; compare with all runs of white space folded to one space. */
/** A difference in points as the pack writes it: one decimal, signed, U+2212 minus. */
function fmtPoints(v: number): string {
  const t = (Math.round(Math.abs(v) * 1000) / 10).toFixed(1);
  return v < 0 && t !== '0.0' ? `\u2212${t}` : `+${t}`;
}

function fold(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

beforeAll(async () => {
  first = await build({ claimsPath: join(root, 'demo/claims.yaml'), outDir: join(work, 'a'), cwd: root });
  text = fold(execFileSync('pdftotext', ['-enc', 'UTF-8', first.files.pdf, '-'], { encoding: 'utf8' }));
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('demo evidence pack', () => {
  it('reaches every verdict with the demo claims', () => {
    const verdicts = new Set(first.decisions.map((d) => d.verdict));
    expect([...verdicts].sort()).toEqual(['estimate', 'not-supported', 'opposite', 'supported', 'too-little-data']);
    expect(first.claims.claims.length).toBeGreaterThanOrEqual(8);
  });

  it('uses every kind of claim', () => {
    const kinds = new Set(first.claims.claims.map((c) => c.kind));
    expect([...kinds].sort()).toEqual(['association', 'change', 'compare', 'crosstab', 'equivalence', 'estimate', 'every', 'gap-change', 'means', 'rank', 'target', 'trend']);
  });

  it('prints every claim, its verdict sentence and its hypotheses in the PDF', () => {
    for (const section of first.model.claims) {
      expect(text).toContain(fold(section.statement));
      expect(text).toContain(fold(section.verdictText));
      expect(text).toContain(fold(section.hypotheses.null));
    }
  });

  it('is a tagged PDF with the pack title', () => {
    const info = execFileSync('pdfinfo', [first.files.pdf], { encoding: 'utf8' });
    expect(info).toMatch(/Tagged:\s+yes/);
    expect(info).toMatch(new RegExp(`Title:\\s+${first.claims.title}\\n`));
    const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
    expect(pages).toBeGreaterThanOrEqual(first.claims.claims.length);
  });

  it('writes results.json that matches its schema and the verdicts in the pack', () => {
    const results = JSON.parse(readFileSync(first.files.results, 'utf8'));
    const schema = JSON.parse(readFileSync(join(root, 'schema/results.schema.json'), 'utf8'));
    const ajv = new Ajv({ allErrors: true });
    const valid = ajv.validate(schema, results);
    expect(ajv.errors ?? []).toEqual([]);
    expect(valid).toBe(true);
    expect(results.claims.map((c: { verdict: string }) => c.verdict)).toEqual(first.decisions.map((d) => d.verdict));
  });

  it("states each tested claim's effective threshold, which agrees with its adjusted p-value", () => {
    const results = JSON.parse(readFileSync(first.files.results, 'utf8')) as { settings: { adjust: string }; claims: Array<{ p: number | null; pAdjusted: number | null; effectiveAlpha: number | null; confidence: number }> };
    expect(results.settings.adjust).toBe('holm');
    const tested = results.claims.filter((c) => c.p !== null);
    expect(tested.length).toBeGreaterThan(5);
    const m = tested.length;
    // Holm's textbook step-down (Holm 1979, common practice to state it so): the k-th smallest p-value is held to
    // alpha / (m - k + 1) until the first step fails; every later claim is settled at that failing step.
    const sorted = tested.slice().sort((a, b) => (a.p as number) - (b.p as number));
    let failed: number | undefined;
    sorted.forEach((c, r) => {
      const alpha = Number((1 - c.confidence).toFixed(12));
      if (failed === undefined && !((c.p as number) < alpha / (m - r))) failed = r;
      const step = failed ?? r;
      expect(c.effectiveAlpha).toBeCloseTo(alpha / (m - step), 15);
      expect((c.pAdjusted as number) < alpha).toBe((c.p as number) < (c.effectiveAlpha as number));
    });
    for (const c of results.claims.filter((r) => r.p === null)) expect(c.effectiveAlpha).toBeNull();
  });

  it('states the verdict at 90, 95 and 99% confidence, with and without adjustment, for every tested claim', () => {
    type Cell = { level: number; adjusted: string; unadjusted: string };
    const results = JSON.parse(readFileSync(first.files.results, 'utf8')) as {
      claims: Array<{ id: string; verdict: string; kind: string; p: number | null; pAdjusted: number | null; confidence: number; stability: { levels: Cell[]; dependsOnLevel: boolean; dependsOnAdjustment: boolean; text: string } | null }>;
    };
    for (const c of results.claims) {
      if (c.p === null || c.kind === 'estimate') {
        expect(c.stability).toBeNull();
        continue;
      }
      const s = c.stability!;
      expect(s.levels.map((l) => l.level)).toEqual([0.9, 0.95, 0.99]);
      // At the claim's own level the adjusted verdict is the pack's verdict.
      expect(s.levels.find((l) => l.level === c.confidence)?.adjusted).toBe(c.verdict);
      // The p-values do not depend on the level, so a claim the pack supports is supported at a level exactly when
      // its (R-checked) adjusted or raw p-value is below one minus that level.
      if (c.verdict === 'supported') {
        for (const l of s.levels) {
          expect({ level: l.level, v: l.adjusted === 'supported' }).toEqual({ level: l.level, v: (c.pAdjusted as number) < Number((1 - l.level).toFixed(12)) });
          expect({ level: l.level, v: l.unadjusted === 'supported' }).toEqual({ level: l.level, v: (c.p as number) < Number((1 - l.level).toFixed(12)) });
        }
      }
    }
    // The demo's equivalence claim is supported at 90% and 95% but not at 99% once adjusted for 13 claims.
    const equal = results.claims.find((c) => c.id === 'campuses-equally-reachable')!;
    expect(equal.stability?.levels.map((l) => l.adjusted)).toEqual(['supported', 'supported', 'not-supported']);
    expect(equal.stability?.dependsOnLevel).toBe(true);
    expect(first.model.summary.find((r) => r.id === 'campuses-equally-reachable')?.dependsOnLevel).toBe(true);
    expect(first.model.summary.find((r) => r.id === 'feedback-below-region')?.dependsOnLevel).toBe(false);
    expect(first.model.claims.find((r) => r.id === 'campuses-equally-reachable')?.stability?.text).toBe(equal.stability?.text);
  });

  it('labels the TOST p-value as what it is and gives results.json the 90% interval the pack sets against the margin', () => {
    const results = JSON.parse(readFileSync(first.files.results, 'utf8')) as { claims: Array<{ id: string; kind: string; interval: { level: number; lower: number; upper: number } }> };
    const eq = results.claims.find((c) => c.kind === 'equivalence')!;
    const section = first.model.claims.find((c) => c.id === eq.id)!;
    // 1 - 2 alpha at 95% (Schuirmann 1987, from memory: two one-sided tests at alpha match a 1 - 2 alpha interval).
    expect(eq.interval.level).toBeCloseTo(0.9, 12);
    const printed = section.numbers.find((r) => r.label.startsWith('Interval set against the margin (90%)'))!;
    expect(printed.value.startsWith(`${fmtPoints(eq.interval.lower)} to ${fmtPoints(eq.interval.upper)} points`)).toBe(true);
    expect(section.numbers.map((r) => r.label)).toContain('p-value (TOST, the larger of the two one-sided p-values)');
    // pdftotext may join a word broken at its hyphen ("p-values" -> "pvalues"): the part before it is enough.
    expect(text).toContain('p-value (TOST, the larger of the two one-sided');
    expect(section.numbers.map((r) => r.label)).not.toContain('p-value (two-sided)');
  });

  it('withholds the counts of a claim with too little data', () => {
    const results = JSON.parse(readFileSync(first.files.results, 'utf8'));
    for (const c of results.claims.filter((r: { verdict: string }) => r.verdict === 'too-little-data')) {
      expect(c.selections).toEqual([]);
      expect(c.units).toEqual([]);
      expect(c.p).toBeNull();
    }
  });

  it('gives byte-identical files when built twice from the same inputs', async () => {
    const second = await build({ claimsPath: join(root, 'demo/claims.yaml'), outDir: join(work, 'b'), cwd: root });
    for (const name of ['pack.pdf', 'results.json', 'results.xlsx']) {
      expect(readFileSync(join(second.files.folder, name)).equals(readFileSync(join(first.files.folder, name)))).toBe(true);
    }
  });

  it('writes results.xlsx and a chart file with its spec for every claim that has a chart', () => {
    const charted = first.model.claims.filter((c) => c.chart).map((c) => c.id);
    expect(charted.length).toBeGreaterThan(10);
    for (const id of charted) {
      expect(readFileSync(join(first.files.folder, 'charts', `${id}.svg`), 'utf8')).toContain('<svg');
      expect(JSON.parse(readFileSync(join(first.files.folder, 'charts', `${id}.vl.json`), 'utf8')).$schema).toMatch(/vega-lite/);
    }
  });
});

describe('rerun on a new release', () => {
  it('builds year one, then year two, and says what changed and why', async () => {
    const out = join(work, 'history');
    const year1 = await build({
      claimsPath: join(root, 'demo/claims.yaml'),
      outDir: out,
      cwd: root,
      data: { lanternfield: 'demo/data/2025/summary.xlsx', pulse: 'demo/data/2025/respondents.csv' },
      date: '2025-03-04',
    });
    expect(year1.diff).toBeUndefined();
    const year2 = await build({ claimsPath: join(root, 'demo/claims.yaml'), outDir: out, cwd: root });
    const d = year2.diff;
    expect(d).toBeDefined();
    // Both data files are new releases; the claims file is the same, so no claim counts as edited.
    expect(d?.data.map((x) => x.id).sort()).toEqual(['lanternfield', 'pulse']);
    expect(d?.edited).toEqual([]);
    // The same claims, run on the 2025 release, give these verdicts; on 2026 these five change (invented data).
    const changed = Object.fromEntries((d?.verdicts ?? []).map((v) => [v.id, `${v.before} -> ${v.after} (${v.reasons.join(', ')})`]));
    expect(changed).toEqual({
      'wellbeing-up-this-year': 'not-supported -> supported (new data)',
      'library-fell': 'not-supported -> opposite (new data)',
      'arrangements-by-campus': 'supported -> not-supported (new data)',
      'library-answers-shifted': 'not-supported -> supported (new data)',
      'campuses-equally-reachable': 'not-supported -> supported (new data)',
    });
    // The PDF's document ID follows the content, so two different packs never share one.
    const docId = (pdf: string) => /\/ID \[<([0-9a-f]+)>/.exec(readFileSync(pdf, 'latin1'))?.[1];
    expect(docId(year1.files.pdf)).toMatch(/^[0-9a-f]{32}$/);
    expect(docId(year2.files.pdf)).not.toBe(docId(year1.files.pdf));
    const text = fold(execFileSync('pdftotext', ['-enc', 'UTF-8', year2.files.pdf, '-'], { encoding: 'utf8' }));
    expect(text).toContain(fold(year2.model.changes?.heading ?? 'missing'));
    expect(text).toContain('Data source lanternfield now reads data/2026/summary.xlsx instead of demo/data/2025/');
    // The command line says the same in the terminal.
    const diff = spawnSync(process.execPath, [join(root, 'bin/warrant.js'), 'diff', year1.files.folder, year2.files.folder], { encoding: 'utf8' });
    expect(diff.status).toBe(0);
    expect(diff.stdout).toContain('wellbeing-up-this-year: Not supported -> Supported (new data)');
  });
});

describe('command line', () => {
  const bin = join(root, 'bin/warrant.js');

  it('explains its commands', () => {
    const help = spawnSync(process.execPath, [bin, '--help'], { encoding: 'utf8' });
    expect(help.status).toBe(0);
    expect(help.stdout).toContain('build <claims>');
    const buildHelp = spawnSync(process.execPath, [bin, 'build', '--help'], { encoding: 'utf8' });
    expect(buildHelp.stdout).toContain('--out');
  });

  it('prints a machine-readable summary with --json and nothing else on stdout', () => {
    const out = join(work, 'cli-json');
    const run = spawnSync(process.execPath, [bin, 'build', join(root, 'demo/claims.yaml'), '--out', out, '--json'], { encoding: 'utf8', cwd: root });
    expect(run.status).toBe(0);
    const summary = JSON.parse(run.stdout);
    expect(summary.pdf).toBe(join(summary.folder, 'pack.pdf'));
    expect(summary.claims).toHaveLength(first.claims.claims.length);
    expect(summary.verdicts).toEqual(Object.fromEntries([...new Set(first.decisions.map((d) => d.verdict))].map((v) => [v, first.decisions.filter((d) => d.verdict === v).length])));
    expect(summary.changedSince).toBeNull();
    expect(run.stderr).toBe('');
  });

  it('stops with exit code 2, one paragraph and no stack trace on a bad claims file, leaving the old pack alone', () => {
    const out = join(work, 'cli');
    const ok = spawnSync(process.execPath, [bin, 'build', join(root, 'demo/claims.yaml'), '--out', out, '--quiet'], { encoding: 'utf8', cwd: root });
    expect(ok.status).toBe(0);
    const before = readFileSync(join(out, 'latest', 'pack.pdf'));
    const bad = join(work, 'bad.yaml');
    writeFileSync(bad, readFileSync(join(root, 'demo/claims.yaml'), 'utf8').replace(/^confidence: .*$/m, 'confidence: 1.5'));
    const run = spawnSync(process.execPath, [bin, 'build', bad, '--out', out], { encoding: 'utf8', cwd: root });
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('bad.yaml:');
    expect(run.stderr).toContain('confidence');
    expect(run.stderr).not.toMatch(/\n\s+at /);
    expect(readFileSync(join(out, 'latest', 'pack.pdf')).equals(before)).toBe(true);
    expect(readdirSync(out).filter((n) => n.startsWith('.'))).toEqual([]);
  });
});
