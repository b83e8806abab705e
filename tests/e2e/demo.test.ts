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
    expect([...verdicts].sort()).toEqual(['not-supported', 'opposite', 'supported', 'too-little-data']);
    expect(first.claims.claims.length).toBeGreaterThanOrEqual(8);
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
    expect(readFileSync(second.files.pdf).equals(readFileSync(first.files.pdf))).toBe(true);
    expect(readFileSync(second.files.results, 'utf8')).toBe(readFileSync(first.files.results, 'utf8'));
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
