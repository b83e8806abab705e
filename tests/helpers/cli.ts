/**
 * Running the command line from tests: one way to build a pack from a claims file and read back what it wrote, so
 * that end-to-end tests share it instead of each spawning, finding the pack folder and reading the PDF its own way.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { expect } from 'vitest';

/** The command as installed: bin/warrant.js over the compiled dist/ (npm test compiles first). */
export const bin = resolve(__dirname, '../../bin/warrant.js');

/** Text with every run of white space as one space, so that words wrapped across PDF lines still match. */
export function fold(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

export interface BuiltPack {
  /** The new pack folder (not the `latest` link). */
  folder: string;
  results: { claims: Array<Record<string, any>> };
  /** The PDF's text (pdftotext), folded. */
  text: string;
}

/**
 * Writes `yaml` to <cwd>/<name>.yaml, runs `warrant build <name>.yaml --out <out> --quiet` in `cwd`, expects exit 0
 * with nothing on stderr, and returns the pack folder, its results.json and its PDF's text.
 */
export function buildPack(cwd: string, yaml: string, options: { name?: string; out?: string } = {}): BuiltPack {
  const name = options.name ?? 'claims';
  const out = join(cwd, options.out ?? 'out');
  writeFileSync(join(cwd, `${name}.yaml`), yaml);
  const r = spawnSync(process.execPath, [bin, 'build', `${name}.yaml`, '--out', options.out ?? 'out', '--quiet'], { cwd, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const folder = join(out, readdirSync(out).find((d) => d !== 'latest') as string);
  return {
    folder,
    results: JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')),
    text: fold(execFileSync('pdftotext', ['-enc', 'UTF-8', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' })),
  };
}
