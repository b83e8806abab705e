/**
 * The claims files shown in README.md are ones `warrant check` accepts. Each ```yaml block of the README that holds
 * `sources:` and `claims:` is written into a folder beside a copy of the demo's data (the examples read the demo's
 * files by their paths) and checked through the command line; a block that stops being valid fails here.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const work = mkdtempSync(join(tmpdir(), 'warrant-readme-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const readme = readFileSync(join(root, 'README.md'), 'utf8');
const blocks = [...readme.matchAll(/^```yaml\n([\s\S]*?)^```$/gm)].map((m) => m[1] as string).filter((b) => /^sources:/m.test(b) && /^claims:/m.test(b));

describe('README claims files', () => {
  it('has at least the first example and the one of the newer forms', () => {
    expect(blocks.length).toBeGreaterThanOrEqual(2);
    const all = blocks.join('\n');
    // The forms the claims file section documents, each in an example that is checked below.
    for (const form of ['units: [Department, Institution]', 'columns: answers', 'against: rest', 'against_label:', 'rows: [Campus, Mode]', 'answer_wording:', 'wording:', 'finite_population_correction: false', 'finite_population_correction: true']) {
      expect(all, form).toContain(form);
    }
  });

  it.each(blocks.map((b, i) => [i + 1, b] as const))('example %i is accepted by warrant check', (i, block) => {
    const dir = join(work, `example-${i}`);
    cpSync(join(root, 'demo/data'), join(dir, 'data'), { recursive: true });
    writeFileSync(join(dir, 'claims.yaml'), block.replace(/^# yaml-language-server:.*\n/m, ''));
    const r = spawnSync(process.execPath, [bin, 'check', 'claims.yaml'], { cwd: dir, encoding: 'utf8' });
    expect(r.stdout + r.stderr).toMatch(/claims\.yaml: \d+ claims?, \d+ sources?, all good\./);
    expect(r.status).toBe(0);
  }, 60_000);
});
